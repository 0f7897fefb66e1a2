namespace Patchproof.Core.Captures.Calibration;

/// <summary>Why a record is not a usable two-level (square-wave) signal.</summary>
public enum SquareWaveProblem
{
    /// <summary>Two settled levels were found.</summary>
    None,

    /// <summary>The record does not alternate between two flat levels (a sine, a triangle, a drooping or AC-coupled square wave).</summary>
    NotTwoLevels,

    /// <summary>Too few plateaus, or too few settled samples on a level, once the edges are left out.</summary>
    TooFewPlateauSamples,
}

/// <summary>The two levels of a square wave as one channel recorded them, with the uncertainty of their difference.</summary>
/// <param name="Problem">Why the record is not usable; <see cref="SquareWaveProblem.None"/> when it is.</param>
/// <param name="Message">What went wrong, in words; empty when nothing did.</param>
/// <param name="HighLevelVolts">Mean of the settled samples of the upper level.</param>
/// <param name="LowLevelVolts">Mean of the settled samples of the lower level.</param>
/// <param name="StatisticalSdVolts">Block-jackknife standard deviation of <see cref="StepVolts"/>.</param>
/// <param name="QuantizationSdVolts">The part of the quantization error the averaging cannot remove (see <see cref="SquareWaveLevels"/>).</param>
/// <param name="Plateaus">Plateaus (runs between edges) that contributed samples.</param>
/// <param name="HighSamples">Settled samples on the upper level.</param>
/// <param name="LowSamples">Settled samples on the lower level.</param>
public sealed record SquareWaveMeasurement(
    SquareWaveProblem Problem,
    string Message,
    double HighLevelVolts,
    double LowLevelVolts,
    double StatisticalSdVolts,
    double QuantizationSdVolts,
    int Plateaus,
    int HighSamples,
    int LowSamples)
{
    /// <summary>The measured peak-to-peak step: high level minus low level.</summary>
    public double StepVolts => HighLevelVolts - LowLevelVolts;

    /// <summary>The step's whole standard deviation: √(statistical² + quantization²).</summary>
    public double StepSdVolts => Math.Sqrt((StatisticalSdVolts * StatisticalSdVolts) + (QuantizationSdVolts * QuantizationSdVolts));

    /// <summary>True when two settled levels were found.</summary>
    public bool IsUsable => Problem is SquareWaveProblem.None;
}

/// <summary>Settings of the two-level measurement.</summary>
public sealed record SquareWaveLevelOptions
{
    /// <summary>Share of a typical plateau's length left out after each edge, so that the RC settling of the edge does not
    /// pull the level. Default 0.2.</summary>
    public double EdgeGuardFraction { get; init; } = 0.2;

    /// <summary>Fewest plateaus (half periods) with settled samples. Default 10 (five periods).</summary>
    public int MinimumPlateaus { get; init; } = 10;

    /// <summary>Fewest settled samples on each level. Default 200.</summary>
    public int MinimumSamplesPerLevel { get; init; } = 200;

    /// <summary>The largest standard deviation of a level's settled samples, as a fraction of the step, for the record to count as
    /// two flat levels. Default 0.03: noise of a few tenths of a percent passes, a sine's half-wave (about a quarter of the
    /// peak-to-peak) does not.</summary>
    public double MaximumPlateauSpread { get; init; } = 0.03;

    /// <summary>Contiguous blocks of the block jackknife. Default 20.</summary>
    public int JackknifeBlocks { get; init; } = 20;
}

/// <summary>Measures the two levels of a recorded square wave: split in two, edges left out, each plateau averaged.</summary>
/// <remarks>
/// <para>Split: a threshold at the midpoint of the two sides' medians (iterated from the 2nd and 98th percentiles), with
/// hysteresis of a quarter of the step so that noise near the threshold does not make extra edges. Each run between edges is
/// a plateau; the first <see cref="SquareWaveLevelOptions.EdgeGuardFraction"/> of a typical plateau after an edge and the last
/// 5 % before one are left out. A level is the mean of its settled samples after rejecting those more than five robust sd from
/// their median (a glitch); the mean, not the median, because the median of 8-bit samples is itself one of the 8-bit
/// levels.</para>
/// <para>Uncertainty: a block jackknife over contiguous blocks of the record, as for the relative gains [1]. Averaging
/// removes quantization error only as far as the noise dithers the converter: for Gaussian noise of sd σ and step Δ the
/// mean's bias is periodic in the level with a first harmonic of amplitude (Δ/π)·exp(-2π²σ²/Δ²) [2]. That bias is the same
/// in every block, so the jackknife cannot see it; it is carried as (Δ/√12)·exp(-2π²σ²/Δ²) per level (Δ/√12 without noise,
/// vanishing once σ is half a step or more), σ being the settled samples' sd less Sheppard's Δ²/12 [3].</para>
/// <para>Checks: a level whose settled samples spread by more than <see cref="SquareWaveLevelOptions.MaximumPlateauSpread"/> of
/// the step, or whose plateaus start and end at different levels (droop, an AC-coupled channel, edges slow against the
/// period), is not a two-level signal; too few plateaus or settled samples per level is refused.</para>
/// <para>References: [1] H. R. Künsch, Ann. Statist. 17 (1989) 1217-1241. [2] B. Widrow, I. Kollár, Quantization Noise,
/// Cambridge University Press 2008, chapters 4 and 5 (moments of the quantized Gaussian). [3] W. F. Sheppard, On the
/// calculation of the most probable values of frequency-constants, Proc. London Math. Soc. 29 (1898) 353-380.</para>
/// </remarks>
public static class SquareWaveLevels
{
    /// <summary>Measures the two levels.</summary>
    /// <param name="samples">One channel's record of the square wave, clipped samples already left out by the caller.</param>
    /// <param name="quantizationStepVolts">The channel's smallest step between recorded levels.</param>
    /// <param name="options">Guards and limits.</param>
    /// <returns>The levels and their uncertainty, or why the record is not a usable square wave.</returns>
    public static SquareWaveMeasurement Measure(ReadOnlySpan<double> samples, double quantizationStepVolts, SquareWaveLevelOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        Preconditions.CheckArgumentRange(nameof(options), options.EdgeGuardFraction is >= 0 and < 0.9 && options.JackknifeBlocks >= 2 && options.MaximumPlateauSpread > 0, "a square-wave option is out of range");
        var step = double.IsFinite(quantizationStepVolts) && quantizationStepVolts > 0 ? quantizationStepVolts : 0;
        var n = samples.Length;
        if (n < 4 * options.JackknifeBlocks)
        {
            return Refuse(SquareWaveProblem.TooFewPlateauSamples, $"only {n} samples; a square wave needs at least {options.MinimumSamplesPerLevel} settled samples on each level");
        }

        var sorted = samples.ToArray();
        Array.Sort(sorted);
        var low = sorted[(int)(0.02 * (n - 1))];
        var high = sorted[(int)(0.98 * (n - 1))];
        if (!(high - low > 4 * step))
        {
            return Refuse(SquareWaveProblem.NotTwoLevels, "the record hardly moves: no two levels to tell apart");
        }

        var threshold = 0.5 * (low + high);
        for (var iteration = 0; iteration < 8; iteration++)
        {
            var split = LowerBound(sorted, threshold);
            if (split == 0 || split == n)
            {
                return Refuse(SquareWaveProblem.NotTwoLevels, "the record does not alternate between two levels");
            }

            low = sorted[split / 2];
            high = sorted[split + ((n - split) / 2)];
            threshold = 0.5 * (low + high);
        }

        var hysteresis = 0.25 * (high - low);
        var runs = Runs(samples, threshold, hysteresis);
        var interior = runs.Where(r => r.Start > 0 && r.End < n).Select(r => r.End - r.Start).OrderBy(length => length).ToList();
        if (interior.Count < 2)
        {
            return Refuse(SquareWaveProblem.TooFewPlateauSamples, $"only {runs.Count} plateaus between edges; record at least {options.MinimumPlateaus / 2} periods");
        }

        var typical = interior[interior.Count / 2];
        var guard = Math.Max(3, (int)Math.Ceiling(options.EdgeGuardFraction * typical));
        var tail = Math.Max(2, (int)Math.Ceiling(0.05 * typical));
        var settled = new List<(int Start, int End, bool High)>();
        foreach (var run in runs)
        {
            var start = run.Start > 0 ? run.Start + guard : run.Start;
            var end = run.End < n ? run.End - tail : run.End;
            if (end - start >= 3)
            {
                settled.Add((start, end, run.High));
            }
        }

        if (settled.Count < options.MinimumPlateaus)
        {
            return Refuse(SquareWaveProblem.TooFewPlateauSamples, $"only {settled.Count} plateaus with settled samples (at least {options.MinimumPlateaus} needed): record more periods, or a slower square wave");
        }

        var highBand = Band(samples, settled, true, step);
        var lowBand = Band(samples, settled, false, step);
        var blocks = options.JackknifeBlocks;
        var sums = new (double High, long HighCount, double Low, long LowCount)[blocks];
        var early = new (double Sum, long Count)[2];
        var late = new (double Sum, long Count)[2];
        double highSquares = 0, lowSquares = 0;
        foreach (var (start, end, isHigh) in settled)
        {
            var (centre, width) = isHigh ? highBand : lowBand;
            var third = (end - start) / 3;
            for (var i = start; i < end; i++)
            {
                var value = samples[i];
                if (Math.Abs(value - centre) > width)
                {
                    continue;
                }

                var block = (int)((long)i * blocks / n);
                if (isHigh)
                {
                    sums[block].High += value - centre;
                    sums[block].HighCount++;
                    highSquares += (value - centre) * (value - centre);
                }
                else
                {
                    sums[block].Low += value - centre;
                    sums[block].LowCount++;
                    lowSquares += (value - centre) * (value - centre);
                }

                var side = isHigh ? 1 : 0;
                if (i < start + third)
                {
                    early[side] = (early[side].Sum + value, early[side].Count + 1);
                }
                else if (i >= end - third)
                {
                    late[side] = (late[side].Sum + value, late[side].Count + 1);
                }
            }
        }

        var highTotal = sums.Sum(s => s.High);
        var highCount = sums.Sum(s => s.HighCount);
        var lowTotal = sums.Sum(s => s.Low);
        var lowCount = sums.Sum(s => s.LowCount);
        if (highCount < options.MinimumSamplesPerLevel || lowCount < options.MinimumSamplesPerLevel)
        {
            return Refuse(SquareWaveProblem.TooFewPlateauSamples, $"only {highCount} settled samples on the upper level and {lowCount} on the lower (at least {options.MinimumSamplesPerLevel} each needed): record longer");
        }

        var highLevel = highBand.Centre + (highTotal / highCount);
        var lowLevel = lowBand.Centre + (lowTotal / lowCount);
        var stepVolts = highLevel - lowLevel;
        var highSd = Math.Sqrt(Math.Max(0, (highSquares / highCount) - Math.Pow(highTotal / highCount, 2)));
        var lowSd = Math.Sqrt(Math.Max(0, (lowSquares / lowCount) - Math.Pow(lowTotal / lowCount, 2)));
        var spread = Math.Max(highSd, lowSd) / stepVolts;
        if (spread > options.MaximumPlateauSpread)
        {
            return Refuse(SquareWaveProblem.NotTwoLevels, FormattableString.Invariant($"the levels are not flat: their samples spread by {100 * spread:0.#} % of the step (at most {100 * options.MaximumPlateauSpread:0.#} %); is it a square wave?"));
        }

        for (var side = 0; side < 2; side++)
        {
            var sd = side == 1 ? highSd : lowSd;
            if (early[side].Count == 0 || late[side].Count == 0)
            {
                continue;
            }

            var droop = (early[side].Sum / early[side].Count) - (late[side].Sum / late[side].Count);
            var noise = sd * Math.Sqrt((1.0 / early[side].Count) + (1.0 / late[side].Count));
            if (Math.Abs(droop) > Math.Max(5 * noise, 0.002 * stepVolts))
            {
                return Refuse(SquareWaveProblem.NotTwoLevels, FormattableString.Invariant($"the {(side == 1 ? "upper" : "lower")} level moves by {1000 * droop:0.0} mV from the start to the end of its plateaus: the channel droops (AC-coupled?) or the edges are slow against the period"));
            }
        }

        var leftOut = new double[blocks];
        for (var k = 0; k < blocks; k++)
        {
            var hc = highCount - sums[k].HighCount;
            var lc = lowCount - sums[k].LowCount;
            leftOut[k] = hc > 0 && lc > 0
                ? (highBand.Centre + ((highTotal - sums[k].High) / hc)) - (lowBand.Centre + ((lowTotal - sums[k].Low) / lc))
                : stepVolts;
        }

        var quantization = Math.Sqrt(Math.Pow(ResidualQuantizationSd(highSd, step), 2) + Math.Pow(ResidualQuantizationSd(lowSd, step), 2));
        return new SquareWaveMeasurement(SquareWaveProblem.None, "", highLevel, lowLevel, Jackknife(leftOut), quantization, settled.Count, (int)highCount, (int)lowCount);
    }

    /// <summary>The sd of a level's mean that averaging cannot remove: (Δ/√12)·exp(-2π²σ²/Δ²), σ² = s² - Δ²/12 (Sheppard).</summary>
    /// <param name="sampleSdVolts">The settled samples' sd, quantized.</param>
    /// <param name="stepVolts">The quantization step; 0 for none.</param>
    public static double ResidualQuantizationSd(double sampleSdVolts, double stepVolts)
    {
        if (!(stepVolts > 0))
        {
            return 0;
        }

        var noiseVariance = Math.Max(0, (sampleSdVolts * sampleSdVolts) - (stepVolts * stepVolts / 12));
        return stepVolts / Math.Sqrt(12) * Math.Exp(-2 * Math.PI * Math.PI * noiseVariance / (stepVolts * stepVolts));
    }

    private static SquareWaveMeasurement Refuse(SquareWaveProblem problem, string message) => new(problem, message, double.NaN, double.NaN, double.NaN, double.NaN, 0, 0, 0);

    /// <summary>Runs of one side of the threshold, with hysteresis: [Start, End) and whether the run is the upper level.</summary>
    private static List<(int Start, int End, bool High)> Runs(ReadOnlySpan<double> samples, double threshold, double hysteresis)
    {
        var runs = new List<(int Start, int End, bool High)>();
        var high = samples[0] >= threshold;
        var start = 0;
        for (var i = 1; i < samples.Length; i++)
        {
            var switches = high ? samples[i] < threshold - hysteresis : samples[i] > threshold + hysteresis;
            if (switches)
            {
                // The edge is where the signal crossed the threshold itself, not the hysteresis band.
                var edge = i;
                while (edge > start + 1 && (high ? samples[edge - 1] < threshold : samples[edge - 1] > threshold))
                {
                    edge--;
                }

                runs.Add((start, edge, high));
                start = edge;
                high = !high;
            }
        }

        runs.Add((start, samples.Length, high));
        return runs;
    }

    /// <summary>A level's median over its settled samples and a rejection half-width of five robust sd (at least two steps).</summary>
    private static (double Centre, double Width) Band(ReadOnlySpan<double> samples, List<(int Start, int End, bool High)> settled, bool high, double step)
    {
        var values = new List<double>();
        foreach (var (start, end, isHigh) in settled)
        {
            if (isHigh == high)
            {
                for (var i = start; i < end; i++)
                {
                    values.Add(samples[i]);
                }
            }
        }

        if (values.Count == 0)
        {
            return (0, 0);
        }

        values.Sort();
        var median = values[values.Count / 2];
        var deviations = values.Select(v => Math.Abs(v - median)).OrderBy(v => v).ToList();
        var robustSd = 1.4826 * deviations[deviations.Count / 2];
        return (median, Math.Max(5 * robustSd, 2 * step) + 1e-12);
    }

    private static int LowerBound(double[] sorted, double value)
    {
        var index = Array.BinarySearch(sorted, value);
        if (index < 0)
        {
            return ~index;
        }

        while (index > 0 && sorted[index - 1] >= value)
        {
            index--;
        }

        return index;
    }

    private static double Jackknife(double[] estimates)
    {
        var mean = estimates.Average();
        var k = estimates.Length;
        return Math.Sqrt((k - 1.0) / k * estimates.Sum(v => (v - mean) * (v - mean)));
    }
}
