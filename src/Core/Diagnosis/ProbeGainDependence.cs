namespace Patchproof.Core.Diagnosis;

/// <summary>How far a finding rests on the probe gains rather than on the capture, and what a calibration capture would change.</summary>
/// <remarks>
/// <para>A probe gain g_c scales channel c, so every coefficient moves by ln g of its own channel minus ln g of each channel in
/// its monomial. On a board whose products pass through multipliers those moves can reproduce a multiplier's (or the resistor
/// after it's) deviation exactly: the part's column lies in the span of the gain columns, and only the gains' priors decide
/// between them.</para>
/// <para><see cref="MimicCosineSquared"/> is the squared cosine between the part's column and that span after whitening by the
/// rows' covariance (1: the gains can reproduce the part exactly). <see cref="GainVarianceShare"/> is 1 - var_known / var, the
/// share of the part's posterior variance that comes from the uncalibrated gains (var_known: the same hypothesis with those
/// gains known). A finding <see cref="DependsOnProbeGains"/> when both pass their limits (<see cref="DiagnosisOptions"/>).</para>
/// <para>What a calibration would buy: the evidence is rerun with the uncalibrated gains' prior sd set to
/// <see cref="DiagnosisOptions.CalibratedGainLogSd"/>, a common gain for the reference probe's own error kept at the
/// probe tolerance, and the rows corrected by the gains this capture already suggests (their posterior means under the
/// winner): the answer a calibration would give if it found the probes where this capture puts them.</para>
/// <para>Only loose gains count: an uncalibrated channel, or after a relative calibration the shared reference gain. An
/// absolute calibration (a square wave of known amplitude) measures that shared gain too and pins its column, so with every
/// channel calibrated absolutely no gain is loose and no finding carries a dependence.</para>
/// </remarks>
/// <param name="DependsOnProbeGains">True when the probe gains could explain the finding and their priors carry most of its uncertainty.</param>
/// <param name="MimicCosineSquared">How closely probe gains can reproduce the part's effect (0 to 1).</param>
/// <param name="GainVarianceShare">Share of the part's posterior variance from the uncalibrated probe gains (0 to 1).</param>
/// <param name="MimickingGains">The probe-gain deviations, in percent, that would reproduce the part's whole deviation; empty when they cannot.</param>
/// <param name="CalibratedSd">The part's posterior sd (log units or volts) if the gains were calibrated.</param>
/// <param name="CalibratedWinner">What the evidence would favour with a calibration, for example "M2 deviates".</param>
/// <param name="CalibratedProbability">That hypothesis's posterior probability.</param>
public sealed record ProbeGainDependence(
    bool DependsOnProbeGains,
    double MimicCosineSquared,
    double GainVarianceShare,
    IReadOnlyList<ChannelGainDeviation> MimickingGains,
    double CalibratedSd,
    string CalibratedWinner,
    double CalibratedProbability);

/// <summary>A probe gain's deviation from nominal.</summary>
/// <param name="Channel">The channel, for example <c>CH1</c>; <c>common</c> for the gain every calibrated channel shares.</param>
/// <param name="DeviationPercent">100 (g / g_nominal - 1).</param>
public sealed record ChannelGainDeviation(string Channel, double DeviationPercent);
