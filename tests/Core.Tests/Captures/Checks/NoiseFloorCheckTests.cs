using Patchproof.Core.Captures.Checks;

namespace Patchproof.Core.Tests.Captures.Checks;

public sealed class NoiseFloorCheckTests
{
    [Theory]
    [InlineData(0.010)]
    [InlineData(0.050)]
    public void Run_SineWithKnownGaussianNoise_EstimatesItsRms(double sigmaVolts)
    {
        var noise = CheckSignals.Gaussian(7);
        var x = CheckSignals.Generate(200_000, i => Math.Sin(2 * Math.PI * i / 2000.0) + (sigmaVolts * noise()));

        var result = Assert.Single(new NoiseFloorCheck().Run(CheckSignals.Uniform(1e-6, x), CaptureCheckContext.WithoutModel));

        Assert.Equal(sigmaVolts * 1e3, result.Values["noiseRmsMillivolts"], sigmaVolts * 1e3 * 0.03);
    }

    [Theory]
    [InlineData(0.10, DiagnosticSeverity.Warning)]
    [InlineData(0.05, DiagnosticSeverity.Info)]
    public void Run_SignalToNoiseAroundTwentyDecibels_WarnsBelowTheLimit(double sigmaVolts, DiagnosticSeverity severity)
    {
        // Derived: a 1 V sine has 1/sqrt(2) V rms; SNR = 20 log10(0.7071 / sigma) = 17.0 dB at 0.1 V, 23.0 dB at 0.05 V.
        var noise = CheckSignals.Gaussian(11);
        var x = CheckSignals.Generate(200_000, i => Math.Sin(2 * Math.PI * i / 2000.0) + (sigmaVolts * noise()));

        var result = Assert.Single(new NoiseFloorCheck().Run(CheckSignals.Uniform(1e-6, x), CaptureCheckContext.WithoutModel));

        Assert.Equal(severity, result.Severity);
        Assert.Equal(20 * Math.Log10(Math.Sqrt(0.5 + (sigmaVolts * sigmaVolts)) / sigmaVolts), result.Values["snrDecibels"], 0.5);
    }
}
