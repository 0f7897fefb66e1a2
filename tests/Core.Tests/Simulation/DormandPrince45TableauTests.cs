using System.Numerics;
using System.Text.Json;
using Patchproof.Core.Simulation;
using Patchproof.TestSupport;

namespace Patchproof.Core.Tests.Simulation;

/// <summary>Checks the tableau against dopri5-tableau.json: Dormand &amp; Prince (1980); Hairer, Nørsett &amp; Wanner,
/// Solving ODE I (1993) Sec. II.5 Table 5.2 and DOPRI5's CDOPRI/CONTD5; Shampine (1986) for the dense output.</summary>
public sealed class DormandPrince45TableauTests
{
    private static readonly ButcherTableau Tableau = DormandPrince45Tableau.Instance;
    private static readonly JsonElement Reference = JsonDocument.Parse(File.ReadAllText(ReferenceDataFiles.PathOf("dopri5-tableau.json"))).RootElement;

    [Fact]
    public void Coefficients_EqualThePublishedRationals_ToTheLastBit()
    {
        // Dormand & Prince 1980 / Hairer et al. 1993 Table 5.2 (dopri5-tableau.json, exact rationals).
        AssertExact(Reference.GetProperty("c"), Tableau.C);
        AssertExact(Reference.GetProperty("b_order5"), Tableau.B);
        AssertExact(Reference.GetProperty("e_hairer_b_minus_bhat"), Tableau.E);
        var rows = Reference.GetProperty("A_lower_rows");
        for (var i = 0; i < Tableau.StageCount; i++)
        {
            AssertExact(rows[i], Tableau.A[i]);
        }

        var p = Reference.GetProperty("dense_output_scipy_P").GetProperty("P");
        for (var i = 0; i < Tableau.StageCount; i++)
        {
            AssertExact(p[i], Tableau.P[i]);
        }
    }

    [Fact]
    public void DenseWeights_EqualHairersContd5Coefficients()
    {
        // Hairer et al. 1993, DOPRI5 CONTD5: d_i equals the last column of P (dopri5-tableau.json).
        var d = Reference.GetProperty("dense_output_hairer_contd5").GetProperty("d");
        for (var i = 0; i < Tableau.StageCount; i++)
        {
            Assert.Equal(ParseRational(d[i].GetProperty("exact").GetString()!), Tableau.P[i][3]);
        }
    }

    [Fact]
    public void RowSumsOfA_EqualC()
    {
        for (var i = 0; i < Tableau.StageCount; i++)
        {
            Assert.Equal(Tableau.C[i], Tableau.A[i].Sum(), 1e-15);
        }
    }

    [Fact]
    public void Weights_SumToOne_AndErrorWeightsSumToZero()
    {
        Assert.Equal(1.0, Tableau.B.Sum(), 1e-15);
        Assert.Equal(0.0, Tableau.E.Sum(), 1e-16);
    }

    [Fact]
    public void Weights_SatisfyAllSeventeenOrderConditionsUpToOrderFive()
    {
        // Butcher's order conditions for the rooted trees of order <= 5 (Hairer et al. 1993, Sec. II.2, Table 2.2).
        var residuals = OrderConditionResiduals(Tableau.B.ToArray());
        Assert.Equal(17, residuals.Count);
        Assert.All(residuals, residual => Assert.True(Math.Abs(residual) < 1e-14, $"order-condition residual {residual}"));
    }

    [Fact]
    public void EmbeddedWeights_SatisfyOrderFour_ButNotOrderFive()
    {
        // b̂ = b - e has order 4; sum(b̂ c^4) = 53929/270000 != 1/5 (dopri5-tableau.json, computed exactly).
        var bHat = Tableau.B.Zip(Tableau.E, (b, e) => b - e).ToArray();
        var residuals = OrderConditionResiduals(bHat);
        Assert.All(residuals.Take(8), residual => Assert.True(Math.Abs(residual) < 1e-14, $"order-4 residual {residual}"));
        var sumC4 = bHat.Select((weight, i) => weight * Math.Pow(Tableau.C[i], 4)).Sum();
        Assert.Equal(53929.0 / 270000.0, sumC4, 1e-15);
    }

    [Fact]
    public void DenseOutput_AtThetaOne_ReproducesTheWeights()
    {
        // Σ_j P[i][j] = b_i (dopri5-tableau.json, verified exactly with sympy).
        for (var i = 0; i < Tableau.StageCount; i++)
        {
            Assert.Equal(Tableau.B[i], Tableau.P[i].Sum(), 1e-15);
        }
    }

    [Fact]
    public void StabilityPolynomial_IsTheTaylorPolynomialPlusZ6Over600()
    {
        // R(z) = Σ_{k<=5} z^k/k! + z^6/600, derived from the tableau (dopri5-tableau.json): coefficient k is b A^(k-1) 1.
        double[] expected = [1.0 / 1, 1.0 / 2, 1.0 / 6, 1.0 / 24, 1.0 / 120, 1.0 / 600];
        var s = Tableau.StageCount;
        var vector = Enumerable.Repeat(1.0, s).ToArray();
        for (var k = 0; k < expected.Length; k++)
        {
            var coefficient = Tableau.B.Select((weight, i) => weight * vector[i]).Sum();
            Assert.Equal(expected[k], coefficient, 1e-15);
            vector = MultiplyA(vector);
        }
    }

    [Fact]
    public void Tableau_IsFirstSameAsLast_WithOrdersFiveAndFour()
    {
        Assert.True(Tableau.IsFirstSameAsLast);
        Assert.Equal(7, Tableau.StageCount);
        Assert.Equal(5, Tableau.Order);
        Assert.Equal(4, Tableau.ErrorEstimatorOrder);
    }

    private static List<double> OrderConditionResiduals(double[] b)
    {
        var c = Tableau.C.ToArray();
        var ac = MultiplyA(c);
        var c2 = c.Select(x => x * x).ToArray();
        var c3 = c.Select(x => x * x * x).ToArray();
        var ac2 = MultiplyA(c2);
        var aac = MultiplyA(ac);
        var cac = c.Zip(ac, (x, y) => x * y).ToArray();
        double Dot(double[] v) => b.Select((weight, i) => weight * v[i]).Sum();
        double[] Times(double[] u, double[] v) => u.Zip(v, (x, y) => x * y).ToArray();
        return
        [
            Dot(Enumerable.Repeat(1.0, b.Length).ToArray()) - 1,
            Dot(c) - (1.0 / 2),
            Dot(c2) - (1.0 / 3),
            Dot(ac) - (1.0 / 6),
            Dot(c3) - (1.0 / 4),
            Dot(cac) - (1.0 / 8),
            Dot(ac2) - (1.0 / 12),
            Dot(aac) - (1.0 / 24),
            Dot(Times(c2, c2)) - (1.0 / 5),
            Dot(Times(c2, ac)) - (1.0 / 10),
            Dot(Times(ac, ac)) - (1.0 / 20),
            Dot(Times(c, ac2)) - (1.0 / 15),
            Dot(Times(c, aac)) - (1.0 / 30),
            Dot(MultiplyA(c3)) - (1.0 / 20),
            Dot(MultiplyA(cac)) - (1.0 / 40),
            Dot(MultiplyA(ac2)) - (1.0 / 60),
            Dot(MultiplyA(aac)) - (1.0 / 120),
        ];
    }

    private static double[] MultiplyA(double[] v) =>
        Tableau.A.Select(row => row.Select((entry, j) => entry * v[j]).Sum()).ToArray();

    private static void AssertExact(JsonElement expected, IReadOnlyList<double> actual)
    {
        Assert.Equal(expected.GetArrayLength(), actual.Count);
        for (var i = 0; i < actual.Count; i++)
        {
            var entry = expected[i];
            Assert.Equal(ParseRational(entry.GetProperty("exact").GetString()!), actual[i]);
            Assert.Equal(entry.GetProperty("value").GetDouble(), actual[i]);
        }
    }

    private static double ParseRational(string text)
    {
        var parts = text.Split('/');
        var numerator = BigInteger.Parse(parts[0], System.Globalization.CultureInfo.InvariantCulture);
        var denominator = parts.Length > 1 ? BigInteger.Parse(parts[1], System.Globalization.CultureInfo.InvariantCulture) : BigInteger.One;
        // Both fit exactly in a double here, so one IEEE division is the correctly rounded rational.
        Assert.True(BigInteger.Abs(numerator) < (BigInteger.One << 53) && denominator < (BigInteger.One << 53));
        return (double)numerator / (double)denominator;
    }
}
