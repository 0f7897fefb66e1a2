namespace Patchproof.Client.Components.Plots;

/// <summary>A last guard on the number of points handed to the browser, for series that arrive undecimated.</summary>
/// <remarks>
/// The server decimates overlays to at most <see cref="MaxPointsPerTrace"/> points per trace (min/max per pixel column or
/// LTTB); a longer series here keeps every k-th point with the last one, so the page stays responsive either way.
/// </remarks>
public static class PlotThinning
{
    /// <summary>The most points one trace sends to the chart.</summary>
    public const int MaxPointsPerTrace = 20_000;

    /// <summary>The points to draw: all of them when there are at most <paramref name="maxPoints"/>, else every k-th and the last.</summary>
    public static (List<object> X, List<object> Y) ToChartPoints(IReadOnlyList<double> x, IReadOnlyList<double> y, int maxPoints = MaxPointsPerTrace)
    {
        var count = Math.Min(x.Count, y.Count);
        var stride = count <= maxPoints ? 1 : (int)Math.Ceiling((double)count / (maxPoints - 1));
        var xs = new List<object>(Math.Min(count, maxPoints));
        var ys = new List<object>(Math.Min(count, maxPoints));
        for (var i = 0; i < count; i += stride)
        {
            xs.Add(x[i]);
            ys.Add(y[i]);
        }

        if (count > 0 && (count - 1) % stride != 0)
        {
            xs.Add(x[count - 1]);
            ys.Add(y[count - 1]);
        }

        return (xs, ys);
    }
}
