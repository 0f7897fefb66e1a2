using System.Globalization;

namespace Patchproof.Core.Reports;

/// <summary>The gain a fit assumes for each channel and the prior the diagnosis gives it: from a calibration, a stated sd, or the probe tolerance.</summary>
/// <remarks>
/// <para>Calibrated channel c: gain g_c from the calibration (its reading per volt of the reference channel's), log-sd
/// √(sd_c² + transfer²). The calibrated channels also share the reference probe's own error, a common column at the probe
/// tolerance. Otherwise: gain 1, log-sd from <see cref="BoardFitOptions.CalibratedGainSd"/> when given, else ln(1 + tolerance) / 2.</para>
/// <para>An absolute calibration (a square wave of known amplitude) also measured the reference's own gain: each calibrated
/// channel's gain is then its absolute one (relative gain times the reference's), and the shared column's log-sd is the
/// reference gain's, amplitude accuracy included, instead of the probe tolerance: the common gain is known
/// (<see cref="CommonIsMeasured"/>).</para>
/// <para>The shooting fit keeps each gain at the value assumed here: in a fully recorded fit a gain trades exactly against the
/// coefficients it touches, so it is carried once, as a nuisance column of the diagnosis.</para>
/// </remarks>
internal sealed class ProbeGainPriors
{
    private readonly Dictionary<string, (double Gain, double LogSd, string Source, bool Calibrated)> channels = new(StringComparer.OrdinalIgnoreCase);

    private ProbeGainPriors(double commonLogSd, bool commonIsMeasured)
    {
        CommonLogSd = commonLogSd;
        CommonIsMeasured = commonIsMeasured;
    }

    /// <summary>The log-sd of the gain every calibrated channel shares: the probe tolerance's, or the measured reference gain's for an absolute calibration.</summary>
    public double CommonLogSd { get; }

    /// <summary>True when an absolute calibration measured that shared gain.</summary>
    public bool CommonIsMeasured { get; }

    /// <summary>Channels whose gain came from the calibration.</summary>
    public IReadOnlyCollection<string> CalibratedChannels => channels.Where(pair => pair.Value.Calibrated).Select(pair => pair.Key).ToList();

    /// <summary>Each channel's log-gain prior sd.</summary>
    public IReadOnlyDictionary<string, double> LogSds => channels.ToDictionary(pair => pair.Key, pair => pair.Value.LogSd, StringComparer.OrdinalIgnoreCase);

    public static ProbeGainPriors For(BoardFitOptions options, IEnumerable<string> channelNames)
    {
        var tolerance = Math.Log(1 + options.ProbeGainTolerance) / 2;
        var absolute = options.Calibration?.Absolute;
        var priors = new ProbeGainPriors(absolute?.ReferenceLogGainSd ?? tolerance, absolute is not null);
        var invariant = CultureInfo.InvariantCulture;
        foreach (var name in channelNames)
        {
            if (options.Calibration?.Find(name) is { } calibrated)
            {
                var sd = Math.Sqrt((calibrated.LogGainSd * calibrated.LogGainSd) + (options.CalibrationTransferSd * options.CalibrationTransferSd));
                var source = absolute is null
                    ? string.Create(invariant, $"calibration against {options.Calibration.ReferenceChannel} ({options.Calibration.CreatedAt:yyyy-MM-dd}), ± {100 * sd:0.00} %; the shared reference probe at its {100 * options.ProbeGainTolerance:0.#} % tolerance")
                    : string.Create(invariant, $"absolute calibration against a {absolute.KnownAmplitudeVolts:0.####} V step on {options.Calibration.ReferenceChannel} ({options.Calibration.CreatedAt:yyyy-MM-dd}), ± {100 * sd:0.00} %; the shared reference gain {absolute.ReferenceGain:0.0000} ± {100 * absolute.ReferenceLogGainSd:0.00} %, the amplitude's accuracy included");
                priors.channels[name] = (options.Calibration.AbsoluteGainOf(calibrated), sd, source, true);
            }
            else if (options.CalibratedGainSd.TryGetValue(name, out var given))
            {
                priors.channels[name] = (1, given, string.Create(invariant, $"stated prior ± {100 * given:0.00} %"), false);
            }
            else
            {
                priors.channels[name] = (1, tolerance, string.Create(invariant, $"probe tolerance {100 * options.ProbeGainTolerance:0.#} %, ± {100 * tolerance:0.00} %"), false);
            }
        }

        return priors;
    }

    /// <summary>The gain the fit divides the channel by (1 when uncalibrated).</summary>
    public double GainOf(string channel) => channels[channel].Gain;

    /// <summary>The gain's log-sd.</summary>
    public double LogSdOf(string channel) => channels[channel].LogSd;

    /// <summary>True when the channel's gain came from the calibration.</summary>
    public bool IsCalibrated(string channel) => channels[channel].Calibrated;

    /// <summary>Where the gain and its prior came from, in words.</summary>
    public string SourceOf(string channel) => channels[channel].Source;
}
