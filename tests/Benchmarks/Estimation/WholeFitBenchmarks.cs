using System.Diagnostics;
using System.Globalization;
using BenchmarkDotNet.Attributes;
using Patchproof.Core.Estimation;
using Patchproof.Core.Estimation.MultipleShooting;

namespace Patchproof.Benchmarks.Estimation;

/// <summary>The whole fit of BENCHMARKS.md section 3: mapping check, equation-error start, multiple shooting with its uncertainty.</summary>
[MemoryDiagnoser]
public class WholeFitBenchmarks
{
    private const double Interval = 0.002;
    private static readonly IReadOnlyList<IReadOnlyList<RegressionTerm>> LorenzTerms =
    [
        [new RegressionTerm("y", [1]), new RegressionTerm("x", [0])],
        [new RegressionTerm("x", [0]), new RegressionTerm("y", [1]), new RegressionTerm("x*z", [0, 2])],
        [new RegressionTerm("x*y", [0, 1]), new RegressionTerm("z", [2])],
    ];

    private static readonly IReadOnlyList<IReadOnlyList<double>> NominalByEquation = [[10, -10], [28, -1, -1], [1, -8.0 / 3]];

    private double[][] capture = [];

    /// <summary>Samples in the capture: the 10,001 of section 3, and the 100,000 of its second target.</summary>
    [Params(10_001, 100_000)]
    public int Samples { get; set; }

    [GlobalSetup]
    public void Setup() => capture = BenchmarkLorenz.Capture(Samples);

    /// <summary>Mapping check, equation-error start and multiple shooting (40 segments of 0.5 on the short capture).</summary>
    [Benchmark]
    public WholeFitResult WholeFit() => Run(capture, null);

    /// <summary>The Lorenz field in the order of <see cref="LorenzTerms"/>, with no equation offsets.</summary>
    public static PolynomialVectorField Field() => new(
        ["x", "y", "z"],
        [
            new PolynomialTerm(0, [1], "y"), new PolynomialTerm(0, [0], "x"),
            new PolynomialTerm(1, [0], "x"), new PolynomialTerm(1, [1], "y"), new PolynomialTerm(1, [0, 2], "x*z"),
            new PolynomialTerm(2, [0, 1], "x*y"), new PolynomialTerm(2, [2], "z"),
        ],
        [false, false, false]);

    /// <summary>Runs the fit; records the time of each stage in <paramref name="stages"/> when given.</summary>
    public static WholeFitResult Run(double[][] channels, List<(string Stage, double Seconds)>? stages)
    {
        var watch = Stopwatch.StartNew();
        void Mark(string stage)
        {
            stages?.Add((stage, watch.Elapsed.TotalSeconds));
            watch.Restart();
        }

        var ranking = ChannelMappingSearch.Rank(channels, Interval, LorenzTerms, NominalByEquation);
        Mark("mapping check");
        var field = Field();
        var start = Start(channels);
        Mark("equation-error start");
        var shootingChannels = ShootingChannels(channels);
        var fit = MultipleShootingEstimator.Fit(field, start.Parameters, shootingChannels, 0, Interval, Options(), null,
            shootingChannels.Select(c => start.StateOffsets[c.StateIndex]).ToList());
        Mark("multiple shooting and uncertainty");
        return new WholeFitResult(ranking[0], fit);
    }

    /// <summary>The equation-error start on the Lorenz field of <see cref="Field"/>.</summary>
    internal static EquationErrorStartResult Start(double[][] channels) =>
        EquationErrorStart.TryEstimate(Field(), channels, Interval, new EquationErrorOptions { MaxWindowDuration = 0.05, BatchDuration = 1 })
            ?? throw new InvalidOperationException("the equation-error start failed");

    /// <summary>One shooting channel a state, gain 1, with its noise floor.</summary>
    internal static List<ShootingChannel> ShootingChannels(double[][] channels) =>
        channels.Select((samples, j) => new ShootingChannel($"CH{j + 1}", j, 1, NoiseSd(samples), samples)).ToList();

    private static MultipleShootingOptions Options()
    {
        var options = new MultipleShootingOptions { SegmentSeconds = 0.5, ChannelOffsetPriorSdVolts = 0.1 };
        return options with { Solver = options.Solver with { InitialDamping = MultipleShootingOptions.NearStartDamping } };
    }

    /// <summary>Prints wall and CPU time per stage for <paramref name="runs"/> runs of each size, with s, r, b, their
    /// relative errors and standard errors. The first run of a size includes the JIT compilation; later ones approach the steady state.</summary>
    public static int PrintTimings(int runs)
    {
        foreach (var samples in new[] { 10_001, 100_000 })
        {
            var channels = BenchmarkLorenz.Capture(samples);
            for (var run = 0; run < runs; run++)
            {
                var stages = new List<(string Stage, double Seconds)>();
                var cpu = Process.GetCurrentProcess().TotalProcessorTime;
                var wall = Stopwatch.StartNew();
                var result = Run(channels, stages);
                var elapsed = wall.Elapsed.TotalSeconds;
                var cpuSeconds = (Process.GetCurrentProcess().TotalProcessorTime - cpu).TotalSeconds;
                var p = result.Shooting.Parameters;
                var e = result.Shooting.StandardErrors;
                var (s, r, b) = (p[0], p[2], -p[6]);
                Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"{samples} samples, run {run + 1}: wall {elapsed:0.000} s, cpu {cpuSeconds:0.000} s, load {LoadAverage()}; {string.Join(", ", stages.Select(x => $"{x.Stage} {x.Seconds:0.000} s"))}; " +
                    $"{result.Shooting.Iterations} iterations, {result.Shooting.ExitReason}; s {s:0.0000} ({s / 10.5 - 1:+0.0e+0;-0.0e+0}, se {e[0] / 10.5:0.0e+0}), r {r:0.0000} ({r / 27.3 - 1:+0.0e+0;-0.0e+0}, se {e[2] / 27.3:0.0e+0}), b {b:0.0000} ({b / 2.6 - 1:+0.0e+0;-0.0e+0}, se {e[6] / 2.6:0.0e+0})"));
            }
        }

        return 0;
    }

    private static string LoadAverage() =>
        File.Exists("/proc/loadavg") ? File.ReadAllText("/proc/loadavg").Split(' ')[0] : "?";

    /// <summary>Noise sd from the median absolute second difference, floored by the quantization step / √12.</summary>
    private static double NoiseSd(double[] samples)
    {
        var differences = new double[samples.Length - 2];
        for (var i = 1; i + 1 < samples.Length; i++)
        {
            differences[i - 1] = Math.Abs(samples[i + 1] - 2 * samples[i] + samples[i - 1]);
        }

        Array.Sort(differences);
        return Math.Max(differences[differences.Length / 2] / (0.6745 * Math.Sqrt(6)), 40.0 / 256 / Math.Sqrt(12));
    }
}

/// <summary>The mapping ranked first and the shooting fit.</summary>
public sealed record WholeFitResult(ChannelMapping BestMapping, MultipleShootingResult Shooting);
