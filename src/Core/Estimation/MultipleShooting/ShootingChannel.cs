namespace Patchproof.Core.Estimation.MultipleShooting;

/// <summary>One recorded channel as the multiple-shooting fit sees it: y(t_i) = g·V_m(t_i) + d + noise.</summary>
/// <param name="Name">The channel name, for example <c>CH1</c>.</param>
/// <param name="StateIndex">The state m the channel records.</param>
/// <param name="NominalGain">The gain the channel should have: +1 or -1 for the mapping's sign, times a known probe factor.</param>
/// <param name="NoiseSdVolts">The channel's noise standard deviation in volts (noise floor, or quantization step / √12), positive.</param>
/// <param name="Samples">The samples in volts, on the common time base.</param>
public sealed record ShootingChannel(string Name, int StateIndex, double NominalGain, double NoiseSdVolts, IReadOnlyList<double> Samples)
{
    /// <summary>When set, the channel's gain is fitted with a Gaussian prior of this relative sd around <see cref="NominalGain"/>; when null it stays at the nominal gain.</summary>
    public double? GainPriorRelativeSd { get; init; }

    /// <summary>Samples to leave out of the fit (clipped stretches), or null to use all; same length as <see cref="Samples"/>.</summary>
    public IReadOnlyList<bool>? Excluded { get; init; }
}
