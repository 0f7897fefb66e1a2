using System.Collections.Immutable;

namespace Patchproof.Core.Circuits.Boards;

/// <summary>Faults to put on a simulated board: deviated parts and non-idealities, read from a short text.</summary>
/// <remarks>
/// <para>The text is a comma-separated list of <c>key=value</c> items:</para>
/// <list type="bullet">
/// <item><c>R3=+10%</c> (a part 10 % high), <c>C3=-15%</c>, <c>M1=-4%</c> (a multiplier's scale 4 % low), or an absolute value <c>R3=3.93k</c>;</item>
/// <item><c>M1.offset=20mV</c>, a multiplier's output offset;</item>
/// <item><c>x.offset=1mV</c> and <c>x.bias=80nA</c>, the input offset voltage and bias current of x's integrator;</item>
/// <item><c>dc-gain=1e5</c>, the op-amps' open-loop DC gain (integrator leak);</item>
/// <item><c>clip=hard</c>, <c>clip=smooth</c> or <c>clip=none</c>.</item>
/// </list>
/// </remarks>
/// <param name="PartDeviations">Relative deviation by part id (+0.10 for 10 % high).</param>
/// <param name="NonIdealities">Offsets, leak and clipping.</param>
public sealed record BoardFaults(ImmutableDictionary<string, double> PartDeviations, BoardNonIdealities NonIdealities)
{
    /// <summary>No faults: parts nominal, smooth clipping only.</summary>
    public static BoardFaults None { get; } = new(ImmutableDictionary<string, double>.Empty, new BoardNonIdealities());

    /// <summary>Reads a fault list for a design.</summary>
    /// <param name="text">The list, for example <c>R3=+10%,M1.offset=20mV</c>; empty for none.</param>
    /// <param name="design">The design the faults apply to.</param>
    /// <param name="faults">The faults, or null.</param>
    /// <param name="error">What is wrong, or null.</param>
    /// <returns>True when the text is valid.</returns>
    public static bool TryParse(string? text, BoardDesign design, out BoardFaults faults, out string? error)
    {
        ArgumentNullException.ThrowIfNull(design);
        faults = None;
        error = null;
        var deviations = ImmutableDictionary.CreateBuilder<string, double>(StringComparer.Ordinal);
        var nonIdealities = new BoardNonIdealities();
        foreach (var item in (text ?? string.Empty).Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            var equals = item.IndexOf('=', StringComparison.Ordinal);
            if (equals <= 0)
            {
                error = $"'{item}' is not key=value (for example R3=+10%)";
                return false;
            }

            var key = item[..equals].Trim();
            var value = item[(equals + 1)..].Trim();
            var dot = key.LastIndexOf('.');
            var owner = dot > 0 ? key[..dot] : key;
            var property = dot > 0 ? key[(dot + 1)..].ToLowerInvariant() : string.Empty;
            if (key.Equals("dc-gain", StringComparison.OrdinalIgnoreCase))
            {
                if (!double.TryParse(value, System.Globalization.NumberStyles.Float, System.Globalization.CultureInfo.InvariantCulture, out var gain) || !(gain > 0))
                {
                    error = $"dc-gain '{value}' must be a positive number such as 1e5";
                    return false;
                }

                nonIdealities = nonIdealities with { IntegratorDcGain = gain };
            }
            else if (key.Equals("clip", StringComparison.OrdinalIgnoreCase))
            {
                if (!Enum.TryParse<OutputClipping>(value, ignoreCase: true, out var clipping))
                {
                    error = $"clip '{value}' must be none, smooth or hard";
                    return false;
                }

                nonIdealities = nonIdealities with { Clipping = clipping };
            }
            else if (property is "offset" or "bias")
            {
                var quantity = property == "offset" ? Quantity.Voltage : Quantity.Current;
                if (!ValueNotation.TryParse(value, quantity, out var amount, out var message))
                {
                    error = $"{key}: {message}";
                    return false;
                }

                if (property == "offset" && design.FindPart(owner) is { Kind: PartKind.Multiplier })
                {
                    nonIdealities = nonIdealities with { MultiplierOutputOffsetsVolts = nonIdealities.MultiplierOutputOffsetsVolts.SetItem(owner, amount) };
                }
                else if (design.FindVariable(owner) is not null)
                {
                    nonIdealities = property == "offset"
                        ? nonIdealities with { IntegratorInputOffsetsVolts = nonIdealities.IntegratorInputOffsetsVolts.SetItem(owner, amount) }
                        : nonIdealities with { IntegratorBiasCurrentsAmperes = nonIdealities.IntegratorBiasCurrentsAmperes.SetItem(owner, amount) };
                }
                else
                {
                    error = $"{key}: '{owner}' is neither a multiplier part nor a variable of the design";
                    return false;
                }
            }
            else if (design.FindPart(key) is { } part)
            {
                if (value.EndsWith('%'))
                {
                    if (!ValueNotation.TryParse(value, Quantity.Fraction, out var fraction, out var message) || !(fraction > -1))
                    {
                        error = $"{key}: {message ?? "a deviation must be above -100 %"}";
                        return false;
                    }

                    deviations[key] = fraction;
                }
                else if (ValueNotation.TryParse(value, part.Quantity, out var absolute, out var message) && absolute / part.NominalValue > 0)
                {
                    deviations[key] = (absolute / part.NominalValue) - 1;
                }
                else
                {
                    error = $"{key}: {message ?? "the value must have the sign of the nominal"}";
                    return false;
                }
            }
            else
            {
                error = $"'{key}' is not a part, a multiplier offset, an integrator offset or bias, dc-gain or clip";
                return false;
            }
        }

        faults = new BoardFaults(deviations.ToImmutable(), nonIdealities);
        return true;
    }
}
