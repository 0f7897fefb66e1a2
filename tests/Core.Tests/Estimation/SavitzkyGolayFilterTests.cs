using System.Text.Json;
using Patchproof.Core.Estimation;
using Patchproof.TestSupport;

namespace Patchproof.Core.Tests.Estimation;

public sealed class SavitzkyGolayFilterTests
{
    public static TheoryData<int, int, int, double[]> PublishedRows()
    {
        // Savitzky & Golay 1964 tables with the Steinier et al. 1972 corrections (tests/ReferenceData/savitzky-golay-coefficients.json).
        using var document = JsonDocument.Parse(File.ReadAllText(ReferenceDataFiles.PathOf("savitzky-golay-coefficients.json")));
        var rows = new TheoryData<int, int, int, double[]>();
        foreach (var row in document.RootElement.GetProperty("table").EnumerateArray())
        {
            var norm = row.GetProperty("norm").GetDouble();
            rows.Add(row.GetProperty("window").GetInt32(), row.GetProperty("polyorder").GetInt32(), row.GetProperty("deriv").GetInt32(),
                row.GetProperty("numerators").EnumerateArray().Select(value => value.GetDouble() / norm).ToArray());
        }

        return rows;
    }

    [Theory]
    [MemberData(nameof(PublishedRows))]
    public void Coefficients_PublishedTableRow_MatchTo1e14(int window, int order, int derivative, double[] expected)
    {
        var filter = new SavitzkyGolayFilter((window - 1) / 2, order, derivative);

        var actual = filter.Coefficients.ToArray();

        Assert.Equal(expected.Length, actual.Length);
        for (var i = 0; i < expected.Length; i++)
        {
            Assert.True(Math.Abs(actual[i] - expected[i]) <= 1e-14, $"coefficient {i}: {actual[i]:R} vs {expected[i]:R}");
        }
    }

    [Theory]
    [InlineData(2, 2, 0)]
    [InlineData(5, 3, 1)]
    [InlineData(10, 4, 2)]
    [InlineData(12, 5, 3)]
    [InlineData(25, 6, 1)]
    public void Apply_PolynomialOfFilterDegree_ReturnsExactDerivativeEverywhereIncludingEnds(int halfWidth, int order, int derivative)
    {
        // Derived (least-squares property): a degree-p fit reproduces any polynomial of degree <= p exactly.
        var random = new Random(halfWidth * 31 + order);
        var coefficients = Enumerable.Range(0, order + 1).Select(_ => random.NextDouble() * 2 - 1).ToArray();
        const double h = 0.01;
        var n = 4 * halfWidth + 7;
        var samples = Enumerable.Range(0, n).Select(k => Polynomial(coefficients, 0, (k - n / 2) * h)).ToArray();
        var filtered = new double[n];

        new SavitzkyGolayFilter(halfWidth, order, derivative).Apply(samples, h, filtered);

        var scale = Enumerable.Range(0, n).Max(k => Math.Abs(Polynomial(coefficients, derivative, (k - n / 2) * h))) + 1e-300;
        for (var k = 0; k < n; k++)
        {
            var exact = Polynomial(coefficients, derivative, (k - n / 2) * h);
            Assert.True(Math.Abs(filtered[k] - exact) <= 1e-9 * Math.Max(scale, 1.0), $"sample {k}: {filtered[k]:R} vs {exact:R}");
        }
    }

    [Fact]
    public void Coefficients_AnyOrderAndWidth_ReproduceMonomialsAtCentreTo1e12()
    {
        // Derived: sum_i c_i i^q = d! when q = d and 0 otherwise, for q <= p (the moment conditions).
        for (var m = 1; m <= 30; m += 3)
        {
            for (var p = 0; p <= Math.Min(6, 2 * m); p++)
            {
                for (var d = 0; d <= p; d++)
                {
                    var c = new SavitzkyGolayFilter(m, p, d).Coefficients;
                    for (var q = 0; q <= p; q++)
                    {
                        var moment = 0.0;
                        for (var i = -m; i <= m; i++)
                        {
                            moment += c[i + m] * Math.Pow(i, q);
                        }

                        var expected = q == d ? Factorial(d) : 0.0;
                        Assert.True(Math.Abs(moment - expected) <= 1e-12 * Math.Max(1, Math.Pow(m, q)), $"m={m} p={p} d={d} q={q}: {moment}");
                    }
                }
            }
        }
    }

    [Fact]
    public void ApplyMasked_ExcludedStretch_NaNsExactlyTheSamplesWhoseWindowTouchesIt()
    {
        const int m = 3;
        var samples = Enumerable.Range(0, 40).Select(k => Math.Sin(0.1 * k)).ToArray();
        var excluded = new bool[40];
        excluded[20] = excluded[21] = true;
        excluded[1] = true;
        var filtered = new double[40];

        var count = new SavitzkyGolayFilter(m, 2).ApplyMasked(samples, excluded, 1.0, filtered);

        for (var k = 0; k < 40; k++)
        {
            var start = Math.Clamp(k - m, 0, 40 - (2 * m + 1));
            var touches = Enumerable.Range(start, 2 * m + 1).Any(i => excluded[i]);
            Assert.Equal(touches, double.IsNaN(filtered[k]));
        }

        Assert.Equal(filtered.Count(double.IsNaN), count);
    }

    [Fact]
    public void Apply_RecordShorterThanWindow_Throws()
    {
        var filter = new SavitzkyGolayFilter(5, 3, 1);

        Assert.Throws<ArgumentOutOfRangeException>(() => filter.Apply(new double[10], 1.0, new double[10]));
    }

    [Fact]
    public void Constructor_DerivativeAboveOrder_Throws()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new SavitzkyGolayFilter(5, 2, 3));
    }

    private static double Polynomial(double[] coefficients, int derivative, double t)
    {
        var sum = 0.0;
        for (var j = derivative; j < coefficients.Length; j++)
        {
            var falling = 1.0;
            for (var i = 0; i < derivative; i++)
            {
                falling *= j - i;
            }

            sum += coefficients[j] * falling * Math.Pow(t, j - derivative);
        }

        return sum;
    }

    private static double Factorial(int n) => n <= 1 ? 1 : n * Factorial(n - 1);
}
