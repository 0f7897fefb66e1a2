using System.Collections.Immutable;

namespace Patchproof.Core.Simulation.Synthesis;

/// <summary>A reference square wave as a trace that <see cref="CaptureSynthesizer"/> can record: two levels, first-order (RC) edges.</summary>
/// <remarks>The source's output follows the ideal square wave through one pole of time constant τ: between edges
/// v → target + (v - target)·exp(-Δt/τ), evaluated exactly at each sample and at each edge inside a sample interval, so the
/// samples carry no discretization error. The trace starts settled on the lower level.</remarks>
public static class SquareWaveSource
{
    /// <summary>The name of the trace's one state, for the channels' <see cref="ScopeChannelSettings.Variable"/>.</summary>
    public const string StateName = "square";

    /// <summary>Samples a square wave from <paramref name="lowVolts"/> to <paramref name="lowVolts"/> + <paramref name="peakToPeakVolts"/>.</summary>
    /// <param name="peakToPeakVolts">High level minus low level, positive.</param>
    /// <param name="lowVolts">The lower level.</param>
    /// <param name="periodSeconds">The period; the wave is high for the second half of each period.</param>
    /// <param name="edgeTimeConstantSeconds">The edges' RC time constant, 0 or more.</param>
    /// <param name="intervalSeconds">The sample spacing.</param>
    /// <param name="sampleCount">How many samples.</param>
    /// <param name="phaseSeconds">Time of the first sample within the period.</param>
    /// <returns>A trace with the one state <see cref="StateName"/>.</returns>
    public static BoardTrace Create(double peakToPeakVolts, double lowVolts, double periodSeconds, double edgeTimeConstantSeconds, double intervalSeconds, int sampleCount, double phaseSeconds = 0)
    {
        Preconditions.CheckArgumentRange(nameof(peakToPeakVolts), peakToPeakVolts > 0 && double.IsFinite(peakToPeakVolts), "the amplitude must be positive");
        Preconditions.CheckArgumentRange(nameof(periodSeconds), periodSeconds > 0 && double.IsFinite(periodSeconds), "the period must be positive");
        Preconditions.CheckArgumentRange(nameof(edgeTimeConstantSeconds), edgeTimeConstantSeconds >= 0, "the edge time constant must be 0 or more");
        Preconditions.CheckArgumentRange(nameof(intervalSeconds), intervalSeconds > 0, "the sample interval must be positive");
        Preconditions.CheckArgumentRange(nameof(sampleCount), sampleCount > 0, "at least one sample");
        var half = periodSeconds / 2;
        // Half period m of the wave, from the time at the start of an interval; the tolerance keeps an edge time on its own side.
        long HalfIndex(double t) => (long)Math.Floor((t / half) + 1e-9);
        double Target(double t) => (HalfIndex(t) & 1) == 1 ? lowVolts + peakToPeakVolts : lowVolts;
        double Relax(double value, double target, double seconds) => edgeTimeConstantSeconds > 0 ? target + ((value - target) * Math.Exp(-seconds / edgeTimeConstantSeconds)) : target;

        var volts = new double[sampleCount];
        var time = phaseSeconds;
        var value = lowVolts;
        volts[0] = Relax(value, Target(time), double.PositiveInfinity);
        value = volts[0];
        for (var k = 1; k < sampleCount; k++)
        {
            var next = phaseSeconds + (k * intervalSeconds);
            var edge = (HalfIndex(time) + 1) * half;
            while (edge <= next)
            {
                value = Relax(value, Target(time), edge - time);
                time = edge;
                edge += half;
            }

            value = Relax(value, Target(time), next - time);
            time = next;
            volts[k] = value;
        }

        return new BoardTrace([StateName], 0, intervalSeconds, [volts.ToImmutableArray()], SolveStatus.Succeeded, "square wave");
    }
}
