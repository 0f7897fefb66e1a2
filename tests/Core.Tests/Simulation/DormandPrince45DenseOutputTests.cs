using Patchproof.Core.Simulation;
using Patchproof.Core.Tests.Simulation.TestSystems;

namespace Patchproof.Core.Tests.Simulation;

public sealed class DormandPrince45DenseOutputTests
{
    [Fact]
    public void Evaluate_HairerForm_EqualsThePolynomialInThetaFromP()
    {
        // Hairer's CONTD5 form equals y0 + h Σ_i K_i Σ_j P_ij θ^j (dopri5-tableau.json, verified with sympy).
        var problem = Problems.Lorenz(1);
        var stepper = new DormandPrince45Stepper(problem, new DormandPrince45 { RelativeTolerance = 1e-6 });
        stepper.Step();
        var h = stepper.LastStepSize;
        var stages = new double[7][];
        var y0 = stepper.PreviousState.ToArray();
        var system = new LorenzSystem();
        var parameters = problem.Parameters.AsSpan();
        var tableau = DormandPrince45Tableau.Instance;
        for (var i = 0; i < 7; i++)
        {
            var stageState = (double[])y0.Clone();
            for (var j = 0; j < i; j++)
            {
                for (var c = 0; c < 3; c++)
                {
                    stageState[c] += h * tableau.A[i][j] * stages[j][c];
                }
            }

            stages[i] = new double[3];
            system.Evaluate(tableau.C[i] * h, stageState, parameters, stages[i]);
        }

        var dense = stepper.CreateDenseOutput();
        var value = new double[3];
        foreach (var theta in new[] { 0.1, 0.37, 0.5, 0.9 })
        {
            dense.Evaluate(theta * h, value);
            for (var c = 0; c < 3; c++)
            {
                var expected = y0[c];
                for (var i = 0; i < 7; i++)
                {
                    var weight = 0.0;
                    for (var j = 0; j < 4; j++)
                    {
                        weight += tableau.P[i][j] * Math.Pow(theta, j + 1);
                    }

                    expected += h * stages[i][c] * weight;
                }

                Assert.Equal(expected, value[c], 1e-13);
            }
        }
    }

    [Fact]
    public void Evaluate_SolutionAtStepTimes_ReproducesTheStepValues()
    {
        // The interpolant matches the step values exactly at both ends (to 1e-15 relative, SciPy's test_rk practice).
        var solution = OdeSolver.Solve(Problems.Lorenz(3), new DormandPrince45 { RelativeTolerance = 1e-8, AbsoluteTolerance = 1e-8, KeepDenseOutput = true });
        var value = new double[3];

        Assert.Equal(solution.Count - 1, solution.SegmentCount);
        for (var i = 0; i < solution.Count; i++)
        {
            solution.Evaluate(solution.Times[i], value);
            var expected = solution.StateAt(i);
            for (var c = 0; c < 3; c++)
            {
                Assert.Equal(expected[c], value[c], 1e-14 * Math.Max(1, Math.Abs(expected[c])));
            }
        }
    }

    [Fact]
    public void Evaluate_InsideAStep_IsFourthOrderAccurate()
    {
        // y' = y cos t, y = e^(sin t) (closed form): at rtol 1e-10 the interpolant stays within 1e-8 between steps.
        var system = new ScalarSystem((t, y) => y * Math.Cos(t));
        var solution = OdeSolver.Solve(Problems.Scalar(system, 1, 0, 10), new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-12, KeepDenseOutput = true });
        var value = new double[1];

        for (var t = 0.0; t <= 10; t += 0.01)
        {
            solution.Evaluate(t, value);
            Assert.Equal(Math.Exp(Math.Sin(t)), value[0], 1e-8);
        }

        var segment = solution.Segment(3);
        Assert.Equal(solution.Times[3], segment.TMin);
        Assert.Equal(solution.Times[4], segment.TMax);
    }
}
