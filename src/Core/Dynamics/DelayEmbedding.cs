namespace Patchproof.Core.Dynamics;

/// <summary>How the embedding delay was chosen.</summary>
public enum DelayRule
{
    /// <summary>The first local minimum of the time-delayed mutual information.</summary>
    FirstMinimumOfMutualInformation,

    /// <summary>The first lag at which the autocorrelation falls below 1/e (used when the mutual information has no minimum in range).</summary>
    AutocorrelationBelowOneOverE,

    /// <summary>Neither rule fired within the searched lags; the largest searched lag was used.</summary>
    LargestSearchedLag,
}

/// <summary>The chosen delay embedding of a scalar series, with the curves behind the choice.</summary>
/// <param name="Delay">The embedding delay tau in samples (at least 1).</param>
/// <param name="Dimension">The embedding dimension m (at least 1).</param>
/// <param name="DelayRule">Which rule fixed the delay.</param>
/// <param name="MutualInformationBits">I(tau) in bits for tau = 0 .. the searched lag (index = lag).</param>
/// <param name="FalseNeighbourFractions">The fraction of false nearest neighbours for m = 1, 2, ... (index m - 1).</param>
public sealed record DelayEmbeddingChoice(int Delay, int Dimension, DelayRule DelayRule, double[] MutualInformationBits, double[] FalseNeighbourFractions);

/// <summary>Delay-coordinate embedding of a scalar series, with the delay and dimension chosen by stated rules.</summary>
/// <remarks>
/// <para>Embedding: point i is (x_i, x_{i+tau}, ..., x_{i+(m-1)tau}), i = 0 .. N - (m-1) tau - 1
/// (Takens 1981).</para>
/// <para>Delay rule: the first local minimum of the mutual information I(tau) between x_t and
/// x_{t+tau}, estimated with a 2-D histogram of 16 equal-width bins per axis (Fraser and Swinney
/// 1986), searched over lags 1 .. the caller's maximum (by default the mean period); if I has no
/// minimum there, the first lag where the autocorrelation drops below 1/e (common practice).</para>
/// <para>Dimension rule: the smallest m in 1 .. 10 whose fraction of false nearest neighbours is
/// below 1 %, with Kennel et al.'s two criteria (distance ratio above R_tol = 15, or the new
/// distance above A_tol = 2 times the series' standard deviation); if none is below 1 %, the m
/// with the smallest fraction. A neighbour distance below the noise floor sqrt(2 m) sigma_noise
/// (sigma_noise from second differences, at least the quantization step / sqrt(12)) counts as that
/// floor: two noisy copies of one state lie about that far apart, and on a quantized or noisy record
/// the ratio test would otherwise call such pairs false in every dimension. Neighbours closer in time than the temporal exclusion are not
/// candidates. At most 10,000 query points, spread evenly over the record, are tested for each m
/// (the tree holds every point), which keeps the cost linear in N for long captures.</para>
/// <para>References: 1. F. Takens, Detecting strange attractors in turbulence, Lecture Notes in
/// Math. 898 (1981) 366-381. 2. A. M. Fraser, H. L. Swinney, Independent coordinates for strange
/// attractors from mutual information, Phys. Rev. A 33 (1986) 1134-1140. 3. M. B. Kennel, R. Brown,
/// H. D. I. Abarbanel, Determining embedding dimension for phase-space reconstruction using a
/// geometrical construction, Phys. Rev. A 45 (1992) 3403-3411.</para>
/// </remarks>
public static class DelayEmbedding
{
    /// <summary>Histogram bins per axis for the mutual information.</summary>
    public const int MutualInformationBins = 16;

    /// <summary>The largest embedding dimension tried.</summary>
    public const int MaximumDimension = 10;

    /// <summary>The false-neighbour fraction below which a dimension is accepted.</summary>
    public const double FalseNeighbourThreshold = 0.01;

    /// <summary>Kennel et al.'s distance-ratio tolerance R_tol.</summary>
    public const double DistanceRatioTolerance = 15;

    /// <summary>Kennel et al.'s attractor-size tolerance A_tol.</summary>
    public const double AttractorSizeTolerance = 2;

    private const int MaximumFalseNeighbourQueries = 10_000;

    /// <summary>Embeds <paramref name="series"/> with delay <paramref name="delay"/> in <paramref name="dimension"/> dimensions.</summary>
    /// <param name="series">The scalar series.</param>
    /// <param name="dimension">m, at least 1.</param>
    /// <param name="delay">tau in samples, at least 1.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the series is too short for m and tau.</exception>
    public static PointCloud Embed(ReadOnlySpan<double> series, int dimension, int delay)
    {
        Preconditions.CheckArgumentRange(nameof(dimension), dimension >= 1, "must be at least 1");
        Preconditions.CheckArgumentRange(nameof(delay), delay >= 1, "must be at least 1");
        var count = series.Length - (dimension - 1) * delay;
        Preconditions.CheckArgumentRange(nameof(series), count >= 1, "is too short for this dimension and delay");
        var coordinates = new double[count * dimension];
        for (var i = 0; i < count; i++)
        {
            for (var c = 0; c < dimension; c++)
            {
                coordinates[i * dimension + c] = series[i + c * delay];
            }
        }

        return new PointCloud(coordinates, dimension, count);
    }

    /// <summary>Chooses the delay and dimension for <paramref name="series"/> by the rules in the remarks.</summary>
    /// <param name="series">The scalar series, at least 100 samples.</param>
    /// <param name="maximumLag">The largest delay searched, in samples (at least 2); the mean period is a good choice.</param>
    /// <param name="temporalExclusion">Neighbours within this many samples of a point are not candidates (0 or more).</param>
    /// <param name="cancellation">Checked between lags, between dimensions and within each false-neighbour search; default none.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the series is too short or the arguments are out of range.</exception>
    /// <exception cref="OperationCanceledException">When <paramref name="cancellation"/> is cancelled.</exception>
    public static DelayEmbeddingChoice Choose(ReadOnlySpan<double> series, int maximumLag, int temporalExclusion, CancellationToken cancellation = default)
    {
        Preconditions.CheckArgumentRange(nameof(series), series.Length >= 100, "needs at least 100 samples");
        Preconditions.CheckArgumentRange(nameof(maximumLag), maximumLag >= 2, "must be at least 2");
        Preconditions.CheckArgumentRange(nameof(temporalExclusion), temporalExclusion >= 0, "must not be negative");
        var lagLimit = Math.Min(maximumLag, series.Length / 10);
        var information = new double[lagLimit + 1];
        for (var lag = 0; lag <= lagLimit; lag++)
        {
            cancellation.ThrowIfCancellationRequested();
            information[lag] = MutualInformationBits(series, lag);
        }

        var (delay, rule) = ChooseDelay(series, information);
        var fractions = new List<double>();
        var dimension = 0;
        for (var m = 1; m <= MaximumDimension && series.Length - m * delay > 2 * temporalExclusion + 10; m++)
        {
            var fraction = FalseNeighbourFraction(series, m, delay, temporalExclusion, cancellation);
            fractions.Add(fraction);
            if (fraction < FalseNeighbourThreshold)
            {
                dimension = m;
                break;
            }
        }

        if (dimension == 0)
        {
            dimension = fractions.Count == 0 ? 1 : fractions.IndexOf(fractions.Min()) + 1;
        }

        return new DelayEmbeddingChoice(delay, dimension, rule, information, [.. fractions]);
    }

    /// <summary>The mutual information in bits between x_t and x_{t+lag}, from a 16 by 16 histogram over the series' range.</summary>
    /// <param name="series">The scalar series.</param>
    /// <param name="lag">The lag in samples, 0 .. N - 1.</param>
    public static double MutualInformationBits(ReadOnlySpan<double> series, int lag)
    {
        Preconditions.CheckArgumentRange(nameof(lag), lag >= 0 && lag < series.Length, "must be between 0 and the series length - 1");
        var min = double.PositiveInfinity;
        var max = double.NegativeInfinity;
        foreach (var v in series)
        {
            min = Math.Min(min, v);
            max = Math.Max(max, v);
        }

        const int bins = MutualInformationBins;
        var scale = max > min ? bins / (max - min) : 0;
        Span<int> joint = stackalloc int[bins * bins];
        Span<int> first = stackalloc int[bins];
        Span<int> second = stackalloc int[bins];
        joint.Clear();
        first.Clear();
        second.Clear();
        var pairs = series.Length - lag;
        for (var i = 0; i < pairs; i++)
        {
            var a = Math.Min((int)((series[i] - min) * scale), bins - 1);
            var b = Math.Min((int)((series[i + lag] - min) * scale), bins - 1);
            joint[a * bins + b]++;
            first[a]++;
            second[b]++;
        }

        var information = 0.0;
        for (var a = 0; a < bins; a++)
        {
            for (var b = 0; b < bins; b++)
            {
                var count = joint[a * bins + b];
                if (count > 0)
                {
                    information += count * Math.Log((double)count * pairs / ((double)first[a] * second[b]));
                }
            }
        }

        return information / pairs / Math.Log(2);
    }

    /// <summary>The fraction of false nearest neighbours when going from dimension m to m + 1 (Kennel et al. 1992).</summary>
    /// <param name="series">The scalar series.</param>
    /// <param name="dimension">m, at least 1.</param>
    /// <param name="delay">tau in samples, at least 1.</param>
    /// <param name="temporalExclusion">Neighbours within this many samples are not candidates.</param>
    /// <param name="cancellation">Checked every 1024 neighbour queries; default none.</param>
    /// <exception cref="OperationCanceledException">When <paramref name="cancellation"/> is cancelled.</exception>
    public static double FalseNeighbourFraction(ReadOnlySpan<double> series, int dimension, int delay, int temporalExclusion, CancellationToken cancellation = default)
    {
        var cloud = Embed(series, dimension, delay);
        var usable = series.Length - dimension * delay;
        Preconditions.CheckArgumentRange(nameof(series), usable > 2 * temporalExclusion + 2, "is too short for this dimension, delay and exclusion");
        var tree = new KdTree(cloud, usable);
        var standardDeviation = StandardDeviation(series);
        var floor = NoiseFloor(series) * Math.Sqrt(2.0 * dimension);
        var stride = Math.Max(1, usable / MaximumFalseNeighbourQueries);
        var tested = 0;
        var falseCount = 0;
        for (var i = 0; i < usable; i += stride)
        {
            if (((i / stride) & 1023) == 0)
            {
                cancellation.ThrowIfCancellationRequested();
            }

            var (j, d2) = tree.Nearest(cloud.PointAt(i), i, temporalExclusion);
            if (j < 0)
            {
                continue;
            }

            var extra = Math.Abs(series[i + dimension * delay] - series[j + dimension * delay]);
            // Below the noise floor a neighbour's distance is noise, not geometry: ratios against it are meaningless.
            var distance = Math.Max(Math.Sqrt(d2), floor);
            var grownDistance = Math.Sqrt(d2 + extra * extra);
            var isFalse = (distance > 0 ? extra / distance > DistanceRatioTolerance : extra > 0)
                || grownDistance / standardDeviation > AttractorSizeTolerance;
            tested++;
            if (isFalse)
            {
                falseCount++;
            }
        }

        return tested == 0 ? 0 : (double)falseCount / tested;
    }

    /// <summary>The series' noise standard deviation: from second differences (see <see cref="ReturnMaps.NoiseStandardDeviation"/>), and never below the quantization step / √12.</summary>
    /// <param name="series">The scalar series.</param>
    public static double NoiseFloor(ReadOnlySpan<double> series)
    {
        var sorted = series.ToArray();
        Array.Sort(sorted);
        var step = double.PositiveInfinity;
        for (var i = 1; i < sorted.Length; i++)
        {
            var gap = sorted[i] - sorted[i - 1];
            if (gap > 0 && gap < step)
            {
                step = gap;
            }
        }

        var quantization = double.IsFinite(step) ? step / Math.Sqrt(12) : 0;
        return Math.Max(ReturnMaps.NoiseStandardDeviation(series), quantization);
    }

    /// <summary>The first lag at which the autocorrelation of <paramref name="series"/> is below 1/e, or -1 if none up to <paramref name="maximumLag"/>.</summary>
    /// <param name="series">The scalar series.</param>
    /// <param name="maximumLag">The largest lag examined.</param>
    public static int AutocorrelationOneOverELag(ReadOnlySpan<double> series, int maximumLag)
    {
        var mean = 0.0;
        foreach (var v in series)
        {
            mean += v;
        }

        mean /= series.Length;
        var variance = 0.0;
        foreach (var v in series)
        {
            variance += (v - mean) * (v - mean);
        }

        if (variance <= 0)
        {
            return -1;
        }

        for (var lag = 1; lag <= Math.Min(maximumLag, series.Length - 1); lag++)
        {
            var sum = 0.0;
            for (var i = 0; i + lag < series.Length; i++)
            {
                sum += (series[i] - mean) * (series[i + lag] - mean);
            }

            if (sum / variance < 1 / Math.E)
            {
                return lag;
            }
        }

        return -1;
    }

    private static (int Delay, DelayRule Rule) ChooseDelay(ReadOnlySpan<double> series, double[] information)
    {
        for (var lag = 1; lag < information.Length - 1; lag++)
        {
            if (information[lag] < information[lag - 1] && information[lag] <= information[lag + 1])
            {
                return (lag, DelayRule.FirstMinimumOfMutualInformation);
            }
        }

        var lagLimit = information.Length - 1;
        var autocorrelationLag = AutocorrelationOneOverELag(series, lagLimit);
        return autocorrelationLag > 0
            ? (autocorrelationLag, DelayRule.AutocorrelationBelowOneOverE)
            : (Math.Max(1, lagLimit), DelayRule.LargestSearchedLag);
    }

    private static double StandardDeviation(ReadOnlySpan<double> series)
    {
        var mean = 0.0;
        foreach (var v in series)
        {
            mean += v;
        }

        mean /= series.Length;
        var sum = 0.0;
        foreach (var v in series)
        {
            sum += (v - mean) * (v - mean);
        }

        var deviation = Math.Sqrt(sum / series.Length);
        return deviation > 0 ? deviation : 1;
    }
}
