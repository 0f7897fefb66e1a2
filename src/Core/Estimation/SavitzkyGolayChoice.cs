namespace Patchproof.Core.Estimation;

/// <summary>The Savitzky-Golay window and order chosen for a record, with the error budget that chose them.</summary>
/// <remarks>Errors are root-mean-square over the record's interior, in the record's unit per time unit^d.
/// PredictedRmsError^2 = NoiseRms^2 + BiasRms^2.</remarks>
/// <param name="HalfWidth">m; the window has 2m + 1 samples.</param>
/// <param name="PolynomialOrder">p.</param>
/// <param name="DerivativeOrder">d.</param>
/// <param name="NoiseStandardDeviation">sigma of the white noise floor used (given, or estimated from the spectrum), in the record's unit.</param>
/// <param name="NoiseRms">sigma sqrt(NoiseGain) / h^d: the noise that passes the filter.</param>
/// <param name="BiasRms">The predicted RMS distortion of the signal by the filter.</param>
/// <param name="PredictedRmsError">sqrt(NoiseRms^2 + BiasRms^2).</param>
/// <param name="Bandwidth">The highest frequency (cycles per time unit) where the signal stands clear of the noise floor.</param>
public sealed record SavitzkyGolayChoice(
    int HalfWidth,
    int PolynomialOrder,
    int DerivativeOrder,
    double NoiseStandardDeviation,
    double NoiseRms,
    double BiasRms,
    double PredictedRmsError,
    double Bandwidth)
{
    /// <summary>The chosen filter.</summary>
    /// <returns>A new filter with this window and order.</returns>
    public SavitzkyGolayFilter ToFilter() => new(HalfWidth, PolynomialOrder, DerivativeOrder);
}
