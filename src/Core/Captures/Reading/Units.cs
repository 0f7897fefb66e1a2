namespace Patchproof.Core.Captures.Reading;

/// <summary>The unit spellings the reader understands, and their factors to SI.</summary>
internal static class Units
{
    /// <summary>Factor from a time unit to seconds, or null when <paramref name="unit"/> is not a time unit.</summary>
    public static double? SecondsPer(string unit) => Normalize(unit) switch
    {
        "s" or "sec" or "secs" or "second" or "seconds" => 1,
        "ms" or "msec" or "millisecond" or "milliseconds" => 1e-3,
        "us" or "µs" or "usec" or "microsecond" or "microseconds" => 1e-6,
        "ns" or "nsec" or "nanosecond" or "nanoseconds" => 1e-9,
        "ps" or "picosecond" or "picoseconds" => 1e-12,
        _ => null,
    };

    /// <summary>Factor from a voltage unit to volts, or null when <paramref name="unit"/> is not a voltage unit.</summary>
    public static double? VoltsPer(string unit)
    {
        var u = Normalize(unit);
        return u switch
        {
            "v" or "volt" or "volts" or "vdc" => 1,
            "mv" or "millivolt" or "millivolts" => 1e-3,
            "uv" or "µv" or "microvolt" or "microvolts" => 1e-6,
            "kv" or "kilovolt" or "kilovolts" => 1e3,
            _ => null,
        };
    }

    /// <summary>Factor from a rate unit to hertz, or null when <paramref name="unit"/> is not a rate unit.</summary>
    public static double? HertzPer(string unit) => Normalize(unit) switch
    {
        "hz" or "sa/s" or "s/s" or "sps" or "samples/s" or "1/s" => 1,
        "khz" or "ksa/s" or "ks/s" or "ksps" => 1e3,
        "mhz" or "msa/s" or "ms/s" or "msps" => 1e6,
        "ghz" or "gsa/s" or "gs/s" or "gsps" => 1e9,
        _ => null,
    };

    /// <summary>True when <paramref name="text"/> is any unit the reader knows (time, voltage, rate, current).</summary>
    public static bool IsKnownUnit(string text) =>
        SecondsPer(text) is not null || VoltsPer(text) is not null || HertzPer(text) is not null || IsOtherKnownUnit(text);

    /// <summary>Removes brackets around a unit: "(mV)", "[s]", "{V}".</summary>
    public static string StripBrackets(string text)
    {
        var t = text.Trim();
        if (t.Length >= 2 && ((t[0] == '(' && t[^1] == ')') || (t[0] == '[' && t[^1] == ']') || (t[0] == '{' && t[^1] == '}')))
        {
            t = t[1..^1].Trim();
        }

        return t;
    }

    private static bool IsOtherKnownUnit(string text) => Normalize(text) is "a" or "ma" or "ua" or "µa" or "amp" or "amps" or "%" or "div";

    private static string Normalize(string unit)
    {
        // Both the micro sign (U+00B5) and the Greek small mu (U+03BC) are written for "micro".
        var t = StripBrackets(unit).Replace('\u03BC', '\u00B5');

        // "MV" would be megavolts, never on a scope: it is a shouted "mV". "MSa/s" lowercases to a rate spelling no time unit shares.
        return t == "MV" ? "mv" : t.ToLowerInvariant();
    }
}
