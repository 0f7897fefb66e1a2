using Patchproof.Core.Models.Library;
using BenchmarkDotNet.Attributes;
using Patchproof.Core.Simulation;

namespace Patchproof.Benchmarks.Simulation;

/// <summary>The work multiple shooting asks for: Lorenz segments of 0.5 time units with dx/dx0 and dx/dp, sampled every 0.002.</summary>
/// <remarks>Run: <c>dotnet run -c Release --project tests/Benchmarks -- --filter '*ForwardSensitivitiesBenchmarks*'</c>.</remarks>
[MemoryDiagnoser]
[Config(typeof(ShortInProcessConfig))]
public class ForwardSensitivitiesBenchmarks
{
    private const int SegmentCount = 40;

    // Sensitivities grow like e^(0.9 t) on the attractor and would overflow a double by t = 790, so the long run stops at 100.
    private readonly OdeProblem problem = new(new LorenzSystem(), [1.0, 1.0, 1.0], 0.0, 100.0, [10.0, 28.0, 8.0 / 3.0]);

    private readonly DormandPrince45 withSensitivities = new() { RelativeTolerance = 1e-8, AbsoluteTolerance = 1e-8, KeepSteps = false, Sensitivities = new ForwardSensitivities() };

    private OdeProblem[] segments = [];

    [GlobalSetup]
    public void Setup()
    {
        // Segment starts on the attractor: every 0.5 time units after a transient of 10.
        var starts = OdeSolver.Solve(problem with { EndTime = 10 + (0.5 * SegmentCount) },
            new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-10, SampleInterval = 0.5 });
        segments = Enumerable.Range(0, SegmentCount)
            .Select(k => problem with { InitialState = [.. starts.StateAt(20 + k).ToArray()], StartTime = 10 + (0.5 * k), EndTime = 10.5 + (0.5 * k) })
            .ToArray();
        long accepted = 0, evaluations = 0;
        foreach (var segment in segments)
        {
            var statistics = OdeSolver.Solve(segment, withSensitivities with { SampleInterval = 0.002 }).Statistics;
            accepted += statistics.AcceptedSteps;
            evaluations += statistics.FunctionEvaluations;
        }

        var longRun = OdeSolver.Solve(problem, withSensitivities).Statistics;
        Console.WriteLine($"// FIGURES 40 segments: accepted {accepted}, evaluations {evaluations}; 0..100 with sensitivities: accepted {longRun.AcceptedSteps}, rejected {longRun.RejectedSteps}");
    }

    [Benchmark(Description = "40 Lorenz segments of 0.5, rtol 1e-8, sensitivities, samples every 0.002")]
    public double Segments()
    {
        var sum = 0.0;
        foreach (var segment in segments)
        {
            sum += OdeSolver.Solve(segment, withSensitivities with { SampleInterval = 0.002 }).FinalParameterSensitivity[0];
        }

        return sum;
    }

    [Benchmark(Description = "Lorenz 0..100, rtol 1e-8, sensitivities, stepper only")]
    public double LongRunStepper()
    {
        var stepper = new DormandPrince45Stepper(problem, withSensitivities);
        while (stepper.Step())
        {
        }

        return stepper.ParameterSensitivity[0];
    }

    [Benchmark(Baseline = true, Description = "Lorenz 0..100, rtol 1e-8, state only, stepper only")]
    public double LongRunStateOnly()
    {
        var stepper = new DormandPrince45Stepper(problem, withSensitivities with { Sensitivities = null });
        while (stepper.Step())
        {
        }

        return stepper.State[0];
    }
}
