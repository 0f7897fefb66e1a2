using Patchproof.Core.Captures.Checks;

namespace Patchproof.Core.Tests.Captures.Checks;

public sealed class TimeBaseCheckTests
{
    private const double Dt = 1e-6;

    [Fact]
    public void Run_UniformTimeBase_ReportsIntervalRateAndDuration()
    {
        var result = Assert.Single(new TimeBaseCheck().Run(CheckSignals.Uniform(2e-6, new float[1001]), CaptureCheckContext.WithoutModel));

        Assert.Equal(DiagnosticSeverity.Info, result.Severity);
        Assert.Equal(500_000, result.Values["sampleRateHertz"], 1e-6);
        Assert.Equal(2e-3, result.Values["durationSeconds"], 15);
    }

    [Fact]
    public void Run_GapOfTenSamples_CountsThem()
    {
        var times = Enumerable.Range(0, 1000).Select(i => (i < 500 ? i : i + 10) * Dt).ToArray();

        var results = new TimeBaseCheck().Run(CheckSignals.Explicit(times, new float[1000]), CaptureCheckContext.WithoutModel).ToList();

        var gaps = Assert.Single(results, r => r.Id == "time-base-gaps");
        Assert.Equal(1, gaps.Values["gaps"]);
        Assert.Equal(10, gaps.Values["missingSamples"]);
    }

    [Fact]
    public void Run_RepeatedAndBackwardSteps_AreReported()
    {
        var times = Enumerable.Range(0, 100).Select(i => i * Dt).ToArray();
        times[10] = times[9];
        times[50] = times[48];

        var results = new TimeBaseCheck().Run(CheckSignals.Explicit(times, new float[100]), CaptureCheckContext.WithoutModel).ToList();

        Assert.Equal(DiagnosticSeverity.Error, Assert.Single(results, r => r.Id == "time-base-backwards").Severity);
        Assert.Equal(1, Assert.Single(results, r => r.Id == "time-base-repeats").Values["repeatedSamples"]);
    }

    [Theory]
    [InlineData(0.02, DiagnosticSeverity.Warning)]
    [InlineData(0.005, DiagnosticSeverity.Info)]
    public void Run_UniformlyJitteredTimes_MeasureTheDerivedJitter(double relativeJitter, DiagnosticSeverity severity)
    {
        // Derived: t_i = i dt + u_i with u_i uniform on [-a, a] gives steps of standard deviation sqrt(2/3) a.
        var a = relativeJitter * Dt / Math.Sqrt(2.0 / 3.0);
        var random = new Random(5);
        var times = Enumerable.Range(0, 100_000).Select(i => (i * Dt) + (a * ((2 * random.NextDouble()) - 1))).ToArray();

        var result = Assert.Single(new TimeBaseCheck().Run(CheckSignals.Explicit(times, new float[times.Length]), CaptureCheckContext.WithoutModel), r => r.Id == "time-base-jitter");

        Assert.Equal(severity, result.Severity);
        Assert.Equal(relativeJitter, result.Values["relativeJitter"], relativeJitter * 0.05);
    }
}
