namespace Patchproof.Core.Estimation;

/// <summary>How strongly consecutive residuals are correlated, and what that does to the effective number of samples.</summary>
/// <remarks>
/// <para>Uses the AR(1) (first-order autoregressive) model of the residual sequence: rho1 = sum r_i r_{i+1} / sum r_i^2,
/// and the large-sample variance factor of a mean, (1 + rho1) / (1 - rho1). The effective sample size is
/// n_eff = n (1 - rho1) / (1 + rho1). A negative rho1 is clamped at 0 (no deflation of the error bars).</para>
/// <para>This is a quick screen. For smoothed, quantized captures the residual correlation is not AR(1): the
/// Savitzky-Golay window imprints a finite-support correlation. There the sandwich over contiguous batches
/// (<see cref="BatchMeansCovariance"/>) is the figure to report; the AR(1) factor is kept for diagnostics and for
/// quick intervals.</para>
/// <para>References:
/// 1. G. E. P. Box, G. M. Jenkins, Time Series Analysis, Holden-Day 1976, section 2.1.
/// 2. D. S. Wilks, Statistical Methods in the Atmospheric Sciences, 3rd ed., Academic Press 2011, chapter 5 (variance inflation of a mean under AR(1) dependence).</para>
/// </remarks>
public static class ResidualAutocorrelation
{
    /// <summary>The lag-one autocorrelation of a residual sequence (mean not removed: residuals of a fit with a constant average zero).</summary>
    /// <param name="residuals">The residuals in time order; at least 2, finite.</param>
    /// <returns>rho1 in [-1, 1]; 0 when every residual is zero.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When fewer than two residuals are given.</exception>
    public static double LagOneCorrelation(ReadOnlySpan<double> residuals)
    {
        Preconditions.CheckArgumentRange(nameof(residuals), residuals.Length >= 2, "needs at least two residuals");
        double lagged = 0, squares = 0;
        for (var i = 0; i < residuals.Length; i++)
        {
            squares += residuals[i] * residuals[i];
            if (i + 1 < residuals.Length)
            {
                lagged += residuals[i] * residuals[i + 1];
            }
        }

        return squares > 0 ? lagged / squares : 0.0;
    }

    /// <summary>The AR(1) variance-inflation factor (1 + rho1) / (1 - rho1), with negative rho1 clamped to 0.</summary>
    /// <param name="residuals">The residuals in time order; at least 2.</param>
    /// <returns>A factor of at least 1; infinite when rho1 is 1.</returns>
    public static double VarianceInflation(ReadOnlySpan<double> residuals)
    {
        var rho = Math.Max(0.0, LagOneCorrelation(residuals));
        return rho >= 1 ? double.PositiveInfinity : (1 + rho) / (1 - rho);
    }

    /// <summary>The effective number of independent samples, n / <see cref="VarianceInflation"/>.</summary>
    /// <param name="residuals">The residuals in time order; at least 2.</param>
    /// <returns>A count between 0 and n.</returns>
    public static double EffectiveSampleSize(ReadOnlySpan<double> residuals) => residuals.Length / VarianceInflation(residuals);
}
