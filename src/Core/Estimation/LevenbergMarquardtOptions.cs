namespace Patchproof.Core.Estimation;

/// <summary>How the Levenberg-Marquardt damping is scaled per unknown.</summary>
public enum DampingScaling
{
    /// <summary>Marquardt: lambda * diag(J'J), each entry the largest seen so far in this run (the MINPACK choice; invariant to the unknowns' units and robust when a column shrinks).</summary>
    MarquardtRunningMaximum,

    /// <summary>Marquardt: lambda * diag(J'J) at the current point.</summary>
    Marquardt,

    /// <summary>Levenberg: lambda * I (depends on the unknowns' units).</summary>
    Identity,
}

/// <summary>How a Jacobian is approximated when none is supplied.</summary>
public enum FiniteDifferenceScheme
{
    /// <summary>One extra residual evaluation per unknown; error of order sqrt(machine epsilon).</summary>
    Forward,

    /// <summary>Two extra evaluations per unknown; error of order epsilon^(2/3).</summary>
    Central,
}

/// <summary>Options of the Levenberg-Marquardt loop: stopping tolerances, iteration cap, damping and Jacobian approximation.</summary>
/// <remarks>
/// <para>Stopping, tested in this order after every iteration, and reported by
/// <see cref="LevenbergMarquardtExitReason"/>:
/// gradient: max_j |g_j| / sqrt(d_j S) &lt;= <see cref="GradientTolerance"/> (the cosine between the residual and each
/// scaled Jacobian column, as in MINPACK);
/// step: ||D delta|| &lt;= <see cref="RelativeStepTolerance"/> (||D p|| + <see cref="RelativeStepTolerance"/>) with
/// D = diag(sqrt(d_j));
/// cost: both the actual and the predicted reduction are at most <see cref="RelativeCostTolerance"/> * S;
/// statistical (when <see cref="VarianceScaledCostTolerance"/> is set): an accepted step whose damping term is at most a
/// tenth of its curvature term reduced the cost, actually and as predicted, by at most tau S/nu with nu =
/// <see cref="ResidualDegreesOfFreedom"/>. With sigma^2 = S/nu, the step delta then has delta' H delta / sigma^2 &lt;= tau, and by
/// Cauchy-Schwarz every linear combination a'p moved by at most sqrt(tau) of its standard error sigma sqrt(a' H^-1 a);
/// further iterations would only polish digits the data do not resolve;
/// or the iteration cap.</para>
/// <para>Defaults: tolerances near what double precision resolves (1e-10 step, 1e-14 cost, 1e-12 gradient), 5000
/// iterations, geodesic acceleration where the problem offers it, initial lambda 1e-3, <see cref="DampingScaling.MarquardtRunningMaximum"/>, central differences.</para>
/// </remarks>
public sealed record LevenbergMarquardtOptions
{
    /// <summary>Relative step tolerance, positive. Default 1e-10.</summary>
    public double RelativeStepTolerance { get; init; } = 1e-10;

    /// <summary>Relative cost-change tolerance, positive. Default 1e-14.</summary>
    public double RelativeCostTolerance { get; init; } = 1e-14;

    /// <summary>Gradient (cosine) tolerance, non-negative. Default 1e-12.</summary>
    public double GradientTolerance { get; init; } = 1e-12;

    /// <summary>The iteration cap (an iteration is one trial step, accepted or not), at least 1. Default 5000.</summary>
    public int MaxIterations { get; init; } = 5000;

    /// <summary>The starting damping factor lambda, positive. Default 1e-3.</summary>
    public double InitialDamping { get; init; } = 1e-3;

    /// <summary>How the damping is scaled per unknown. Default <see cref="DampingScaling.MarquardtRunningMaximum"/>.</summary>
    public DampingScaling Scaling { get; init; } = DampingScaling.MarquardtRunningMaximum;

    /// <summary>The finite-difference scheme used when no Jacobian is supplied. Default <see cref="FiniteDifferenceScheme.Central"/>.</summary>
    public FiniteDifferenceScheme FiniteDifferences { get; init; } = FiniteDifferenceScheme.Central;

    /// <summary>When the problem supports it (<see cref="IGeodesicAccelerationProblem"/>), each trial step adds half the geodesic
    /// acceleration, and a step whose acceleration is large against its velocity (2 |a| / |v| &gt; 0.75 in the damping's
    /// scale) is refused as if it had failed. Default true: it carries the loop along narrow curved valleys (NIST StRD MGH10
    /// from its first start) and off saturating plateaus (BoxBOD from its first start) that plain damping stalls in.</summary>
    public bool GeodesicAcceleration { get; init; } = true;

    /// <summary>The statistical stop tau (see the remarks), positive, or null for none. Default null.</summary>
    public double? VarianceScaledCostTolerance { get; init; }

    /// <summary>nu, the residual degrees of freedom (observations minus unknowns) the statistical stop scales the cost by. Default 0 (the stop is off).</summary>
    public int ResidualDegreesOfFreedom { get; init; }

    /// <summary>Told the iteration count and the cost before every iteration, on the solving thread; null for none.</summary>
    public IProgress<LevenbergMarquardtIteration>? Progress { get; init; }

    /// <summary>Checked before every iteration: once cancelled, the loop stops with <see cref="OperationCanceledException"/>. Default none.</summary>
    public CancellationToken Cancellation { get; init; }

    /// <summary>Throws when an option is out of range.</summary>
    internal void Validate()
    {
        Preconditions.CheckArgumentRange(nameof(RelativeStepTolerance), RelativeStepTolerance > 0 && double.IsFinite(RelativeStepTolerance), "must be positive and finite");
        Preconditions.CheckArgumentRange(nameof(RelativeCostTolerance), RelativeCostTolerance > 0 && double.IsFinite(RelativeCostTolerance), "must be positive and finite");
        Preconditions.CheckArgumentRange(nameof(GradientTolerance), GradientTolerance >= 0 && double.IsFinite(GradientTolerance), "must be non-negative and finite");
        Preconditions.CheckArgumentRange(nameof(MaxIterations), MaxIterations >= 1, "must be at least 1");
        Preconditions.CheckArgumentRange(nameof(VarianceScaledCostTolerance), VarianceScaledCostTolerance is not { } tau || (tau > 0 && double.IsFinite(tau)), "must be positive and finite when set");
        Preconditions.CheckArgumentRange(nameof(ResidualDegreesOfFreedom), ResidualDegreesOfFreedom >= 0, "must not be negative");
        Preconditions.CheckArgumentRange(nameof(InitialDamping), InitialDamping > 0 && double.IsFinite(InitialDamping), "must be positive and finite");
    }
}
