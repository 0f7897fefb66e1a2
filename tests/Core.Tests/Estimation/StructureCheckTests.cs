using Patchproof.Core.Estimation;

namespace Patchproof.Core.Tests.Estimation;

public sealed class StructureCheckTests
{
    private static readonly string[] Names = ["x", "y", "z"];

    private readonly ITestOutputHelper output = TestContext.Current.TestOutputHelper!;

    /// <summary>Lorenz (1963) as the design: x' = s(y - x), y' = r x - y - x z, z' = x y - b z.</summary>
    private static IReadOnlyList<IReadOnlyList<double>> LorenzNominal =>
    [
        [SyntheticLorenz.Sigma, -SyntheticLorenz.Sigma],
        [SyntheticLorenz.Rho, -1, -1],
        [1, -SyntheticLorenz.Beta],
    ];

    [Fact]
    public void Run_LorenzCaptureAgainstLorenzDesign_FindsExactlyItsSevenTerms()
    {
        // The structure of Lorenz (1963), J. Atmos. Sci. 20, 130-141, equations (25)-(27): seven terms in all, no others.
        var (states, _) = SyntheticLorenz.Clean();
        var capture = SyntheticLorenz.Capture(states, seed: 21);

        var result = StructureCheck.Run(capture, Names, SyntheticLorenz.SampleInterval, EquationErrorRegressionTests.LorenzTerms, LorenzNominal);

        Report(result);
        Assert.True(result.Passed, result.Message);
        Assert.Equal(7, result.Equations.Sum(e => e.Terms.Count(t => t.Kept)));
        Assert.All(result.Equations.SelectMany(e => e.Terms), t => Assert.Equal(t.Nominal is not null, t.Kept));
    }

    [Fact]
    public void Run_DesignLacksATermTheCaptureHas_ReportsItAsUnexpected()
    {
        // The design leaves out y's x*z term, which the Lorenz capture has.
        var (states, _) = SyntheticLorenz.Clean();
        var capture = SyntheticLorenz.Capture(states, seed: 22);
        IReadOnlyList<IReadOnlyList<RegressionTerm>> design = [EquationErrorRegressionTests.LorenzTerms[0], [new("x", [0]), new("y", [1])], EquationErrorRegressionTests.LorenzTerms[2]];
        IReadOnlyList<IReadOnlyList<double>> nominal = [LorenzNominal[0], [SyntheticLorenz.Rho, -1], LorenzNominal[2]];

        var result = StructureCheck.Run(capture, Names, SyntheticLorenz.SampleInterval, design, nominal);

        Report(result);
        var finding = Assert.Single(result.Findings);
        Assert.Equal(("y", "x*z", StructureFindingKind.UnexpectedTerm), (finding.Equation, finding.Term, finding.Kind));
        Assert.InRange(finding.Estimate, -1.05, -0.95);
        Assert.False(result.Passed);
    }

    [Fact]
    public void Run_DesignHasATermTheCaptureLacks_ReportsItAsMissing()
    {
        // The design expects a y*z term in x' (an input the board should have), which the Lorenz capture does not compute.
        var (states, _) = SyntheticLorenz.Clean();
        var capture = SyntheticLorenz.Capture(states, seed: 23);
        IReadOnlyList<IReadOnlyList<RegressionTerm>> design = [[new("y", [1]), new("x", [0]), new("y*z", [1, 2])], EquationErrorRegressionTests.LorenzTerms[1], EquationErrorRegressionTests.LorenzTerms[2]];
        IReadOnlyList<IReadOnlyList<double>> nominal = [[SyntheticLorenz.Sigma, -SyntheticLorenz.Sigma, 0.5], LorenzNominal[1], LorenzNominal[2]];

        var result = StructureCheck.Run(capture, Names, SyntheticLorenz.SampleInterval, design, nominal);

        Report(result);
        var finding = Assert.Single(result.Findings);
        Assert.Equal(("x", "y*z", StructureFindingKind.MissingTerm), (finding.Equation, finding.Term, finding.Kind));
    }

    [Fact]
    public void Run_DesignTermOfTheWrongSign_ReportsItAsReversed()
    {
        var (states, _) = SyntheticLorenz.Clean();
        var capture = SyntheticLorenz.Capture(states, seed: 24);
        IReadOnlyList<IReadOnlyList<double>> nominal = [LorenzNominal[0], LorenzNominal[1], [-1, -SyntheticLorenz.Beta]];

        var result = StructureCheck.Run(capture, Names, SyntheticLorenz.SampleInterval, EquationErrorRegressionTests.LorenzTerms, nominal);

        Report(result);
        var finding = Assert.Single(result.Findings);
        Assert.Equal(("z", "x*y", StructureFindingKind.ReversedTerm), (finding.Equation, finding.Term, finding.Kind));
    }

    [Fact]
    public void NotPerformed_SaysWhy()
    {
        var result = StructureCheck.NotPerformed("z was not recorded.");

        Assert.False(result.Passed);
        Assert.Equal("Structure check not performed: z was not recorded.", result.Message);
    }

    private void Report(StructureCheckResult result)
    {
        output.WriteLine($"filter m={result.FilterHalfWidth} p={result.FilterOrder}: {result.Message}");
        foreach (var equation in result.Equations)
        {
            output.WriteLine($"{equation.Equation}': R^2 {equation.RSquared:F6}, constant {equation.Constant:G4}; " +
                string.Join("; ", equation.Terms.Select(t => $"{t.Term} {(t.Kept ? "kept" : "pruned")} {t.Estimate:G5} t={t.TValue:G3} size={t.RelativeSize:G3}")));
        }
    }
}
