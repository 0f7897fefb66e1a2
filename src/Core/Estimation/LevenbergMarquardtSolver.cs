namespace Patchproof.Core.Estimation;

/// <summary>The Levenberg-Marquardt loop over any <see cref="ILevenbergMarquardtProblem"/>: damping, gain-ratio acceptance and the stopping tests.</summary>
/// <remarks>
/// <para>At the accepted point p with cost S, gradient g = J'r and scale d (see <see cref="DampingScaling"/>), the trial
/// step solves (J'J + lambda diag(d)) delta = -g. Its predicted reduction under the Gauss-Newton model
/// L(delta) = ||r + J delta||^2 is S - L(delta) = -delta'g + lambda delta' diag(d) delta, which needs no product with J.
/// The gain ratio rho = (S - S(p + delta)) / predicted decides: rho &gt; 1e-4 accepts the step and multiplies lambda by
/// max(1/3, 1 - (2 rho - 1)^3); otherwise lambda is multiplied by nu and nu doubled (Nielsen's update; nu resets to 2
/// on success). Stopping tests are listed on <see cref="LevenbergMarquardtOptions"/>.</para>
/// <para>References:
/// 1. K. Levenberg, A method for the solution of certain non-linear problems in least squares, Q. Appl. Math. 2 (1944) 164-168.
/// 2. D. W. Marquardt, An algorithm for least-squares estimation of nonlinear parameters, J. SIAM 11 (1963) 431-441.
/// 3. H. B. Nielsen, Damping parameter in Marquardt's method, report IMM-REP-1999-05, DTU 1999.
/// 4. J. J. Moré, The Levenberg-Marquardt algorithm: implementation and theory, Lecture Notes in Mathematics 630 (1978) 105-116 (scaling and stopping tests).</para>
/// </remarks>
public static class LevenbergMarquardtSolver
{
    private const double AcceptanceThreshold = 1e-4;
    private const double MaximumDamping = 1e32;
    private const double MaximumAccelerationRatio = 0.75;

    /// <summary>Minimises S(p) from <paramref name="initialParameters"/>.</summary>
    /// <param name="problem">The problem; it is linearized at every accepted point.</param>
    /// <param name="initialParameters">The starting point (length <see cref="ILevenbergMarquardtProblem.ParameterCount"/>), finite.</param>
    /// <param name="options">Tolerances, cap and damping; defaults when null.</param>
    /// <returns>The last accepted point, its cost, counters and the exit reason.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When the start has the wrong length or is not finite, or an option is out of range.</exception>
    /// <exception cref="OperationCanceledException">When <see cref="LevenbergMarquardtOptions.Cancellation"/> is cancelled between iterations.</exception>
    public static LevenbergMarquardtOutcome Minimize(ILevenbergMarquardtProblem problem, ReadOnlySpan<double> initialParameters, LevenbergMarquardtOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(problem);
        options ??= new LevenbergMarquardtOptions();
        options.Validate();
        var count = problem.ParameterCount;
        Preconditions.CheckArgumentRange(nameof(initialParameters), initialParameters.Length == count, "must have one entry per unknown");
        foreach (var value in initialParameters)
        {
            Preconditions.CheckFinite(nameof(initialParameters), value);
        }

        var parameters = initialParameters.ToArray();
        var trial = new double[count];
        var step = new double[count];
        var gradient = new double[count];
        var curvature = new double[count];
        var scale = new double[count];
        var damping = new double[count];
        var acceleration = new double[count];
        var accelerating = options.GeodesicAcceleration ? problem as IGeodesicAccelerationProblem : null;

        var costEvaluations = 1;
        if (!problem.TryEvaluateCost(parameters, out var cost))
        {
            return new LevenbergMarquardtOutcome(parameters, double.NaN, 0, 0, costEvaluations, 0, options.InitialDamping, LevenbergMarquardtExitReason.NonFiniteInitialCost);
        }

        var linearizations = 1;
        if (!problem.TryLinearize(parameters, gradient, curvature))
        {
            return new LevenbergMarquardtOutcome(parameters, cost, 0, 0, costEvaluations, linearizations, options.InitialDamping, LevenbergMarquardtExitReason.Singular);
        }

        UpdateScale(options.Scaling, curvature, scale, first: true);
        var lambda = options.InitialDamping;
        var growth = 2.0;
        var iterations = 0;
        var accepted = 0;
        while (true)
        {
            if (GradientIsSmall(gradient, curvature, cost, options.GradientTolerance))
            {
                return Finish(LevenbergMarquardtExitReason.ConvergedOnGradient);
            }

            if (iterations >= options.MaxIterations)
            {
                return Finish(LevenbergMarquardtExitReason.MaxIterations);
            }

            options.Cancellation.ThrowIfCancellationRequested();
            options.Progress?.Report(new LevenbergMarquardtIteration(iterations, options.MaxIterations, cost));
            iterations++;
            for (var j = 0; j < count; j++)
            {
                damping[j] = lambda * scale[j];
            }

            if (!problem.TrySolveDampedStep(damping, step))
            {
                if (!Grow())
                {
                    return Finish(LevenbergMarquardtExitReason.Singular);
                }

                continue;
            }

            double predicted = 0, dampingTerm = 0, stepNorm = 0, pointNorm = 0;
            for (var j = 0; j < count; j++)
            {
                dampingTerm += damping[j] * step[j] * step[j];
                predicted += -step[j] * gradient[j] + damping[j] * step[j] * step[j];
                var root = Math.Sqrt(scale[j]);
                stepNorm += root * step[j] * root * step[j];
                pointNorm += root * parameters[j] * root * parameters[j];
                trial[j] = parameters[j] + step[j];
            }

            stepNorm = Math.Sqrt(stepNorm);
            pointNorm = Math.Sqrt(pointNorm);
            if (accelerating is not null)
            {
                if (!accelerating.TryAcceleration(parameters, step, damping, acceleration))
                {
                    if (!Grow())
                    {
                        return Finish(LevenbergMarquardtExitReason.Singular);
                    }

                    continue;
                }

                double accelerationNorm = 0;
                for (var j = 0; j < count; j++)
                {
                    accelerationNorm += scale[j] * acceleration[j] * acceleration[j];
                }

                if (stepNorm > 0 && 2 * Math.Sqrt(accelerationNorm) / stepNorm > MaximumAccelerationRatio)
                {
                    if (!Grow())
                    {
                        var small = stepNorm <= options.RelativeStepTolerance * (pointNorm + options.RelativeStepTolerance);
                        return Finish(small ? LevenbergMarquardtExitReason.ConvergedOnStep : LevenbergMarquardtExitReason.Singular);
                    }

                    continue;
                }

                for (var j = 0; j < count; j++)
                {
                    trial[j] += 0.5 * acceleration[j];
                }
            }

            costEvaluations++;
            var trialFinite = problem.TryEvaluateCost(trial, out var trialCost);
            var actual = trialFinite ? cost - trialCost : double.NegativeInfinity;
            var ratio = predicted > 0 ? actual / predicted : (actual > 0 ? 1.0 : -1.0);
            var stepIsSmall = stepNorm <= options.RelativeStepTolerance * (pointNorm + options.RelativeStepTolerance);
            var costIsFlat = Math.Abs(actual) <= options.RelativeCostTolerance * cost && predicted <= options.RelativeCostTolerance * cost && ratio <= 2;

            if (trialFinite && ratio > AcceptanceThreshold)
            {
                // predicted = delta' H delta + 2 lambda delta' D delta: the step is nearly Gauss-Newton when the damping term is small.
                var withinUncertainty = options.VarianceScaledCostTolerance is { } tau && options.ResidualDegreesOfFreedom > 0
                    && dampingTerm <= 0.1 * (predicted - (2 * dampingTerm))
                    && actual <= tau * trialCost / options.ResidualDegreesOfFreedom
                    && predicted <= tau * trialCost / options.ResidualDegreesOfFreedom;
                (parameters, trial) = (trial, parameters);
                cost = trialCost;
                accepted++;
                var shrink = 2 * ratio - 1;
                lambda *= Math.Max(1.0 / 3.0, 1 - shrink * shrink * shrink);
                growth = 2.0;
                linearizations++;
                if (!problem.TryLinearize(parameters, gradient, curvature))
                {
                    return Finish(LevenbergMarquardtExitReason.Singular);
                }

                UpdateScale(options.Scaling, curvature, scale, first: false);
                if (withinUncertainty)
                {
                    return Finish(LevenbergMarquardtExitReason.ConvergedWithinUncertainty);
                }
            }
            else if (!Grow())
            {
                return Finish(stepIsSmall ? LevenbergMarquardtExitReason.ConvergedOnStep : LevenbergMarquardtExitReason.Singular);
            }

            if (cost == 0)
            {
                return Finish(LevenbergMarquardtExitReason.ConvergedOnGradient);
            }

            if (costIsFlat)
            {
                return Finish(LevenbergMarquardtExitReason.ConvergedOnCost);
            }

            if (stepIsSmall)
            {
                return Finish(LevenbergMarquardtExitReason.ConvergedOnStep);
            }
        }

        bool Grow()
        {
            lambda *= growth;
            growth *= 2;
            return lambda <= MaximumDamping && double.IsFinite(growth);
        }

        LevenbergMarquardtOutcome Finish(LevenbergMarquardtExitReason reason) =>
            new(parameters, cost, iterations, accepted, costEvaluations, linearizations, lambda, reason);
    }

    private static bool GradientIsSmall(double[] gradient, double[] curvature, double cost, double tolerance)
    {
        if (cost == 0)
        {
            return true;
        }

        var residualNorm = Math.Sqrt(cost);
        var largest = 0.0;
        for (var j = 0; j < gradient.Length; j++)
        {
            var columnNorm = Math.Sqrt(curvature[j]);
            if (columnNorm > 0)
            {
                largest = Math.Max(largest, Math.Abs(gradient[j]) / (columnNorm * residualNorm));
            }
        }

        return largest <= tolerance;
    }

    private static void UpdateScale(DampingScaling scaling, double[] curvature, double[] scale, bool first)
    {
        for (var j = 0; j < scale.Length; j++)
        {
            var value = curvature[j];
            switch (scaling)
            {
                case DampingScaling.Identity:
                    scale[j] = 1.0;
                    break;
                case DampingScaling.Marquardt:
                    scale[j] = value > 0 ? value : 1.0;
                    break;
                default:
                    scale[j] = first ? (value > 0 ? value : 1.0) : Math.Max(scale[j], value);
                    break;
            }
        }
    }
}
