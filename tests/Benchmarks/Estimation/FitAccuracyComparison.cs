using System.Globalization;
using Patchproof.Core.Estimation.MultipleShooting;
using Patchproof.Core.Models.Library;

namespace Patchproof.Benchmarks.Estimation;

/// <summary>Accuracy of the section 3 fit over many noise realizations, in two forms.</summary>
/// <remarks>
/// <para>"board": the whole fit of <see cref="WholeFitBenchmarks"/>, seven free term coefficients and three channel
/// offsets, as a board is fitted. "tied": the fit BENCHMARKS.md's reference script makes, the three Lorenz parameters
/// (sigma in both terms of x', unit coefficients held) and no offsets, by the same multiple shooting with the Lorenz
/// system as the field, started from the equation-error estimate.</para>
/// <para>One realization decides little: the reference's errors are one draw of the estimator's scatter. The RMS of the
/// relative errors over the seeds estimates that scatter. Run: <c>dotnet run -c Release --project tests/Benchmarks -- fit-accuracy 20</c>.</para>
/// </remarks>
internal static class FitAccuracyComparison
{
    private const double Interval = 0.002;
    private static readonly double[] Truth = [10.5, 27.3, 2.6];

    public static int Print(int seeds)
    {
        var board = new List<double[]>();
        var tied = new List<double[]>();
        for (var seed = 1; seed <= seeds; seed++)
        {
            var channels = BenchmarkLorenz.Capture(10_001, seed);
            var whole = WholeFitBenchmarks.Run(channels, null).Shooting;
            var boardErrors = RelativeErrors([whole.Parameters[0], whole.Parameters[2], -whole.Parameters[6]]);
            var watch = System.Diagnostics.Stopwatch.StartNew();
            var tiedFit = FitTied(channels);
            var tiedSeconds = watch.Elapsed.TotalSeconds;
            var tiedErrors = RelativeErrors(tiedFit.Parameters);
            board.Add(boardErrors);
            tied.Add(tiedErrors);
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"seed {seed,2}: board {Format(boardErrors)} ({whole.Iterations} it); tied {Format(tiedErrors)} ({tiedFit.Iterations} it, {tiedSeconds:0.000} s with its start, se {Format(RelativeSd(tiedFit.StandardErrors))})"));
        }

        Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"RMS over {seeds} seeds: board {Format(Rms(board))}; tied {Format(Rms(tied))}"));
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"mean |error| over {seeds} seeds: board {Format(MeanAbsolute(board))}; tied {Format(MeanAbsolute(tied))}"));
        return 0;
    }

    private static MultipleShootingResult FitTied(double[][] channels)
    {
        var p = WholeFitBenchmarks.Start(channels).Parameters;
        var shootingChannels = WholeFitBenchmarks.ShootingChannels(channels);
        var options = new MultipleShootingOptions { SegmentSeconds = 0.5, EstimateChannelOffsets = false };
        options = options with { Solver = options.Solver with { InitialDamping = MultipleShootingOptions.NearStartDamping } };
        return MultipleShootingEstimator.Fit(new LorenzSystem(), [p[0], p[2], -p[6]], shootingChannels, 0, Interval, options);
    }

    private static double[] RelativeErrors(IReadOnlyList<double> estimate) => [.. Truth.Select((t, i) => (estimate[i] / t) - 1)];

    private static double[] RelativeSd(IReadOnlyList<double> sd) => [.. Truth.Select((t, i) => sd[i] / t)];

    private static double[] Rms(List<double[]> errors) => [.. Enumerable.Range(0, 3).Select(i => Math.Sqrt(errors.Average(e => e[i] * e[i])))];

    private static double[] MeanAbsolute(List<double[]> errors) => [.. Enumerable.Range(0, 3).Select(i => errors.Average(e => Math.Abs(e[i])))];

    private static string Format(double[] values) =>
        string.Join(" ", values.Select(v => v.ToString("+0.0e+0;-0.0e+0", CultureInfo.InvariantCulture)));
}
