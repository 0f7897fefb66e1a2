namespace Patchproof.Core.Dynamics;

/// <summary>How a two-lobed attractor shares its time between its lobes: switches and residence times.</summary>
/// <param name="SwitchCount">How many times the trajectory passed from one lobe to the other.</param>
/// <param name="PositiveResidenceSeconds">Durations of complete visits to the positive lobe (the first and last, cut by the record's ends, are left out).</param>
/// <param name="NegativeResidenceSeconds">Durations of complete visits to the negative lobe.</param>
/// <param name="PositiveFraction">The fraction of the record spent in the positive lobe.</param>
/// <param name="IsTwoLobed">True when both lobes hold at least 10 % of the time and there are at least 3 switches.</param>
public sealed record LobeStatistics(
    int SwitchCount,
    double[] PositiveResidenceSeconds,
    double[] NegativeResidenceSeconds,
    double PositiveFraction,
    bool IsTwoLobed)
{
    /// <summary>The mean duration of a complete visit to either lobe, in seconds (NaN with none).</summary>
    public double MeanResidenceSeconds()
    {
        var all = PositiveResidenceSeconds.Concat(NegativeResidenceSeconds).ToArray();
        return all.Length == 0 ? double.NaN : all.Average();
    }

    /// <summary>The switching rate in switches per second over the whole record.</summary>
    /// <param name="recordSeconds">The record's duration, positive.</param>
    public double SwitchesPerSecond(double recordSeconds) => SwitchCount / recordSeconds;
}

/// <summary>Counts lobe switches by the sign of a chosen variable (x for the Lorenz attractor), with hysteresis.</summary>
/// <remarks>
/// <para>Rule: the lobe is the sign of (v - centre); a switch is recorded only when v crosses from
/// below centre - h to above centre + h or back, with h = 5 % of the range by default, so noise
/// near the centre never counts as a switch. The switch time is where v last crossed the centre
/// before reaching the far threshold. The centre defaults to 0, the symmetry plane of the Lorenz
/// system; a board with an offset passes its own.</para>
/// </remarks>
public static class LobeSwitching
{
    /// <summary>Computes the lobe statistics of <paramref name="values"/>.</summary>
    /// <param name="values">The samples of the variable whose sign names the lobe.</param>
    /// <param name="sampleIntervalSeconds">dt, positive.</param>
    /// <param name="centre">The value separating the lobes, in the channel's unit.</param>
    /// <param name="hysteresisFraction">h as a fraction of the range, in [0, 1).</param>
    /// <exception cref="ArgumentOutOfRangeException">When dt or the fraction is out of range.</exception>
    public static LobeStatistics Analyze(ReadOnlySpan<double> values, double sampleIntervalSeconds, double centre = 0, double hysteresisFraction = 0.05)
    {
        Preconditions.CheckArgumentRange(nameof(sampleIntervalSeconds), sampleIntervalSeconds > 0 && double.IsFinite(sampleIntervalSeconds), "must be positive and finite");
        Preconditions.CheckArgumentRange(nameof(hysteresisFraction), hysteresisFraction >= 0 && hysteresisFraction < 1, "must be in [0, 1)");
        if (values.Length == 0)
        {
            return new LobeStatistics(0, [], [], double.NaN, false);
        }

        var min = double.PositiveInfinity;
        var max = double.NegativeInfinity;
        var positiveSamples = 0;
        foreach (var v in values)
        {
            min = Math.Min(min, v);
            max = Math.Max(max, v);
            if (v > centre)
            {
                positiveSamples++;
            }
        }

        var h = hysteresisFraction * (max - min);
        var positive = new List<double>();
        var negative = new List<double>();
        var lobe = 0;
        var lastCentreCrossing = 0;
        var enteredAt = -1;
        var switches = 0;
        for (var i = 0; i < values.Length; i++)
        {
            var v = values[i];
            if (i > 0 && (values[i - 1] - centre) * (v - centre) <= 0 && values[i - 1] != v)
            {
                lastCentreCrossing = i;
            }

            var now = v > centre + h ? 1 : v < centre - h ? -1 : 0;
            if (now == 0 || now == lobe)
            {
                continue;
            }

            if (lobe != 0)
            {
                switches++;
                if (enteredAt >= 0)
                {
                    (lobe > 0 ? positive : negative).Add((lastCentreCrossing - enteredAt) * sampleIntervalSeconds);
                }

                enteredAt = lastCentreCrossing;
            }

            lobe = now;
        }

        var fraction = (double)positiveSamples / values.Length;
        var twoLobed = fraction >= 0.1 && fraction <= 0.9 && switches >= 3;
        return new LobeStatistics(switches, [.. positive], [.. negative], fraction, twoLobed);
    }
}
