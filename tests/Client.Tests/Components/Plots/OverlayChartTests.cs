using Bunit;
using Patchproof.Client.Components.Plots;
using Patchproof.Client.Tests.Fakes;

namespace Patchproof.Client.Tests.Components.Plots;

public sealed class OverlayChartTests : BunitContext
{
    public OverlayChartTests() => JSInterop.Mode = JSRuntimeMode.Loose;

    [Fact]
    public void Render_ThreeTraces_NamesEachInWordsWithItsLineStyle()
    {
        var cut = Render<OverlayChart>(ps => ps.Add(p => p.Plot, DemoData.Plane("x against z")).Add(p => p.ChartId, "plane-0"));

        var legend = cut.FindAll(".legend-words li");
        Assert.Equal(["capture (measured on the board)", "nominal design (simulated)", "fitted values (simulated)"], legend.Select(l => l.TextContent.Trim()));
        Assert.Contains("dash", legend[1].QuerySelector(".swatch")!.ClassName, StringComparison.Ordinal);
        Assert.Equal("x against z", cut.Find("figcaption .title").TextContent);
    }

    [Fact]
    public void ZoomInButton_ChangesTheViewAndEnablesShowAll()
    {
        var cut = Render<OverlayChart>(ps => ps.Add(p => p.Plot, DemoData.Plane("x against z")).Add(p => p.ChartId, "plane-0"));
        Assert.True(cut.Find("button[aria-label='Show all']").HasAttribute("disabled"));

        cut.Find("button[aria-label='Zoom in']").Click();

        Assert.Equal(2, cut.Instance.Viewport.Magnification, 9);
        Assert.False(cut.Find("button[aria-label='Show all']").HasAttribute("disabled"));
        Assert.Contains("x from", cut.Find("[aria-live=polite]").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void ArrowKeyOnTheToolbar_PansTheView()
    {
        var cut = Render<OverlayChart>(ps => ps.Add(p => p.Plot, DemoData.Plane("x against z")).Add(p => p.ChartId, "plane-0"));
        var before = cut.Instance.Viewport.X;

        cut.Find("[role=toolbar]").KeyDown("ArrowRight");

        Assert.True(cut.Instance.Viewport.X.Min > before.Min);
    }
}
