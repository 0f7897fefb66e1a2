namespace Patchproof.Core.Dynamics;

/// <summary>A one-sided power spectral density: frequencies and the density at each.</summary>
/// <remarks>
/// <para>Units: <see cref="FrequenciesHertz"/> in cycles per time unit of the input (hertz for a
/// capture in seconds); <see cref="Density"/> in (channel unit)^2 per hertz. The density is
/// one-sided: the sum of <c>Density[k] * BinWidthHertz</c> over all bins equals the variance of
/// the (segment-detrended) signal, which is Parseval's theorem in the form the tests check.</para>
/// </remarks>
/// <param name="FrequenciesHertz">Bin frequencies k / (L dt), k = 0 .. L/2.</param>
/// <param name="Density">One-sided power spectral density at each bin.</param>
/// <param name="BinWidthHertz">The spacing of the bins, 1 / (L dt).</param>
/// <param name="SegmentLength">The segment length L in samples.</param>
/// <param name="SegmentCount">How many overlapping segments were averaged.</param>
public sealed record PowerSpectrum(double[] FrequenciesHertz, double[] Density, double BinWidthHertz, int SegmentLength, int SegmentCount)
{
    /// <summary>The total power: the sum of density times bin width, in (channel unit)^2.</summary>
    public double TotalPower() => Density.Sum() * BinWidthHertz;

    /// <summary>The index of the bin with the largest density, the DC bin excluded.</summary>
    public int PeakBin()
    {
        var best = Density.Length > 1 ? 1 : 0;
        for (var k = 1; k < Density.Length; k++)
        {
            if (Density[k] > Density[best])
            {
                best = k;
            }
        }

        return best;
    }

    /// <summary>The power-weighted mean frequency in hertz, sum f P / sum P, the DC bin excluded.</summary>
    /// <remarks>Its reciprocal is the mean period Rosenstein et al. (1993) use for the temporal
    /// exclusion of neighbours.</remarks>
    public double MeanFrequencyHertz()
    {
        var weighted = 0.0;
        var total = 0.0;
        for (var k = 1; k < Density.Length; k++)
        {
            weighted += FrequenciesHertz[k] * Density[k];
            total += Density[k];
        }

        return total > 0 ? weighted / total : 0;
    }
}
