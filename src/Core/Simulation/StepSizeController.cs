namespace Patchproof.Core.Simulation;

/// <summary>The proportional-integral step-size controller of the DOPRI5 code.</summary>
/// <remarks>
/// <para>With err_n the error norm of the current step (accept when err_n ≤ 1) and err_(n-1) that of the
/// previous accepted step (1e-4 before the first), the proposed next step is h_new = h · factor with
/// factor = Safety · err_n^(-α) · err_(n-1)^β, α = 0.2 - 0.75 β, clipped to [MinFactor, MaxFactor].
/// After a rejection the factor is Safety · err_n^(-0.2), at least MinFactor; a step accepted right after
/// a rejection may not grow (factor capped at 1). β = 0 gives the elementary controller
/// Safety · err^(-1/(q+1)) with q = 4.</para>
/// <para>Defaults: Safety 0.9, MinFactor 0.2, MaxFactor 10, Beta 0.04 (as DOPRI5).</para>
/// <para>References:
/// 1. E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I, 2nd ed., Springer 1993, Sec. II.4 (step-size control) and code DOPRI5.
/// 2. K. Gustafsson, Control theoretic techniques for stepsize selection in explicit Runge-Kutta methods, ACM Trans. Math. Softw. 17 (1991) 533-554.</para>
/// </remarks>
public sealed record StepSizeController
{
    /// <summary>The error norm assumed for the step before the first (Hairer's FACOLD start value).</summary>
    public const double InitialPreviousErrorNorm = 1e-4;

    /// <summary>The safety factor (between 0 and 1; default 0.9).</summary>
    public double Safety { get; init; } = 0.9;

    /// <summary>The smallest allowed ratio h_new / h (positive, below 1; default 0.2).</summary>
    public double MinFactor { get; init; } = 0.2;

    /// <summary>The largest allowed ratio h_new / h (above 1; default 10).</summary>
    public double MaxFactor { get; init; } = 10.0;

    /// <summary>The integral gain β of the PI controller (0 to 0.2; default 0.04, 0 for the elementary controller).</summary>
    public double Beta { get; init; } = 0.04;

    /// <summary>The exponent α = 0.2 - 0.75 β applied to the current error norm.</summary>
    public double Alpha => 0.2 - (0.75 * Beta);

    /// <summary>The step-size ratio to use after a step with error norm <paramref name="errorNorm"/>.</summary>
    /// <param name="errorNorm">The scaled RMS error norm of the step just tried (at least 0).</param>
    /// <param name="previousErrorNorm">The error norm of the previous accepted step (at least 1e-4).</param>
    /// <param name="previousStepRejected">Whether the attempt before this one was rejected.</param>
    /// <returns>h_new / h: below 1 when <paramref name="errorNorm"/> &gt; 1 (the step is rejected).</returns>
    public double ProposeFactor(double errorNorm, double previousErrorNorm, bool previousStepRejected) =>
        ProposeFactorFromLogarithms(Math.Log(errorNorm), Math.Log(previousErrorNorm), previousStepRejected);

    /// <summary>As <see cref="ProposeFactor"/>, with both norms given as natural logarithms so a step needs one logarithm and one exponential.</summary>
    internal double ProposeFactorFromLogarithms(double logErrorNorm, double logPreviousErrorNorm, bool previousStepRejected)
    {
        if (logErrorNorm > 0.0)
        {
            return Math.Max(MinFactor, Safety * Math.Exp(-Alpha * logErrorNorm));
        }

        var factor = double.IsNegativeInfinity(logErrorNorm)
            ? MaxFactor
            : Safety * Math.Exp((Beta * logPreviousErrorNorm) - (Alpha * logErrorNorm));
        factor = Math.Clamp(factor, MinFactor, MaxFactor);
        return previousStepRejected ? Math.Min(factor, 1.0) : factor;
    }

    /// <summary>Checks the constants; throws for a caller's mistake.</summary>
    internal void Validate()
    {
        Preconditions.CheckArgumentRange(nameof(Safety), Safety > 0 && Safety <= 1, "must be in (0, 1]");
        Preconditions.CheckArgumentRange(nameof(MinFactor), MinFactor > 0 && MinFactor < 1, "must be in (0, 1)");
        Preconditions.CheckArgumentRange(nameof(MaxFactor), MaxFactor > 1 && double.IsFinite(MaxFactor), "must be a finite number above 1");
        Preconditions.CheckArgumentRange(nameof(Beta), Beta >= 0 && Beta <= 0.2, "must be in [0, 0.2]");
    }
}
