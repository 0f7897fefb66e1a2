using System.Collections.Immutable;
using Patchproof.Core.Captures;

namespace Patchproof.Core.Simulation.Synthesis;

/// <summary>Turns a board trace into a scope capture: probe gains and offsets, noise, 8-bit quantization over the window, clipping, an arbitrary trigger time.</summary>
/// <remarks>
/// <para>y = Quantize(sign * gain * V + offset + e), e ~ N(0, noise^2) from a seeded generator
/// (System.Random with a seed is reproducible across runs; Gaussian draws by Box-Muller). Quantize
/// rounds to the nearest of 2^bits levels spanning the window and clamps to its ends.</para>
/// <para>Capture time is board time minus the trigger sample's time, so a fit cannot read the
/// board's start from the file.</para>
/// </remarks>
public static class CaptureSynthesizer
{
    /// <summary>Synthesizes a capture.</summary>
    /// <param name="trace">The simulated board.</param>
    /// <param name="options">Channels, noise, seed and trigger.</param>
    /// <param name="metadata">Metadata to attach (board id, settings), or null.</param>
    /// <returns>The capture and, per channel, how many samples sit at a window end (clipped).</returns>
    /// <exception cref="ArgumentException">A channel probes a variable the trace lacks.</exception>
    public static SyntheticCapture Synthesize(BoardTrace trace, CaptureSynthesisOptions options, IReadOnlyList<MetadataEntry>? metadata = null)
    {
        ArgumentNullException.ThrowIfNull(trace);
        ArgumentNullException.ThrowIfNull(options);
        Preconditions.CheckArgumentRange(nameof(options), options.TriggerSampleIndex >= 0 && options.TriggerSampleIndex < trace.SampleCount, "the trigger sample must lie inside the trace");
        var random = new Random(options.Seed);
        var channels = new List<CaptureChannel>();
        var clipped = ImmutableArray.CreateBuilder<int>();
        foreach (var channel in options.Channels)
        {
            var state = trace.StateNames.IndexOf(channel.Variable);
            if (state < 0)
            {
                throw new ArgumentException($"channel {channel.Name} probes '{channel.Variable}', which the board does not have", nameof(options));
            }

            var levels = (1 << channel.Bits) - 1;
            var low = channel.WindowCenterVolts - (channel.WindowSpanVolts / 2);
            var step = channel.StepVolts;
            var samples = new float[trace.SampleCount];
            var clippedCount = 0;
            for (var k = 0; k < samples.Length; k++)
            {
                var volts = (channel.ProbeSign * channel.ProbeGain * trace.Volts[state][k]) + channel.ProbeOffsetVolts + (options.NoiseVolts * Gaussian(random));
                var code = Math.Round((volts - low) / step);
                if (code <= 0 || code >= levels)
                {
                    clippedCount++;
                }

                code = Math.Clamp(code, 0, levels);
                samples[k] = (float)(low + (code * step));
            }

            channels.Add(new CaptureChannel(channel.Name, "V", samples, null, channels.Count + 1));
            clipped.Add(clippedCount);
        }

        var start = -options.TriggerSampleIndex * trace.IntervalSeconds;
        var capture = new Capture(new UniformTimeBase(start, trace.IntervalSeconds, trace.SampleCount), channels, metadata ?? []);
        return new SyntheticCapture(capture, clipped.ToImmutable(), trace.TimeAt(options.TriggerSampleIndex));
    }

    private static double Gaussian(Random random)
    {
        var u1 = 1.0 - random.NextDouble();
        var u2 = random.NextDouble();
        return Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
    }
}

/// <summary>A synthetic capture and what was done to it.</summary>
/// <param name="Capture">The capture, as the capture reader would return it.</param>
/// <param name="ClippedSamples">Per channel, the number of samples at a window end.</param>
/// <param name="TriggerBoardSeconds">The board time that became capture time 0.</param>
public sealed record SyntheticCapture(Capture Capture, ImmutableArray<int> ClippedSamples, double TriggerBoardSeconds);
