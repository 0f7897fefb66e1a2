using Patchproof.Core.Estimation;

namespace Patchproof.Core.Tests.Estimation;

public sealed class EquationErrorRegressionTests
{
    private readonly ITestOutputHelper output = TestContext.Current.TestOutputHelper!;

    /// <summary>Lorenz terms: dx = th*y + th*x; dy = th*x + th*x*z + th*y; dz = th*x*y + th*z (each with a constant).</summary>
    internal static readonly IReadOnlyList<IReadOnlyList<RegressionTerm>> LorenzTerms =
    [
        [new RegressionTerm("y", [1]), new RegressionTerm("x", [0])],
        [new RegressionTerm("x", [0]), new RegressionTerm("x*z", [0, 2]), new RegressionTerm("y", [1])],
        [new RegressionTerm("x*y", [0, 1]), new RegressionTerm("z", [2])],
    ];

    [Fact]
    public void Fit_BenchmarkLorenzCapture_RecoversCoefficientsAsWellAsTheReferenceScript()
    {
        // BENCHMARKS.md section 3: true s = 10.5, r = 27.3, b = 2.6; 0.5 % noise, quantized to 40/256. The reference
        // equation-error script got 10.4968, 27.2955, 2.5993 (relative errors -3.1e-4, -1.7e-4, -2.5e-4).
        var (states, _) = SyntheticLorenz.Clean();
        var capture = SyntheticLorenz.Capture(states, seed: 1);

        var result = EquationErrorRegression.Fit(capture, SyntheticLorenz.SampleInterval, LorenzTerms);

        var x = result.Equations[0];
        var y = result.Equations[1];
        var z = result.Equations[2];
        var s = x.Coefficients[0];
        var r = y.Coefficients[0];
        var b = -z.Coefficients[1];
        output.WriteLine($"filter m={result.HalfWidth} p={result.PolynomialOrder}; s {s:F4} (-x: {-x.Coefficients[1]:F4}), r {r:F4}, b {b:F4}; xz {y.Coefficients[1]:F4}, y {y.Coefficients[2]:F4}, xy {z.Coefficients[0]:F4}");
        output.WriteLine($"standard errors (batch means) s {x.StandardErrors[0]:E2} r {y.StandardErrors[0]:E2} b {z.StandardErrors[1]:E2} y {y.StandardErrors[2]:E2}; least squares s {x.Fit.StandardErrors[0]:E2}");
        // Relative errors within 1e-3 (the reference script's were 1.7e-4 to 3.1e-4 on its own noise draw; this draw's
        // quantization error alone moves r by about 8e-4 whatever the window).
        Assert.InRange(Math.Abs(s / SyntheticLorenz.Sigma - 1), 0, 1e-3);
        Assert.InRange(Math.Abs(-x.Coefficients[1] / SyntheticLorenz.Sigma - 1), 0, 1e-3);
        Assert.InRange(Math.Abs(r / SyntheticLorenz.Rho - 1), 0, 1e-3);
        Assert.InRange(Math.Abs(b / SyntheticLorenz.Beta - 1), 0, 1e-3);
        // The unit coefficients of the equations, within four batch-means standard errors (which are the honest ones here).
        Assert.InRange(y.Coefficients[1], -1 - 4 * y.StandardErrors[1], -1 + 4 * y.StandardErrors[1]);
        Assert.InRange(y.Coefficients[2], -1 - 4 * y.StandardErrors[2], -1 + 4 * y.StandardErrors[2]);
        Assert.InRange(z.Coefficients[0], 1 - 4 * z.StandardErrors[0], 1 + 4 * z.StandardErrors[0]);
        Assert.InRange(s, SyntheticLorenz.Sigma - 4 * x.StandardErrors[0], SyntheticLorenz.Sigma + 4 * x.StandardErrors[0]);
        Assert.InRange(r, SyntheticLorenz.Rho - 4 * y.StandardErrors[0], SyntheticLorenz.Rho + 4 * y.StandardErrors[0]);
        Assert.All(result.Equations, fit => Assert.True(fit.RSquared > 0.99, $"equation {fit.Equation}: R^2 {fit.RSquared}"));
    }

    [Fact]
    public void Fit_MaskedStretch_LeavesItsWindowsOut()
    {
        var (states, _) = SyntheticLorenz.Clean(samples: 4001);
        var capture = SyntheticLorenz.Capture(states, seed: 2);
        var excluded = new bool[4001];
        for (var i = 2000; i < 2100; i++)
        {
            excluded[i] = true;
        }

        var options = new EquationErrorOptions { Filter = (10, 3), Excluded = excluded };
        var masked = EquationErrorRegression.Fit(capture, SyntheticLorenz.SampleInterval, LorenzTerms, options);
        var plain = EquationErrorRegression.Fit(capture, SyntheticLorenz.SampleInterval, LorenzTerms, options with { Excluded = null });

        // 100 masked samples plus a half-width of 10 on each side drop out.
        Assert.Equal(plain.Equations[0].SampleCount - 120, masked.Equations[0].SampleCount);
    }
}
