using Patchproof.Core.Simulation;
using Patchproof.Core.Tests.Simulation.TestSystems;

namespace Patchproof.Core.Tests.Simulation;

public sealed class OdeSolverTests
{
    [Theory]
    [InlineData(1e-10, 1e-4)]
    [InlineData(1e-12, 1e-6)]
    public void Solve_ArenstorfOrbit_ClosesAfterItsPeriod(double tolerance, double allowed)
    {
        // Hairer, Nørsett & Wanner, Solving ODE I (1993), Sec. II.0: the orbit is periodic, y(T) = y(0).
        // Tolerances from CHECKS.md (SciPy RK45 reached 3.3e-6 at 1e-10 and 3.9e-8 at 1e-12).
        var problem = Problems.Arenstorf();

        var solution = OdeSolver.Solve(problem, new DormandPrince45 { RelativeTolerance = tolerance, AbsoluteTolerance = tolerance });

        Assert.Equal(SolveStatus.Succeeded, solution.Status);
        var worst = MaxAbsDifference(solution.FinalState, problem.InitialState.AsSpan());
        Assert.True(worst <= allowed, $"max abs error after one period {worst:E2} (steps {solution.Statistics.AcceptedSteps})");
    }

    [Fact]
    public void Solve_ArenstorfOrbit_KeepsTheJacobiConstant()
    {
        // The Jacobi constant of the restricted three-body problem is conserved; C(0) = 2.856412520209871
        // (derived from Hairer et al.'s initial values); drift < 1e-7 at rtol = atol = 1e-10 (CHECKS.md; SciPy 1.4e-9).
        var problem = Problems.Arenstorf();
        var initial = ArenstorfSystem.JacobiConstant(problem.InitialState.AsSpan());

        var solution = OdeSolver.Solve(problem, new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-10 });

        Assert.Equal(2.856412520209871, initial, 1e-14);
        var drift = Enumerable.Range(0, solution.Count).Max(i => Math.Abs(ArenstorfSystem.JacobiConstant(solution.StateAt(i)) - initial));
        Assert.True(drift < 1e-7, $"Jacobi constant drift {drift:E2}");
    }

    [Theory]
    [InlineData("A1", 1.0)]
    [InlineData("A2", 1.0)]
    [InlineData("A3", 1.0)]
    [InlineData("A4", 1.0)]
    public void Solve_ClosedFormProblems_MatchTheExactSolutionAtTwenty(string name, double initial)
    {
        // Closed forms (ode-reference.json; DETEST A1-A4 numbering from memory): rtol 1e-10 gives relative error <= 1e-7 (CHECKS.md).
        var system = name switch
        {
            "A1" => new ScalarSystem((t, y) => -y),
            "A2" => new ScalarSystem((t, y) => -y * y * y / 2),
            "A3" => new ScalarSystem((t, y) => y * Math.Cos(t)),
            _ => new ScalarSystem((t, y) => y / 4 * (1 - (y / 20))),
        };
        var expected = OdeReference.ExactSolution(name, "y");

        // Absolute tolerance far below the solution so the check is relative even for exp(-20).
        var solution = OdeSolver.Solve(Problems.Scalar(system, initial, 0, 20), new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-20 });

        Assert.Equal(SolveStatus.Succeeded, solution.Status);
        var relative = Math.Abs(solution.FinalState[0] - expected) / Math.Abs(expected);
        Assert.True(relative <= 1e-7, $"{name}: relative error {relative:E2}");
    }

    [Fact]
    public void Solve_DampedOscillator_MatchesTheClosedFormAtOneSecond()
    {
        // Closed form x = e^(-ζω0 t)(cos ωd t + ζ/sqrt(1-ζ²) sin ωd t) (ode-reference.json); tolerance 1e-8 (CHECKS.md).
        var problem = new OdeProblem(new DampedOscillatorSystem(), [1.0, 0.0], 0, 1, [0.1, 2 * Math.PI]);

        var solution = OdeSolver.Solve(problem, new DormandPrince45 { RelativeTolerance = 1e-12, AbsoluteTolerance = 1e-12 });

        Assert.Equal(0.53153512372717173, solution.FinalState[0], 1e-8);
        Assert.Equal(0.10608522530432260, solution.FinalState[1], 1e-8);
    }

    [Theory]
    [InlineData(1e-10, 10.0, 1e-5)]
    [InlineData(1e-12, 10.0, 1e-7)]
    [InlineData(1e-10, 20.0, 1e-2)]
    [InlineData(1e-12, 20.0, 1e-4)]
    public void Solve_Lorenz_MatchesTheTaylorReferenceTrajectory(double tolerance, double endTime, double allowed)
    {
        // ode-reference.json: a 40-digit Taylor-series integration (computed with mpmath, not published);
        // tolerances from CHECKS.md (SciPy RK45: 1.6e-7 / 1.6e-9 at t = 10, 2.4e-4 / 2.4e-6 at t = 20).
        var solution = OdeSolver.Solve(Problems.Lorenz(endTime), new DormandPrince45 { RelativeTolerance = tolerance, AbsoluteTolerance = tolerance, KeepSteps = false });

        Assert.Equal(SolveStatus.Succeeded, solution.Status);
        var error = MaxAbsDifference(solution.FinalState, OdeReference.LorenzAt(endTime));
        Assert.True(error <= allowed, $"max abs error {error:E2} at t = {endTime}");
    }

    [Fact]
    public void Solve_LorenzDenseOutput_FollowsTheReferenceTrajectoryAtEveryHalfUnit()
    {
        // ode-reference.json rows t = 0..20 step 0.5 (mpmath Taylor); allowed error 1e-7 at rtol 1e-12, grown
        // by e^(0.9 (t - 10)) after t = 10 as the largest Lyapunov exponent 0.9056 (Sprott) predicts (CHECKS.md).
        var solution = OdeSolver.Solve(Problems.Lorenz(20), new DormandPrince45 { RelativeTolerance = 1e-12, AbsoluteTolerance = 1e-12, KeepDenseOutput = true });
        var state = new double[3];

        foreach (var (time, expected) in OdeReference.LorenzTrajectory())
        {
            solution.Evaluate(time, state);
            var allowed = 1e-7 * Math.Max(1.0, Math.Exp(0.9 * (time - 10)));
            var error = MaxAbsDifference(state, expected);
            Assert.True(error <= allowed, $"t = {time}: error {error:E2} > {allowed:E2}");
        }
    }

    [Fact]
    public void Solve_Sampled_GivesTheSameStatesAsDenseOutput()
    {
        // Arrange
        var problem = Problems.Lorenz(5);
        var dense = OdeSolver.Solve(problem, new DormandPrince45 { RelativeTolerance = 1e-9, AbsoluteTolerance = 1e-9, KeepDenseOutput = true });

        // Act
        var sampled = OdeSolver.Solve(problem, new DormandPrince45 { RelativeTolerance = 1e-9, AbsoluteTolerance = 1e-9, SampleInterval = 0.01 });

        // Assert
        Assert.Equal(501, sampled.Count);
        Assert.Equal(5.0, sampled.Times[^1]);
        var state = new double[3];
        for (var i = 0; i < sampled.Count; i++)
        {
            dense.Evaluate(sampled.Times[i], state);
            Assert.Equal(state, sampled.StateAt(i).ToArray());
        }
    }

    [Fact]
    public void Solve_BackwardsInTime_ReturnsToTheInitialValue()
    {
        // y' = y cos t has y = e^(sin t) (closed form); integrate from t = 20 back to 0.
        var system = new ScalarSystem((t, y) => y * Math.Cos(t));
        var problem = Problems.Scalar(system, Math.Exp(Math.Sin(20)), 20, 0);

        var solution = OdeSolver.Solve(problem, new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-12, KeepDenseOutput = true });

        Assert.Equal(SolveStatus.Succeeded, solution.Status);
        Assert.Equal(0.0, solution.FinalTime);
        Assert.Equal(1.0, solution.FinalState[0], 1e-8);
        Assert.True(system.SmallestTimeEvaluated >= 0.0);
        var state = new double[1];
        solution.Evaluate(7.3, state);
        Assert.Equal(Math.Exp(Math.Sin(7.3)), state[0], 1e-8);
    }

    [Theory]
    [InlineData(1e-3)]
    [InlineData(1e-8)]
    public void Solve_NeverEvaluatesPastTheEndTime(double tolerance)
    {
        var system = new ScalarSystem((t, y) => y * Math.Cos(t));

        var solution = OdeSolver.Solve(Problems.Scalar(system, 1, 0, Math.PI), new DormandPrince45 { RelativeTolerance = tolerance });

        Assert.Equal(SolveStatus.Succeeded, solution.Status);
        Assert.Equal(Math.PI, solution.FinalTime);
        Assert.True(system.LargestTimeEvaluated <= Math.PI, $"evaluated at {system.LargestTimeEvaluated}");
    }

    [Fact]
    public void Solve_ZeroLengthInterval_FinishesWithoutEvaluating()
    {
        var system = new ScalarSystem((t, y) => y);

        var solution = OdeSolver.Solve(Problems.Scalar(system, 2, 1, 1), new DormandPrince45 { KeepDenseOutput = true });

        Assert.Equal(SolveStatus.Succeeded, solution.Status);
        Assert.Equal(0, solution.Statistics.FunctionEvaluations);
        Assert.Equal(2.0, solution.FinalState[0]);
        var state = new double[1];
        solution.Evaluate(1, state);
        Assert.Equal(2.0, state[0]);
    }

    [Fact]
    public void Solve_NaNInTheRightHandSide_ReportsNonFiniteStateWithTheTime()
    {
        var system = new ScalarSystem((t, y) => t < 0.5 ? 1.0 : double.NaN);

        var solution = OdeSolver.Solve(Problems.Scalar(system, 0, 0, 1), new DormandPrince45());

        Assert.Equal(SolveStatus.NonFiniteState, solution.Status);
        Assert.StartsWith("non-finite state at t = ", solution.Message, StringComparison.Ordinal);
        Assert.InRange(solution.FinalTime, 0.0, 0.5);
        Assert.True(double.IsFinite(solution.FinalState[0]));
    }

    [Fact]
    public void Solve_ExponentialBlowUp_ReportsNonFiniteState()
    {
        // y' = 100 y overflows a double near t = 7.1.
        var system = new ScalarSystem((t, y) => 100 * y);

        var solution = OdeSolver.Solve(Problems.Scalar(system, 1, 0, 10), new DormandPrince45());

        Assert.Equal(SolveStatus.NonFiniteState, solution.Status);
        Assert.InRange(solution.FinalTime, 6.5, 7.2);
        Assert.Contains("t = 7", solution.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Solve_FiniteTimeSingularity_StopsWithStepSizeTooSmallNearIt()
    {
        // y' = y², y(0) = 1 has y = 1/(1 - t) (closed form): the step collapses at the pole t = 1 instead of running on.
        var system = new ScalarSystem((t, y) => y * y);

        var solution = OdeSolver.Solve(Problems.Scalar(system, 1, 0, 2), new DormandPrince45 { RelativeTolerance = 1e-6 });

        Assert.Contains(solution.Status, new[] { SolveStatus.StepSizeTooSmall, SolveStatus.NonFiniteState });
        // A step may land a hair beyond the pole before the step size collapses.
        Assert.InRange(solution.FinalTime, 0.999, 1.001);
        Assert.Contains(" at t = ", solution.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Solve_StepBudget_StopsAtTheBudget()
    {
        var solution = OdeSolver.Solve(Problems.Lorenz(1000), new DormandPrince45 { MaxSteps = 50 });

        Assert.Equal(SolveStatus.MaxStepsExceeded, solution.Status);
        Assert.Equal(50, solution.Statistics.AcceptedSteps + solution.Statistics.RejectedSteps);
        Assert.Contains("50 steps", solution.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Solve_EvaluationBudget_NeverExceedsTheBudget()
    {
        var solution = OdeSolver.Solve(Problems.Lorenz(1000), new DormandPrince45 { MaxEvaluations = 1000 });

        Assert.Equal(SolveStatus.MaxEvaluationsExceeded, solution.Status);
        Assert.InRange(solution.Statistics.FunctionEvaluations, 990, 1000);
    }

    [Fact]
    public void Solve_Statistics_CountSixEvaluationsPerAttemptedStep()
    {
        // First same as last: six new stages per attempt, plus f(t0) and one for the first-step heuristic.
        var solution = OdeSolver.Solve(Problems.Lorenz(10), new DormandPrince45 { RelativeTolerance = 1e-6, AbsoluteTolerance = 1e-6 });

        var statistics = solution.Statistics;
        Assert.True(statistics.RejectedSteps > 0);
        Assert.Equal((6 * (statistics.AcceptedSteps + statistics.RejectedSteps)) + 2, statistics.FunctionEvaluations);
        Assert.Equal(statistics.AcceptedSteps + 1, solution.Count);
    }

    [Theory]
    [InlineData(-1e-6, 1e-6)]
    [InlineData(1e-6, -1e-6)]
    [InlineData(double.NaN, 1e-6)]
    public void Solve_NegativeOrNaNTolerance_Throws(double relative, double absolute)
    {
        var exception = Assert.Throws<ArgumentOutOfRangeException>(() =>
            OdeSolver.Solve(Problems.Lorenz(1), new DormandPrince45 { RelativeTolerance = relative, AbsoluteTolerance = absolute }));
        Assert.Contains("Tolerance", exception.ParamName, StringComparison.Ordinal);
    }

    [Fact]
    public void Solve_NonFiniteInitialState_Throws()
    {
        var problem = Problems.Lorenz(1) with { InitialState = [1.0, double.NaN, 1.0] };

        var exception = Assert.Throws<ArgumentOutOfRangeException>(() => OdeSolver.Solve(problem, new DormandPrince45()));

        Assert.Equal("InitialState", exception.ParamName);
    }

    [Fact]
    public void Solve_WrongParameterCount_Throws()
    {
        var problem = Problems.Lorenz(1) with { Parameters = [10.0] };

        var exception = Assert.Throws<ArgumentOutOfRangeException>(() => OdeSolver.Solve(problem, new DormandPrince45()));

        Assert.Equal("Parameters", exception.ParamName);
    }

    [Fact]
    public void Evaluate_OutsideTheSolvedInterval_Throws()
    {
        var solution = OdeSolver.Solve(Problems.Lorenz(1), new DormandPrince45 { KeepDenseOutput = true });

        Assert.Throws<ArgumentOutOfRangeException>(() => solution.Evaluate(1.5, new double[3]));
    }

    [Fact]
    public void Evaluate_WithoutDenseOutput_Throws()
    {
        var solution = OdeSolver.Solve(Problems.Lorenz(1), new DormandPrince45());

        Assert.Throws<InvalidOperationException>(() => solution.Evaluate(0.5, new double[3]));
    }

    [Fact]
    public void Solve_RungeKutta4_ConvergesWithOrderFour()
    {
        // Kutta (1901), order 4 (Hairer et al. 1993, Sec. II.1): halving h divides the error by about 16.
        var system = new ScalarSystem((t, y) => y * Math.Cos(t));
        double ErrorWith(double step) =>
            Math.Abs(OdeSolver.Solve(Problems.Scalar(system, 1, 0, 20), new RungeKutta4 { Step = step }).FinalState[0] - Math.Exp(Math.Sin(20)));

        var slope = Math.Log2(ErrorWith(0.1) / ErrorWith(0.05));

        Assert.InRange(slope, 3.7, 4.3);
    }

    [Fact]
    public void Solve_RungeKutta4_StepsAndBackwards()
    {
        var system = new ScalarSystem((t, y) => -y);

        var solution = OdeSolver.Solve(Problems.Scalar(system, Math.Exp(-1), 1, 0), new RungeKutta4 { Step = 0.3 });

        Assert.Equal(SolveStatus.Succeeded, solution.Status);
        Assert.Equal(5, solution.Count);
        Assert.Equal(0.0, solution.FinalTime);
        Assert.Equal(1.0, solution.FinalState[0], 1e-3);
        Assert.Equal(16, solution.Statistics.FunctionEvaluations);
    }

    [Fact]
    public void Solve_CancelledDuringALongRun_StopsWithinTheNextCheckOfSteps()
    {
        // The token is cancelled at the 10,000th field evaluation of a run that would take millions; the solver looks
        // at it every 1024 accepted steps (six evaluations each, a few more for rejected steps).
        using var source = new CancellationTokenSource();
        var system = new CancellingSystem(new LorenzSystem(), source, 10_000);
        var problem = new OdeProblem(system, [1.0, 1.0, 1.0], 0, 10_000, [.. LorenzSystem.ClassicParameters]);
        var method = new DormandPrince45 { RelativeTolerance = 1e-8, AbsoluteTolerance = 1e-8, KeepSteps = false, MaxSteps = int.MaxValue, Cancellation = source.Token };

        Assert.ThrowsAny<OperationCanceledException>(() => OdeSolver.Solve(problem, method));
        Assert.InRange(system.Evaluations, 10_000, 10_000 + (2 * 7 * DormandPrince45.CancellationCheckSteps));
    }

    private static double MaxAbsDifference(ReadOnlySpan<double> actual, ReadOnlySpan<double> expected)
    {
        var worst = 0.0;
        for (var i = 0; i < expected.Length; i++)
        {
            worst = Math.Max(worst, Math.Abs(actual[i] - expected[i]));
        }

        return worst;
    }
}
