using Patchproof.Core.Estimation;
using Patchproof.Core.Models;

namespace Patchproof.Core.Tests.Estimation;

public sealed class EquationErrorBasisTests
{
    [Fact]
    public void TryFromModel_Lorenz_GivesTheSevenTermsWithNominalValues()
    {
        // Lorenz (1963): x' = sigma (y - x), y' = rho x - x z - y, z' = x y - beta z, nominal (10, 28, 8/3).
        var ok = EquationErrorBasis.TryFromModel(ModelCatalog.Lorenz.Parse().Terms(), out var basis, out var reason);

        Assert.True(ok, reason);
        Assert.Equal(["y", "x"], basis!.Terms[0].Select(term => term.Name));
        Assert.Equal([0, 2], basis.Terms[1][1].Factors);
        Assert.Equal([28.0, -1.0, -1.0], basis.NominalCoefficients[1]);
        Assert.Equal([1.0, -8.0 / 3.0], basis.NominalCoefficients[2]);
    }

    [Fact]
    public void TryFromModel_LorenzBasis_FitsTheBenchmarkCapture()
    {
        // BENCHMARKS.md section 3 capture through the model's own terms: s, r, b within 1e-3.
        EquationErrorBasis.TryFromModel(ModelCatalog.Lorenz.Parse().Terms(), out var basis, out _);
        var (states, _) = SyntheticLorenz.Clean();

        var result = EquationErrorRegression.Fit(SyntheticLorenz.Capture(states, seed: 1), SyntheticLorenz.SampleInterval, basis!.Terms);

        Assert.InRange(result.Equations[0].Coefficients[0] / SyntheticLorenz.Sigma, 0.999, 1.001);
        Assert.InRange(result.Equations[1].Coefficients[0] / SyntheticLorenz.Rho, 0.999, 1.001);
        Assert.InRange(-result.Equations[2].Coefficients[1] / SyntheticLorenz.Beta, 0.999, 1.001);
    }
}
