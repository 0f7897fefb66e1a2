using Patchproof.Core.Simulation;
using Patchproof.Core.Tests.Simulation.TestSystems;

namespace Patchproof.Core.Tests.Simulation;

public sealed class EventLocatorTests
{
    [Theory]
    [InlineData("mu=1", 1.0, 1e-7)]
    [InlineData("mu=0.5", 0.5, 1e-6)]
    [InlineData("mu=2", 2.0, 1e-6)]
    [InlineData("mu=5", 5.0, 1e-6)]
    public void MaximumOf_VanDerPolLimitCycle_GivesThePeriodAndAmplitude(string key, double mu, double allowed)
    {
        // ode-reference.json: periods and x_max computed with SciPy DOP853 at 1e-13 (not published); tolerances from CHECKS.md.
        var reference = OdeReference.VanDerPol(key);
        var problem = new OdeProblem(new VanDerPolSystem(), [2.0, 0.0], 0, 200, [mu]);
        var options = new DormandPrince45 { RelativeTolerance = 1e-12, AbsoluteTolerance = 1e-12, KeepSteps = false, Events = [OdeEvent.MaximumOf(0)] };

        var solution = OdeSolver.Solve(problem, options);

        Assert.Equal(SolveStatus.Succeeded, solution.Status);
        var maxima = solution.Events;
        Assert.True(maxima.Count > 10);
        var period = maxima[^1].Time - maxima[^2].Time;
        Assert.Equal(reference.GetProperty("period").GetDouble(), period, allowed);
        Assert.Equal(reference.GetProperty("amplitude_xmax").GetDouble(), maxima[^1].State[0], allowed);
    }

    [Fact]
    public void ZeroCrossing_Terminal_StopsAtTheLocatedTime()
    {
        // A body dropped from rest at height 10 (x' = -g t, x(0) = 10) reaches the ground at t = sqrt(2 h / g) (closed form).
        const double gravity = 9.80665;
        var system = new ScalarSystem((t, x) => -gravity * t);
        var options = new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-12, KeepDenseOutput = true,
            Events = [OdeEvent.ZeroCrossing((t, state) => state[0], EventDirection.Falling, isTerminal: true)] };

        var solution = OdeSolver.Solve(Problems.Scalar(system, 10, 0, 5), options);

        var expected = Math.Sqrt(2 * 10 / gravity);
        Assert.Equal(SolveStatus.StoppedByEvent, solution.Status);
        Assert.Equal(expected, solution.FinalTime, 1e-12);
        Assert.Equal(0.0, solution.FinalState[0], 1e-10);
        Assert.Single(solution.Events);
        Assert.Equal(solution.FinalTime, solution.Events[0].Time);
        Assert.Equal(solution.FinalTime, solution.Times[^1]);
        Assert.Equal(solution.FinalTime, solution.TMax);
    }

    [Fact]
    public void ZeroCrossing_Direction_FiltersCrossings()
    {
        // sin t on [0, 4π + 1]: rising zeros at 2π, 4π; falling at π, 3π (the zero at t = 0 is where it starts and does not count).
        var system = new ScalarSystem((t, y) => Math.Cos(t));
        EventFunction sine = (t, state) => state[0];
        var options = new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-12,
            Events = [OdeEvent.ZeroCrossing(sine, EventDirection.Rising), OdeEvent.ZeroCrossing(sine, EventDirection.Falling), OdeEvent.ZeroCrossing(sine)] };

        var solution = OdeSolver.Solve(Problems.Scalar(system, 0, 0, (4 * Math.PI) + 1), options);

        var rising = solution.Events.Where(e => e.EventIndex == 0).Select(e => e.Time).ToArray();
        var falling = solution.Events.Where(e => e.EventIndex == 1).Select(e => e.Time).ToArray();
        Assert.Equal(2, rising.Length);
        Assert.Equal(2 * Math.PI, rising[0], 1e-9);
        Assert.Equal(4 * Math.PI, rising[1], 1e-9);
        Assert.Equal(2, falling.Length);
        Assert.Equal(Math.PI, falling[0], 1e-9);
        Assert.Equal(3 * Math.PI, falling[1], 1e-9);
        Assert.Equal(4, solution.Events.Count(e => e.EventIndex == 2));
        Assert.True(solution.Events.Select(e => e.Time).SequenceEqual(solution.Events.Select(e => e.Time).Order()));
    }

    [Fact]
    public void MaximumOf_Backwards_FindsTheMaximaOfTheCosine()
    {
        // y = cos t, integrated backwards from 7 to -7: maxima at 2π, 0, -2π (closed form).
        var system = new ScalarSystem((t, y) => -Math.Sin(t));
        var options = new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-12, Events = [OdeEvent.MaximumOf(0)] };

        var solution = OdeSolver.Solve(Problems.Scalar(system, Math.Cos(7), 7, -7), options);

        Assert.Equal([2 * Math.PI, 0, -2 * Math.PI], solution.Events.Select(e => Math.Round(e.Time, 8)).ToArray(),
            (left, right) => Math.Abs(left - Math.Round(right, 8)) < 1e-8);
    }

    [Fact]
    public void MaximumOf_StateIndexOutOfRange_Throws()
    {
        var options = new DormandPrince45 { Events = [OdeEvent.MaximumOf(3)] };

        Assert.Throws<ArgumentOutOfRangeException>(() => OdeSolver.Solve(Problems.Lorenz(1), options));
    }
}
