namespace Patchproof.Core.Simulation;

/// <summary>The RMS error norm used to accept or reject a step.</summary>
/// <remarks>
/// <para>‖e‖ = sqrt((1/N) Σ_i (e_i / sc_i)^2) with sc_i = atol_i + rtol · max(|y_i|, |ynew_i|), summed
/// over the N error-controlled components. A step is accepted when ‖e‖ ≤ 1.</para>
/// <para>Reference: 1. E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I,
/// 2nd ed., Springer 1993, Sec. II.4, eq. (4.11).</para>
/// </remarks>
internal static class ScaledErrorNorm
{
    /// <summary>The square ‖e‖² of the scaled RMS norm of <paramref name="error"/>.</summary>
    /// <remarks>The stepper compares ‖e‖² with 1 and takes ln ‖e‖ as ln(‖e‖²) / 2, which saves a square
    /// root on every step's critical path.</remarks>
    public static double MeanSquare(ReadOnlySpan<double> error, ReadOnlySpan<double> y, ReadOnlySpan<double> yNew, ReadOnlySpan<double> absoluteTolerances, double relativeTolerance)
    {
        var count = absoluteTolerances.Length;
        error = error[..count];
        y = y[..count];
        yNew = yNew[..count];
        var sum = 0.0;
        for (var i = 0; i < absoluteTolerances.Length; i++)
        {
            var scale = absoluteTolerances[i] + (relativeTolerance * Math.Max(Math.Abs(y[i]), Math.Abs(yNew[i])));
            var ratio = error[i] / scale;
            sum += ratio * ratio;
        }

        return sum / count;
    }
}
