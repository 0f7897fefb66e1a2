using Patchproof.Core.Simulation;
using Patchproof.Core.Tests.Simulation.TestSystems;

namespace Patchproof.Core.Tests.Simulation;

public sealed class DormandPrince45StepperTests
{
    [Fact]
    public void Step_OneStepOfExponentialGrowth_EqualsTheStabilityPolynomial()
    {
        // y' = y, y(0) = 1, h = 0.1: y1 = R(0.1) = 1.10517091833333333 (dopri5-tableau.json, derived from the tableau).
        var stepper = new DormandPrince45Stepper(Problems.Scalar(new ScalarSystem((t, y) => y), 1, 0, 0.1), new DormandPrince45 { FixedStep = 0.1 });

        Assert.True(stepper.Step());

        Assert.True(stepper.IsFinished);
        Assert.Equal(1.10517091833333333, stepper.State[0], 1e-15);
    }

    [Fact]
    public void Step_FixedStepConvergence_HasOrderFive()
    {
        // Dormand & Prince 1980 (order 5). y' = y cos t on [0, 20] with 200/400/800 steps; errors 2.217e-8,
        // 6.956e-10, 2.174e-11 within 20 % (computed with NumPy from the tableau, CHECKS.md), log2 ratio 5 ± 0.3.
        double[] expected = [2.217e-8, 6.956e-10, 2.174e-11];
        var errors = new double[3];
        for (var i = 0; i < 3; i++)
        {
            var steps = 200 << i;
            var system = new ScalarSystem((t, y) => y * Math.Cos(t));
            var stepper = new DormandPrince45Stepper(Problems.Scalar(system, 1, 0, 20), new DormandPrince45 { FixedStep = 20.0 / steps, MaxSteps = 10 * steps });
            while (stepper.Step())
            {
            }

            Assert.Equal(SolveStatus.Succeeded, stepper.Status);
            Assert.InRange(stepper.Statistics.AcceptedSteps, steps, steps + 1);
            errors[i] = Math.Abs(stepper.State[0] - Math.Exp(Math.Sin(20)));
            Assert.InRange(errors[i], 0.8 * expected[i], 1.2 * expected[i]);
        }

        Assert.InRange(Math.Log2(errors[0] / errors[1]), 4.7, 5.3);
        Assert.InRange(Math.Log2(errors[1] / errors[2]), 4.7, 5.3);
    }

    [Fact]
    public void Step_AfterWarmUp_AllocatesNothing()
    {
        // Arrange
        var stepper = new DormandPrince45Stepper(Problems.Lorenz(1000), new DormandPrince45 { RelativeTolerance = 1e-9, AbsoluteTolerance = 1e-9 });
        for (var i = 0; i < 100; i++)
        {
            stepper.Step();
        }

        // Act
        var before = GC.GetAllocatedBytesForCurrentThread();
        for (var i = 0; i < 10_000; i++)
        {
            stepper.Step();
        }

        var allocated = GC.GetAllocatedBytesForCurrentThread() - before;

        // Assert
        Assert.Equal(0, allocated);
    }

    [Fact]
    public void Step_WithSensitivities_AllocatesNothing()
    {
        var options = new DormandPrince45 { RelativeTolerance = 1e-8, AbsoluteTolerance = 1e-8, Sensitivities = new ForwardSensitivities() };
        var stepper = new DormandPrince45Stepper(Problems.Lorenz(1000), options);
        for (var i = 0; i < 100; i++)
        {
            stepper.Step();
        }

        var before = GC.GetAllocatedBytesForCurrentThread();
        for (var i = 0; i < 5_000; i++)
        {
            stepper.Step();
        }

        Assert.Equal(0, GC.GetAllocatedBytesForCurrentThread() - before);
    }

    [Fact]
    public void Step_AfterFinishing_ReturnsFalseAndKeepsTheState()
    {
        var stepper = new DormandPrince45Stepper(Problems.Lorenz(0.5), new DormandPrince45());
        while (stepper.Step())
        {
        }

        var state = stepper.State.ToArray();

        Assert.False(stepper.Step());
        Assert.Equal(0.5, stepper.Time);
        Assert.Equal(state, stepper.State.ToArray());
    }

    [Fact]
    public void Step_FirstStepGiven_UsesIt()
    {
        var stepper = new DormandPrince45Stepper(Problems.Lorenz(1), new DormandPrince45 { FirstStep = 1e-4 });

        stepper.Step();

        Assert.Equal(1e-4, stepper.LastStepSize, 1e-18);
        Assert.Equal(1, stepper.Statistics.FunctionEvaluations - 6);
    }

    [Fact]
    public void Step_MaxStep_BoundsEveryStep()
    {
        var stepper = new DormandPrince45Stepper(Problems.Scalar(new ScalarSystem((t, y) => 0), 0, 0, 1), new DormandPrince45 { MaxStep = 0.125, FirstStep = 1 });
        var steps = 0;
        while (stepper.Step())
        {
            steps++;
            Assert.True(Math.Abs(stepper.LastStepSize) <= 0.125);
        }

        Assert.Equal(8, steps);
    }

    [Fact]
    public void CreateDenseOutput_ReproducesBothEndsOfTheStep()
    {
        // The continuous extension interpolates y0 and y1 (Hairer et al. 1993, Sec. II.6).
        var stepper = new DormandPrince45Stepper(Problems.Lorenz(1), new DormandPrince45 { RelativeTolerance = 1e-6 });
        stepper.Step();
        stepper.Step();
        var dense = stepper.CreateDenseOutput();
        var value = new double[3];

        dense.Evaluate(stepper.PreviousTime, value);
        for (var i = 0; i < 3; i++)
        {
            Assert.Equal(stepper.PreviousState[i], value[i], 1e-15);
        }

        dense.Evaluate(stepper.Time, value);
        for (var i = 0; i < 3; i++)
        {
            Assert.Equal(stepper.State[i], value[i], 1e-14);
        }
    }
}
