using Patchproof.Core.Circuits;

namespace Patchproof.Core.Captures.Calibration;

/// <summary>A known square-wave amplitude and its accuracy as people write them (<c>10V</c>, <c>0.1%</c>): both or neither,
/// a positive amplitude, an accuracy above 0 and below 1. The caller names the two fields, so a command line and a form
/// report them in their own words.</summary>
public static class KnownAmplitudeNotation
{
    /// <summary>Reads the pair.</summary>
    /// <param name="amplitudeText">The peak-to-peak amplitude, or null.</param>
    /// <param name="accuracyText">Its relative accuracy (one sd), or null.</param>
    /// <param name="amplitudeField">How the caller names the amplitude, for example <c>--known-amplitude</c>.</param>
    /// <param name="accuracyField">How the caller names the accuracy.</param>
    /// <returns>The amplitude in volts and its relative sd (null and 0 when neither is given), or the field at fault and why.</returns>
    public static KnownAmplitudeReading Read(string? amplitudeText, string? accuracyText, string amplitudeField, string accuracyField)
    {
        if (amplitudeText is null && accuracyText is null)
        {
            return new KnownAmplitudeReading(null, 0, null, null);
        }

        if (amplitudeText is null)
        {
            return KnownAmplitudeReading.Failed(accuracyField, $"{accuracyField}: give it with {amplitudeField}, the square wave's peak-to-peak amplitude.");
        }

        if (!ValueNotation.TryParse(amplitudeText, Quantity.Voltage, out var volts, out var message) || !(volts > 0))
        {
            return KnownAmplitudeReading.Failed(amplitudeField, $"{amplitudeField} {amplitudeText}: {message ?? "expected a positive peak-to-peak amplitude, for example 10V"}.");
        }

        if (accuracyText is null)
        {
            return KnownAmplitudeReading.Failed(accuracyField,
                $"{amplitudeField}: also give {accuracyField}, the amplitude's relative accuracy (for example 0.1%); an absolute gain is only as good as the amplitude it is measured against.");
        }

        if (!ValueNotation.TryParse(accuracyText, Quantity.Fraction, out var accuracy, out message) || !(accuracy > 0 && accuracy < 1))
        {
            return KnownAmplitudeReading.Failed(accuracyField, $"{accuracyField} {accuracyText}: {message ?? "expected a relative accuracy above 0 and below 1, for example 0.1% or 0.001"}.");
        }

        return new KnownAmplitudeReading(volts, accuracy, null, null);
    }
}

/// <summary>What <see cref="KnownAmplitudeNotation.Read"/> found.</summary>
/// <param name="AmplitudeVolts">The peak-to-peak amplitude, or null when none was given (or on an error).</param>
/// <param name="RelativeSd">Its relative accuracy, one sd (0 when none).</param>
/// <param name="ErrorField">The field at fault, or null when the pair reads.</param>
/// <param name="Error">Why, or null.</param>
public sealed record KnownAmplitudeReading(double? AmplitudeVolts, double RelativeSd, string? ErrorField, string? Error)
{
    /// <summary>Whether the pair reads (including when neither was given).</summary>
    public bool IsValid => Error is null;

    internal static KnownAmplitudeReading Failed(string field, string error) => new(null, 0, field, error);
}
