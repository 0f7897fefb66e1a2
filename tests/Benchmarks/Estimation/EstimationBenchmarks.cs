using System.Globalization;
using BenchmarkDotNet.Attributes;
using Patchproof.Core.Estimation;
using Patchproof.TestSupport;

namespace Patchproof.Benchmarks.Estimation;

/// <summary>Savitzky-Golay filtering of a long record, the equation-error fit of BENCHMARKS.md section 3, and Levenberg-Marquardt on a NIST set.</summary>
[MemoryDiagnoser]
public class EstimationBenchmarks
{
    private static readonly IReadOnlyList<IReadOnlyList<RegressionTerm>> LorenzTerms =
    [
        [new RegressionTerm("y", [1]), new RegressionTerm("x", [0])],
        [new RegressionTerm("x", [0]), new RegressionTerm("x*z", [0, 2]), new RegressionTerm("y", [1])],
        [new RegressionTerm("x*y", [0, 1]), new RegressionTerm("z", [2])],
    ];

    private readonly SavitzkyGolayFilter filter = new(10, 3, 1);
    private double[] longRecord = [];
    private double[] filtered = [];
    private double[][] capture = [];
    private double[] thurberX = [];
    private double[] thurberY = [];

    [GlobalSetup]
    public void Setup()
    {
        capture = BenchmarkLorenz.Capture(10_001);
        longRecord = BenchmarkLorenz.Capture(100_000)[0];
        filtered = new double[longRecord.Length];
        var rows = File.ReadAllLines(ReferenceDataFiles.PathOf("nist-strd/Thurber.dat"))[60..97]
            .Select(line => line.Split(' ', StringSplitOptions.RemoveEmptyEntries).Select(v => double.Parse(v, CultureInfo.InvariantCulture)).ToArray())
            .ToArray();
        thurberY = rows.Select(r => r[0]).ToArray();
        thurberX = rows.Select(r => r[1]).ToArray();
    }

    /// <summary>Cubic first-derivative filter, window 21, over 100,000 samples.</summary>
    [Benchmark]
    public void SavitzkyGolayFilter100k() => filter.Apply(longRecord, 0.002, filtered);

    /// <summary>Choosing window and order for one 10,001-sample channel.</summary>
    [Benchmark]
    public SavitzkyGolayChoice SavitzkyGolayChoice10k() => SavitzkyGolaySelector.Choose(capture[0], 0.002, 1);

    /// <summary>The whole equation-error fit of the BENCHMARKS.md section 3 capture, filter chosen from the data.</summary>
    [Benchmark]
    public EquationErrorResult EquationErrorLorenz() => EquationErrorRegression.Fit(capture, 0.002, LorenzTerms);

    /// <summary>The equation-error fit with the filter fixed (window 21, cubic), as the reference script did.</summary>
    [Benchmark]
    public EquationErrorResult EquationErrorLorenzFixedFilter() => EquationErrorRegression.Fit(capture, 0.002, LorenzTerms, new EquationErrorOptions { Filter = (10, 3) });

    /// <summary>Levenberg-Marquardt on NIST StRD Thurber (37 observations, 7 parameters) from start 1, analytic Jacobian.</summary>
    [Benchmark]
    public NonlinearFitResult LevenbergMarquardtThurber() =>
        new LevenbergMarquardtFitter().Fit(new NonlinearLeastSquaresProblem(thurberX.Length, 7, ThurberResiduals, ThurberJacobian), [1000, 1000, 400, 40, 0.7, 0.3, 0.03]);

    private void ThurberResiduals(ReadOnlySpan<double> b, Span<double> r)
    {
        for (var i = 0; i < thurberX.Length; i++)
        {
            var x = thurberX[i];
            r[i] = thurberY[i] - (b[0] + x * (b[1] + x * (b[2] + x * b[3]))) / (1 + x * (b[4] + x * (b[5] + x * b[6])));
        }
    }

    private void ThurberJacobian(ReadOnlySpan<double> b, Span<double> jacobian)
    {
        for (var i = 0; i < thurberX.Length; i++)
        {
            var x = thurberX[i];
            var numerator = b[0] + x * (b[1] + x * (b[2] + x * b[3]));
            var denominator = 1 + x * (b[4] + x * (b[5] + x * b[6]));
            var row = jacobian.Slice(i * 7, 7);
            var power = 1.0;
            for (var k = 0; k < 4; k++)
            {
                row[k] = -power / denominator;
                power *= x;
            }

            power = x;
            for (var k = 4; k < 7; k++)
            {
                row[k] = numerator * power / (denominator * denominator);
                power *= x;
            }
        }
    }
}
