namespace Patchproof.Core.Dynamics;

/// <summary>Reduces long traces to what a plot can show: min/max per pixel column, LTTB, and arc-length thinning of phase curves.</summary>
/// <remarks>
/// <para>Which is used where (see docs/dynamics.md):</para>
/// <list type="number">
/// <item><description><see cref="MinMaxPerColumn"/> for captured time series: each of C equal time
/// columns keeps its lowest and its highest sample, in time order, so a trace carries at most 2C
/// points and the envelope a scope would show survives exactly: a one-sample spike or a clipped
/// stretch never disappears. Default C = 10,000, so at most 20,000 points.</description></item>
/// <item><description><see cref="LargestTriangleThreeBuckets"/> for simulated time series and
/// overlays of restarted simulations: the traces are smooth, and LTTB keeps the visual shape
/// (peaks, turning points) with one point per bucket.</description></item>
/// <item><description><see cref="AlongCurve"/> for phase planes (x against y): time is not an axis,
/// so columns mean nothing; instead the curve is resampled at equal arc length measured in
/// coordinates scaled by each axis's range, so points lie evenly along the drawn line whatever the
/// speed along the orbit, and every turn wider than the step is kept.</description></item>
/// </list>
/// <para>Every method keeps the first and last sample and returns the source indices of what it
/// kept; a trace that is already short enough is returned whole.</para>
/// <para>References: 1. S. Steinarsson, Downsampling time series for visual representation, MSc
/// thesis, University of Iceland (2013), chapter 4 (LTTB).</para>
/// </remarks>
public static class TraceDecimation
{
    /// <summary>The largest number of points a displayed trace carries by default.</summary>
    public const int DefaultPointBudget = 20_000;

    /// <summary>Keeps the lowest and highest sample of each of <paramref name="columns"/> equal-width time columns.</summary>
    /// <param name="time">Sample times, non-decreasing.</param>
    /// <param name="values">Samples, same length as <paramref name="time"/>.</param>
    /// <param name="columns">Number of columns (at least 1); the trace keeps at most 2 per column.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the lengths differ or <paramref name="columns"/> is below 1.</exception>
    public static DisplaySeries MinMaxPerColumn(ReadOnlySpan<double> time, ReadOnlySpan<double> values, int columns = DefaultPointBudget / 2)
    {
        CheckPair(time, values);
        Preconditions.CheckArgumentRange(nameof(columns), columns >= 1, "must be at least 1");
        var n = time.Length;
        if (n <= 2 * columns)
        {
            return Whole(time, values);
        }

        var kept = new List<int>(2 * columns + 2);
        var t0 = time[0];
        var span = time[n - 1] - t0;
        var start = 0;
        for (var column = 0; column < columns && start < n; column++)
        {
            var columnEnd = column == columns - 1 ? double.PositiveInfinity : t0 + span * (column + 1) / columns;
            var end = start;
            var lowest = start;
            var highest = start;
            while (end < n && time[end] < columnEnd)
            {
                if (values[end] < values[lowest])
                {
                    lowest = end;
                }

                if (values[end] > values[highest])
                {
                    highest = end;
                }

                end++;
            }

            if (end == start)
            {
                continue;
            }

            kept.Add(Math.Min(lowest, highest));
            if (lowest != highest)
            {
                kept.Add(Math.Max(lowest, highest));
            }

            start = end;
        }

        if (kept[0] != 0)
        {
            kept.Insert(0, 0);
        }

        if (kept[^1] != n - 1)
        {
            kept.Add(n - 1);
        }

        return Pick(time, values, kept);
    }

    /// <summary>Largest-Triangle-Three-Buckets: keeps <paramref name="pointCount"/> points that preserve the trace's visual shape.</summary>
    /// <param name="x">Abscissae, non-decreasing.</param>
    /// <param name="y">Ordinates, same length.</param>
    /// <param name="pointCount">Points to keep (at least 3).</param>
    /// <exception cref="ArgumentOutOfRangeException">When the lengths differ or <paramref name="pointCount"/> is below 3.</exception>
    public static DisplaySeries LargestTriangleThreeBuckets(ReadOnlySpan<double> x, ReadOnlySpan<double> y, int pointCount = DefaultPointBudget)
    {
        CheckPair(x, y);
        Preconditions.CheckArgumentRange(nameof(pointCount), pointCount >= 3, "must be at least 3");
        var n = x.Length;
        if (n <= pointCount)
        {
            return Whole(x, y);
        }

        var kept = new List<int>(pointCount) { 0 };
        var bucketSize = (double)(n - 2) / (pointCount - 2);
        var previous = 0;
        for (var bucket = 0; bucket < pointCount - 2; bucket++)
        {
            var from = (int)(bucket * bucketSize) + 1;
            var to = (int)((bucket + 1) * bucketSize) + 1;
            var nextFrom = to;
            var nextTo = Math.Min((int)((bucket + 2) * bucketSize) + 1, n);
            double meanX = 0, meanY = 0;
            for (var i = nextFrom; i < nextTo; i++)
            {
                meanX += x[i];
                meanY += y[i];
            }

            var nextCount = Math.Max(nextTo - nextFrom, 1);
            if (nextTo <= nextFrom)
            {
                meanX = x[n - 1];
                meanY = y[n - 1];
            }
            else
            {
                meanX /= nextCount;
                meanY /= nextCount;
            }

            var bestArea = -1.0;
            var best = from;
            for (var i = from; i < to; i++)
            {
                var area = Math.Abs((x[previous] - meanX) * (y[i] - y[previous]) - (x[previous] - x[i]) * (meanY - y[previous]));
                if (area > bestArea)
                {
                    bestArea = area;
                    best = i;
                }
            }

            kept.Add(best);
            previous = best;
        }

        kept.Add(n - 1);
        return Pick(x, y, kept);
    }

    /// <summary>Thins a phase-plane curve to at most <paramref name="pointBudget"/> points spaced evenly in arc length (axes scaled to their ranges).</summary>
    /// <param name="x">The horizontal channel.</param>
    /// <param name="y">The vertical channel, same length.</param>
    /// <param name="pointBudget">The largest number of points to keep (at least 2).</param>
    /// <exception cref="ArgumentOutOfRangeException">When the lengths differ or <paramref name="pointBudget"/> is below 2.</exception>
    public static DisplaySeries AlongCurve(ReadOnlySpan<double> x, ReadOnlySpan<double> y, int pointBudget = DefaultPointBudget)
    {
        CheckPair(x, y);
        Preconditions.CheckArgumentRange(nameof(pointBudget), pointBudget >= 2, "must be at least 2");
        var n = x.Length;
        if (n <= pointBudget)
        {
            return Whole(x, y);
        }

        var scaleX = InverseRange(x);
        var scaleY = InverseRange(y);
        var total = 0.0;
        for (var i = 1; i < n; i++)
        {
            total += Hypot((x[i] - x[i - 1]) * scaleX, (y[i] - y[i - 1]) * scaleY);
        }

        // One step of arc length per kept point leaves room for the forced last point.
        var step = total / (pointBudget - 2);
        var kept = new List<int>(pointBudget) { 0 };
        var travelled = 0.0;
        for (var i = 1; i < n - 1; i++)
        {
            travelled += Hypot((x[i] - x[i - 1]) * scaleX, (y[i] - y[i - 1]) * scaleY);
            if (travelled >= step && kept.Count < pointBudget - 1)
            {
                kept.Add(i);
                travelled = 0;
            }
        }

        kept.Add(n - 1);
        return Pick(x, y, kept);
    }

    private static double Hypot(double a, double b) => Math.Sqrt(a * a + b * b);

    private static double InverseRange(ReadOnlySpan<double> values)
    {
        var min = double.PositiveInfinity;
        var max = double.NegativeInfinity;
        foreach (var v in values)
        {
            min = Math.Min(min, v);
            max = Math.Max(max, v);
        }

        return max > min ? 1 / (max - min) : 1;
    }

    private static void CheckPair(ReadOnlySpan<double> x, ReadOnlySpan<double> y)
    {
        Preconditions.CheckArgumentRange(nameof(y), x.Length == y.Length, "must have as many samples as the abscissae");
        Preconditions.CheckArgumentRange(nameof(x), x.Length >= 1, "needs at least one sample");
    }

    private static DisplaySeries Whole(ReadOnlySpan<double> x, ReadOnlySpan<double> y)
    {
        var indices = new int[x.Length];
        for (var i = 0; i < indices.Length; i++)
        {
            indices[i] = i;
        }

        return new DisplaySeries(x.ToArray(), y.ToArray(), indices);
    }

    private static DisplaySeries Pick(ReadOnlySpan<double> x, ReadOnlySpan<double> y, List<int> kept)
    {
        var xs = new double[kept.Count];
        var ys = new double[kept.Count];
        for (var i = 0; i < kept.Count; i++)
        {
            xs[i] = x[kept[i]];
            ys[i] = y[kept[i]];
        }

        return new DisplaySeries(xs, ys, kept.ToArray());
    }
}
