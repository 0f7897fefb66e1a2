using System.Collections.Immutable;
using Patchproof.Core.Models;

namespace Patchproof.Core.Dynamics;

/// <summary>One phase plane's decimated trace.</summary>
/// <param name="XChannel">Index of the horizontal channel.</param>
/// <param name="YChannel">Index of the vertical channel.</param>
/// <param name="Trace">The decimated curve.</param>
public sealed record PhasePlaneTrace(int XChannel, int YChannel, DisplaySeries Trace);

/// <summary>Decimated traces of one record (the capture, or a design restarted along it).</summary>
/// <param name="Label">What the traces show, for example "capture", "nominal design", "fitted design".</param>
/// <param name="TimeSeries">One trace per channel against time (the model's time unit).</param>
/// <param name="PhasePlanes">One trace per pair of channels.</param>
/// <param name="RestartTimes">Where the simulation was restarted from the capture's state (empty for the capture).</param>
public sealed record OverlayTraces(string Label, IReadOnlyList<DisplaySeries> TimeSeries, IReadOnlyList<PhasePlaneTrace> PhasePlanes, double[] RestartTimes);

/// <summary>A design to overlay: a label and its parameter values.</summary>
/// <param name="Label">For example "nominal design".</param>
/// <param name="Parameters">The model's parameters for this design.</param>
public sealed record OverlayDesign(string Label, ImmutableArray<double> Parameters);

/// <summary>Overlays of a capture and of simulations restarted from its state along the record, decimated for display.</summary>
/// <remarks>
/// <para>Each design is simulated in pieces: at every restart time (every
/// <c>restartInterval</c> along the record, half a Lyapunov time being a good choice) the model starts
/// again from the capture's state, so the overlay shows how each design follows the board over
/// short stretches rather than a long run that chaos makes meaningless. The pieces join into one
/// trace per channel on the capture's time axis.</para>
/// <para>Decimation (see <see cref="TraceDecimation"/>): the capture's time series by min/max per
/// column, the simulations' by LTTB, every phase plane by equal arc length; no trace carries more
/// than <see cref="TraceDecimation.DefaultPointBudget"/> points.</para>
/// </remarks>
public static class OverlaySeries
{
    /// <summary>Builds the capture's traces and each design's restarted traces.</summary>
    /// <param name="capture">The capture, one array per state variable in the model's units and order.</param>
    /// <param name="sampleInterval">The capture's sample interval in the model's time unit.</param>
    /// <param name="system">The model.</param>
    /// <param name="designs">The designs to overlay (nominal, fitted, ...).</param>
    /// <param name="restartInterval">Time between restarts in the model's time unit, at least one sample.</param>
    /// <param name="tolerance">Tolerance of the restarted solves.</param>
    /// <param name="cancellation">Checked before each restart and during the solves; default none.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the capture does not match the system or an interval is out of range.</exception>
    /// <exception cref="OperationCanceledException">When <paramref name="cancellation"/> is cancelled.</exception>
    public static IReadOnlyList<OverlayTraces> Build(IReadOnlyList<double[]> capture, double sampleInterval, IOdeSystem system, IReadOnlyList<OverlayDesign> designs, double restartInterval, double tolerance = 1e-8, CancellationToken cancellation = default)
    {
        ArgumentNullException.ThrowIfNull(capture);
        ArgumentNullException.ThrowIfNull(system);
        ArgumentNullException.ThrowIfNull(designs);
        Preconditions.CheckArgumentRange(nameof(capture), capture.Count == system.StateCount && capture.All(channel => channel.Length == capture[0].Length && channel.Length >= 2), "must hold one equally long array (2 or more samples) per state variable");
        Preconditions.CheckArgumentRange(nameof(sampleInterval), sampleInterval > 0 && double.IsFinite(sampleInterval), "must be positive and finite");
        Preconditions.CheckArgumentRange(nameof(restartInterval), restartInterval >= sampleInterval && double.IsFinite(restartInterval), "must be at least one sample interval");
        var n = capture[0].Length;
        var time = new double[n];
        for (var i = 0; i < n; i++)
        {
            time[i] = i * sampleInterval;
        }

        var result = new List<OverlayTraces>
        {
            new("capture", capture.Select(channel => TraceDecimation.MinMaxPerColumn(time, channel)).ToArray(), Planes(capture), []),
        };
        var piece = Math.Max(1, (int)Math.Round(restartInterval / sampleInterval));
        foreach (var design in designs)
        {
            var simulated = capture.Select(_ => new double[n]).ToArray();
            var restarts = new List<double>();
            for (var start = 0; start < n - 1; start += piece)
            {
                cancellation.ThrowIfCancellationRequested();
                var count = Math.Min(piece + 1, n - start);
                var part = RestartedSimulation.Run(system, design.Parameters, capture, sampleInterval, start, count, tolerance, cancellation);
                restarts.Add(start * sampleInterval);
                for (var c = 0; c < simulated.Length; c++)
                {
                    var length = part[c].Length;
                    Array.Copy(part[c], 0, simulated[c], start, length);
                    for (var k = length; k < count; k++)
                    {
                        simulated[c][start + k] = double.NaN;
                    }
                }
            }

            result.Add(new OverlayTraces(design.Label, simulated.Select(channel => TraceDecimation.LargestTriangleThreeBuckets(time, channel)).ToArray(), Planes(simulated), [.. restarts]));
        }

        return result;
    }

    private static PhasePlaneTrace[] Planes(IReadOnlyList<double[]> channels)
    {
        var planes = new List<PhasePlaneTrace>();
        for (var i = 0; i < channels.Count; i++)
        {
            for (var j = i + 1; j < channels.Count; j++)
            {
                planes.Add(new PhasePlaneTrace(i, j, TraceDecimation.AlongCurve(channels[i], channels[j])));
            }
        }

        return [.. planes];
    }
}
