namespace Patchproof.Core.Simulation;

/// <summary>Integrates a problem with the classical fixed-step Runge-Kutta method (see <see cref="RungeKutta4"/>).</summary>
/// <remarks>Stages: K1 = f(t, y), K2 = f(t + h/2, y + h K1/2), K3 = f(t + h/2, y + h K2/2), K4 = f(t + h, y + h K3),
/// y1 = y + h (K1 + 2 K2 + 2 K3 + K4)/6.</remarks>
internal static class RungeKutta4Run
{
    public static OdeSolution Solve(OdeProblem problem, RungeKutta4 options)
    {
        problem.Validate();
        options.Validate();
        var system = problem.System;
        var n = system.StateCount;
        var parameters = problem.Parameters.AsSpan();
        var direction = problem.EndTime >= problem.StartTime ? 1.0 : -1.0;
        var y = problem.InitialState.ToArray();
        var next = new double[n];
        var k1 = new double[n];
        var k2 = new double[n];
        var k3 = new double[n];
        var k4 = new double[n];
        var stage = new double[n];
        var times = new DoubleBuffer(options.KeepSteps ? 1024 : 0);
        var values = new DoubleBuffer(options.KeepSteps ? 1024 * n : 0);
        var time = problem.StartTime;
        long evaluations = 0;
        long steps = 0;
        var status = SolveStatus.Succeeded;
        if (options.KeepSteps)
        {
            times.Add(time);
            values.Add(y);
        }

        while (time != problem.EndTime)
        {
            if (steps >= options.MaxSteps)
            {
                status = SolveStatus.MaxStepsExceeded;
                break;
            }

            if (evaluations + 4 > options.MaxEvaluations)
            {
                status = SolveStatus.MaxEvaluationsExceeded;
                break;
            }

            var newTime = time + (direction * options.Step);
            if (direction * (newTime - problem.EndTime) >= 0)
            {
                newTime = problem.EndTime;
            }

            var h = newTime - time;
            system.Evaluate(time, y, parameters, k1);
            for (var i = 0; i < n; i++)
            {
                stage[i] = y[i] + (0.5 * h * k1[i]);
            }

            system.Evaluate(time + (0.5 * h), stage, parameters, k2);
            for (var i = 0; i < n; i++)
            {
                stage[i] = y[i] + (0.5 * h * k2[i]);
            }

            system.Evaluate(time + (0.5 * h), stage, parameters, k3);
            for (var i = 0; i < n; i++)
            {
                stage[i] = y[i] + (h * k3[i]);
            }

            system.Evaluate(newTime, stage, parameters, k4);
            evaluations += 4;
            var sum = 0.0;
            for (var i = 0; i < n; i++)
            {
                next[i] = y[i] + (h / 6.0 * (k1[i] + (2.0 * k2[i]) + (2.0 * k3[i]) + k4[i]));
                sum += next[i];
            }

            if (!double.IsFinite(sum))
            {
                status = SolveStatus.NonFiniteState;
                break;
            }

            (y, next) = (next, y);
            time = newTime;
            steps++;
            if (options.KeepSteps)
            {
                times.Add(time);
                values.Add(y);
            }
        }

        return new OdeSolution(
            status,
            OdeSolver.Describe(status, time, options),
            new SolverStatistics(evaluations, 0, steps, 0),
            n,
            system.ParameterCount,
            hasSensitivities: false,
            problem.StartTime,
            time,
            y,
            times.ToArray(),
            values.ToArray(),
            [],
            hasDenseOutput: false,
            [],
            [],
            []);
    }
}
