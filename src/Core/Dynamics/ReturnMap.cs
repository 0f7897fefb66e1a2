namespace Patchproof.Core.Dynamics;

/// <summary>Successive maxima of one variable, M_n against M_{n+1}, with a summary of the map's shape.</summary>
/// <param name="MaximaTimesSeconds">The refined time of each maximum.</param>
/// <param name="MaximaValues">The refined value M_n of each maximum, in the channel's unit.</param>
/// <param name="Shape">The fitted shape of the map, or null with fewer than 8 maxima.</param>
public sealed record ReturnMap(double[] MaximaTimesSeconds, double[] MaximaValues, ReturnMapShape? Shape)
{
    /// <summary>The number of (M_n, M_{n+1}) pairs.</summary>
    public int PairCount => Math.Max(0, MaximaValues.Length - 1);
}

/// <summary>The shape of a single-humped return map: its apex and the straight-line slopes of its two branches.</summary>
/// <remarks>The apex is the vertex of a least-squares parabola through all pairs; the branches are
/// the pairs left and right of it, each fitted by a straight line outside a band of 3 % of the
/// range around the apex (the map has a cusp there whose slope grows without bound, and the few
/// pairs in the band would otherwise dominate the fitted slope). Local slopes are straight-line fits
/// over four equal parts of each branch (outside the band); their smallest magnitude tells whether
/// the map stretches everywhere. A tent-like map whose slopes are
/// both steeper than 1 in magnitude stretches every interval, the mark of chaos Lorenz (1963)
/// drew from his Fig. 4.</remarks>
/// <param name="MinimumValue">The smallest maximum M_n.</param>
/// <param name="MaximumValue">The largest maximum M_n.</param>
/// <param name="ApexInput">M_n at the parabola's vertex.</param>
/// <param name="ApexOutput">The largest M_{n+1} among pairs within 2 % of the range of the apex input.</param>
/// <param name="LeftSlope">Slope of the line fitted to pairs with M_n below the apex.</param>
/// <param name="RightSlope">Slope of the line fitted to pairs with M_n above the apex.</param>
/// <param name="FixedPoint">Where the right branch's line crosses M_{n+1} = M_n (NaN if it does not within the range).</param>
/// <param name="ResidualRms">RMS distance of the fitted pairs from the two branch lines, in the channel's unit.</param>
/// <param name="MinimumAbsoluteLocalSlope">The smallest magnitude among the local slopes of both branches.</param>
public sealed record ReturnMapShape(
    double MinimumValue,
    double MaximumValue,
    double ApexInput,
    double ApexOutput,
    double LeftSlope,
    double RightSlope,
    double FixedPoint,
    double ResidualRms,
    double MinimumAbsoluteLocalSlope)
{
    /// <summary>The half-width of the band around the apex left out of the branch fits, as a fraction of the range.</summary>
    public const double ApexBandFraction = 0.03;

    /// <summary>True when the left branch rises, the right falls, and every local slope is steeper than 1 in magnitude.</summary>
    public bool IsExpandingSingleHump => LeftSlope > 1 && RightSlope < -1 && MinimumAbsoluteLocalSlope > 1;
}

/// <summary>Builds the return map of successive maxima of a sampled variable.</summary>
/// <remarks>
/// <para>Maxima: a hysteresis detector walks the samples. It holds a running maximum and records it
/// when the signal has fallen more than the hysteresis h below it, then holds a running minimum
/// until the signal rises more than h above that, so noise of less than h never splits one
/// maximum into two. h is 5 % of the channel's range by default, and never less than 8 times the
/// noise standard deviation estimated from second differences (see
/// <see cref="NoiseStandardDeviation"/>), so a noisy capture does not split its peaks either. Each recorded sample maximum x_i is
/// refined by the parabola through (x_{i-1}, x_i, x_{i+1}): offset
/// delta = (x_{i-1} - x_{i+1}) / (2 (x_{i-1} - 2 x_i + x_{i+1})) samples and value
/// x_i - (x_{i-1} - x_{i+1}) delta / 4.</para>
/// <para>References: 1. E. N. Lorenz, Deterministic nonperiodic flow, J. Atmos. Sci. 20 (1963)
/// 130-141, Fig. 4 (the map of successive z maxima).</para>
/// </remarks>
public static class ReturnMaps
{
    /// <summary>The default hysteresis as a fraction of the channel's range.</summary>
    public const double DefaultHysteresisFraction = 0.05;

    /// <summary>Finds the maxima of <paramref name="values"/> and builds their return map.</summary>
    /// <param name="values">The samples of the chosen variable.</param>
    /// <param name="sampleIntervalSeconds">dt, positive.</param>
    /// <param name="hysteresisFraction">The hysteresis as a fraction of the range, in (0, 1).</param>
    /// <exception cref="ArgumentOutOfRangeException">When dt or the fraction is out of range.</exception>
    public static ReturnMap OfMaxima(ReadOnlySpan<double> values, double sampleIntervalSeconds, double hysteresisFraction = DefaultHysteresisFraction)
    {
        Preconditions.CheckArgumentRange(nameof(sampleIntervalSeconds), sampleIntervalSeconds > 0 && double.IsFinite(sampleIntervalSeconds), "must be positive and finite");
        Preconditions.CheckArgumentRange(nameof(hysteresisFraction), hysteresisFraction > 0 && hysteresisFraction < 1, "must be between 0 and 1");
        var times = new List<double>();
        var maxima = new List<double>();
        if (values.Length >= 3)
        {
            var min = double.PositiveInfinity;
            var max = double.NegativeInfinity;
            foreach (var v in values)
            {
                min = Math.Min(min, v);
                max = Math.Max(max, v);
            }

            var hysteresis = Math.Max(hysteresisFraction * (max - min), 8 * NoiseStandardDeviation(values));
            var seekingMaximum = true;
            var extremum = 0;
            for (var i = 1; i < values.Length; i++)
            {
                if (seekingMaximum)
                {
                    if (values[i] > values[extremum])
                    {
                        extremum = i;
                    }
                    else if (values[i] < values[extremum] - hysteresis)
                    {
                        if (extremum > 0)
                        {
                            var (offset, value) = Refine(values[extremum - 1], values[extremum], values[extremum + 1]);
                            times.Add((extremum + offset) * sampleIntervalSeconds);
                            maxima.Add(value);
                        }

                        seekingMaximum = false;
                        extremum = i;
                    }
                }
                else if (values[i] < values[extremum])
                {
                    extremum = i;
                }
                else if (values[i] > values[extremum] + hysteresis)
                {
                    seekingMaximum = true;
                    extremum = i;
                }
            }
        }

        var maximaValues = maxima.ToArray();
        return new ReturnMap([.. times], maximaValues, maximaValues.Length >= 8 ? Describe(maximaValues) : null);
    }

    /// <summary>A robust estimate of white measurement noise from second differences: MAD / 0.6745 / sqrt(6).</summary>
    /// <remarks>For an oversampled smooth signal the second difference is almost all noise, whose
    /// variance is 6 sigma^2; the median absolute deviation ignores the few large values at sharp
    /// turns.</remarks>
    /// <param name="values">The samples (3 or more).</param>
    public static double NoiseStandardDeviation(ReadOnlySpan<double> values)
    {
        if (values.Length < 3)
        {
            return 0;
        }

        var differences = new double[values.Length - 2];
        for (var i = 1; i < values.Length - 1; i++)
        {
            differences[i - 1] = Math.Abs(values[i - 1] - 2 * values[i] + values[i + 1]);
        }

        var median = MathNet.Numerics.Statistics.ArrayStatistics.MedianInplace(differences);
        return median / 0.6745 / Math.Sqrt(6);
    }

    private static (double Offset, double Value) Refine(double before, double peak, double after)
    {
        var curvature = before - 2 * peak + after;
        if (curvature >= 0)
        {
            return (0, peak);
        }

        var offset = 0.5 * (before - after) / curvature;
        return (offset, peak - 0.25 * (before - after) * offset);
    }

    private static ReturnMapShape Describe(double[] maxima)
    {
        var count = maxima.Length - 1;
        var input = maxima.AsSpan(0, count);
        var output = maxima.AsSpan(1, count);
        var min = double.PositiveInfinity;
        var max = double.NegativeInfinity;
        foreach (var v in maxima)
        {
            min = Math.Min(min, v);
            max = Math.Max(max, v);
        }

        var coefficients = MathNet.Numerics.Fit.Polynomial(input.ToArray(), output.ToArray(), 2);
        var apex = coefficients[2] < 0 ? Math.Clamp(-coefficients[1] / (2 * coefficients[2]), min, max) : max;
        var near = 0.02 * (max - min);
        var apexOutput = double.NegativeInfinity;
        for (var i = 0; i < count; i++)
        {
            if (Math.Abs(input[i] - apex) <= near)
            {
                apexOutput = Math.Max(apexOutput, output[i]);
            }
        }

        if (double.IsNegativeInfinity(apexOutput))
        {
            apexOutput = coefficients[0] + coefficients[1] * apex + coefficients[2] * apex * apex;
        }

        var band = ReturnMapShape.ApexBandFraction * (max - min);
        var (leftSlope, _, leftSquares, leftCount) = BranchLine(input, output, min, apex - band);
        var (rightSlope, rightIntercept, rightSquares, rightCount) = BranchLine(input, output, apex + band, max);
        var minimumLocal = double.PositiveInfinity;
        for (var part = 0; part < 4; part++)
        {
            var leftWidth = (apex - band - min) / 4;
            var rightWidth = (max - apex - band) / 4;
            var (l, _, _, ln) = BranchLine(input, output, min + part * leftWidth, min + (part + 1) * leftWidth);
            var (r, _, _, rn) = BranchLine(input, output, apex + band + part * rightWidth, apex + band + (part + 1) * rightWidth);
            if (ln >= 3)
            {
                minimumLocal = Math.Min(minimumLocal, Math.Abs(l));
            }

            if (rn >= 3)
            {
                minimumLocal = Math.Min(minimumLocal, Math.Abs(r));
            }
        }
        var fixedPoint = rightSlope != 1 ? rightIntercept / (1 - rightSlope) : double.NaN;
        if (!(fixedPoint >= min && fixedPoint <= max))
        {
            fixedPoint = double.NaN;
        }

        var rms = Math.Sqrt((leftSquares + rightSquares) / Math.Max(1, leftCount + rightCount));
        return new ReturnMapShape(min, max, apex, apexOutput, leftSlope, rightSlope, fixedPoint, rms, double.IsPositiveInfinity(minimumLocal) ? double.NaN : minimumLocal);
    }

    private static (double Slope, double Intercept, double Squares, int Count) BranchLine(ReadOnlySpan<double> input, ReadOnlySpan<double> output, double from, double to)
    {
        double sx = 0, sy = 0, sxx = 0, sxy = 0;
        var n = 0;
        for (var i = 0; i < input.Length; i++)
        {
            if (input[i] >= from && input[i] <= to)
            {
                sx += input[i];
                sy += output[i];
                sxx += input[i] * input[i];
                sxy += input[i] * output[i];
                n++;
            }
        }

        if (n < 2)
        {
            return (double.NaN, double.NaN, 0, 0);
        }

        var denominator = n * sxx - sx * sx;
        var slope = denominator != 0 ? (n * sxy - sx * sy) / denominator : double.NaN;
        var intercept = (sy - slope * sx) / n;
        var squares = 0.0;
        for (var i = 0; i < input.Length; i++)
        {
            if (input[i] >= from && input[i] <= to)
            {
                var r = output[i] - (slope * input[i] + intercept);
                squares += r * r;
            }
        }

        return (slope, intercept, squares, n);
    }
}
