using System.Globalization;
using Patchproof.Core.Captures.Checks;

namespace Patchproof.Core.Captures.Calibration;

/// <summary>Measures each channel's gain and offset against a reference channel from a capture in which every probe sat on one node.</summary>
/// <remarks>
/// <para>Model: y_c(t) = a_c + b_c s(t) + e_c(t) and y_ref(t) = s(t) + e_ref(t), where both readings carry errors of the
/// same kind: the scope's 8-bit steps (variance Δ²/12) and noise. Ordinary least squares of y_c on y_ref treats the
/// reference as exact and so shrinks the slope by the factor s_ss / (s_ss + σ_ref²); regressing the other way round
/// gives a different answer again. The errors-in-variables fit that is consistent here is Deming regression: the
/// maximum-likelihood line when the ratio λ = σ_c² / σ_ref² of the two error variances is known [1, 2]:
/// b = (s_yy - λ s_xx + √((s_yy - λ s_xx)² + 4 λ s_xy²)) / (2 s_xy), a = ȳ - b x̄.
/// λ comes from each channel's own error level, σ² = max(noise², Δ²/12), with the noise from the median absolute second
/// difference and Δ the smallest step between recorded levels. Orthogonal (total) least squares is the special case
/// λ = 1, right only when both channels have the same step, which different volts/div settings break; regression
/// against the channels' mean still carries the mean's own error and ties every channel's answer to the others.</para>
/// <para>Uncertainty: a block jackknife over contiguous blocks [3]. Quantization errors of a slowly swept signal and the
/// scope's own filtering correlate neighbouring samples, so a per-sample formula would be too optimistic; leaving out one
/// block at a time keeps that correlation inside the blocks.</para>
/// <para>One-signal check: if both probes saw the same node, the residual y_c - a - b y_ref is only the two channels'
/// errors, with RMS √(σ_c² + b² σ_ref²). A residual RMS more than <see cref="ProbeCalibrationOptions.ResidualRatioLimit"/>
/// times that, or a correlation below <see cref="ProbeCalibrationOptions.MinimumCorrelation"/>, means another node, a
/// loose ground, an AC-coupled channel or a delay between channels. Samples where any channel clipped are left out.</para>
/// <para>Absolute gain: when the capture is a square wave of known peak-to-peak amplitude
/// (<see cref="ProbeCalibrationOptions.KnownAmplitudeVolts"/>), each channel's two levels are measured
/// (<see cref="SquareWaveLevels"/>) and the reference channel's gain is its measured step over the known one, with the
/// amplitude's accuracy added in quadrature to the measurement's sd. The other channels keep their Deming gains against the
/// reference; a plateau's quantization error is the same in every block, so each of their sds also gains the part of the
/// two channels' quantization error that the averaging leaves. No channel may clip: a clipped level is not the source's.</para>
/// <para>References: [1] W. E. Deming, Statistical Adjustment of Data, Wiley 1943. [2] W. A. Fuller, Measurement Error
/// Models, Wiley 1987, section 1.3. [3] H. R. Künsch, The jackknife and the bootstrap for general stationary
/// observations, Ann. Statist. 17 (1989) 1217-1241.</para>
/// </remarks>
public static class ProbeCalibrator
{
    /// <summary>Calibrates the capture's voltage channels against the reference with the default settings.</summary>
    /// <param name="capture">The calibration capture: every probe on one node.</param>
    /// <param name="sourceFiles">The files it was read from, for the record.</param>
    /// <param name="clock">Stamps the calibration.</param>
    public static ProbeCalibrationResult Calibrate(Capture capture, IReadOnlyList<string> sourceFiles, TimeProvider clock) =>
        Calibrate(capture, sourceFiles, new ProbeCalibrationOptions(), clock);

    /// <summary>Calibrates the capture's voltage channels against the reference.</summary>
    /// <param name="capture">The calibration capture: every probe on one node.</param>
    /// <param name="sourceFiles">The files it was read from, for the record.</param>
    /// <param name="options">Reference channel and check limits.</param>
    /// <param name="clock">Stamps the calibration.</param>
    /// <returns>The gains and offsets with the findings; <see cref="ProbeCalibrationResult.IsUsable"/> says whether to use them.</returns>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range.</exception>
    public static ProbeCalibrationResult Calibrate(Capture capture, IReadOnlyList<string> sourceFiles, ProbeCalibrationOptions options, TimeProvider clock)
    {
        ArgumentNullException.ThrowIfNull(capture);
        ArgumentNullException.ThrowIfNull(sourceFiles);
        ArgumentNullException.ThrowIfNull(options);
        ArgumentNullException.ThrowIfNull(clock);
        Preconditions.CheckArgumentRange(nameof(options), options.JackknifeBlocks >= 2, "the jackknife needs at least two blocks");
        Preconditions.CheckArgumentRange(nameof(options), options.ResidualRatioLimit > 1 && options.MinimumCorrelation is > 0 and < 1 && options.MinimumSignalSteps > 0, "a check limit is out of range");
        Preconditions.CheckArgumentRange(nameof(options), options.KnownAmplitudeVolts is null || (double.IsFinite(options.KnownAmplitudeVolts.Value) && options.KnownAmplitudeVolts > 0), "the known amplitude must be a positive number of volts");
        Preconditions.CheckArgumentRange(nameof(options), options.KnownAmplitudeRelativeSd is >= 0 and < 1, "the known amplitude's relative accuracy must be a fraction between 0 and 1");

        var findings = new List<string>();
        var voltage = capture.Channels.Where(c => c.IsVoltage).ToList();
        foreach (var other in capture.Channels.Where(c => !c.IsVoltage))
        {
            findings.Add($"{other.Name} is not a voltage channel (unit {other.Unit}); it was left out.");
        }

        var reference = options.ReferenceChannel is null ? voltage.FirstOrDefault() : capture.FindChannel(options.ReferenceChannel);
        if (options.ReferenceChannel is not null && (reference is null || !reference.IsVoltage))
        {
            findings.Add($"The capture has no voltage channel '{options.ReferenceChannel}' to use as the reference (it has {string.Join(", ", voltage.Select(c => c.Name))}).");
            return new ProbeCalibrationResult(ProbeCalibrationStatus.TooFewChannels, null, findings);
        }

        var minimumSamples = 4 * options.JackknifeBlocks;
        if (voltage.Count < 2 || reference is null || capture.SampleCount < minimumSamples)
        {
            findings.Add($"A calibration needs at least two voltage channels and {minimumSamples} samples; this capture has {voltage.Count} and {capture.SampleCount}.");
            return new ProbeCalibrationResult(ProbeCalibrationStatus.TooFewChannels, null, findings);
        }

        var ordered = voltage.Where(c => c != reference).Prepend(reference).ToList();
        var kept = KeptSamples(capture, ordered);
        if (kept.Length < minimumSamples)
        {
            findings.Add($"Only {kept.Length} samples are left once clipped stretches are removed; record again with a wider volts/div.");
            return new ProbeCalibrationResult(ProbeCalibrationStatus.TooFewChannels, null, findings);
        }

        var signals = ordered.Select(c => kept.Select(i => (double)c.Samples.Span[i]).ToArray()).ToList();
        var errors = ordered.Select(c => ErrorLevel(c)).ToList();
        var x = signals[0];
        var meanX = x.Average();
        var status = ProbeCalibrationStatus.Calibrated;
        var referenceSd = Math.Sqrt(x.Sum(v => (v - meanX) * (v - meanX)) / x.Length);
        var referenceSteps = referenceSd / errors[0].Step;
        if (!(referenceSteps >= options.MinimumSignalSteps))
        {
            status = ProbeCalibrationStatus.TooLittleSignal;
            findings.Add(string.Create(CultureInfo.InvariantCulture,
                $"{reference.Name} swings over only {referenceSteps:0.#} quantization steps (standard deviation; at least {options.MinimumSignalSteps:0} needed): probe a node with a larger swing, or use a finer volts/div so the signal fills most of the screen."));
        }

        var channels = new List<ChannelCalibration>
        {
            new(reference.Name, 1, 0, 0, 0, 1, 0, errors[0].Sigma * Math.Sqrt(2), errors[0].Step),
        };
        for (var c = 1; c < ordered.Count; c++)
        {
            var y = signals[c];
            var meanY = y.Average();
            var lambda = errors[c].Sigma * errors[c].Sigma / (errors[0].Sigma * errors[0].Sigma);
            var total = DemingSums.Of(x, y, meanX, meanY);
            var (slope, centredIntercept, sxx, syy, sxy) = total.Line(lambda);
            var intercept = meanY + centredIntercept - (slope * meanX);
            var blockSlopes = new double[options.JackknifeBlocks];
            var blockIntercepts = new double[options.JackknifeBlocks];
            for (var k = 0; k < options.JackknifeBlocks; k++)
            {
                var from = (int)((long)k * x.Length / options.JackknifeBlocks);
                var to = (int)((long)(k + 1) * x.Length / options.JackknifeBlocks);
                var block = DemingSums.Of(x.AsSpan(from, to - from), y.AsSpan(from, to - from), meanX, meanY);
                var (s, i, _, _, _) = (total - block).Line(lambda);
                blockSlopes[k] = s;
                blockIntercepts[k] = meanY + i - (s * meanX);
            }

            var residualRms = Math.Sqrt(Math.Max(0, syy - (2 * slope * sxy) + (slope * slope * sxx)));
            var expected = Math.Sqrt((errors[c].Sigma * errors[c].Sigma) + (slope * slope * errors[0].Sigma * errors[0].Sigma));
            var correlation = sxy / Math.Sqrt(sxx * syy);
            var measured = new ChannelCalibration(ordered[c].Name, slope, Jackknife(blockSlopes), intercept, Jackknife(blockIntercepts), correlation, residualRms, expected, errors[c].Step);
            channels.Add(measured);

            if (!FollowsReference(measured, options))
            {
                status = status is ProbeCalibrationStatus.Calibrated ? ProbeCalibrationStatus.NotOneSignal : status;
                findings.Add(string.Create(CultureInfo.InvariantCulture,
                    $"{ordered[c].Name} does not follow {reference.Name}: residual {1000 * residualRms:0.0} mV rms where the quantization steps and noise allow {1000 * expected:0.0} mV, correlation {correlation:0.00000}. The probes did not see one signal: check that every probe tip and ground clip sit on the same node, that no channel is AC-coupled or band-limited differently from the others, and record again."));
            }
            else if (Math.Abs(slope - 1) > options.GainWarningDistance)
            {
                findings.Add(string.Create(CultureInfo.InvariantCulture,
                    $"{ordered[c].Name} reads {slope:0.###} times {reference.Name}: far more than any probe tolerance; check both channels' probe-factor settings (1x against 10x) and whether a channel is inverted."));
            }
        }

        KnownAmplitudeReference? absolute = null;
        if (options.KnownAmplitudeVolts is { } known)
        {
            (status, absolute) = MeasureAbsolute(capture, ordered, kept.Length, signals, errors, channels, known, options, status, findings);
        }

        var calibration = new ProbeCalibration(reference.Name, channels, kept.Length, kept.Length * capture.TimeBase.DurationSeconds / Math.Max(1, capture.SampleCount),
            sourceFiles.ToArray(), clock.GetUtcNow(), options.Note)
        {
            Absolute = absolute,
        };
        return new ProbeCalibrationResult(status, calibration, findings);
    }

    /// <summary>The one-signal check of one calibrated channel: its residual RMS within the limit times the expected one, and its correlation with the reference high enough.</summary>
    /// <param name="channel">A channel other than the reference, as measured.</param>
    /// <param name="options">The check limits (<see cref="ProbeCalibrationOptions.ResidualRatioLimit"/>, <see cref="ProbeCalibrationOptions.MinimumCorrelation"/>).</param>
    /// <returns>True when the channel saw the same signal as the reference.</returns>
    public static bool FollowsReference(ChannelCalibration channel, ProbeCalibrationOptions options)
    {
        ArgumentNullException.ThrowIfNull(channel);
        ArgumentNullException.ThrowIfNull(options);
        return channel.ResidualRmsVolts <= options.ResidualRatioLimit * channel.ExpectedResidualRmsVolts && channel.Correlation >= options.MinimumCorrelation;
    }

    /// <summary>The reference's absolute gain from the square wave's levels; widens the other channels' gain sds by their residual quantization error.</summary>
    private static (ProbeCalibrationStatus Status, KnownAmplitudeReference? Absolute) MeasureAbsolute(
        Capture capture,
        List<CaptureChannel> ordered,
        int keptCount,
        List<double[]> signals,
        List<(double Sigma, double Step)> errors,
        List<ChannelCalibration> channels,
        double knownVolts,
        ProbeCalibrationOptions options,
        ProbeCalibrationStatus status,
        List<string> findings)
    {
        var invariant = CultureInfo.InvariantCulture;
        if (keptCount < capture.SampleCount)
        {
            var clipped = CaptureInspection.Run(capture).Where(check => check.Id == "clipping" && check.Channel is not null).Select(check => check.Channel!).Distinct().ToList();
            findings.Add($"{(clipped.Count > 0 ? string.Join(", ", clipped) : "A channel")} clipped: a clipped level is not the source's level, so the absolute gain cannot be measured. Use a wider volts/div or a smaller amplitude, and record again.");
            return (status is ProbeCalibrationStatus.Calibrated ? ProbeCalibrationStatus.LevelsClipped : status, null);
        }

        var levelOptions = options.Levels with { JackknifeBlocks = options.JackknifeBlocks };
        var levels = signals.Select((signal, c) => SquareWaveLevels.Measure(signal, errors[c].Step, levelOptions)).ToList();
        var failed = levels.Select((level, c) => (level, c)).Where(pair => !pair.level.IsUsable).ToList();
        if (failed.Count > 0)
        {
            foreach (var (level, c) in failed)
            {
                findings.Add($"{ordered[c].Name} is not a usable square wave: {level.Message}. An absolute calibration needs every probe on a square wave of known amplitude (docs/probe-calibration.md).");
            }

            var problem = failed.Any(pair => pair.level.Problem is SquareWaveProblem.NotTwoLevels) ? ProbeCalibrationStatus.NotTwoLevels : ProbeCalibrationStatus.TooFewPlateauSamples;
            return (status is ProbeCalibrationStatus.Calibrated ? problem : status, null);
        }

        var referenceLevels = levels[0];
        var absolute = KnownAmplitudeReference.From(knownVolts, options.KnownAmplitudeRelativeSd, referenceLevels);
        var referenceQuantization = referenceLevels.QuantizationSdVolts / referenceLevels.StepVolts;
        for (var c = 1; c < channels.Count; c++)
        {
            // The relative gain is a ratio of the two channels' steps: both plateaus' fixed quantization errors enter it.
            var own = levels[c].QuantizationSdVolts / levels[c].StepVolts;
            var extra = Math.Abs(channels[c].Gain) * Math.Sqrt((own * own) + (referenceQuantization * referenceQuantization));
            channels[c] = channels[c] with { GainSd = Math.Sqrt((channels[c].GainSd * channels[c].GainSd) + (extra * extra)) };
        }

        findings.Add(string.Create(invariant,
            $"{ordered[0].Name} reads the {knownVolts:0.####} V step as {absolute.MeasuredAmplitudeVolts:0.####} ± {absolute.MeasuredAmplitudeSdVolts * 1000:0.0} mV ({referenceLevels.Plateaus} plateaus): absolute gain {absolute.ReferenceGain:0.00000} ± {absolute.ReferenceGainSd:0.00000}, of which the amplitude's stated accuracy is ± {absolute.ReferenceGain * options.KnownAmplitudeRelativeSd:0.00000}."));
        if (Math.Abs(absolute.ReferenceGain - 1) > options.GainWarningDistance)
        {
            findings.Add(string.Create(invariant,
                $"{ordered[0].Name} reads {absolute.ReferenceGain:0.###} times the stated amplitude: far more than any probe tolerance; check the probe-factor setting (1x against 10x) and the amplitude you gave."));
        }

        return (status, absolute);
    }

    /// <summary>Sample indices where no channel sits at a clipped level.</summary>
    private static int[] KeptSamples(Capture capture, IReadOnlyList<CaptureChannel> channels)
    {
        var clipped = CaptureInspection.Run(capture).Where(check => check.Id == "clipping" && check.Channel is not null).ToList();
        var levels = channels.Select(c => clipped.Where(check => check.Channel == c.Name).Select(check => check.Values["levelVolts"]).ToArray()).ToList();
        var kept = new List<int>(capture.SampleCount);
        for (var i = 0; i < capture.SampleCount; i++)
        {
            var excluded = false;
            for (var c = 0; c < channels.Count && !excluded; c++)
            {
                var value = channels[c].Samples.Span[i];
                excluded = levels[c].Any(level => Math.Abs(value - level) <= 1e-6 * Math.Max(1, Math.Abs(level)));
            }

            if (!excluded)
            {
                kept.Add(i);
            }
        }

        return kept.ToArray();
    }

    /// <summary>A channel's error level: σ = max(noise, Δ/√12), with the noise from second differences and Δ the smallest level step.</summary>
    private static (double Sigma, double Step) ErrorLevel(CaptureChannel channel)
    {
        var noise = ChannelStatistics.NoiseRms(channel.Samples.Span);
        var (_, _, step) = ChannelStatistics.Levels(channel.Samples.Span);
        step = double.IsFinite(step) && step > 0 ? step : Math.Max(noise, 1e-9);
        return (Math.Max(noise, step / Math.Sqrt(12)), step);
    }

    private static double Jackknife(double[] estimates)
    {
        var mean = estimates.Average();
        var k = estimates.Length;
        return Math.Sqrt((k - 1.0) / k * estimates.Sum(v => (v - mean) * (v - mean)));
    }
}
