namespace Patchproof.Core.Dynamics;

/// <summary>Settings for <see cref="CorrelationDimension"/>.</summary>
public sealed record CorrelationDimensionOptions
{
    /// <summary>Pairs closer in time than this many samples are not counted (Theiler window); 0 takes the mean period from the power spectrum of each channel (the longest).</summary>
    public int TheilerWindowSamples { get; init; }

    /// <summary>The largest number of reference points (spread evenly over the record); each is paired with every point (default 5000).</summary>
    public int MaximumReferencePoints { get; init; } = 5000;

    /// <summary>Reference points are also limited so that reference points times all points stays below this (default 5e7).</summary>
    public long PairBudget { get; init; } = 50_000_000;

    /// <summary>Radii per factor of two (default 4).</summary>
    public int RadiiPerOctave { get; init; } = 4;

    /// <summary>How many octaves below the largest radius are scanned (default 12).</summary>
    public int OctavesScanned { get; init; } = 12;

    /// <summary>The largest radius as a fraction of the bounding-box diagonal (default 0.125).</summary>
    public double LargestRadiusFraction { get; init; } = 0.125;

    /// <summary>The width of the scaling window in octaves (default 3: a factor of 8 in r).</summary>
    public int ScalingWindowOctaves { get; init; } = 3;

    /// <summary>A radius enters the scaling region only when at least this many pairs lie within it (default 1000).</summary>
    public long MinimumPairs { get; init; } = 1000;

    /// <summary>Checked every 16 reference points (each one a tree search over the whole record): once cancelled, the
    /// estimate stops with <see cref="OperationCanceledException"/>. Default none.</summary>
    public CancellationToken Cancellation { get; init; }
}

/// <summary>The correlation dimension with the correlation sum and the chosen scaling region behind it.</summary>
/// <param name="Status">Whether the estimate could be made.</param>
/// <param name="Dimension">D_2, the slope of ln C(r) against ln r in the scaling region; NaN unless estimated.</param>
/// <param name="LogRadius">ln r at each radius, r in channel units.</param>
/// <param name="LogCorrelationSum">ln C(r), C the fraction of counted pairs closer than r (negative infinity where none).</param>
/// <param name="LocalSlopes">d ln C / d ln r by central differences (NaN at the ends or where C is 0).</param>
/// <param name="Fit">The scaling region (indices into the arrays) and its line; null unless estimated.</param>
/// <param name="TheilerWindowSamples">The Theiler window used.</param>
/// <param name="ReferencePointCount">The number of reference points.</param>
/// <param name="PairCount">The number of pairs the sums are normalized by.</param>
public sealed record CorrelationDimensionResult(
    EstimateStatus Status,
    double Dimension,
    double[] LogRadius,
    double[] LogCorrelationSum,
    double[] LocalSlopes,
    ScalingRegion? Fit,
    int TheilerWindowSamples,
    int ReferencePointCount,
    long PairCount);

/// <summary>The correlation dimension D_2 of a sampled trajectory by the Grassberger-Procaccia method.</summary>
/// <remarks>
/// <para>Formula: C(r) = (number of pairs (i, j), |i - j| &gt; W, with |x_i - x_j| &lt; r) / (number
/// of such pairs); D_2 = d ln C / d ln r where that slope is constant. W is the Theiler window. The
/// reference points i are spread evenly over the record, at most 5000 and at most 5e7 / N, each
/// paired with every point (so the work stays bounded for long captures); pairs are found with a k-d tree bounded by the largest radius, so no all-pairs loop runs.</para>
/// <para>Radii: r_k = r_max 2^{-(K - k)/4}, 4 per octave, over 12 octaves below
/// r_max = an eighth of the bounding-box diagonal (larger radii feel the attractor's edge and
/// cost the most pairs).</para>
/// <para>Scaling-region rule: among windows of 3 octaves (13 consecutive radii) where every radius
/// holds at least 1000 pairs (so ln C has a relative error of about 3 % or less), take the window
/// whose local slopes have the smallest standard deviation relative to their mean; D_2 is the
/// least-squares slope of ln C on ln r over it. The Theiler window defaults to the mean period
/// 1 / f_mean of the Welch spectrum.</para>
/// <para>References: 1. P. Grassberger, I. Procaccia, Characterization of strange attractors, Phys.
/// Rev. Lett. 50 (1983) 346-349. 2. P. Grassberger, I. Procaccia, Measuring the strangeness of
/// strange attractors, Physica D 9 (1983) 189-208. 3. J. Theiler, Spurious dimension from
/// correlation algorithms applied to limited time-series data, Phys. Rev. A 34 (1986) 2427-2432.</para>
/// </remarks>
public static class CorrelationDimension
{
    /// <summary>Estimates D_2 from channels that together form the state.</summary>
    /// <param name="channels">Equally long channels.</param>
    /// <param name="sampleIntervalSeconds">dt, positive (used only for the default Theiler window).</param>
    /// <param name="options">Settings; null for the defaults.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the channels differ in length or dt is not positive.</exception>
    /// <exception cref="OperationCanceledException">When <see cref="CorrelationDimensionOptions.Cancellation"/> is cancelled.</exception>
    public static CorrelationDimensionResult EstimateFromChannels(IReadOnlyList<double[]> channels, double sampleIntervalSeconds, CorrelationDimensionOptions? options = null)
    {
        options ??= new CorrelationDimensionOptions();
        Preconditions.CheckArgumentRange(nameof(sampleIntervalSeconds), sampleIntervalSeconds > 0 && double.IsFinite(sampleIntervalSeconds), "must be positive and finite");
        var cloud = PointCloud.FromChannels(channels);
        if (options.TheilerWindowSamples == 0 && cloud.Count >= 64)
        {
            options = options with { TheilerWindowSamples = channels.Max(channel => RosensteinLyapunov.MeanPeriodSamples(channel, sampleIntervalSeconds)) };
        }

        return Estimate(cloud, options);
    }

    /// <summary>Estimates D_2 from a trajectory in state or embedding space.</summary>
    /// <param name="trajectory">Points in time order.</param>
    /// <param name="options">Settings; null for the defaults (Theiler window 0 means none).</param>
    /// <exception cref="ArgumentOutOfRangeException">When an option is out of range.</exception>
    /// <exception cref="OperationCanceledException">When <see cref="CorrelationDimensionOptions.Cancellation"/> is cancelled.</exception>
    public static CorrelationDimensionResult Estimate(PointCloud trajectory, CorrelationDimensionOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(trajectory);
        options ??= new CorrelationDimensionOptions();
        Preconditions.CheckArgumentRange(nameof(options), options.RadiiPerOctave >= 1 && options.OctavesScanned >= 1 && options.ScalingWindowOctaves >= 1 && options.MaximumReferencePoints >= 1, "counts must be positive");
        Preconditions.CheckArgumentRange(nameof(options), options.LargestRadiusFraction > 0 && options.LargestRadiusFraction <= 1, "the largest-radius fraction must be in (0, 1]");
        var window = Math.Max(0, options.TheilerWindowSamples);
        var n = trajectory.Count;
        var radiusCount = options.RadiiPerOctave * options.OctavesScanned + 1;
        var windowPoints = options.RadiiPerOctave * options.ScalingWindowOctaves + 1;
        if (n < 2 * window + 100)
        {
            return new CorrelationDimensionResult(EstimateStatus.TooShort, double.NaN, [], [], [], null, window, 0, 0);
        }

        var largest = options.LargestRadiusFraction * trajectory.BoundingBoxDiagonal();
        var logStep = Math.Log(2) / options.RadiiPerOctave;
        var logLargest = Math.Log(largest);
        var logSmallest = logLargest - (radiusCount - 1) * logStep;
        var histogram = new long[radiusCount];
        var tree = new KdTree(trajectory, n);
        var references = (int)Math.Min(Math.Min(options.MaximumReferencePoints, n), Math.Max(1, options.PairBudget / n));
        var stride = (double)n / references;
        long pairs = 0;
        for (var r = 0; r < references; r++)
        {
            if ((r & 15) == 0)
            {
                options.Cancellation.ThrowIfCancellationRequested();
            }

            var i = (int)(r * stride);
            tree.AccumulateWithin(trajectory.PointAt(i), i, window, logSmallest, 1 / logStep, histogram);
            pairs += n - (Math.Min(n - 1, i + window) - Math.Max(0, i - window) + 1);
        }

        var logRadius = new double[radiusCount];
        var logSum = new double[radiusCount];
        var cumulative = new long[radiusCount];
        long running = 0;
        for (var k = 0; k < radiusCount; k++)
        {
            running += histogram[k];
            cumulative[k] = running;
            logRadius[k] = logSmallest + k * logStep;
            logSum[k] = running > 0 ? Math.Log((double)running / pairs) : double.NegativeInfinity;
        }

        var slopes = new double[radiusCount];
        for (var k = 0; k < radiusCount; k++)
        {
            slopes[k] = k == 0 || k == radiusCount - 1 || cumulative[k - 1] == 0
                ? double.NaN
                : (logSum[k + 1] - logSum[k - 1]) / (logRadius[k + 1] - logRadius[k - 1]);
        }

        var region = ChooseRegion(logRadius, logSum, slopes, cumulative, windowPoints, options.MinimumPairs);
        return region is null
            ? new CorrelationDimensionResult(EstimateStatus.NoScalingRegion, double.NaN, logRadius, logSum, slopes, null, window, references, pairs)
            : new CorrelationDimensionResult(EstimateStatus.Estimated, region.Slope, logRadius, logSum, slopes, region, window, references, pairs);
    }

    private static ScalingRegion? ChooseRegion(double[] logRadius, double[] logSum, double[] slopes, long[] cumulative, int windowPoints, long minimumPairs)
    {
        var bestFirst = -1;
        var bestSpread = double.PositiveInfinity;
        for (var first = 1; first + windowPoints - 1 < logRadius.Length - 1; first++)
        {
            if (cumulative[first - 1] < minimumPairs)
            {
                continue;
            }

            double mean = 0, squares = 0;
            for (var k = first; k < first + windowPoints; k++)
            {
                mean += slopes[k];
            }

            mean /= windowPoints;
            for (var k = first; k < first + windowPoints; k++)
            {
                squares += (slopes[k] - mean) * (slopes[k] - mean);
            }

            var spread = Math.Sqrt(squares / windowPoints) / mean;
            if (mean > 0 && spread < bestSpread)
            {
                bestSpread = spread;
                bestFirst = first;
            }
        }

        return bestFirst < 0 ? null : ScalingRegion.Fit(logRadius, logSum, bestFirst, bestFirst + windowPoints - 1);
    }
}
