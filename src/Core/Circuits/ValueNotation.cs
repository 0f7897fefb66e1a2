using System.Globalization;
using System.Text;

namespace Patchproof.Core.Circuits;

/// <summary>Reads and writes part values as people write them: <c>100k</c>, <c>10n</c>, <c>4.7 µF</c>, <c>4k7</c>, <c>2000 pF</c>, <c>1M</c>.</summary>
/// <remarks>
/// <para>A value is a decimal number (invariant culture, point as decimal mark, optional exponent), an
/// optional SI prefix and an optional unit symbol, with or without spaces between: <c>4.7uF</c>,
/// <c>4.7 µF</c>, <c>4.7 μF</c>. The prefix may also stand in for the decimal point, as printed on
/// parts: <c>4k7</c> = 4.7 kΩ, <c>2n2</c> = 2.2 nF, <c>4R7</c> = 4.7 Ω.</para>
/// <para>Prefixes: p (1e-12), n (1e-9), u/µ/μ (1e-6), m (1e-3), k/K (1e3), M or Meg (1e6), G (1e9).
/// For resistances a lone lower-case <c>m</c> is refused as ambiguous (milliohm or megohm?).</para>
/// <para>Units: Ω, ohm, R for resistance; F; V; A; s; /V or 1/V; % or ppm. Where the quantity
/// allows it (see <see cref="Quantity"/>) a bare number is read in the base unit; where it does
/// not (capacitance, current, time), a bare number is an error, since 10 could mean 10 F or 10 nF.</para>
/// </remarks>
public static class ValueNotation
{
    /// <summary>Reads one value.</summary>
    /// <param name="text">The text as written, for example <c>10 nF</c>.</param>
    /// <param name="quantity">What the value measures.</param>
    /// <param name="value">The value in the base unit (ohms, farads, volts, amperes, seconds, 1/V, V per unit, fraction).</param>
    /// <param name="error">One sentence saying what is wrong, or null on success.</param>
    /// <returns>True when the text is a valid value of <paramref name="quantity"/>.</returns>
    public static bool TryParse(string? text, Quantity quantity, out double value, out string? error)
    {
        value = double.NaN;
        error = null;
        if (string.IsNullOrWhiteSpace(text))
        {
            error = "is empty; write a value such as " + ExampleOf(quantity);
            return false;
        }

        var compact = Compact(text);
        var numberLength = NumberPrefixLength(compact);
        if (numberLength == 0)
        {
            error = $"'{text}' does not start with a number; write a value such as {ExampleOf(quantity)}";
            return false;
        }

        if (!double.TryParse(compact.AsSpan(0, numberLength), NumberStyles.Float, CultureInfo.InvariantCulture, out var number) || !double.IsFinite(number))
        {
            error = $"'{text}' is not a number";
            return false;
        }

        var rest = compact[numberLength..];

        // Part-marking notation: 4k7, 2n2, 4R7 (the prefix letter is the decimal point).
        if (rest.Length >= 2 && IsPrefixLetter(rest[0], quantity) && char.IsAsciiDigit(rest[1]) && !compact[..numberLength].Contains('.', StringComparison.Ordinal) && !compact[..numberLength].Contains('e', StringComparison.OrdinalIgnoreCase))
        {
            var digits = 1;
            while (digits < rest.Length && char.IsAsciiDigit(rest[digits]))
            {
                digits++;
            }

            var fraction = double.Parse("0." + rest[1..digits], CultureInfo.InvariantCulture);
            var letter = rest[0];
            var multiplier = letter is 'R' or 'r' ? 1.0 : PrefixMultiplier(letter.ToString());
            number = (number + (number < 0 ? -fraction : fraction)) * multiplier;
            rest = rest[digits..];
            if (!TryUnit(rest, quantity, out var unitError, allowPrefix: false, out _))
            {
                error = $"'{text}': {unitError}";
                return false;
            }

            value = number;
            return true;
        }

        if (!TryUnit(rest, quantity, out var message, allowPrefix: true, out var scale))
        {
            error = $"'{text}': {message}";
            return false;
        }

        value = number * scale;
        return true;
    }

    /// <summary>Reads one value, throwing on bad text; for values written in code and tests.</summary>
    /// <param name="text">The text, for example <c>4k7</c>.</param>
    /// <param name="quantity">What the value measures.</param>
    /// <returns>The value in the base unit.</returns>
    /// <exception cref="ArgumentException">The text is not a valid value.</exception>
    public static double Parse(string text, Quantity quantity) =>
        TryParse(text, quantity, out var value, out var error) ? value : throw new ArgumentException(error, nameof(text));

    /// <summary>Writes a value with an SI prefix and its unit symbol, for example <c>10 kΩ</c>, <c>4.7 µF</c>, <c>1 ms</c>.</summary>
    /// <param name="value">The value in the base unit.</param>
    /// <param name="quantity">What it measures.</param>
    /// <returns>Readable text that <see cref="TryParse"/> reads back to the same value (to 6 significant digits).</returns>
    public static string Format(double value, Quantity quantity)
    {
        var unit = quantity switch
        {
            Quantity.Resistance => "Ω",
            Quantity.Capacitance => "F",
            Quantity.Voltage => "V",
            Quantity.Current => "A",
            Quantity.Time => "s",
            Quantity.PerVolt => "/V",
            Quantity.VoltsPerUnit => "V",
            _ => string.Empty,
        };
        if (quantity == Quantity.Fraction)
        {
            return (value * 100).ToString("0.####", CultureInfo.InvariantCulture) + " %";
        }

        if (quantity is Quantity.PerVolt or Quantity.VoltsPerUnit || value == 0 || !double.IsFinite(value))
        {
            return value.ToString("G6", CultureInfo.InvariantCulture) + " " + unit;
        }

        var exponent = (int)Math.Floor(Math.Log10(Math.Abs(value)) / 3) * 3;
        exponent = Math.Clamp(exponent, -12, 9);
        var mantissa = value / Math.Pow(10, exponent);
        if (Math.Abs(Math.Round(mantissa, 4)) >= 1000 && exponent < 9)
        {
            exponent += 3;
            mantissa /= 1000;
        }

        var prefix = exponent switch
        {
            -12 => "p",
            -9 => "n",
            -6 => "µ",
            -3 => "m",
            3 => "k",
            6 => "M",
            9 => "G",
            _ => string.Empty,
        };
        return mantissa.ToString("0.#####", CultureInfo.InvariantCulture) + " " + prefix + unit;
    }

    private static string ExampleOf(Quantity quantity) => quantity switch
    {
        Quantity.Resistance => "100k or 4k7",
        Quantity.Capacitance => "10n or 4.7 µF",
        Quantity.Voltage => "1 V",
        Quantity.Current => "80 nA",
        Quantity.Time => "1 ms",
        Quantity.PerVolt => "0.1 /V",
        Quantity.VoltsPerUnit => "0.5 V",
        _ => "5 %",
    };

    private static string Compact(string text)
    {
        var builder = new StringBuilder(text.Length);
        foreach (var character in text.Trim())
        {
            if (!char.IsWhiteSpace(character))
            {
                builder.Append(character == '\u2212' ? '-' : character);
            }
        }

        return builder.ToString();
    }

    private static int NumberPrefixLength(string text)
    {
        var index = 0;
        if (index < text.Length && (text[index] == '+' || text[index] == '-'))
        {
            index++;
        }

        var digitsStart = index;
        while (index < text.Length && (char.IsAsciiDigit(text[index]) || text[index] == '.'))
        {
            index++;
        }

        if (index == digitsStart)
        {
            return 0;
        }

        // An exponent only when digits follow it, so "2e" stays a number and a unit starting with e is not eaten.
        if (index + 1 < text.Length && (text[index] == 'e' || text[index] == 'E'))
        {
            var probe = index + 1;
            if (probe < text.Length && (text[probe] == '+' || text[probe] == '-'))
            {
                probe++;
            }

            if (probe < text.Length && char.IsAsciiDigit(text[probe]))
            {
                while (probe < text.Length && char.IsAsciiDigit(text[probe]))
                {
                    probe++;
                }

                index = probe;
            }
        }

        return index;
    }

    private static bool IsPrefixLetter(char letter, Quantity quantity) =>
        letter is 'p' or 'n' or 'u' or 'µ' or 'μ' or 'k' or 'K' or 'M' or 'G'
        || (letter is 'm' && quantity != Quantity.Resistance)
        || (letter is 'R' or 'r' && quantity == Quantity.Resistance);

    private static double PrefixMultiplier(string prefix) => prefix switch
    {
        "p" => 1e-12,
        "n" => 1e-9,
        "u" or "µ" or "μ" => 1e-6,
        "m" => 1e-3,
        "k" or "K" => 1e3,
        "M" or "Meg" or "meg" or "MEG" => 1e6,
        "G" => 1e9,
        "" => 1.0,
        _ => double.NaN,
    };

    private static bool TryUnit(string rest, Quantity quantity, out string? error, bool allowPrefix, out double scale)
    {
        error = null;
        scale = 1.0;
        var symbols = UnitSymbols(quantity);
        string? matchedUnit = null;
        foreach (var symbol in symbols)
        {
            if (rest.EndsWith(symbol, StringComparison.Ordinal) && (matchedUnit is null || symbol.Length > matchedUnit.Length))
            {
                matchedUnit = symbol;
            }
        }

        var prefix = matchedUnit is null ? rest : rest[..^matchedUnit.Length];
        if (prefix.Length > 0 && !allowPrefix)
        {
            error = $"unexpected '{rest}' after the value";
            return false;
        }

        if (quantity == Quantity.Fraction)
        {
            if (prefix.Length > 0)
            {
                error = $"unknown unit '{rest}'; write a fraction as 5 % or 0.05";
                return false;
            }

            scale = matchedUnit switch
            {
                "%" => 0.01,
                "ppm" => 1e-6,
                _ => 1.0,
            };
            return true;
        }

        if (quantity == Quantity.Resistance && prefix == "m")
        {
            error = "a lower-case m is ambiguous for a resistance; write 1M or 1 MΩ for megohms";
            return false;
        }

        var multiplier = PrefixMultiplier(prefix);
        if (double.IsNaN(multiplier))
        {
            error = $"unknown unit '{rest}'; write a value such as {ExampleOf(quantity)}";
            return false;
        }

        if (allowPrefix && matchedUnit is null && prefix.Length == 0 && quantity is Quantity.Capacitance or Quantity.Current or Quantity.Time)
        {
            error = $"needs a unit (a bare number is ambiguous here); write a value such as {ExampleOf(quantity)}";
            return false;
        }

        scale = multiplier;
        return true;
    }

    private static string[] UnitSymbols(Quantity quantity) => quantity switch
    {
        Quantity.Resistance => ["Ω", "Ohm", "ohm", "ohms", "Ohms", "R", "\u2126"],
        Quantity.Capacitance => ["F"],
        Quantity.Voltage => ["V"],
        Quantity.Current => ["A"],
        Quantity.Time => ["s"],
        Quantity.PerVolt => ["/V", "1/V", "perV"],
        Quantity.VoltsPerUnit => ["V", "V/unit", "V/u"],
        _ => ["%", "ppm"],
    };
}
