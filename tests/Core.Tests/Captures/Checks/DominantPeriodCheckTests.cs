using Patchproof.Core.Captures.Checks;

namespace Patchproof.Core.Tests.Captures.Checks;

public sealed class DominantPeriodCheckTests
{
    [Theory]
    [InlineData(10.0, DiagnosticSeverity.Warning)]
    [InlineData(25.0, DiagnosticSeverity.Info)]
    [InlineData(102.4, DiagnosticSeverity.Info)]
    public void Run_SineOfKnownPeriod_CountsSamplesPerPeriod(double samplesPerPeriod, DiagnosticSeverity severity)
    {
        var x = CheckSignals.Generate(8192, i => Math.Sin(2 * Math.PI * i / samplesPerPeriod));

        var result = Assert.Single(new DominantPeriodCheck().Run(CheckSignals.Uniform(1e-3, x), CaptureCheckContext.WithoutModel), r => r.Id == "samples-per-period");

        Assert.Equal(severity, result.Severity);
        Assert.Equal(samplesPerPeriod, result.Values["samplesPerPeriod"], samplesPerPeriod * 0.01);
    }

    [Theory]
    [InlineData(5, DiagnosticSeverity.Warning)]
    [InlineData(40, DiagnosticSeverity.Info)]
    public void Run_RecordOfKnownLength_CountsDominantPeriods(int periods, DiagnosticSeverity severity)
    {
        const int n = 16_384;
        var x = CheckSignals.Generate(n, i => Math.Sin(2 * Math.PI * periods * i / n));

        var result = Assert.Single(new DominantPeriodCheck().Run(CheckSignals.Uniform(1e-4, x), CaptureCheckContext.WithoutModel), r => r.Id == "record-length");

        Assert.Equal(severity, result.Severity);
        Assert.Equal(periods, result.Values["periodsInRecord"], periods * 0.02);
    }

    [Fact]
    public void Run_SineOnARamp_StillFindsTheSine()
    {
        // The ramp would dominate the lowest bins without removing the least-squares line first.
        var x = CheckSignals.Generate(8192, i => (0.5 * Math.Sin(2 * Math.PI * i / 64.0)) + (i * 1e-3));

        var result = Assert.Single(new DominantPeriodCheck().Run(CheckSignals.Uniform(1e-3, x), CaptureCheckContext.WithoutModel), r => r.Id == "samples-per-period");

        Assert.Equal(64, result.Values["samplesPerPeriod"], 0.5);
    }
}
