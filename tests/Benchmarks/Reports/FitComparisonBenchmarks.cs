using System.Collections.Immutable;
using System.Globalization;
using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Configs;
using BenchmarkDotNet.Diagnosers;
using BenchmarkDotNet.Jobs;
using BenchmarkDotNet.Toolchains.InProcess.Emit;
using Patchproof.Core.Captures;
using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Files;
using Patchproof.Core.Estimation.MultipleShooting;
using Patchproof.Core.Reports;
using Patchproof.Core.Simulation;

namespace Patchproof.Benchmarks.Reports;

/// <summary>The whole comparison stage (every invariant, overlay and spectrum) on a 100,000-sample, 3-channel Lorenz board capture (target: under 3 s).</summary>
/// <remarks>The board is designs/qh-l3-wren.json (Lorenz 10, 28, 8/3 at 1 ms per problem time unit), sampled every
/// 0.01 problem time units (10 µs) over 1000 units, 0.5 % noise, 8-bit quantization. The fit is made once in the setup,
/// without the comparison; the benchmark times <see cref="FitComparisonBuilder.Build"/> alone. Runs in process.</remarks>
[Config(typeof(LongInProcessConfig))]
public class FitComparisonBenchmarks
{
    private BoardDesign design = null!;
    private Capture capture = null!;
    private FitReport report = null!;

    [GlobalSetup]
    public void Setup()
    {
        design = DesignFileReader.ReadFile(DesignPath("qh-l3-wren.json")).Value;
        capture = BoardCapture(design, 100_000, samplesPerUnit: 100);
        report = BoardFitter.Fit(design, capture, new BoardFitOptions { CompareInvariants = false }, TimeProvider.System).Value;
        var once = FitComparisonBuilder.Build(design, capture, report);
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"// FIGURES comparison {once.ElapsedSeconds:0.000} s; fit converged {report.Quality.Converged}; reason '{once.Reason}'"));
        foreach (var timing in once.Timings)
        {
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"// FIGURES   {timing.Part}: {timing.Seconds:0.000} s"));
        }
    }

    /// <summary>Runs the comparison several times after one setup and prints each part's time (<c>comparison-timings [runs]</c>).</summary>
    public static int PrintTimings(int runs)
    {
        var benchmark = new FitComparisonBenchmarks();
        benchmark.Setup();
        for (var run = 0; run < runs; run++)
        {
            var cpuBefore = System.Diagnostics.Process.GetCurrentProcess().TotalProcessorTime;
            var comparison = FitComparisonBuilder.Build(benchmark.design, benchmark.capture, benchmark.report);
            var cpuSeconds = (System.Diagnostics.Process.GetCurrentProcess().TotalProcessorTime - cpuBefore).TotalSeconds;
            var parts = string.Join(", ", comparison.Timings.Select(t => string.Create(CultureInfo.InvariantCulture, $"{t.Part} {t.Seconds:0.000}")));
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"run {run + 1}: {comparison.ElapsedSeconds:0.000} s wall, {cpuSeconds:0.000} s of CPU, load average {LoadAverage()} ({parts})"));
            if (run == 0 && comparison.CaptureLyapunov is { } exponent)
            {
                var fractions = string.Join(" ", exponent.FalseNeighbourFractions.Select(f => f.ToString("0.000", CultureInfo.InvariantCulture)));
                Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  Rosenstein: {exponent.LargestPerProblemUnit:0.000} per unit, delay {exponent.DelaySamples}, dimension {exponent.EmbeddingDimension}, false neighbours {fractions}; model {comparison.ModelLyapunov?.Fitted.LargestPerProblemUnit:0.000}; dimension {comparison.CorrelationDimension?.Capture.Dimension:0.000} / {comparison.CorrelationDimension?.Fitted.Dimension:0.000}"));
            }
        }

        return 0;
    }

    private static string LoadAverage() =>
        File.Exists("/proc/loadavg") ? string.Join(" ", File.ReadAllText("/proc/loadavg").Split(' ').Take(3)) : "unknown";

    [Benchmark]
    public double WholeComparison() => FitComparisonBuilder.Build(design, capture, report).ElapsedSeconds;

    private static string DesignPath(string file)
    {
        for (var folder = new DirectoryInfo(AppContext.BaseDirectory); folder is not null; folder = folder.Parent)
        {
            var candidate = Path.Combine(folder.FullName, "designs", file);
            if (File.Exists(candidate))
            {
                return candidate;
            }
        }

        throw new FileNotFoundException("designs folder not found above the benchmark's directory", file);
    }

    private static Capture BoardCapture(BoardDesign board, int samples, int samplesPerUnit)
    {
        var variables = board.Variables.Select(v => v.Name).ToList();
        var terms = board.Terms();
        var field = new PolynomialVectorField(
            variables,
            terms.Select(t => new PolynomialTerm(variables.IndexOf(t.Variable), t.Basis.Variables.Select(v => variables.IndexOf(v)).ToList(), t.Basis.ToString())).ToList(),
            variables.Select(_ => false).ToList());
        var parameters = terms.Select(t => t.NominalCoefficient).ToImmutableArray();
        var tau = board.TimeScaleSeconds;
        var start = board.Variables.Select(v => v.ToVolts(1.0)).ToImmutableArray();
        var settle = OdeSolver.Solve(new OdeProblem(field, start, 0, 10 * tau, parameters), new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-10 });
        var dt = tau / samplesPerUnit;
        var run = OdeSolver.Solve(new OdeProblem(field, [.. settle.FinalState.ToArray()], 10 * tau, 10 * tau + (samples - 1) * dt, parameters),
            new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-10, SampleInterval = dt, MaxSteps = 100_000_000 });
        var random = new Random(7);
        var channels = new List<CaptureChannel>();
        for (var j = 0; j < variables.Count; j++)
        {
            var clean = Enumerable.Range(0, samples).Select(i => run.StateAt(i)[j]).ToArray();
            var mean = clean.Average();
            var sd = Math.Sqrt(clean.Sum(v => (v - mean) * (v - mean)) / samples);
            var step = 2 * 1.1 * clean.Max(Math.Abs) / 256;
            var values = clean.Select(v =>
            {
                var noise = Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
                return (float)(Math.Round((v + 0.005 * sd * noise) / step) * step);
            }).ToArray();
            channels.Add(new CaptureChannel($"CH{j + 1}", "V", values, "benchmark.csv", j + 2));
        }

        return new Capture(new UniformTimeBase(0, dt, samples), channels, []);
    }
}

/// <summary>One warm-up and three measured runs in the host process, with room for a slow machine (the default in-process limit is 5 minutes).</summary>
public sealed class LongInProcessConfig : ManualConfig
{
    public LongInProcessConfig()
    {
        AddJob(Job.Default
            .WithToolchain(new InProcessEmitToolchain(TimeSpan.FromMinutes(30), logOutput: true))
            .WithLaunchCount(1)
            .WithWarmupCount(1)
            .WithIterationCount(3));
        AddDiagnoser(MemoryDiagnoser.Default);
    }
}
