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
    /// <summary>Writes 1 / sc_i for every error-controlled component.</summary>
    /// <remarks>The stepper multiplies each error component by these and compares ‖e‖² with 1, taking ln ‖e‖ as
    /// ln(‖e‖²) / 2: no division and no square root wait on the last stage.</remarks>
    public static void InverseScales(ReadOnlySpan<double> y, ReadOnlySpan<double> yNew, ReadOnlySpan<double> absoluteTolerances, double relativeTolerance, Span<double> destination)
    {
        var count = absoluteTolerances.Length;
        y = y[..count];
        yNew = yNew[..count];
        destination = destination[..count];
        for (var i = 0; i < absoluteTolerances.Length; i++)
        {
            destination[i] = 1.0 / (absoluteTolerances[i] + (relativeTolerance * Math.Max(Math.Abs(y[i]), Math.Abs(yNew[i]))));
        }
    }
}
