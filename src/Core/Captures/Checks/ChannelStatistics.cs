namespace Patchproof.Core.Captures.Checks;

/// <summary>Plain statistics of a channel's samples, computed in double.</summary>
internal static class ChannelStatistics
{
    /// <summary>Samples used for the distinct-level and noise estimates on long channels, evenly spread.</summary>
    public const int MaxSampled = 1 << 20;

    public static (double Mean, double Rms, double Min, double Max) Moments(ReadOnlySpan<float> x)
    {
        double sum = 0;
        var min = double.PositiveInfinity;
        var max = double.NegativeInfinity;
        foreach (var v in x)
        {
            sum += v;
            min = Math.Min(min, v);
            max = Math.Max(max, v);
        }

        var mean = sum / x.Length;
        double squares = 0;
        foreach (var v in x)
        {
            var d = v - mean;
            squares += d * d;
        }

        return (mean, Math.Sqrt(squares / x.Length), min, max);
    }

    /// <summary>Distinct levels among (up to <see cref="MaxSampled"/>) samples, and the smallest gap between two of them.</summary>
    public static (int Distinct, int Examined, double SmallestStep) Levels(ReadOnlySpan<float> x)
    {
        var stride = Math.Max(1, x.Length / MaxSampled);
        var count = (x.Length + stride - 1) / stride;
        var values = new float[count];
        for (var i = 0; i < count; i++)
        {
            values[i] = x[i * stride];
        }

        Array.Sort(values);
        var distinct = 1;
        var smallest = double.PositiveInfinity;
        for (var i = 1; i < values.Length; i++)
        {
            if (values[i] != values[i - 1])
            {
                distinct++;
                smallest = Math.Min(smallest, (double)values[i] - values[i - 1]);
            }
        }

        return (distinct, count, smallest);
    }

    /// <summary>Noise RMS from the median absolute second difference: sigma = 1.4826 MAD(d) / sqrt(6), d_i = x_{i+1} - 2x_i + x_{i-1}.</summary>
    /// <remarks>For white noise the second difference has variance 6 sigma^2; the median ignores edges and a smooth signal's curvature.</remarks>
    public static double NoiseRms(ReadOnlySpan<float> x)
    {
        if (x.Length < 3)
        {
            return 0;
        }

        var triples = x.Length - 2;
        var stride = Math.Max(1, triples / MaxSampled);
        var count = (triples + stride - 1) / stride;
        var d = new double[count];
        for (var k = 0; k < count; k++)
        {
            var i = (k * stride) + 1;
            d[k] = (double)x[i + 1] - (2.0 * x[i]) + x[i - 1];
        }

        Array.Sort(d);
        var median = d[count / 2];
        for (var k = 0; k < count; k++)
        {
            d[k] = Math.Abs(d[k] - median);
        }

        Array.Sort(d);
        return 1.4826 * d[count / 2] / Math.Sqrt(6);
    }
}
