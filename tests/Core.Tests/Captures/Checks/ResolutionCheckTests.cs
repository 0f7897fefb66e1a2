using Patchproof.Core.Captures.Checks;

namespace Patchproof.Core.Tests.Captures.Checks;

public sealed class ResolutionCheckTests
{
    [Theory]
    [InlineData(0.040, 51, DiagnosticSeverity.Warning)]
    [InlineData(0.010, 201, DiagnosticSeverity.Info)]
    public void Run_QuantizedSine_ReportsLevelsStepAndBits(double stepVolts, int levels, DiagnosticSeverity severity)
    {
        // A +/-1 V sine quantized to the step uses 2/step + 1 levels: log2(levels) effective bits (derived).
        var x = CheckSignals.Generate(50_000, i => CheckSignals.Quantize(Math.Sin(2 * Math.PI * i / 5000.0), stepVolts));

        var result = Assert.Single(new ResolutionCheck().Run(CheckSignals.Uniform(1e-6, x), CaptureCheckContext.WithoutModel));

        Assert.Equal(severity, result.Severity);
        Assert.Equal(levels, result.Values["distinctLevels"]);
        Assert.Equal(stepVolts * 1e3, result.Values["stepMillivolts"], 1e-3);
        Assert.Equal(Math.Log2(levels), result.Values["effectiveBits"], 1e-4);
    }

    [Fact]
    public void Run_FlatChannel_IsAnError()
    {
        var result = Assert.Single(new ResolutionCheck().Run(CheckSignals.Uniform(1e-6, new float[100]), CaptureCheckContext.WithoutModel));

        Assert.Equal(DiagnosticSeverity.Error, result.Severity);
    }

    [Fact]
    public void Run_ContinuousValues_ReportNoStep()
    {
        var noise = CheckSignals.Gaussian(3);
        var x = CheckSignals.Generate(10_000, _ => noise());

        var result = Assert.Single(new ResolutionCheck().Run(CheckSignals.Uniform(1e-6, x), CaptureCheckContext.WithoutModel));

        Assert.Equal(DiagnosticSeverity.Info, result.Severity);
        Assert.False(result.Values.ContainsKey("stepMillivolts"));
    }
}
