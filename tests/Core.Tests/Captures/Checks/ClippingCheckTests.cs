using Patchproof.Core.Captures;
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
    [Fact]
    public void Run_SignalRestingOnAFloorInsideTheStatedWindow_IsNotClipped()
    {
        // A spiky signal that rests within one step of zero between spikes, like a Rössler z, on a screen of 8 divisions
        // at 0.25 V/div centred on 0.8 V (-0.2 V to 1.8 V): its lowest level is far from the window's edges.
        var x = CheckSignals.Generate(20_000, i => CheckSignals.Quantize(0.002 + Math.Pow(Math.Max(0, Math.Sin(2 * Math.PI * i / 2000.0)), 40), Step));
        var plain = CheckSignals.Uniform(1e-6, x);
        var withWindow = new Capture(plain.TimeBase, plain.Channels, [new("CH1 V/div", "0.25", "V", null, null, 1), new("CH1 position", "0.8", "V", null, null, 2)]);

        var without = new ClippingCheck().Run(plain, CaptureCheckContext.WithoutModel).ToList();
        var with = new ClippingCheck().Run(withWindow, CaptureCheckContext.WithoutModel).ToList();

        Assert.Contains(without, r => r.Message.Contains("bottom", StringComparison.Ordinal));
        Assert.Empty(with);
    }

    [Fact]
    public void Run_ClippedAtTheStatedWindowEdge_StillFindsIt()
    {
        // Window 8 x 0.25 V centred on 0: -1 V to 1 V; the sine overdriven by a quarter is pinned at both edges.
        var x = CheckSignals.Generate(100_000, i => CheckSignals.Quantize(Math.Clamp(1.25 * Math.Sin(2 * Math.PI * i / 1000.0), -1, 1 - Step), Step));
        var plain = CheckSignals.Uniform(1e-6, x);
        var withWindow = new Capture(plain.TimeBase, plain.Channels, [new("CH1 V/div", "250 mV", null, null, null, 1), new("CH1 position", "0", "V", null, null, 2)]);

        var results = new ClippingCheck().Run(withWindow, CaptureCheckContext.WithoutModel).ToList();

        Assert.Equal(2, results.Count);
    }

    [Fact]
    public void TryRead_WindowThatDoesNotHoldTheSamples_IsIgnored()
    {
        // A position convention other than the screen centre shows as samples outside the window: nothing is inferred.
        var metadata = new List<MetadataEntry> { new("CH1 V/div", "0.25", "V", null, null, 1), new("CH1 position", "-3", "div", null, null, 2) };

        Assert.Null(ScopeWindow.TryRead(metadata, "CH1", -0.5, 0.5));
        Assert.Equal(new ScopeWindow(-1, 1), ScopeWindow.TryRead([new("ch1 volts/div", "0.25", null, null, null, 1), new("CH1 offset", "0 V", null, null, null, 2)], "CH1", -0.5, 0.5));
    }
}
