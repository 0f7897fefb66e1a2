using System.Globalization;

namespace Patchproof.Client.Models;

/// <summary>Writes values with an SI prefix, the way parts are labelled on a bench: 100 kOhm, 10 nF, 470 nF.</summary>
public static class EngineeringFormat
{
    private static readonly (double Factor, string Prefix)[] Prefixes =
    [
        (1e12, "T"), (1e9, "G"), (1e6, "M"), (1e3, "k"), (1, ""), (1e-3, "m"), (1e-6, "µ"), (1e-9, "n"), (1e-12, "p"), (1e-15, "f"),
    ];

    /// <summary>Formats <paramref name="value"/> with up to four significant digits and the prefix that keeps it between 1 and 1000.</summary>
    /// <param name="value">The value in base units.</param>
    /// <param name="unit">The unit's symbol; dimensionless and per-volt units get no prefix.</param>
    public static string Format(double value, string unit)
    {
        if (double.IsNaN(value) || double.IsInfinity(value))
        {
            return "—";
        }

        if (value == 0 || unit is "" or "1/V" or "%")
        {
            return (value.ToString("G4", CultureInfo.InvariantCulture) + " " + unit).TrimEnd();
        }

        var magnitude = Math.Abs(value);
        foreach (var (factor, prefix) in Prefixes)
        {
            if (magnitude >= factor * 0.9995)
            {
                return $"{(value / factor).ToString("G4", CultureInfo.InvariantCulture)} {prefix}{unit}";
            }
        }

        return value.ToString("G4", CultureInfo.InvariantCulture) + " " + unit;
    }
}
