using System.Collections.Immutable;
using BenchmarkDotNet.Attributes;
using Patchproof.Core.Models;
using Patchproof.Core.Models.Library;
using Patchproof.Core.Simulation;

namespace Patchproof.Benchmarks.Models;

/// <summary>The compiled Lorenz text against the hand-written Lorenz system, called through <see cref="IOdeSystem"/> as the solver calls it.</summary>
/// <remarks>Each benchmark makes 1000 calls on a state that moves, so the figures are per call. Target: compiled within 1.3x of hand-written, zero bytes.</remarks>
[MemoryDiagnoser]
public class CompiledModelBenchmarks
{
    private const int Calls = 1000;
    private readonly double[] state = [1.5, -2.25, 20.0];
    private readonly double[] derivative = new double[3];
    private readonly double[] jacobian = new double[9];
    private IOdeSystem handWritten = null!;
    private IOdeSystem compiled = null!;
    private double[] parameters = null!;

    /// <summary>Compiles the Lorenz text once.</summary>
    [GlobalSetup]
    public void Setup()
    {
        handWritten = new LorenzSystem();
        compiled = ModelCatalog.Lorenz.Parse().Compile();
        parameters = ModelCatalog.Lorenz.NominalParameters();
    }

    private double Run(IOdeSystem system)
    {
        var sum = 0.0;
        for (var i = 0; i < Calls; i++)
        {
            state[0] = 1.5 + (i * 1e-3);
            system.Evaluate(i, state, parameters, derivative);
            sum += derivative[0];
        }

        return sum;
    }

    private double RunStateJacobian(IOdeSystem system)
    {
        var sum = 0.0;
        for (var i = 0; i < Calls; i++)
        {
            state[0] = 1.5 + (i * 1e-3);
            system.EvaluateStateJacobian(i, state, parameters, jacobian);
            sum += jacobian[5];
        }

        return sum;
    }

    private double RunParameterJacobian(IOdeSystem system)
    {
        var sum = 0.0;
        for (var i = 0; i < Calls; i++)
        {
            state[0] = 1.5 + (i * 1e-3);
            system.EvaluateParameterJacobian(i, state, parameters, jacobian);
            sum += jacobian[0];
        }

        return sum;
    }

    /// <summary>f(t, x; p), hand-written.</summary>
    [Benchmark(Baseline = true, OperationsPerInvoke = Calls)]
    [BenchmarkCategory("Evaluate")]
    public double EvaluateHandWritten() => Run(handWritten);

    /// <summary>f(t, x; p), compiled from text.</summary>
    [Benchmark(OperationsPerInvoke = Calls)]
    [BenchmarkCategory("Evaluate")]
    public double EvaluateCompiled() => Run(compiled);

    /// <summary>df/dx, hand-written.</summary>
    [Benchmark(OperationsPerInvoke = Calls)]
    public double StateJacobianHandWritten() => RunStateJacobian(handWritten);

    /// <summary>df/dx, compiled from text.</summary>
    [Benchmark(OperationsPerInvoke = Calls)]
    public double StateJacobianCompiled() => RunStateJacobian(compiled);

    /// <summary>df/dp, hand-written.</summary>
    [Benchmark(OperationsPerInvoke = Calls)]
    public double ParameterJacobianHandWritten() => RunParameterJacobian(handWritten);

    /// <summary>df/dp, compiled from text.</summary>
    [Benchmark(OperationsPerInvoke = Calls)]
    public double ParameterJacobianCompiled() => RunParameterJacobian(compiled);
}

/// <summary>A whole Lorenz solve, t = 0 to 100 from (1, 1, 1) at rtol = atol = 1e-9, with each system.</summary>
[MemoryDiagnoser]
public class CompiledModelSolveBenchmarks
{
    private OdeProblem handWritten = null!;
    private OdeProblem compiled = null!;
    private readonly DormandPrince45 method = new() { RelativeTolerance = 1e-9, AbsoluteTolerance = 1e-9 };

    /// <summary>Builds both problems.</summary>
    [GlobalSetup]
    public void Setup()
    {
        var parameters = ModelCatalog.Lorenz.NominalParameters().ToImmutableArray();
        handWritten = new OdeProblem(new LorenzSystem(), [1.0, 1.0, 1.0], 0, 100, parameters);
        compiled = handWritten with { System = ModelCatalog.Lorenz.Parse().Compile() };
    }

    /// <summary>Hand-written Lorenz.</summary>
    [Benchmark(Baseline = true)]
    public long SolveHandWritten() => OdeSolver.Solve(handWritten, method).Statistics.AcceptedSteps;

    /// <summary>Compiled Lorenz text.</summary>
    [Benchmark]
    public long SolveCompiled() => OdeSolver.Solve(compiled, method).Statistics.AcceptedSteps;
}
