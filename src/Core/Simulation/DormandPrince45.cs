using System.Collections.Immutable;

namespace Patchproof.Core.Simulation;

/// <summary>Options for the adaptive Dormand-Prince 5(4) method with per-component error control.</summary>
/// <remarks>
/// <para>A step is accepted when the RMS norm of its local error estimate, each component divided by
/// sc_i = atol_i + rtol * max(|y_i|, |ynew_i|), is at most 1 (see <see cref="StepSizeController"/>).
/// Tolerances are in the units of the state; <see cref="MaxStep"/> and <see cref="FirstStep"/> in the
/// system's time unit, as magnitudes (the sign follows the direction of integration).</para>
/// <para>Defaults: rtol 1e-3, atol 1e-6 (as SciPy's solve_ivp), no step limit, the Hairer first-step
/// heuristic, steps kept, no dense output, no samples, no events, no sensitivities.</para>
/// <para>Output: with <see cref="SampleTimes"/> or <see cref="SampleInterval"/> the solution holds the
/// state at those times only (interpolated by the 4th-order dense output), so a long run stores no
/// per-step data; otherwise it holds the state at every accepted step if <see cref="OdeMethod.KeepSteps"/>.
/// <see cref="KeepDenseOutput"/> stores the interpolant of every step for <see cref="OdeSolution.Evaluate"/>.</para>
/// <para>References:
/// 1. J. R. Dormand, P. J. Prince, A family of embedded Runge-Kutta formulae, J. Comput. Appl. Math. 6 (1980) 19-26.
/// 2. E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I, 2nd ed., Springer 1993, Sec. II.4-II.6.</para>
/// </remarks>
public sealed record DormandPrince45 : OdeMethod
{
    /// <summary>The relative tolerance rtol (at least 0; default 1e-3).</summary>
    public double RelativeTolerance { get; init; } = 1e-3;

    /// <summary>The absolute tolerance atol for every component, in state units (at least 0; default 1e-6).</summary>
    public double AbsoluteTolerance { get; init; } = 1e-6;

    /// <summary>Optional absolute tolerances per state component (length n, each at least 0); overrides
    /// <see cref="AbsoluteTolerance"/> for the state. Default: none.</summary>
    public ImmutableArray<double> AbsoluteTolerances { get; init; }

    /// <summary>The largest step magnitude allowed (positive; default infinity).</summary>
    public double MaxStep { get; init; } = double.PositiveInfinity;

    /// <summary>The magnitude of the first step; 0 (the default) chooses it by the Hairer heuristic.</summary>
    public double FirstStep { get; init; }

    /// <summary>When positive, every step has this magnitude and the error estimate is ignored (for
    /// convergence studies); the last step is shortened to end at the end time. Default 0 (adaptive).</summary>
    public double FixedStep { get; init; }

    /// <summary>Whether the interpolant of every accepted step is stored so the solution can be
    /// evaluated at any time; default false. Costs 5 n doubles per step.</summary>
    public bool KeepDenseOutput { get; init; }

    /// <summary>Optional sample times, monotone in the direction of integration and inside the interval.
    /// Default: none.</summary>
    public ImmutableArray<double> SampleTimes { get; init; }

    /// <summary>Optional sample spacing (positive, in time units): samples at t0, t0 ± dt, ... up to the
    /// end time. Default 0 (none). Ignored when <see cref="SampleTimes"/> is given.</summary>
    public double SampleInterval { get; init; }

    /// <summary>Events located on the dense output of each step (zero crossings, maxima). Default: none.</summary>
    public ImmutableArray<OdeEvent> Events { get; init; } = [];

    /// <summary>When set, the forward sensitivities dx/dx0 and dx/dp are integrated alongside the state.
    /// Default: null (off).</summary>
    public ForwardSensitivities? Sensitivities { get; init; }

    /// <summary>The step-size controller; default the DOPRI5 PI controller.</summary>
    public StepSizeController Controller { get; init; } = new();

    /// <summary>Checked every <see cref="CancellationCheckSteps"/> accepted steps: once cancelled, the solve stops with
    /// <see cref="OperationCanceledException"/>. Default none.</summary>
    public CancellationToken Cancellation { get; init; }

    /// <summary>Accepted steps between two looks at <see cref="Cancellation"/> (a step costs six field evaluations, so the
    /// look is free at this spacing and a long run still stops within a few milliseconds).</summary>
    public const int CancellationCheckSteps = 1024;

    /// <summary>Whether samples were requested.</summary>
    internal bool HasSamples => !SampleTimes.IsDefaultOrEmpty || SampleInterval > 0;

    /// <inheritdoc />
    internal override void Validate()
    {
        base.Validate();
        Preconditions.CheckArgumentRange(nameof(RelativeTolerance), RelativeTolerance >= 0 && double.IsFinite(RelativeTolerance), "must be a finite number at least 0");
        Preconditions.CheckArgumentRange(nameof(AbsoluteTolerance), AbsoluteTolerance >= 0 && double.IsFinite(AbsoluteTolerance), "must be a finite number at least 0");
        if (!AbsoluteTolerances.IsDefault)
        {
            foreach (var tolerance in AbsoluteTolerances)
            {
                Preconditions.CheckArgumentRange(nameof(AbsoluteTolerances), tolerance >= 0 && double.IsFinite(tolerance), "each must be a finite number at least 0");
            }
        }

        Preconditions.CheckArgumentRange(nameof(MaxStep), MaxStep > 0, "must be positive");
        Preconditions.CheckArgumentRange(nameof(FirstStep), FirstStep >= 0 && double.IsFinite(FirstStep), "must be a finite number at least 0");
        Preconditions.CheckArgumentRange(nameof(FixedStep), FixedStep >= 0 && double.IsFinite(FixedStep), "must be a finite number at least 0");
        Preconditions.CheckArgumentRange(nameof(SampleInterval), SampleInterval >= 0 && double.IsFinite(SampleInterval), "must be a finite number at least 0");
        ArgumentNullException.ThrowIfNull(Controller);
        Controller.Validate();
    }
}
