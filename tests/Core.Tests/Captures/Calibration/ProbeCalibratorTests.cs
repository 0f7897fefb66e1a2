using Microsoft.Extensions.Time.Testing;
using Patchproof.Core.Captures.Calibration;

namespace Patchproof.Core.Tests.Captures.Calibration;

public sealed class ProbeCalibratorTests
{
    private static readonly FakeTimeProvider Clock = new(new DateTimeOffset(2026, 12, 1, 12, 0, 0, TimeSpan.Zero));

    [Fact]
    public void Calibrate_ThreeProbesWithKnownGainRatios_RecoversEachRatioWithinItsStatedUncertainty()
    {
        // Known by construction: CH2 reads 1.018 and CH3 0.983 times what CH1 reads, with offsets of -15 and +20 mV against CH1's +10 mV.
        var node = CalibrationCaptures.TwoTones(20_000, 4.0);
        var capture = CalibrationCaptures.FromNode(node, 1e-5, [1.0, 1.018, 0.983], [0.010, -0.015, 0.020], [5.0, 5.0, 5.0], 0.01, seed: 3);

        var result = ProbeCalibrator.Calibrate(capture, ["calibration.csv"], Clock);

        Assert.True(result.IsUsable, string.Join(" ", result.Findings));
        var calibration = result.Calibration!;
        Assert.Equal("CH1", calibration.ReferenceChannel);
        var ch2 = calibration.Find("CH2")!;
        var ch3 = calibration.Find("CH3")!;
        Assert.InRange(ch2.Gain, 1.018 - (3 * ch2.GainSd), 1.018 + (3 * ch2.GainSd));
        Assert.InRange(ch3.Gain, 0.983 - (3 * ch3.GainSd), 0.983 + (3 * ch3.GainSd));
        Assert.InRange(ch2.GainSd, 1e-6, 5e-4);
        // y2 = -0.015 + 1.018 (y1 - 0.010): the intercept against CH1 is -0.02518 V.
        Assert.InRange(ch2.OffsetVolts, -0.02518 - (3 * ch2.OffsetSdVolts) - 1e-4, -0.02518 + (3 * ch2.OffsetSdVolts) + 1e-4);
        Assert.InRange(ch2.ResidualRmsVolts, 0.5 * ch2.ExpectedResidualRmsVolts, 1.5 * ch2.ExpectedResidualRmsVolts);
    }

    [Fact]
    public void Calibrate_SmallSignalWithCoarseSteps_AvoidsTheAttenuationOfOrdinaryLeastSquares()
    {
        // Fuller (1987), section 1.1: least squares of y on an x that carries error variance s_u² shrinks the slope by the
        // reliability ratio s_xx / (s_xx + s_u²). Here the reference swings over about 12 steps with half a step of noise,
        // so that ratio is about 0.998: ordinary least squares comes out about 0.2 % low; the Deming line must not.
        var node = CalibrationCaptures.TwoTones(60_000, 0.25);
        var capture = CalibrationCaptures.FromNode(node, 1e-5, [1.0, 1.0125], [0, 0.004], [5.0, 5.0], 0.02, seed: 4);

        var result = ProbeCalibrator.Calibrate(capture, [], new ProbeCalibrationOptions { MinimumSignalSteps = 5 }, Clock);

        var ch2 = result.Calibration!.Find("CH2")!;
        var x = capture.Channels[0].Samples.ToArray().Select(v => (double)v).ToArray();
        var y = capture.Channels[1].Samples.ToArray().Select(v => (double)v).ToArray();
        var (mx, my) = (x.Average(), y.Average());
        var ordinary = x.Zip(y).Sum(p => (p.First - mx) * (p.Second - my)) / x.Sum(v => (v - mx) * (v - mx));
        Assert.True(ordinary < 1.0125 - (4 * ch2.GainSd), $"least squares {ordinary} should be attenuated");
        Assert.InRange(ch2.Gain, 1.0125 - (3 * ch2.GainSd), 1.0125 + (3 * ch2.GainSd));
    }

    [Fact]
    public void DemingLine_EqualErrorVariances_IsThePrincipalAxisOfTheScatter()
    {
        // Pearson (1901): with equal error variances the Deming line is the major axis of the scatter, the first
        // singular vector of the centred data; computed here independently with MathNet's SVD.
        var random = new Random(5);
        var x = Enumerable.Range(0, 500).Select(i => (i / 50.0) + random.NextDouble()).ToArray();
        var y = x.Select(v => (0.7 * v) + (2 * random.NextDouble())).ToArray();
        var (mx, my) = (x.Average(), y.Average());
        var (slope, intercept, _, _, _) = DemingSums.Of(x, y, mx, my).Line(1.0);
        var data = MathNet.Numerics.LinearAlgebra.Matrix<double>.Build.Dense(x.Length, 2, (i, j) => j == 0 ? x[i] - mx : y[i] - my);
        var axis = data.Svd().VT.Row(0);

        Assert.Equal(axis[1] / axis[0], slope, 1e-10);
        Assert.Equal(0, intercept, 1e-10);
    }

    [Fact]
    public void Calibrate_ProbeOnAnotherNode_SaysTheProbesDidNotSeeOneSignal()
    {
        var node = CalibrationCaptures.TwoTones(20_000, 4.0);
        var other = CalibrationCaptures.TwoTones(20_000, 4.0).Select((v, i) => v + (0.8 * Math.Sin(i / 41.0))).ToArray();
        var first = CalibrationCaptures.FromNode(node, 1e-5, [1.0], [0], [5.0], 0.01, seed: 6);
        var second = CalibrationCaptures.FromNode(other, 1e-5, [1.0], [0], [5.0], 0.01, seed: 7);
        var capture = new Patchproof.Core.Captures.Capture(first.TimeBase, [first.Channels[0], second.Channels[0] with { Name = "CH2" }], []);

        var result = ProbeCalibrator.Calibrate(capture, [], Clock);

        Assert.Equal(ProbeCalibrationStatus.NotOneSignal, result.Status);
        Assert.False(result.IsUsable);
        Assert.Contains(result.Findings, f => f.StartsWith("CH2 does not follow CH1", StringComparison.Ordinal));
    }

    [Fact]
    public void Calibrate_SignalOfTwoSteps_SaysTheSwingIsTooSmall()
    {
        var node = CalibrationCaptures.TwoTones(20_000, 0.08);
        var capture = CalibrationCaptures.FromNode(node, 1e-5, [1.0, 1.01], [0, 0], [5.0, 5.0], 0.01, seed: 8);

        var result = ProbeCalibrator.Calibrate(capture, [], Clock);

        Assert.Equal(ProbeCalibrationStatus.TooLittleSignal, result.Status);
        Assert.Contains(result.Findings, f => f.Contains("quantization steps", StringComparison.Ordinal));
    }

    [Fact]
    public void Calibrate_OneChannel_IsTooFewChannels()
    {
        var capture = CalibrationCaptures.FromNode(CalibrationCaptures.TwoTones(1000, 4.0), 1e-5, [1.0], [0], [5.0], 0.01, seed: 9);

        var result = ProbeCalibrator.Calibrate(capture, [], Clock);

        Assert.Equal(ProbeCalibrationStatus.TooFewChannels, result.Status);
        Assert.Null(result.Calibration);
    }

    [Fact]
    public void Calibrate_UnknownReferenceChannel_NamesIt()
    {
        var capture = CalibrationCaptures.FromNode(CalibrationCaptures.TwoTones(1000, 4.0), 1e-5, [1.0, 1.0], [0, 0], [5.0, 5.0], 0.01, seed: 10);

        var result = ProbeCalibrator.Calibrate(capture, [], new ProbeCalibrationOptions { ReferenceChannel = "CH7" }, Clock);

        Assert.Equal(ProbeCalibrationStatus.TooFewChannels, result.Status);
        Assert.Contains("CH7", result.Findings[0], StringComparison.Ordinal);
    }
}
