using Patchproof.TestSupport;
using System.Collections.Immutable;
using Patchproof.Core.Estimation.MultipleShooting;
using Patchproof.Core.Simulation;

namespace Patchproof.Core.Tests.Estimation.MultipleShooting;

/// <summary>
/// The capture of BENCHMARKS.md section 3: Lorenz with s = 10.5, r = 27.3, b = 2.6, a transient of 10 time units
/// dropped, 20 time units at dt = 0.002 (10,001 samples), Gaussian noise of 0.5 % of each channel's SD, quantized
/// to 40/256 (an 8-bit scope over a 40-unit window).
/// </summary>
internal static class SyntheticLorenzCapture
{
    public const double Sigma = 10.5, Rho = 27.3, Beta = 2.6;
    public const double Interval = 0.002;
    public const double Step = 40.0 / 256;

    public static PolynomialVectorField Field(bool offsets = true) => new(
        ["x", "y", "z"],
        [
            new PolynomialTerm(0, [1], "y"), new PolynomialTerm(0, [0], "x"),
            new PolynomialTerm(1, [0], "x"), new PolynomialTerm(1, [1], "y"), new PolynomialTerm(1, [0, 2], "x*z"),
            new PolynomialTerm(2, [0, 1], "x*y"), new PolynomialTerm(2, [2], "z"),
        ],
        [offsets, offsets, offsets]);

    public static double[] TrueTerms => [Sigma, -Sigma, Rho, -1, -1, 1, -Beta];

    public static double[] NominalTerms => [10, -10, 28, -1, -1, 1, -8.0 / 3];

    /// <summary>The three channels x, y, z (optionally with offsets added) and their noise sd.</summary>
    public static (double[][] Channels, double[] NoiseSd) Generate(int seed, double duration = 20, double[]? channelOffsets = null)
    {
        var field = Field(offsets: false);
        var transient = OdeSolver.Solve(
            new OdeProblem(field, [1.0, 1.0, 1.0], 0, 10, [.. TrueTerms]),
            new DormandPrince45 { RelativeTolerance = 1e-11, AbsoluteTolerance = 1e-11 });
        var count = (int)Math.Round(duration / Interval) + 1;
        var times = Enumerable.Range(0, count).Select(i => 10 + i * Interval).ToImmutableArray();
        var run = OdeSolver.Solve(
            new OdeProblem(field, [.. transient.FinalState.ToArray()], 10, times[^1], [.. TrueTerms]),
            new DormandPrince45 { RelativeTolerance = 1e-11, AbsoluteTolerance = 1e-11, SampleTimes = times });
        var random = new Random(seed);
        var channels = new double[3][];
        var noise = new double[3];
        for (var j = 0; j < 3; j++)
        {
            var clean = Enumerable.Range(0, count).Select(i => run.StateAt(i)[j]).ToArray();
            var mean = clean.Average();
            var sd = Math.Sqrt(clean.Sum(v => (v - mean) * (v - mean)) / count);
            var noiseSd = 0.005 * sd;
            var offset = channelOffsets?[j] ?? 0;
            channels[j] = clean.Select(v => Math.Round((v + offset + noiseSd * GaussianNoise.Next(random)) / Step) * Step).ToArray();
            noise[j] = Math.Sqrt(noiseSd * noiseSd + Step * Step / 12);
        }

        return (channels, noise);
    }

}
