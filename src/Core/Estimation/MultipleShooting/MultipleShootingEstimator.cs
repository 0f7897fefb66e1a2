using MathNet.Numerics.LinearAlgebra;
using Patchproof.Core.Models;

namespace Patchproof.Core.Estimation.MultipleShooting;

/// <summary>Fits a board's coefficients, offsets and channel offsets (and gains, with a prior) to a capture by multiple shooting.</summary>
/// <remarks>
/// <para>A chaotic trajectory cannot be fitted as one long solution: tiny coefficient errors grow exponentially and the
/// cost surface becomes a maze of local minima. Multiple shooting cuts the record into segments shorter than about half a
/// Lyapunov time, gives each its own initial state, and asks for continuity at the joins as part of the least squares, so
/// every segment stays close to the data while the shared coefficients are estimated from all of them.</para>
/// <para>The unknowns are solved by Levenberg-Marquardt with the Jacobian from forward sensitivities; segment states are
/// eliminated block by block (see <see cref="MultipleShootingProblem"/>), so one iteration costs O(K n³ + K n² P + P³).
/// A Huber loss, by reweighting at every linearization, keeps glitches from steering the fit.</para>
/// <para>Uncertainty: the covariance of the globals is σ̂² (C - Bᵀ T⁻¹ B)⁻¹ with σ̂² the weighted residual variance,
/// widened by (1 + ρ)/(1 - ρ) with ρ the lag-one autocorrelation of the residuals (smoothing and quantization correlate them).</para>
/// <para>References: 1. H. G. Bock, Recent advances in parameter identification techniques for ODE, in Numerical Treatment of
/// Inverse Problems, Birkhäuser 1983. 2. M. Baake, K. Baake, H. G. Bock, K. M. Briggs, Fitting ordinary differential equations
/// to chaotic data, Phys. Rev. A 45 (1992) 5524-5529. 3. H. U. Voss, J. Timmer, J. Kurths, Nonlinear dynamical system
/// identification from uncertain and indirect measurements, Int. J. Bifurcation and Chaos 14 (2004) 1905-1933.
/// 4. P. J. Huber, Robust estimation of a location parameter, Ann. Math. Statist. 35 (1964) 73-101.</para>
/// </remarks>
public static class MultipleShootingEstimator
{
    /// <summary>Fits <paramref name="field"/> to the channels.</summary>
    /// <param name="field">The vector field whose parameters are fitted: a board's <see cref="PolynomialVectorField"/> in volts and
    /// seconds (one free coefficient a term), or any other system with its parameter Jacobian, for example a model whose
    /// parameters are tied across terms (Lorenz's sigma in both terms of x').</param>
    /// <param name="initialParameters">Starting coefficients and offsets (the design's nominal values, or an equation-error estimate).</param>
    /// <param name="channels">The channels, all on one uniform time base; each state at most once.</param>
    /// <param name="startSeconds">Time of the first sample.</param>
    /// <param name="intervalSeconds">The sample interval; positive.</param>
    /// <param name="options">Segment length, tolerances, loss.</param>
    /// <param name="stateGuess">Optional full-state guess per sample (for hidden states, from <see cref="PecoraCarrollSynchronizer"/>); observed states are taken from the channels.</param>
    /// <param name="initialChannelOffsetsVolts">Optional starting channel offsets, one per channel (for example from <see cref="EquationErrorStart"/>); zeros when null.</param>
    /// <returns>The fitted values, their covariance, and how the fit went.</returns>
    /// <exception cref="ArgumentOutOfRangeException">Shapes disagree, or a setting is out of range.</exception>
    public static MultipleShootingResult Fit(
        IOdeSystem field,
        IReadOnlyList<double> initialParameters,
        IReadOnlyList<ShootingChannel> channels,
        double startSeconds,
        double intervalSeconds,
        MultipleShootingOptions options,
        IReadOnlyList<double[]>? stateGuess = null,
        IReadOnlyList<double>? initialChannelOffsetsVolts = null)
    {
        Preconditions.CheckArgumentRange(nameof(initialParameters), initialParameters.Count == field.ParameterCount, "must have one value per field parameter");
        Preconditions.CheckArgumentRange(nameof(channels), channels.Count > 0 && channels.All(c => c.Samples.Count == channels[0].Samples.Count && c.NoiseSdVolts > 0 && c.NominalGain != 0), "needs channels of equal length with positive noise and non-zero gain");
        Preconditions.CheckArgumentRange(nameof(channels), channels.Select(c => c.StateIndex).Distinct().Count() == channels.Count, "each state may be recorded by one channel only");
        Preconditions.CheckArgumentRange(nameof(intervalSeconds), intervalSeconds > 0, "must be positive");
        Preconditions.CheckArgumentRange(nameof(options), options.SegmentSeconds > 0, "the segment length must be positive");
        Preconditions.CheckArgumentRange(nameof(options), options.ParameterPriors.All(prior => prior.Index >= 0 && prior.Index < field.ParameterCount && prior.Sd > 0), "each prior needs a valid parameter index and a positive sd");

        var problem = new MultipleShootingProblem(field, channels, startSeconds, intervalSeconds, options);
        var n = field.StateCount;
        var segmentStates = Enumerable.Range(0, problem.SegmentCount).Select(k =>
        {
            var sample = problem.SegmentFirstSample(k);
            var state = new double[n];
            for (var j = 0; j < n; j++)
            {
                var c = 0;
                while (c < channels.Count && channels[c].StateIndex != j)
                {
                    c++;
                }

                state[j] = c < channels.Count
                    ? (channels[c].Samples[sample] - (initialChannelOffsetsVolts?[c] ?? 0)) / channels[c].NominalGain
                    : stateGuess?[sample][j] ?? 0;
            }

            return (IReadOnlyList<double>)state;
        }).ToList();
        var start = problem.Pack(segmentStates, initialParameters, initialChannelOffsetsVolts?.ToArray() ?? new double[channels.Count]);
        var solver = options.Solver with { ResidualDegreesOfFreedom = Math.Max(0, problem.UsedObservationCount - problem.ParameterCount) };
        var outcome = LevenbergMarquardtSolver.Minimize(problem, start, solver);
        outcome = RestartWhileStalled(problem, outcome, solver);
        var solution = outcome.Parameters;

        // Uncertainty at the solution: relinearize, condense, scale by the residual variance, widen for correlation.
        var gradient = new double[problem.ParameterCount];
        var curvature = new double[problem.ParameterCount];
        problem.TryLinearize(solution, gradient, curvature);
        var residuals = problem.ObservationResiduals(solution);
        for (var c = 0; c < channels.Count; c++)
        {
            if (channels[c].Excluded is { } excluded)
            {
                for (var i = 0; i < residuals[c].Length; i++)
                {
                    residuals[c][i] = excluded[i] ? double.NaN : residuals[c][i];
                }
            }
        }

        var observations = residuals.Sum(r => r.Count(double.IsFinite));
        var degreesOfFreedom = Math.Max(1, observations - problem.ParameterCount);
        var residualVariance = residuals.Sum(r => r.Where(double.IsFinite).Sum(v => v * v)) / degreesOfFreedom;
        var correlation = LagOneAutocorrelation(residuals);
        var inflation = Math.Clamp((1 + correlation) / (1 - correlation), 1, 100);
        var globals = problem.GlobalCount;
        var condensed = problem.CondensedCurvature();
        var covariance = condensed is null
            ? Matrix<double>.Build.Dense(globals, globals, double.NaN)
            : ResolvedInverse(condensed) * (residualVariance * inflation);

        var errors = Enumerable.Range(0, globals).Select(p => Math.Sqrt(Math.Max(covariance[p, p], 0))).ToArray();
        var correlationMatrix = Matrix<double>.Build.Dense(globals, globals, (a, b) => covariance[a, b] / (errors[a] * errors[b]));
        var globalOffset = problem.SegmentCount * n;
        var offsetCount = options.EstimateChannelOffsets ? channels.Count : 0;
        var names = field.ParameterNames
            .Concat(options.EstimateChannelOffsets ? channels.Select(c => "offset:" + c.Name) : [])
            .Concat(problem.GainChannels.Select(c => "gain:" + channels[c].Name))
            .ToList();
        var offsetErrors = channels.Select((_, c) => options.EstimateChannelOffsets ? errors[field.ParameterCount + c] : 0).ToList();
        var gainErrors = channels.Select((_, c) =>
        {
            var slot = problem.GainChannels.ToList().IndexOf(c);
            return slot < 0 ? 0 : errors[field.ParameterCount + offsetCount + slot];
        }).ToList();
        var rms = residuals.Select((r, c) => Math.Sqrt(r.Where(double.IsFinite).Select(v => v * v).DefaultIfEmpty(0).Average()) * channels[c].NoiseSdVolts).ToList();
        return new MultipleShootingResult(
            solution.AsSpan(globalOffset, field.ParameterCount).ToArray(),
            errors.Take(field.ParameterCount).ToArray(),
            channels.Select((_, c) => problem.OffsetOf(solution, c)).ToList(),
            offsetErrors,
            channels.Select((_, c) => problem.GainOf(solution, c)).ToList(),
            gainErrors,
            names,
            covariance.ToRowMajorArray(),
            correlationMatrix.ToRowMajorArray(),
            Enumerable.Range(0, problem.SegmentCount).Select(problem.SegmentStart).ToList(),
            Enumerable.Range(0, problem.SegmentCount).Select(k => (IReadOnlyList<double>)solution.AsSpan(k * n, n).ToArray()).ToList(),
            rms,
            inflation,
            outcome.Iterations,
            outcome.ExitReason,
            outcome.SumOfSquares);
    }

    /// <summary>Restarts the loop (damping and scaling reset) while it stopped on a small step under heavy damping.</summary>
    /// <remarks>Near the optimum the shooting cost is not exactly quadratic (Huber weights, continuity at the joins,
    /// adaptive integration), so a run of rejected steps can drive lambda up until every step is tiny and the step test
    /// fires far from the minimum. A fresh start with light damping takes the Gauss-Newton step again; the restarts
    /// share the iteration cap, and their progress reports continue the count against it, so a progress bar never steps back.</remarks>
    private static LevenbergMarquardtOutcome RestartWhileStalled(MultipleShootingProblem problem, LevenbergMarquardtOutcome outcome, LevenbergMarquardtOptions solver)
    {
        var iterations = outcome.Iterations;
        for (var restart = 0; restart < 3; restart++)
        {
            var stalled = outcome.ExitReason is LevenbergMarquardtExitReason.ConvergedOnStep && outcome.FinalDamping > 1e3 * solver.InitialDamping;
            if (!stalled || iterations >= solver.MaxIterations)
            {
                break;
            }

            var progress = solver.Progress is { } outer ? new ContinuedIterationProgress(outer, iterations, solver.MaxIterations) : null;
            var again = LevenbergMarquardtSolver.Minimize(problem, outcome.Parameters, solver with { MaxIterations = solver.MaxIterations - iterations, Progress = progress });
            iterations += again.Iterations;
            var improved = again.SumOfSquares < outcome.SumOfSquares;
            outcome = (improved ? again : outcome) with { Iterations = iterations };
            if (!improved)
            {
                break;
            }
        }

        return outcome;
    }

    /// <summary>The inverse of the condensed curvature where the data resolve it; NaN in the rows and columns of every
    /// unknown that a flat direction moves.</summary>
    /// <remarks>An exactly flat direction (a channel offset that trades against a coefficient and an equation offset,
    /// with no prior to pin it) makes the matrix singular, and a plain inverse then returns rounding noise that differs
    /// between machines. The symmetric eigendecomposition of the Jacobi-scaled matrix finds such directions: eigenvalues
    /// below 1e-11 of the largest count as zero.</remarks>
    private static Matrix<double> ResolvedInverse(Matrix<double> curvature)
    {
        var size = curvature.RowCount;
        var scale = Enumerable.Range(0, size).Select(i => curvature[i, i] > 0 ? 1 / Math.Sqrt(curvature[i, i]) : 0).ToArray();
        var scaled = Matrix<double>.Build.Dense(size, size, (a, b) => 0.5 * (curvature[a, b] + curvature[b, a]) * scale[a] * scale[b]);
        var decomposition = scaled.Evd(Symmetricity.Symmetric);
        var values = decomposition.EigenValues.Select(value => value.Real).ToArray();
        var vectors = decomposition.EigenVectors;
        var threshold = 1e-11 * Math.Max(values.Max(), double.Epsilon);
        var unresolved = new bool[size];
        var inverse = Matrix<double>.Build.Dense(size, size);
        for (var e = 0; e < size; e++)
        {
            if (values[e] > threshold)
            {
                inverse += vectors.Column(e).OuterProduct(vectors.Column(e)) / values[e];
                continue;
            }

            for (var i = 0; i < size; i++)
            {
                unresolved[i] |= scale[i] == 0 || Math.Abs(vectors[i, e]) > 1e-6;
            }
        }

        return Matrix<double>.Build.Dense(size, size, (a, b) => unresolved[a] || unresolved[b] ? double.NaN : inverse[a, b] * scale[a] * scale[b]);
    }

    private static double LagOneAutocorrelation(double[][] residuals)
    {
        double numerator = 0, denominator = 0;
        foreach (var channel in residuals)
        {
            var mean = channel.Where(double.IsFinite).DefaultIfEmpty(0).Average();
            for (var i = 0; i < channel.Length; i++)
            {
                if (!double.IsFinite(channel[i]))
                {
                    continue;
                }

                denominator += (channel[i] - mean) * (channel[i] - mean);
                if (i + 1 < channel.Length && double.IsFinite(channel[i + 1]))
                {
                    numerator += (channel[i] - mean) * (channel[i + 1] - mean);
                }
            }
        }

        return denominator > 0 ? Math.Clamp(numerator / denominator, 0, 0.99) : 0;
    }
}
