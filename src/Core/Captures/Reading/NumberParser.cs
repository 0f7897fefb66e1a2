using System.Globalization;
using System.Text;

namespace Patchproof.Core.Captures.Reading;

/// <summary>What became of one numeric field.</summary>
internal enum FieldStatus
{
    /// <summary>A finite number.</summary>
    Number,

    /// <summary>Nothing but spaces (or empty quotes).</summary>
    Empty,

    /// <summary>NaN or an infinity, in any of the usual spellings.</summary>
    NonFinite,

    /// <summary>A number written with the other decimal separator than the file uses.</summary>
    OtherDecimalSeparator,

    /// <summary>Text that is not a number.</summary>
    NotANumber,
}

/// <summary>Parses decimal numbers from UTF-8 bytes exactly (correctly rounded), whatever the machine's locale.</summary>
/// <remarks>
/// A fast path handles numbers of at most 19 significant digits whose value is m * 10^e with m below 2^53
/// and |e| at most 22: both m and 10^e are exact doubles, so one IEEE multiplication or division rounds
/// correctly (Clinger's fast path [1]). Everything else goes to <see cref="double.TryParse(ReadOnlySpan{byte}, NumberStyles, IFormatProvider?, out double)"/>
/// with the invariant culture, which is also correctly rounded in .NET Core 3.0 and later [2].
/// References:
/// 1. W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990.
/// 2. .NET blog, "Floating-Point Parsing and Formatting improvements in .NET Core 3.0", 2019.
/// </remarks>
internal static class NumberParser
{
    private static readonly double[] PowersOfTen =
    [
        1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11,
        1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
    ];

    /// <summary>Parses one field (surrounding spaces and one pair of double quotes allowed).</summary>
    /// <param name="field">The field's bytes.</param>
    /// <param name="decimalSeparator">'.' or ','.</param>
    /// <param name="value">The value when the status is <see cref="FieldStatus.Number"/>.</param>
    /// <param name="lastDigitExponent">The power of ten of the last written digit (-5 for "1.00000e+00"): the printed resolution.</param>
    public static FieldStatus Parse(ReadOnlySpan<byte> field, byte decimalSeparator, out double value, out int lastDigitExponent)
    {
        value = 0;
        lastDigitExponent = 0;
        field = Trim(field);
        if (field.Length >= 2 && field[0] == (byte)'"' && field[^1] == (byte)'"')
        {
            field = Trim(field[1..^1]);
        }

        if (field.IsEmpty)
        {
            return FieldStatus.Empty;
        }

        var i = 0;
        var negative = false;
        if (field[0] == (byte)'-' || field[0] == (byte)'+')
        {
            negative = field[0] == (byte)'-';
            i = 1;
        }

        ulong mantissa = 0;
        var significant = 0;
        var fractionDigits = 0;
        var sawDigit = false;
        var sawSeparator = false;
        var overflowDigits = false;
        for (; i < field.Length; i++)
        {
            var b = field[i];
            var d = (uint)(b - '0');
            if (d <= 9)
            {
                sawDigit = true;
                if (sawSeparator)
                {
                    fractionDigits++;
                }

                if (mantissa == 0 && d == 0)
                {
                    continue;
                }

                if (significant < 19)
                {
                    mantissa = (mantissa * 10) + d;
                    significant++;
                }
                else
                {
                    overflowDigits = true;
                }
            }
            else if (b == decimalSeparator && !sawSeparator)
            {
                sawSeparator = true;
            }
            else
            {
                break;
            }
        }

        if (!sawDigit)
        {
            return Classify(field, decimalSeparator);
        }

        var exponent = 0;
        if (i < field.Length)
        {
            if ((field[i] | 0x20) != (byte)'e')
            {
                return Classify(field, decimalSeparator);
            }

            i++;
            var exponentNegative = false;
            if (i < field.Length && (field[i] == (byte)'-' || field[i] == (byte)'+'))
            {
                exponentNegative = field[i] == (byte)'-';
                i++;
            }

            var exponentDigits = 0;
            for (; i < field.Length; i++)
            {
                var d = (uint)(field[i] - '0');
                if (d > 9)
                {
                    return Classify(field, decimalSeparator);
                }

                if (exponent < 100_000)
                {
                    exponent = (exponent * 10) + (int)d;
                }

                exponentDigits++;
            }

            if (exponentDigits == 0)
            {
                return FieldStatus.NotANumber;
            }

            if (exponentNegative)
            {
                exponent = -exponent;
            }
        }

        lastDigitExponent = exponent - fractionDigits;
        if (!overflowDigits && mantissa <= (1UL << 53))
        {
            var scale = lastDigitExponent;
            if (mantissa == 0)
            {
                value = negative ? -0.0 : 0.0;
                return FieldStatus.Number;
            }

            if (scale >= 0 && scale <= 22)
            {
                var v = mantissa * PowersOfTen[scale];
                if (double.IsFinite(v))
                {
                    value = negative ? -v : v;
                    return FieldStatus.Number;
                }
            }
            else if (scale < 0 && scale >= -22)
            {
                var v = mantissa / PowersOfTen[-scale];
                value = negative ? -v : v;
                return FieldStatus.Number;
            }
        }

        return ParseSlow(field, decimalSeparator, out value);
    }

    /// <summary>Parses a number written in a string (metadata values), with the given decimal separator.</summary>
    public static bool TryParse(string text, char decimalSeparator, out double value)
    {
        var bytes = Encoding.UTF8.GetBytes(text);
        return Parse(bytes, (byte)decimalSeparator, out value, out _) == FieldStatus.Number;
    }

    /// <summary>Removes spaces and tabs at both ends.</summary>
    public static ReadOnlySpan<byte> Trim(ReadOnlySpan<byte> field)
    {
        var start = 0;
        var end = field.Length;
        while (start < end && (field[start] == (byte)' ' || field[start] == (byte)'\t'))
        {
            start++;
        }

        while (end > start && (field[end - 1] == (byte)' ' || field[end - 1] == (byte)'\t'))
        {
            end--;
        }

        return field[start..end];
    }

    private static FieldStatus ParseSlow(ReadOnlySpan<byte> field, byte decimalSeparator, out double value)
    {
        Span<byte> copy = field.Length <= 256 ? stackalloc byte[field.Length] : new byte[field.Length];
        field.CopyTo(copy);
        if (decimalSeparator != (byte)'.')
        {
            copy.Replace(decimalSeparator, (byte)'.');
        }

        if (double.TryParse(copy, NumberStyles.Float, CultureInfo.InvariantCulture, out value) && double.IsFinite(value))
        {
            return FieldStatus.Number;
        }

        return double.IsFinite(value) ? FieldStatus.NotANumber : FieldStatus.NonFinite;
    }

    private static FieldStatus Classify(ReadOnlySpan<byte> field, byte decimalSeparator)
    {
        var body = field[0] is (byte)'-' or (byte)'+' ? field[1..] : field;
        if (body.Length is >= 3 and <= 9)
        {
            Span<byte> lower = stackalloc byte[body.Length];
            for (var k = 0; k < body.Length; k++)
            {
                lower[k] = (byte)(body[k] | 0x20);
            }

            if (lower.SequenceEqual("nan"u8) || lower.SequenceEqual("inf"u8) || lower.SequenceEqual("infinity"u8) || lower.SequenceEqual("1.#inf"u8))
            {
                return FieldStatus.NonFinite;
            }
        }

        var other = decimalSeparator == (byte)'.' ? (byte)',' : (byte)'.';
        if (field.Contains(other))
        {
            Span<byte> swapped = field.Length <= 256 ? stackalloc byte[field.Length] : new byte[field.Length];
            field.CopyTo(swapped);
            swapped.Replace(other, decimalSeparator);
            if (Parse(swapped, decimalSeparator, out _, out _) == FieldStatus.Number)
            {
                return FieldStatus.OtherDecimalSeparator;
            }
        }

        return FieldStatus.NotANumber;
    }
}
