namespace Patchproof.Core.Diagnosis;

/// <summary>What a diagnosis column stands for.</summary>
public enum DiagnosisColumnKind
{
    /// <summary>A part's value (resistor, capacitor, multiplier scale), as a log-deviation ln(actual/nominal).</summary>
    PartValue,

    /// <summary>A part's offset (integrator input offset, multiplier output offset), in volts.</summary>
    PartOffset,

    /// <summary>A probe's relative gain, as a log-deviation (a nuisance: never blamed).</summary>
    ChannelGain,

    /// <summary>A direction of channel offsets the capture cannot reveal, in volts (a nuisance).</summary>
    ChannelOffset,

    /// <summary>The scope's time base, as a log-deviation common to every coefficient (a nuisance).</summary>
    TimeBase,
}

/// <summary>One thing that can move the measured rows: a part, a probe gain, a channel offset, the time base.</summary>
/// <remarks>
/// <para>The column's <see cref="Entries"/> say how much each row moves per unit of the column's deviation u:
/// row = sum over columns of Entries[row] * u + noise. For a part value u = ln(actual/nominal), so an
/// integrator input resistor enters its term with -1, the integrator's capacitor with -1, a multiplier
/// with +1. For an offset u is in volts.</para>
/// <para>Each column has a Gaussian prior: <see cref="HealthySd"/> when the part is assumed healthy,
/// <see cref="FaultSd"/> when a hypothesis lets it deviate freely. <see cref="ToleranceBand"/> is the
/// half-width of the part's tolerance in the same units as u (ln(1 + tolerance) for values).</para>
/// <para>Use the factory methods; they apply the priors the diagnosis is calibrated for: a healthy part's
/// sd is a third of its band (a tolerance is a limit, not two sigma), a free part's value sd is ln 3,
/// a free offset's sd 50 mV.</para>
/// </remarks>
public sealed record DiagnosisColumn
{
    /// <summary>A stable identifier, for example <c>R5</c>, <c>A2.offset</c>, <c>gain:CH1</c>.</summary>
    public required string Id { get; init; }

    /// <summary>What a person reads, for example "R5 (x into the y integrator)".</summary>
    public required string Label { get; init; }

    /// <summary>What the column stands for.</summary>
    public required DiagnosisColumnKind Kind { get; init; }

    /// <summary>How each row moves per unit deviation of this column; one entry per row.</summary>
    public required IReadOnlyList<double> Entries { get; init; }

    /// <summary>Prior standard deviation of u while the column is assumed healthy (log units or volts).</summary>
    public required double HealthySd { get; init; }

    /// <summary>Prior standard deviation of u when a hypothesis frees the column (log units or volts).</summary>
    public double FaultSd { get; init; }

    /// <summary>Half-width of the tolerance band of u (ln(1 + tolerance) for values, volts for offsets).</summary>
    public double ToleranceBand { get; init; }

    /// <summary>The largest |u| that is physically plausible for this part (for example ln 3.5 for an R or C).</summary>
    public double PlausibleLimit { get; init; } = double.PositiveInfinity;

    /// <summary>The nominal value in <see cref="Unit"/> (ohms, farads, 1/V); 0 for offsets.</summary>
    public double NominalValue { get; init; }

    /// <summary>The unit of <see cref="NominalValue"/>, for example "Ω", "F", "1/V", "V".</summary>
    public string Unit { get; init; } = "";

    /// <summary>For a probe gain: true when a calibration capture set its prior (a few tenths of a percent), false when the probe tolerance did.</summary>
    public bool PinnedByCalibration { get; init; }

    /// <summary>The id of the column for the gain that every calibrated channel shares: the reference probe's own, unmeasured error.</summary>
    public const string CommonGainId = "gain:common";

    /// <summary>True for parts that a finding can name; probe gains, channel offsets and the time base are nuisances.</summary>
    public bool IsFaultCandidate => Kind is DiagnosisColumnKind.PartValue or DiagnosisColumnKind.PartOffset;

    /// <summary>A part value (resistor, capacitor, multiplier scale) with its relative tolerance.</summary>
    /// <param name="id">The part id, for example <c>R5</c>.</param>
    /// <param name="label">What a person reads.</param>
    /// <param name="nominalValue">The nominal value in <paramref name="unit"/>; non-zero, negative only for a reference voltage.</param>
    /// <param name="unit">The unit, for example "Ω".</param>
    /// <param name="relativeTolerance">The tolerance as a fraction, for example 0.01 for 1 %; positive.</param>
    /// <param name="entries">The part's log-exponent in each row.</param>
    /// <param name="plausibleFactor">The largest plausible factor of deviation (3.5 for R and C, 1.5 for a gain).</param>
    public static DiagnosisColumn ForPartValue(string id, string label, double nominalValue, string unit, double relativeTolerance, IReadOnlyList<double> entries, double plausibleFactor = 3.5)
    {
        Preconditions.CheckArgumentRange(nameof(relativeTolerance), relativeTolerance > 0 && double.IsFinite(relativeTolerance), "must be a positive fraction");
        Preconditions.CheckArgumentRange(nameof(nominalValue), nominalValue != 0 && double.IsFinite(nominalValue), "must be non-zero (negative for a negative reference voltage)");
        var band = Math.Log(1 + relativeTolerance);
        return new DiagnosisColumn
        {
            Id = id, Label = label, Kind = DiagnosisColumnKind.PartValue, Entries = entries.ToArray(),
            HealthySd = band / 3, FaultSd = Math.Log(3), ToleranceBand = band, PlausibleLimit = Math.Log(plausibleFactor),
            NominalValue = nominalValue, Unit = unit,
        };
    }

    /// <summary>A part's offset (for example an integrator's input offset voltage) with its tolerance in volts.</summary>
    /// <param name="id">The identifier, for example <c>A2.offset</c>.</param>
    /// <param name="label">What a person reads.</param>
    /// <param name="toleranceVolts">The largest offset a healthy part shows, in volts; positive.</param>
    /// <param name="entries">How each row moves per volt of offset.</param>
    public static DiagnosisColumn ForPartOffset(string id, string label, double toleranceVolts, IReadOnlyList<double> entries)
    {
        Preconditions.CheckArgumentRange(nameof(toleranceVolts), toleranceVolts > 0 && double.IsFinite(toleranceVolts), "must be positive");
        return new DiagnosisColumn
        {
            Id = id, Label = label, Kind = DiagnosisColumnKind.PartOffset, Entries = entries.ToArray(),
            HealthySd = toleranceVolts / 3, FaultSd = 0.05, ToleranceBand = toleranceVolts, PlausibleLimit = 0.1,
            NominalValue = 0, Unit = "V",
        };
    }

    /// <summary>A probe's relative gain, a nuisance with a prior sd of ln(1 + tolerance)/2.</summary>
    /// <param name="channel">The channel name, for example <c>CH1</c>.</param>
    /// <param name="relativeTolerance">The probe's gain tolerance (about 0.02 uncalibrated, a few 1e-3 calibrated).</param>
    /// <param name="entries">+1 on the terms of the channel's own equation, -p for each power p of the channel in a term's monomial.</param>
    /// <param name="sdOverride">A prior sd in log units to use instead, for example from a calibration capture.</param>
    public static DiagnosisColumn ForChannelGain(string channel, double relativeTolerance, IReadOnlyList<double> entries, double? sdOverride = null)
    {
        Preconditions.CheckArgumentRange(nameof(relativeTolerance), relativeTolerance > 0, "must be positive");
        var sd = sdOverride ?? Math.Log(1 + relativeTolerance) / 2;
        return new DiagnosisColumn
        {
            Id = "gain:" + channel, Label = $"probe gain of {channel}", Kind = DiagnosisColumnKind.ChannelGain, Entries = entries.ToArray(),
            HealthySd = sd, FaultSd = sd, ToleranceBand = Math.Log(1 + relativeTolerance), NominalValue = 1, Unit = "V/V",
        };
    }

    /// <summary>A direction of channel offsets the capture cannot reveal, a nuisance in volts.</summary>
    /// <param name="id">The identifier, for example <c>offset:CH1</c>.</param>
    /// <param name="label">What a person reads.</param>
    /// <param name="sdVolts">Prior sd, about half the expected probe offset.</param>
    /// <param name="entries">How each row moves per volt along the direction.</param>
    public static DiagnosisColumn ForChannelOffset(string id, string label, double sdVolts, IReadOnlyList<double> entries) => new()
    {
        Id = id, Label = label, Kind = DiagnosisColumnKind.ChannelOffset, Entries = entries.ToArray(),
        HealthySd = sdVolts, FaultSd = sdVolts, ToleranceBand = 2 * sdVolts, Unit = "V",
    };

    /// <summary>The scope's time base, common to every coefficient row; a nuisance with the time base's accuracy as its sd.</summary>
    /// <param name="entries">+1 on every log-coefficient row, 0 on offset rows.</param>
    /// <param name="relativeAccuracy">The scope's time-base accuracy, about 1e-4.</param>
    public static DiagnosisColumn ForTimeBase(IReadOnlyList<double> entries, double relativeAccuracy = 1e-4) => new()
    {
        Id = "timebase", Label = "the scope's time base", Kind = DiagnosisColumnKind.TimeBase, Entries = entries.ToArray(),
        HealthySd = relativeAccuracy, FaultSd = relativeAccuracy, ToleranceBand = relativeAccuracy, NominalValue = 1,
    };
}
