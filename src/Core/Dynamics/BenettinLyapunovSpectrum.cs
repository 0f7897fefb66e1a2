using System.Collections.Immutable;
using Patchproof.Core.Models;
using Patchproof.Core.Simulation;

namespace Patchproof.Core.Dynamics;

/// <summary>Settings for <see cref="BenettinLyapunovSpectrum"/>.</summary>
public sealed record BenettinOptions
{
    /// <summary>Time between re-orthonormalizations, in the system's time unit (default 1).</summary>
    public double ReorthonormalizationInterval { get; init; } = 1.0;

    /// <summary>Time integrated first and discarded, so the state settles on the attractor (default 100).</summary>
    public double Transient { get; init; } = 100;

    /// <summary>Relative and absolute tolerance of the Dormand-Prince solves (default 1e-8).</summary>
    public double Tolerance { get; init; } = 1e-8;

    /// <summary>Checked during the transient and before each re-orthonormalization interval: once cancelled, the computation
    /// stops with <see cref="OperationCanceledException"/>. Default none.</summary>
    public CancellationToken Cancellation { get; init; }
}

/// <summary>The Lyapunov spectrum of a flow by Benettin's method: variational equations and repeated QR.</summary>
/// <remarks>
/// <para>Method: the state and its n x n tangent map Phi = dx(t)/dx(t_k) are integrated together
/// over each interval [t_k, t_k + Delta] by the project's Dormand-Prince solver with forward
/// sensitivities (the variational equation Phi' = J(x) Phi, J from
/// <see cref="IOdeSystem.EvaluateStateJacobian"/>). The tangent basis is carried on as
/// Q_{k+1} R_{k+1} = Phi_k Q_k (modified Gram-Schmidt), and
/// lambda_i = sum_k ln R_k(i, i) / (K Delta). Delta = 1 time unit keeps the growth of Lorenz's
/// leading direction (about e^0.9 per unit) far from losing the contracting ones to rounding.</para>
/// <para>Invariants: the exponents' sum equals the time mean of the Jacobian's trace (Liouville),
/// -(sigma + 1 + beta) for Lorenz at every T, up to the solver's tolerance; one exponent of an
/// autonomous flow with a bounded non-fixed orbit is 0.</para>
/// <para>References: 1. G. Benettin, L. Galgani, A. Giorgilli, J.-M. Strelcyn, Lyapunov
/// characteristic exponents for smooth dynamical systems, Meccanica 15 (1980) 9-30 and 21-30.
/// 2. I. Shimada, T. Nagashima, A numerical approach to ergodic problem of dissipative dynamical
/// systems, Prog. Theor. Phys. 61 (1979) 1605-1616. 3. A. Wolf, J. B. Swift, H. L. Swinney,
/// J. A. Vastano, Determining Lyapunov exponents from a time series, Physica D 16 (1985)
/// 285-317.</para>
/// </remarks>
public static class BenettinLyapunovSpectrum
{
    /// <summary>Computes the spectrum over <paramref name="duration"/> time units after the transient.</summary>
    /// <param name="system">The flow; its state Jacobian must be exact.</param>
    /// <param name="initialState">Where to start (length n, finite).</param>
    /// <param name="parameters">The parameters (length m).</param>
    /// <param name="duration">Time averaged over, positive (at least one interval).</param>
    /// <param name="options">Settings; null for the defaults.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the lengths, the duration or an option are out of range.</exception>
    /// <exception cref="OperationCanceledException">When <see cref="BenettinOptions.Cancellation"/> is cancelled.</exception>
    public static LyapunovSpectrum Compute(IOdeSystem system, ReadOnlySpan<double> initialState, ReadOnlySpan<double> parameters, double duration, BenettinOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(system);
        options ??= new BenettinOptions();
        var n = system.StateCount;
        Preconditions.CheckArgumentRange(nameof(initialState), initialState.Length == n, "must have one value per state variable");
        Preconditions.CheckArgumentRange(nameof(parameters), parameters.Length == system.ParameterCount, "must have one value per parameter");
        Preconditions.CheckArgumentRange(nameof(options), options.ReorthonormalizationInterval > 0 && options.Transient >= 0 && options.Tolerance > 0, "interval and tolerance must be positive, the transient not negative");
        Preconditions.CheckArgumentRange(nameof(duration), duration >= options.ReorthonormalizationInterval && double.IsFinite(duration), "must cover at least one re-orthonormalization interval");
        var parameterArray = parameters.ToImmutableArray();
        var plain = new DormandPrince45 { RelativeTolerance = options.Tolerance, AbsoluteTolerance = options.Tolerance, KeepSteps = false, MaxSteps = int.MaxValue, Cancellation = options.Cancellation };
        var tangent = plain with { Sensitivities = new ForwardSensitivities() };
        var state = initialState.ToArray();
        var time = 0.0;
        if (options.Transient > 0)
        {
            var settle = OdeSolver.Solve(new OdeProblem(system, [.. state], 0, options.Transient, parameterArray), plain);
            if (!settle.IsSuccess)
            {
                return Failed(n, "the transient stopped: " + settle.Message);
            }

            state = settle.FinalState.ToArray();
            time = options.Transient;
        }

        var basis = new double[n * n];
        for (var i = 0; i < n; i++)
        {
            basis[i * n + i] = 1;
        }

        var product = new double[n * n];
        var logNorms = new double[n];
        var sums = new double[n];
        var intervals = (long)Math.Floor(duration / options.ReorthonormalizationInterval + 1e-9);
        long done = 0;
        string? problem = null;
        for (; done < intervals; done++)
        {
            options.Cancellation.ThrowIfCancellationRequested();
            var solution = OdeSolver.Solve(new OdeProblem(system, [.. state], time, time + options.ReorthonormalizationInterval, parameterArray), tangent);
            if (!solution.IsSuccess)
            {
                problem = $"stopped after {done} intervals: {solution.Message}";
                break;
            }

            Orthonormalization.Multiply(solution.FinalStateSensitivity, basis, product, n);
            Orthonormalization.ModifiedGramSchmidt(product, n, n, logNorms);
            for (var i = 0; i < n; i++)
            {
                sums[i] += logNorms[i];
            }

            (basis, product) = (product, basis);
            solution.FinalState.CopyTo(state);
            time += options.ReorthonormalizationInterval;
        }

        if (done == 0)
        {
            return Failed(n, problem ?? "no interval completed");
        }

        var averagedTime = done * options.ReorthonormalizationInterval;
        var exponents = sums.Select(sum => sum / averagedTime).OrderByDescending(value => value).ToArray();
        return new LyapunovSpectrum(exponents, LyapunovSpectrum.KaplanYorke(exponents), done, averagedTime) { Problem = problem };
    }

    private static LyapunovSpectrum Failed(int n, string problem) =>
        new(Enumerable.Repeat(double.NaN, n).ToArray(), double.NaN, 0, 0) { Problem = problem };
}
