using Patchproof.Client.Components.Plots;

namespace Patchproof.Client.Tests.Components.Plots;

public sealed class PlotThinningTests
{
    [Fact]
    public void ToChartPoints_ShortSeries_KeepsEveryPoint()
    {
        var (x, y) = PlotThinning.ToChartPoints([1.0, 2, 3], [4.0, 5, 6]);

        Assert.Equal([1.0, 2, 3], x.Cast<double>());
        Assert.Equal([4.0, 5, 6], y.Cast<double>());
    }

    [Fact]
    public void ToChartPoints_MillionPoints_StaysWithinTheLimitAndKeepsBothEnds()
    {
        var values = Enumerable.Range(0, 1_000_000).Select(i => (double)i).ToArray();

        var (x, _) = PlotThinning.ToChartPoints(values, values);

        Assert.InRange(x.Count, 2, PlotThinning.MaxPointsPerTrace);
        Assert.Equal(0.0, x[0]);
        Assert.Equal(999_999.0, x[^1]);
    }
}
