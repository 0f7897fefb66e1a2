using Patchproof.Core.Captures;
using Patchproof.Core.Captures.Checks;

namespace Patchproof.Core.Tests.Captures.Checks;

public sealed class ModelAwareCheckTests
{
    private static readonly CaptureCheckContext LorenzZ = new([new ChannelExpectation("CH3", "z", MustHaveNonZeroMean: true)]);

    [Fact]
    public void AcCoupling_ZWithItsMean_IsFine()
    {
        // Lorenz (10, 28, 8/3): z stays between about 1 and 48 with a mean near 23.5 (from memory); here 0.1 V per unit.
        var z = CheckSignals.Generate(10_000, i => 0.1 * (23.5 + (8 * Math.Sin(i * 0.01))));
        var capture = CheckSignals.Uniform(1e-5, new float[10_000], new float[10_000], z);

        Assert.Empty(new AcCouplingCheck().Run(capture, LorenzZ));
    }

    [Fact]
    public void AcCoupling_ZCentredOnZero_WarnsOfAcCoupling()
    {
        var z = CheckSignals.Generate(10_000, i => 0.8 * Math.Sin(i * 0.01));
        var capture = CheckSignals.Uniform(1e-5, new float[10_000], new float[10_000], z);

        var result = Assert.Single(new AcCouplingCheck().Run(capture, LorenzZ));

        Assert.Equal(DiagnosticSeverity.Warning, result.Severity);
        Assert.Equal("CH3", result.Channel);
    }

    [Fact]
    public void AcCoupling_WithoutExpectations_DoesNothing()
    {
        var capture = CheckSignals.Uniform(1e-5, CheckSignals.Generate(100, i => Math.Sin(i)));

        Assert.Empty(new AcCouplingCheck().Run(capture, CaptureCheckContext.WithoutModel));
    }

    [Fact]
    public void Inspection_ExtraCheck_RunsAfterTheStandardOnes()
    {
        var capture = CheckSignals.Uniform(1e-5, CheckSignals.Generate(1000, i => Math.Sin(i * 0.1)));

        var results = CaptureInspection.Run(capture, null, [new AlwaysCheck()]);

        Assert.Equal("always", results[^1].Id);
        Assert.Contains(results, r => r.Id == "dc-level");
    }

    private sealed class AlwaysCheck : ICaptureCheck
    {
        public string Id => "always";

        public IEnumerable<CaptureCheckResult> Run(Capture capture, CaptureCheckContext context) =>
            [new CaptureCheckResult(Id, DiagnosticSeverity.Info, null, "ran", new Dictionary<string, double>())];
    }
}
