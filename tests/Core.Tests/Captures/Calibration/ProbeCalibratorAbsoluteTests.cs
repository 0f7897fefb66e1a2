using System.Collections.Immutable;
using Microsoft.Extensions.Time.Testing;
using Patchproof.Core.Captures;
using Patchproof.Core.Captures.Calibration;
using Patchproof.Core.Simulation.Synthesis;

namespace Patchproof.Core.Tests.Captures.Calibration;

/// <summary>Absolute calibration against a square wave of known amplitude. The captures are invented data made to be
/// recovered: every probe on a 10 V square wave through gains known by construction, noise, 8-bit steps, RC edges.</summary>
public sealed class ProbeCalibratorAbsoluteTests
{
    private static readonly FakeTimeProvider Clock = new(new DateTimeOffset(2026, 12, 1, 12, 0, 0, TimeSpan.Zero));
    private static readonly double[] Gains = [1.02, 0.99, 1.005];

    [Fact]
    public void Calibrate_SquareWaveOfKnownAmplitude_RecoversEveryChannelsAbsoluteGain()
    {
        var capture = SquareWave(Gains, window: 16, noiseVolts: 0.02, seed: 1);

        var result = ProbeCalibrator.Calibrate(capture, ["square.csv"], Options(0.001), Clock);

        Assert.True(result.IsUsable, string.Join(" ", result.Findings));
        var calibration = result.Calibration!;
        Assert.True(calibration.IsAbsolute);
        var absolute = calibration.Absolute!;
        Assert.InRange(absolute.ReferenceGain, Gains[0] - (3 * absolute.ReferenceGainSd), Gains[0] + (3 * absolute.ReferenceGainSd));
        for (var c = 1; c < Gains.Length; c++)
        {
            var channel = calibration.Channels[c];
            var gain = calibration.AbsoluteGainOf(channel);
            var sd = gain * Math.Sqrt((channel.LogGainSd * channel.LogGainSd) + (absolute.ReferenceLogGainSd * absolute.ReferenceLogGainSd));
            Assert.InRange(gain, Gains[c] - (3 * sd), Gains[c] + (3 * sd));
            Assert.InRange(sd, 1e-4, 0.003);
        }
    }

    [Fact]
    public void Calibrate_AbsoluteGainSd_AddsTheAmplitudeAccuracyInQuadrature()
    {
        var capture = SquareWave(Gains, window: 16, noiseVolts: 0.02, seed: 2);

        var tight = ProbeCalibrator.Calibrate(capture, [], Options(0.0005), Clock).Calibration!.Absolute!;
        var loose = ProbeCalibrator.Calibrate(capture, [], Options(0.01), Clock).Calibration!.Absolute!;

        Assert.Equal(tight.ReferenceGain, loose.ReferenceGain, 12);
        foreach (var (absolute, accuracy) in new[] { (tight, 0.0005), (loose, 0.01) })
        {
            var measured = absolute.MeasuredAmplitudeSdVolts / absolute.MeasuredAmplitudeVolts;
            Assert.Equal(Math.Sqrt((measured * measured) + (accuracy * accuracy)), absolute.ReferenceLogGainSd, 12);
            Assert.True(absolute.ReferenceLogGainSd >= accuracy);
        }

        Assert.InRange(loose.ReferenceLogGainSd, 0.01, 0.0102);
    }

    [Fact]
    public void Calibrate_WithoutAKnownAmplitude_StaysRelative()
    {
        var capture = SquareWave(Gains, window: 16, noiseVolts: 0.02, seed: 3);

        var relative = ProbeCalibrator.Calibrate(capture, [], Clock);
        var absolute = ProbeCalibrator.Calibrate(capture, [], Options(0.001), Clock);

        Assert.True(relative.IsUsable);
        Assert.Null(relative.Calibration!.Absolute);
        Assert.False(relative.Calibration.IsAbsolute);
        Assert.Equal(relative.Calibration.Channels.Select(c => c.Gain), absolute.Calibration!.Channels.Select(c => c.Gain));
    }

    [Fact]
    public void Calibrate_ClippedSquareWave_IsRefusedAsLevelsClipped()
    {
        // A ±4 V window (1 V/div) cannot hold the +6 V level.
        var capture = SquareWave(Gains, window: 8, noiseVolts: 0.02, seed: 4);

        var result = ProbeCalibrator.Calibrate(capture, [], Options(0.001), Clock);

        Assert.Equal(ProbeCalibrationStatus.LevelsClipped, result.Status);
        Assert.False(result.IsUsable);
        Assert.Contains(result.Findings, f => f.Contains("clipped", StringComparison.Ordinal));
    }

    [Fact]
    public void Calibrate_NodeThatIsNotASquareWave_IsRefusedAsNotTwoLevels()
    {
        var node = CalibrationCaptures.TwoTones(20_000, 4.0);
        var capture = CalibrationCaptures.FromNode(node, 1e-5, [1.0, 1.01], [0, 0], [5.0, 5.0], 0.01, seed: 5);

        var result = ProbeCalibrator.Calibrate(capture, [], Options(0.001), Clock);

        Assert.Equal(ProbeCalibrationStatus.NotTwoLevels, result.Status);
        Assert.Contains(result.Findings, f => f.Contains("not a usable square wave", StringComparison.Ordinal));
    }

    [Fact]
    public void Calibrate_NegativeAmplitudeOrAccuracyOfOneOrMore_Throws()
    {
        var capture = SquareWave(Gains, window: 16, noiseVolts: 0.02, seed: 6);

        Assert.Throws<ArgumentOutOfRangeException>(() => ProbeCalibrator.Calibrate(capture, [], new ProbeCalibrationOptions { KnownAmplitudeVolts = -10, KnownAmplitudeRelativeSd = 0.001 }, Clock));
        Assert.Throws<ArgumentOutOfRangeException>(() => ProbeCalibrator.Calibrate(capture, [], Options(1.5), Clock));
    }

    private static ProbeCalibrationOptions Options(double accuracy) => new() { KnownAmplitudeVolts = 10, KnownAmplitudeRelativeSd = accuracy };

    /// <summary>Every channel on a 1 kHz, 10 V square wave from -4 V to +6 V (RC edges of 2 µs), 25 000 samples over 20 ms, one window.</summary>
    private static Capture SquareWave(double[] gains, double window, double noiseVolts, int seed)
    {
        var trace = SquareWaveSource.Create(10, -4, 1e-3, 2e-6, 8e-7, 25_000, phaseSeconds: 4.1e-4);
        var channels = gains.Select((gain, c) => new ScopeChannelSettings($"CH{c + 1}", SquareWaveSource.StateName, 1, gain, 0.005 * c, 0.5, window)).ToImmutableArray();
        return CaptureSynthesizer.Synthesize(trace, new CaptureSynthesisOptions(channels, noiseVolts, seed, 0)).Capture;
    }
}
