using System.Collections.Immutable;
using Patchproof.Core.Captures.Calibration;
using Patchproof.Core.Simulation.Synthesis;

namespace Patchproof.Core.Tests.Captures.Calibration;

/// <summary>The two-level measurement. The square waves are invented data made to be recovered: levels known by construction,
/// recorded through noise and 8-bit quantization over a ±8 V window (step 62.7 mV), with RC edges.</summary>
public sealed class SquareWaveLevelsTests
{
    private const double Step = 16.0 / 255;

    [Fact]
    public void Measure_NoisySquareWaveOfKnownLevels_RecoversTheStepWithinItsStatedUncertainty()
    {
        // Recovery test on invented data: levels -4 V and +6 V read through a gain of 1.013, noise 20 mV (a third of a step).
        var samples = Record(Square(10, -4), gain: 1.013, noiseVolts: 0.020, seed: 1);

        var levels = SquareWaveLevels.Measure(samples, Step, new SquareWaveLevelOptions());

        Assert.True(levels.IsUsable, levels.Message);
        Assert.InRange(levels.StepVolts, (10 * 1.013) - (3 * levels.StepSdVolts), (10 * 1.013) + (3 * levels.StepSdVolts));
        Assert.InRange(levels.StepSdVolts, 1e-4, 0.002 * 10);
        Assert.InRange(levels.Plateaus, 38, 42);
    }

    [Fact]
    public void Measure_DitheringNoise_LeavesNoQuantizationTermAndStatesTheStatisticalError()
    {
        // With noise of a full step the quantized mean is unbiased to within exp(-2π²) of a step (Widrow and Kollár 2008,
        // chapter 5): the stated sd is the jackknife's, and the truth must lie within it.
        var samples = Record(Square(10, -4), gain: 0.991, noiseVolts: Step, seed: 2);

        var levels = SquareWaveLevels.Measure(samples, Step, new SquareWaveLevelOptions());

        Assert.True(levels.IsUsable, levels.Message);
        Assert.True(levels.QuantizationSdVolts < 0.1 * levels.StatisticalSdVolts, $"quantization {levels.QuantizationSdVolts}, jackknife {levels.StatisticalSdVolts}");
        Assert.InRange(levels.StepVolts, (10 * 0.991) - (3 * levels.StepSdVolts), (10 * 0.991) + (3 * levels.StepSdVolts));
    }

    [Fact]
    public void Measure_NoiseFarBelowOneStep_CarriesTheQuantizationErrorTheJackknifeCannotSee()
    {
        // 1 mV of noise does not dither a 62.7 mV step: each level reads as the nearest 8-bit code, off by up to half a step.
        var samples = Record(Square(10, -4), gain: 1.0, noiseVolts: 0.001, seed: 3);

        var levels = SquareWaveLevels.Measure(samples, Step, new SquareWaveLevelOptions());

        Assert.True(levels.IsUsable, levels.Message);
        // Δ/√12 per level without dither (the uniform quantization error, Widrow and Kollár 2008, chapter 4), both levels in quadrature.
        Assert.InRange(levels.QuantizationSdVolts, 0.95 * Math.Sqrt(2) * Step / Math.Sqrt(12), 1.0001 * Math.Sqrt(2) * Step / Math.Sqrt(12));
        Assert.True(levels.StatisticalSdVolts < 0.2 * levels.QuantizationSdVolts);
        Assert.InRange(levels.StepVolts, 10 - (3 * levels.StepSdVolts), 10 + (3 * levels.StepSdVolts));
    }

    [Fact]
    public void ResidualQuantizationSd_FollowsTheGaussianCharacteristicFunction()
    {
        // Widrow and Kollár (2008): the quantized Gaussian's mean bias decays as exp(-2π²σ²/Δ²); without noise the error is
        // uniform over one step, sd Δ/√12. σ here is the sample sd less Sheppard's Δ²/12.
        Assert.Equal(Step / Math.Sqrt(12), SquareWaveLevels.ResidualQuantizationSd(0, Step), 12);
        var sampleSd = Math.Sqrt((0.25 * Step * Step) + (Step * Step / 12));
        Assert.Equal(Step / Math.Sqrt(12) * Math.Exp(-2 * Math.PI * Math.PI * 0.25), SquareWaveLevels.ResidualQuantizationSd(sampleSd, Step), 12);
        Assert.Equal(0, SquareWaveLevels.ResidualQuantizationSd(0.01, 0));
    }

    [Fact]
    public void Measure_SineWave_IsNotATwoLevelSignal()
    {
        var sine = Enumerable.Range(0, 25_000).Select(i => 1 + (5 * Math.Sin(2 * Math.PI * i * 8e-7 / 1e-3))).ToArray();
        var samples = Record(sine, gain: 1, noiseVolts: 0.01, seed: 4);

        var levels = SquareWaveLevels.Measure(samples, Step, new SquareWaveLevelOptions());

        Assert.Equal(SquareWaveProblem.NotTwoLevels, levels.Problem);
        Assert.Contains("not flat", levels.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Measure_DroopingPlateaus_IsNotATwoLevelSignal()
    {
        // An AC-coupled channel: each plateau decays towards 0 V with a 5 ms time constant (1 % over half a period at most).
        var square = Square(10, -5);
        var drooped = new double[square.Length];
        var highPass = 0.0;
        var decay = Math.Exp(-8e-7 / 5e-3);
        for (var i = 0; i < square.Length; i++)
        {
            highPass = i == 0 ? square[0] : decay * (highPass + square[i] - square[i - 1]);
            drooped[i] = highPass;
        }

        var levels = SquareWaveLevels.Measure(Record(drooped, gain: 1, noiseVolts: 0.02, seed: 5), Step, new SquareWaveLevelOptions());

        Assert.Equal(SquareWaveProblem.NotTwoLevels, levels.Problem);
        Assert.Contains("droops", levels.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Measure_TwoPeriods_IsTooFewPlateaus()
    {
        var samples = Record(Square(10, -4).Take(2_500).ToArray(), gain: 1, noiseVolts: 0.02, seed: 6);

        var levels = SquareWaveLevels.Measure(samples, Step, new SquareWaveLevelOptions());

        Assert.Equal(SquareWaveProblem.TooFewPlateauSamples, levels.Problem);
    }

    /// <summary>A 1 kHz square wave, 25 000 samples 0.8 µs apart (20 ms), RC edges of 2 µs.</summary>
    private static double[] Square(double peakToPeakVolts, double lowVolts) =>
        [.. SquareWaveSource.Create(peakToPeakVolts, lowVolts, 1e-3, 2e-6, 8e-7, 25_000, phaseSeconds: 2.3e-4).Volts[0]];

    private static double[] Record(double[] volts, double gain, double noiseVolts, int seed)
    {
        var trace = new BoardTrace([SquareWaveSource.StateName], 0, 8e-7, [volts.ToImmutableArray()], Core.Simulation.SolveStatus.Succeeded, "");
        var channel = new ScopeChannelSettings("CH1", SquareWaveSource.StateName, 1, gain, 0, 0, 16);
        var capture = CaptureSynthesizer.Synthesize(trace, new CaptureSynthesisOptions([channel], noiseVolts, seed, 0)).Capture;
        return capture.Channels[0].Samples.ToArray().Select(v => (double)v).ToArray();
    }
}
