using System.Globalization;

namespace Patchproof.Core.Captures.Checks;

/// <summary>Number formatting for check messages: invariant culture, readable units.</summary>
internal static class CheckText
{
    public static string Volts(double volts, string unit = "V")
    {
        if (unit != "V")
        {
            return volts.ToString("G4", CultureInfo.InvariantCulture) + " " + unit;
        }

        var a = Math.Abs(volts);
        return a != 0 && a < 1 ? (volts * 1e3).ToString("G4", CultureInfo.InvariantCulture) + " mV" : volts.ToString("G4", CultureInfo.InvariantCulture) + " V";
    }

    public static string Number(double value, string format = "G4") => value.ToString(format, CultureInfo.InvariantCulture);

    public static string Percent(double fraction) => (fraction * 100).ToString("G3", CultureInfo.InvariantCulture) + " %";

    public static string Hertz(double hertz) =>
        hertz >= 1e6 ? Number(hertz / 1e6) + " MHz" : hertz >= 1e3 ? Number(hertz / 1e3) + " kHz" : Number(hertz) + " Hz";
}
