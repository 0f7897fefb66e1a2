using Patchproof.Core.Simulation;
using Patchproof.Core.Tests.Simulation.TestSystems;

namespace Patchproof.Core.Tests.Simulation;

public sealed class ForwardSensitivitiesTests
{
    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void Sensitivities_Lorenz_MatchCentralDifferencesOfWholeSolutions(bool inErrorControl)
    {
        // Check against finite differences of whole solutions (CHECKS.md; central differences, step 1e-5 relative,
        // truncation error about 1e-10 relative, solver error 1e-12 / 1e-5 = 1e-7).
        var problem = Problems.Lorenz(2);
        var options = new DormandPrince45 { RelativeTolerance = 1e-12, AbsoluteTolerance = 1e-12, KeepSteps = false,
            Sensitivities = new ForwardSensitivities { IncludeInErrorControl = inErrorControl } };
        var plain = options with { Sensitivities = null };

        var solution = OdeSolver.Solve(problem, options);

        Assert.Equal(SolveStatus.Succeeded, solution.Status);
        var stateSensitivity = solution.FinalStateSensitivity.ToArray();
        var parameterSensitivity = solution.FinalParameterSensitivity.ToArray();
        for (var j = 0; j < 3; j++)
        {
            var delta = 1e-5;
            var up = OdeSolver.Solve(problem with { InitialState = problem.InitialState.SetItem(j, problem.InitialState[j] + delta) }, plain).FinalState.ToArray();
            var down = OdeSolver.Solve(problem with { InitialState = problem.InitialState.SetItem(j, problem.InitialState[j] - delta) }, plain).FinalState.ToArray();
            for (var i = 0; i < 3; i++)
            {
                var difference = (up[i] - down[i]) / (2 * delta);
                Assert.Equal(difference, stateSensitivity[(i * 3) + j], 1e-5 * Math.Max(1, Math.Abs(difference)));
            }
        }

        for (var k = 0; k < 3; k++)
        {
            var delta = 1e-5 * problem.Parameters[k];
            var up = OdeSolver.Solve(problem with { Parameters = problem.Parameters.SetItem(k, problem.Parameters[k] + delta) }, plain).FinalState.ToArray();
            var down = OdeSolver.Solve(problem with { Parameters = problem.Parameters.SetItem(k, problem.Parameters[k] - delta) }, plain).FinalState.ToArray();
            for (var i = 0; i < 3; i++)
            {
                var difference = (up[i] - down[i]) / (2 * delta);
                Assert.Equal(difference, parameterSensitivity[(i * 3) + k], 1e-5 * Math.Max(1, Math.Abs(difference)));
            }
        }
    }

    [Fact]
    public void StateSensitivity_LinearOscillator_EqualsTheTransitionMatrix()
    {
        // For a linear system dx/dx0 is the state-transition matrix: its columns are the solutions from (1, 0) and (0, 1) (derived).
        var system = new DampedOscillatorSystem();
        var options = new DormandPrince45 { RelativeTolerance = 1e-12, AbsoluteTolerance = 1e-12 };
        var problem = new OdeProblem(system, [0.3, -0.2], 0, 1, [0.1, 2 * Math.PI]);

        var solution = OdeSolver.Solve(problem, options with { Sensitivities = new ForwardSensitivities() });
        var first = OdeSolver.Solve(problem with { InitialState = [1.0, 0.0] }, options).FinalState.ToArray();
        var second = OdeSolver.Solve(problem with { InitialState = [0.0, 1.0] }, options).FinalState.ToArray();

        var matrix = solution.FinalStateSensitivity;
        Assert.Equal(first[0], matrix[0], 1e-9);
        Assert.Equal(first[1], matrix[2], 1e-9);
        Assert.Equal(second[0], matrix[1], 1e-9);
        Assert.Equal(second[1], matrix[3], 1e-9);
    }

    [Fact]
    public void Sensitivities_AtSamples_AndDenseOutput_AgreeWithTheFinalValue()
    {
        var options = new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-10, SampleInterval = 0.25,
            Sensitivities = new ForwardSensitivities(), KeepDenseOutput = true };

        var solution = OdeSolver.Solve(Problems.Lorenz(1), options);

        Assert.Equal(5, solution.Count);
        Assert.Equal(new double[] { 1, 0, 0, 0, 1, 0, 0, 0, 1 }, solution.StateSensitivityAt(0).ToArray());
        Assert.Equal(new double[9], solution.ParameterSensitivityAt(0).ToArray());
        Assert.Equal(solution.FinalParameterSensitivity.ToArray(), solution.ParameterSensitivityAt(4).ToArray());
        var stateSensitivity = new double[9];
        var parameterSensitivity = new double[9];
        solution.EvaluateSensitivities(0.5, stateSensitivity, parameterSensitivity);
        Assert.Equal(solution.StateSensitivityAt(2).ToArray(), stateSensitivity);
        Assert.Equal(solution.ParameterSensitivityAt(2).ToArray(), parameterSensitivity);
    }

    [Fact]
    public void FinalStateSensitivity_WhenNotRequested_Throws()
    {
        var solution = OdeSolver.Solve(Problems.Lorenz(1), new DormandPrince45());

        Assert.Throws<InvalidOperationException>(() => solution.FinalStateSensitivity.ToArray());
    }
}
