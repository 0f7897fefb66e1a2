using Patchproof.Core.Captures.Checks;

namespace Patchproof.Core.Tests.Captures.Checks;

public sealed class ClippingCheckTests
{
    private const double Step = 2.0 / 256;

    [Fact]
    public void Run_FullScaleQuantizedSine_DoesNotCallItClipped()
    {
        // An 8-bit scope reading a sine that just fills the screen: the peak dwells on its top level, but is not pinned.
        var x = CheckSignals.Generate(100_000, i => CheckSignals.Quantize(Math.Sin(2 * Math.PI * i / 1000.0), Step));

        var results = new ClippingCheck().Run(CheckSignals.Uniform(1e-6, x), CaptureCheckContext.WithoutModel).ToList();

        Assert.Empty(results);
    }

    [Fact]
    public void Run_SineOverdrivenByAQuarter_FindsTheKnownFractionAtEachRail()
    {
        // Derived: a sine of amplitude A spends (pi - 2 asin(u / A)) / (2 pi) of each period above u. Clipped at the 8-bit
        // range, the top level collects everything above 1 - 1.5 steps, the bottom level everything below -1 + 0.5 step.
        var x = CheckSignals.Generate(100_000, i => CheckSignals.Quantize(Math.Clamp(1.25 * Math.Sin(2 * Math.PI * i / 1000.0), -1, 1 - Step), Step));
        static double Above(double u) => (Math.PI - (2 * Math.Asin(u / 1.25))) / (2 * Math.PI);

        var results = new ClippingCheck().Run(CheckSignals.Uniform(1e-6, x), CaptureCheckContext.WithoutModel).ToList();

        Assert.Equal(2, results.Count);
        Assert.All(results, r => Assert.Equal(DiagnosticSeverity.Warning, r.Severity));
        Assert.Equal(Above(1 - (1.5 * Step)), results[0].Values["fractionAtLevel"], 0.002);
        Assert.Equal(Above(1 - (0.5 * Step)), results[1].Values["fractionAtLevel"], 0.002);
        Assert.Equal(100, results[0].Values["runs"]);
    }

    [Fact]
    public void Run_RunsShorterThanTheMinimum_AreNotClipping()
    {
        var x = CheckSignals.Generate(10_000, i => i % 500 < ClippingCheck.MinimumRun - 1 ? 1.0 : Math.Sin(i * 0.01) * 0.9);

        Assert.Empty(new ClippingCheck().Run(CheckSignals.Uniform(1e-6, x), CaptureCheckContext.WithoutModel));
    }
}
