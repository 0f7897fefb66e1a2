using System.Globalization;

namespace Patchproof.Core.Diagnosis;

/// <summary>Writes part values the way people read them: 108.2 kΩ, 8.5 nF, 0.096 1/V.</summary>
internal static class EngineeringFormat
{
    private static readonly (double Scale, string Prefix)[] Prefixes =
        [(1e12, "T"), (1e9, "G"), (1e6, "M"), (1e3, "k"), (1, ""), (1e-3, "m"), (1e-6, "µ"), (1e-9, "n"), (1e-12, "p"), (1e-15, "f")];

    public static string Format(double value, string unit)
    {
        if (unit is not ("Ω" or "F" or "H" or "V" or "A" or "s") || value == 0 || !double.IsFinite(value))
        {
            return string.Create(CultureInfo.InvariantCulture, $"{value:G4} {unit}").TrimEnd();
        }

        var magnitude = Math.Abs(value);
        foreach (var (scale, prefix) in Prefixes)
        {
            if (magnitude >= scale * 0.9995)
            {
                return string.Create(CultureInfo.InvariantCulture, $"{value / scale:0.###} {prefix}{unit}");
            }
        }

        return string.Create(CultureInfo.InvariantCulture, $"{value:G4} {unit}");
    }
}
