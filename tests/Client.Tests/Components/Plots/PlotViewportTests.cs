using Patchproof.Client.Components.Plots;

namespace Patchproof.Client.Tests.Components.Plots;

public sealed class PlotViewportTests
{
    private static PlotViewport Viewport() => new(new AxisRange(-20, 20), new AxisRange(0, 50));

    [Fact]
    public void New_StartsAtHome()
    {
        var viewport = Viewport();

        Assert.True(viewport.IsHome);
        Assert.Equal(1, viewport.Magnification);
    }

    [Fact]
    public void ZoomIn_HalvesBothRangesAboutTheCentre()
    {
        var viewport = Viewport();

        viewport.ZoomIn();

        Assert.Equal(new AxisRange(-10, 10), viewport.X);
        Assert.Equal(new AxisRange(12.5, 37.5), viewport.Y);
        Assert.Equal(2, viewport.Magnification);
        Assert.False(viewport.IsHome);
    }

    [Fact]
    public void ZoomOut_AfterZoomIn_ReturnsHome()
    {
        var viewport = Viewport();

        viewport.ZoomIn();
        viewport.ZoomOut();

        Assert.True(viewport.IsHome);
    }

    [Fact]
    public void ZoomOut_StopsAtFourTimesTheHomeView()
    {
        var viewport = Viewport();

        for (var i = 0; i < 10; i++)
        {
            viewport.ZoomOut();
        }

        Assert.Equal(160, viewport.X.Width, 9);
    }

    [Theory]
    [InlineData(PanDirection.Left, -30, 10, 0, 50)]
    [InlineData(PanDirection.Right, -10, 30, 0, 50)]
    [InlineData(PanDirection.Up, -20, 20, 12.5, 62.5)]
    [InlineData(PanDirection.Down, -20, 20, -12.5, 37.5)]
    public void Pan_MovesAQuarterOfTheViewInItsDirection(PanDirection direction, double xMin, double xMax, double yMin, double yMax)
    {
        var viewport = Viewport();

        viewport.Pan(direction);

        Assert.Equal(new AxisRange(xMin, xMax), viewport.X);
        Assert.Equal(new AxisRange(yMin, yMax), viewport.Y);
    }

    [Fact]
    public void Reset_AfterZoomAndPan_ReturnsHomeAndTellsListeners()
    {
        var viewport = Viewport();
        var changes = 0;
        viewport.Changed += () => changes++;

        viewport.ZoomIn();
        viewport.Pan(PanDirection.Left);
        viewport.Reset();

        Assert.True(viewport.IsHome);
        Assert.Equal(3, changes);
    }

    [Fact]
    public void Show_InvertedRange_IsIgnored()
    {
        var viewport = Viewport();

        viewport.Show(new AxisRange(5, 1), new AxisRange(0, 1));

        Assert.True(viewport.IsHome);
    }

    [Fact]
    public void Show_ADragZoom_BecomesTheView()
    {
        var viewport = Viewport();

        viewport.Show(new AxisRange(1, 5), new AxisRange(10, 20));

        Assert.Equal(new AxisRange(1, 5), viewport.X);
        Assert.Equal(10, viewport.Magnification);
    }

    [Fact]
    public void Enclosing_PadsTheDataAndSkipsNonFiniteValues()
    {
        var range = AxisRange.Enclosing([0, double.NaN, 10, double.PositiveInfinity], padding: 0.1);

        Assert.Equal(new AxisRange(-1, 11), range);
    }

    [Fact]
    public void Enclosing_NoValues_IsTheUnitRange()
    {
        Assert.Equal(new AxisRange(0, 1), AxisRange.Enclosing([]));
    }
}
