namespace Patchproof.Core.Estimation;

/// <summary>Options of the equation-error regression.</summary>
/// <remarks>Defaults: the Savitzky-Golay window and order chosen from the data (<see cref="SavitzkyGolaySelector"/>)
/// with windows up to 0.05 time units,
/// a constant in every equation, batches of one time unit for the batch-means covariance.</remarks>
public sealed record EquationErrorOptions
{
    /// <summary>A fixed (half-width, order) for the smoothing and derivative filter, or null to choose from the data.</summary>
    public (int HalfWidth, int PolynomialOrder)? Filter { get; init; }

    /// <summary>Per-channel white noise floors sigma in the channel's unit (from the capture checks), or null to estimate them from the spectrum.</summary>
    public IReadOnlyList<double>? NoiseStandardDeviations { get; init; }

    /// <summary>The longest filter window considered when the filter is chosen from the data, in the time unit of the
    /// sample interval. Default 0.05: wider windows flatten the peaks that product terms such as x*z depend on and bias
    /// their coefficients, even where they would still lower the derivative's own mean-square error.</summary>
    public double MaxWindowDuration { get; init; } = 0.05;

    /// <summary>Whether each equation gets a constant term b_j (an offset). Default true.</summary>
    public bool IncludeConstant { get; init; } = true;

    /// <summary>The batch length for the batch-means covariance, in the time unit of the sample interval. Default 1 (one problem time unit).</summary>
    public double BatchDuration { get; init; } = 1.0;

    /// <summary>Samples to mark unusable (clipped stretches, glitches), or null; their windows drop out of the regression.</summary>
    public IReadOnlyList<bool>? Excluded { get; init; }
}
