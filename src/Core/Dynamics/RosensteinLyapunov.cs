namespace Patchproof.Core.Dynamics;

/// <summary>Settings for <see cref="RosensteinLyapunov"/>; zero means "choose by the documented rule".</summary>
public sealed record RosensteinOptions
{
    /// <summary>Neighbours closer in time than this many samples are not used; 0 takes the mean period from the power spectrum.</summary>
    public int TemporalExclusionSamples { get; init; }

    /// <summary>Length of the divergence curve in samples; 0 grows it from four mean periods until the curve levels off.</summary>
    public int CurveLengthSamples { get; init; }

    /// <summary>The fit starts where the curve has risen by this fraction of its total rise (default 0.25).</summary>
    public double LowerRiseFraction { get; init; } = 0.25;

    /// <summary>The fit ends where the curve has risen by this fraction of its total rise (default 0.6).</summary>
    public double UpperRiseFraction { get; init; } = 0.6;

    /// <summary>Checked while the embedding is chosen and every 1024 reference points of the neighbour search and the
    /// divergence curve: once cancelled, the estimate stops with <see cref="OperationCanceledException"/>. Default none.</summary>
    public CancellationToken Cancellation { get; init; }
}

/// <summary>The largest Lyapunov exponent from data, with the divergence curve and the fitted region behind it.</summary>
/// <param name="Status">Whether the estimate could be made.</param>
/// <param name="LargestExponentPerSecond">lambda_1 in 1/s (1/problem time unit for model data); NaN unless estimated.</param>
/// <param name="DivergenceTimesSeconds">Times k dt of the divergence curve.</param>
/// <param name="MeanLogDivergence">The mean of ln d_j(k) over all reference points j, in ln(channel unit).</param>
/// <param name="Fit">The fitted region of the curve (indices into the two arrays) and its line; null unless estimated.</param>
/// <param name="TemporalExclusionSamples">The temporal exclusion used, in samples.</param>
/// <param name="ReferencePointCount">How many reference points contributed.</param>
/// <param name="Embedding">The delay embedding used, or null when the channels themselves formed the state.</param>
public sealed record RosensteinResult(
    EstimateStatus Status,
    double LargestExponentPerSecond,
    double[] DivergenceTimesSeconds,
    double[] MeanLogDivergence,
    ScalingRegion? Fit,
    int TemporalExclusionSamples,
    int ReferencePointCount,
    DelayEmbeddingChoice? Embedding);

/// <summary>The largest Lyapunov exponent of a sampled trajectory by Rosenstein's method.</summary>
/// <remarks>
/// <para>Method: for every point j of the trajectory (embedded, or the channels taken as the state)
/// find its nearest neighbour j' at least the temporal exclusion away in time (k-d tree, not all
/// pairs), follow both forward and average y(k) = mean_j ln |x_{j+k} - x_{j'+k}|. In the linear
/// stretch y(k) ~ lambda_1 k dt + const; lambda_1 is the least-squares slope there.</para>
/// <para>Rules: the temporal exclusion is the mean period 1 / f_mean of the Welch spectrum (the
/// longest among the channels), as Rosenstein et al. propose. The curve is four mean periods long
/// at first and doubled (up to N/4) until its last quarter rises by less than 5 % of its total rise,
/// so it reaches the plateau, but never beyond 16 mean periods. Long records use at most 20,000
/// reference points spread evenly (every point remains a candidate neighbour), which keeps the
/// cost linear in N. With y_0 = y(0) and the plateau y_p = the mean of the last tenth, the
/// fit runs from the first k with y(k) &gt;= y_0 + 0.25 (y_p - y_0) to the first k with
/// y(k) &gt;= y_0 + 0.6 (y_p - y_0): past the initial re-orientation of the separation onto the
/// unstable direction, and before saturation bends the curve. For a scalar series the delay and
/// dimension come from <see cref="DelayEmbedding.Choose"/> with the lag searched up to the mean
/// period.</para>
/// <para>References: 1. M. T. Rosenstein, J. J. Collins, C. J. De Luca, A practical method for
/// calculating largest Lyapunov exponents from small data sets, Physica D 65 (1993) 117-134.</para>
/// </remarks>
public static class RosensteinLyapunov
{
    private const int MinimumPoints = 200;

    /// <summary>The largest number of reference points, spread evenly over the record.</summary>
    public const int MaximumReferencePoints = 20_000;

    /// <summary>The longest divergence curve, in mean periods (the exclusion).</summary>
    public const int MaximumCurvePeriods = 16;

    /// <summary>Estimates lambda_1 from a scalar series, choosing the embedding by the documented rules.</summary>
    /// <param name="series">The samples, uniformly spaced.</param>
    /// <param name="sampleIntervalSeconds">dt, positive.</param>
    /// <param name="options">Settings; null for the defaults.</param>
    /// <exception cref="ArgumentOutOfRangeException">When dt is not positive.</exception>
    /// <exception cref="OperationCanceledException">When <see cref="RosensteinOptions.Cancellation"/> is cancelled.</exception>
    public static RosensteinResult EstimateFromSeries(ReadOnlySpan<double> series, double sampleIntervalSeconds, RosensteinOptions? options = null)
    {
        options ??= new RosensteinOptions();
        Preconditions.CheckArgumentRange(nameof(sampleIntervalSeconds), sampleIntervalSeconds > 0 && double.IsFinite(sampleIntervalSeconds), "must be positive and finite");
        if (series.Length < MinimumPoints)
        {
            return TooShort(options.TemporalExclusionSamples, null);
        }

        var exclusion = options.TemporalExclusionSamples > 0 ? options.TemporalExclusionSamples : MeanPeriodSamples(series, sampleIntervalSeconds);
        var embedding = DelayEmbedding.Choose(series, Math.Max(2, exclusion), exclusion, options.Cancellation);
        var cloud = DelayEmbedding.Embed(series, embedding.Dimension, embedding.Delay);
        return Estimate(cloud, sampleIntervalSeconds, options with { TemporalExclusionSamples = exclusion }) with { Embedding = embedding };
    }

    /// <summary>Estimates lambda_1 from channels that together form the state (for example x, y, z of a three-channel capture).</summary>
    /// <param name="channels">Equally long channels.</param>
    /// <param name="sampleIntervalSeconds">dt, positive.</param>
    /// <param name="options">Settings; null for the defaults.</param>
    /// <exception cref="ArgumentOutOfRangeException">When dt is not positive or the channels differ in length.</exception>
    /// <exception cref="OperationCanceledException">When <see cref="RosensteinOptions.Cancellation"/> is cancelled.</exception>
    public static RosensteinResult EstimateFromChannels(IReadOnlyList<double[]> channels, double sampleIntervalSeconds, RosensteinOptions? options = null)
    {
        options ??= new RosensteinOptions();
        var cloud = PointCloud.FromChannels(channels);
        if (options.TemporalExclusionSamples == 0 && cloud.Count >= MinimumPoints)
        {
            var exclusion = channels.Max(channel => MeanPeriodSamples(channel, sampleIntervalSeconds));
            options = options with { TemporalExclusionSamples = exclusion };
        }

        return Estimate(cloud, sampleIntervalSeconds, options);
    }

    /// <summary>Estimates lambda_1 from a trajectory already in state or embedding space.</summary>
    /// <param name="trajectory">Points in time order, dt apart.</param>
    /// <param name="sampleIntervalSeconds">dt, positive.</param>
    /// <param name="options">Settings; the temporal exclusion must be given (positive) or is taken as 1 sample.</param>
    /// <exception cref="ArgumentOutOfRangeException">When dt is not positive or a rise fraction is outside (0, 1).</exception>
    /// <exception cref="OperationCanceledException">When <see cref="RosensteinOptions.Cancellation"/> is cancelled.</exception>
    public static RosensteinResult Estimate(PointCloud trajectory, double sampleIntervalSeconds, RosensteinOptions options)
    {
        ArgumentNullException.ThrowIfNull(trajectory);
        ArgumentNullException.ThrowIfNull(options);
        Preconditions.CheckArgumentRange(nameof(sampleIntervalSeconds), sampleIntervalSeconds > 0 && double.IsFinite(sampleIntervalSeconds), "must be positive and finite");
        Preconditions.CheckArgumentRange(nameof(options), options.LowerRiseFraction > 0 && options.LowerRiseFraction < options.UpperRiseFraction && options.UpperRiseFraction < 1, "rise fractions must satisfy 0 < lower < upper < 1");
        var exclusion = Math.Max(1, options.TemporalExclusionSamples);
        var n = trajectory.Count;
        if (n < MinimumPoints || n < 4 * exclusion + 50)
        {
            return TooShort(exclusion, null);
        }

        var maximumLength = Math.Max(50, Math.Min(n / 4, MaximumCurvePeriods * exclusion));
        var length = options.CurveLengthSamples > 0 ? Math.Min(options.CurveLengthSamples, n / 2) : Math.Min(Math.Max(50, 4 * exclusion), maximumLength);
        var neighbours = new int[n];
        KdTree? tree = null;
        var treeCount = 0;
        double[] curve;
        int references;
        while (true)
        {
            var usable = n - length;
            if (tree is null || treeCount != usable)
            {
                tree = new KdTree(trajectory, usable);
                treeCount = usable;
                FindNeighbours(trajectory, tree, exclusion, neighbours, options.Cancellation);
            }

            (curve, references) = DivergenceCurve(trajectory, neighbours, usable, length, Stride(usable), options.Cancellation);
            if (options.CurveLengthSamples > 0 || length >= maximumLength || HasLevelledOff(curve))
            {
                break;
            }

            length = Math.Min(2 * length, maximumLength);
        }

        var times = new double[curve.Length];
        for (var k = 0; k < times.Length; k++)
        {
            times[k] = k * sampleIntervalSeconds;
        }

        var region = ChooseRegion(times, curve, options.LowerRiseFraction, options.UpperRiseFraction);
        return region is null
            ? new RosensteinResult(EstimateStatus.NoScalingRegion, double.NaN, times, curve, null, exclusion, references, null)
            : new RosensteinResult(EstimateStatus.Estimated, region.Slope, times, curve, region, exclusion, references, null);
    }

    /// <summary>The mean period 1 / f_mean of the Welch spectrum, in samples (at least 1).</summary>
    /// <param name="series">The samples.</param>
    /// <param name="sampleIntervalSeconds">dt, positive.</param>
    public static int MeanPeriodSamples(ReadOnlySpan<double> series, double sampleIntervalSeconds)
    {
        var spectrum = WelchSpectrum.Estimate(series, sampleIntervalSeconds);
        var meanFrequency = spectrum.MeanFrequencyHertz();
        return meanFrequency > 0 ? Math.Max(1, (int)Math.Round(1 / (meanFrequency * sampleIntervalSeconds))) : 1;
    }

    private static int Stride(int usable) => Math.Max(1, (usable + MaximumReferencePoints - 1) / MaximumReferencePoints);

    private static void FindNeighbours(PointCloud trajectory, KdTree tree, int exclusion, int[] neighbours, CancellationToken cancellation)
    {
        var stride = Stride(tree.Count);
        for (var j = 0; j < tree.Count; j += stride)
        {
            if (((j / stride) & 1023) == 0)
            {
                cancellation.ThrowIfCancellationRequested();
            }

            var (index, d2) = tree.Nearest(trajectory.PointAt(j), j, exclusion);
            neighbours[j] = d2 > 0 ? index : -1;
        }
    }

    private static (double[] Curve, int References) DivergenceCurve(PointCloud trajectory, int[] neighbours, int usable, int length, int stride, CancellationToken cancellation)
    {
        var sums = new double[length];
        var counts = new int[length];
        var dimension = trajectory.Dimension;
        var coordinates = trajectory.Coordinates;
        var references = 0;

        // Implementation note: products of squared distances over blocks of 8 reference points
        // take one logarithm per block instead of one per pair; each factor is clamped to
        // [1e-36, 1e36], so a block's product stays well inside the range of a double.
        const int block = 8;
        var products = new double[length];
        Array.Fill(products, 1.0);
        var inBlock = 0;
        for (var j = 0; j < usable; j += stride)
        {
            if (((j / stride) & 1023) == 0)
            {
                cancellation.ThrowIfCancellationRequested();
            }

            var neighbour = neighbours[j];
            if (neighbour < 0)
            {
                continue;
            }

            references++;
            if (++inBlock == block)
            {
                Flush(sums, products);
                inBlock = 0;
            }

            for (var k = 0; k < length; k++)
            {
                var a = (j + k) * dimension;
                var b = (neighbour + k) * dimension;
                var d2 = 0.0;
                for (var c = 0; c < dimension; c++)
                {
                    var d = coordinates[a + c] - coordinates[b + c];
                    d2 += d * d;
                }

                if (d2 > 0)
                {
                    products[k] *= Math.Clamp(d2, 1e-36, 1e36);
                    counts[k]++;
                }
            }
        }

        Flush(sums, products);

        var curve = new double[length];
        for (var k = 0; k < length; k++)
        {
            curve[k] = counts[k] > 0 ? sums[k] / counts[k] : double.NaN;
        }

        return (curve, references);
    }

    private static void Flush(double[] sums, double[] products)
    {
        for (var k = 0; k < sums.Length; k++)
        {
            sums[k] += 0.5 * Math.Log(products[k]);
            products[k] = 1;
        }
    }

    private static bool HasLevelledOff(double[] curve)
    {
        var n = curve.Length;
        var rise = curve[n - 1] - curve[0];
        var lastQuarterRise = curve[n - 1] - curve[n - 1 - n / 4];
        return rise > 0 && lastQuarterRise < 0.05 * rise;
    }

    private static ScalingRegion? ChooseRegion(double[] times, double[] curve, double lower, double upper)
    {
        var n = curve.Length;
        var tail = Math.Max(1, n / 10);
        var plateau = 0.0;
        for (var k = n - tail; k < n; k++)
        {
            plateau += curve[k];
        }

        plateau /= tail;
        var start = curve[0];
        var rise = plateau - start;
        if (!(rise > 0))
        {
            return null;
        }

        var first = -1;
        var last = -1;
        for (var k = 0; k < n; k++)
        {
            if (first < 0 && curve[k] >= start + lower * rise)
            {
                first = k;
            }

            if (curve[k] >= start + upper * rise)
            {
                last = k;
                break;
            }
        }

        return first < 0 || last - first < 3 ? null : ScalingRegion.Fit(times, curve, first, last);
    }

    private static RosensteinResult TooShort(int exclusion, DelayEmbeddingChoice? embedding) =>
        new(EstimateStatus.TooShort, double.NaN, [], [], null, exclusion, 0, embedding);
}
