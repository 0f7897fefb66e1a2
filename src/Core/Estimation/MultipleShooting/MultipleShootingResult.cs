namespace Patchproof.Core.Estimation.MultipleShooting;

/// <summary>The outcome of a multiple-shooting fit: the shared coefficients with their uncertainty, the channel offsets and gains, and how it went.</summary>
/// <param name="Parameters">The field's parameters: term coefficients, then offsets (see <see cref="PolynomialVectorField"/>).</param>
/// <param name="StandardErrors">Standard errors of <paramref name="Parameters"/>, inflated for residual autocorrelation.</param>
/// <param name="ChannelOffsetsVolts">The fitted offset d_c of each channel (0 when not estimated).</param>
/// <param name="ChannelOffsetStandardErrors">Their standard errors (0 when not estimated).</param>
/// <param name="ChannelGains">The gain g_c of each channel (the nominal gain when not estimated).</param>
/// <param name="ChannelGainStandardErrors">Their standard errors (0 when not estimated).</param>
/// <param name="GlobalNames">Names of the global unknowns in <paramref name="Covariance"/> order.</param>
/// <param name="Covariance">Covariance of the global unknowns (parameters, then channel offsets, then gains), row-major.</param>
/// <param name="Correlation">The correlation matrix of the same, row-major.</param>
/// <param name="SegmentStartTimesSeconds">Start time of each segment.</param>
/// <param name="SegmentStates">The fitted initial state of each segment (segments by states).</param>
/// <param name="ResidualRmsVolts">Root-mean-square observation residual of each channel, in volts.</param>
/// <param name="VarianceInflation">The factor by which the plain covariance was widened for correlated residuals.</param>
/// <param name="Iterations">Levenberg-Marquardt iterations.</param>
/// <param name="ExitReason">Why the solver stopped.</param>
/// <param name="Cost">The final weighted sum of squares.</param>
public sealed record MultipleShootingResult(
    IReadOnlyList<double> Parameters,
    IReadOnlyList<double> StandardErrors,
    IReadOnlyList<double> ChannelOffsetsVolts,
    IReadOnlyList<double> ChannelOffsetStandardErrors,
    IReadOnlyList<double> ChannelGains,
    IReadOnlyList<double> ChannelGainStandardErrors,
    IReadOnlyList<string> GlobalNames,
    IReadOnlyList<double> Covariance,
    IReadOnlyList<double> Correlation,
    IReadOnlyList<double> SegmentStartTimesSeconds,
    IReadOnlyList<IReadOnlyList<double>> SegmentStates,
    IReadOnlyList<double> ResidualRmsVolts,
    double VarianceInflation,
    int Iterations,
    LevenbergMarquardtExitReason ExitReason,
    double Cost)
{
    /// <summary>True when the solver stopped on one of its convergence tests.</summary>
    public bool Converged => ExitReason.IsConverged();
}
