namespace Patchproof.Core.Captures.Reading;

/// <summary>The fast path for a plain numeric row: one pass over the bytes, parsing each number up to its delimiter.</summary>
/// <remarks>
/// Handles rows of exactly the expected number of unquoted, unpadded numbers of at most 19 digits whose value is
/// m * 10^e with m at most 2^53 and |e| at most 22 (Clinger's fast path, correctly rounded: both factors are exact
/// doubles and IEEE division or multiplication rounds once), optionally followed by trailing delimiters. Anything
/// else returns false, and the caller reads the row with the general path, which also names what is wrong.
/// References:
/// 1. W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990.
/// </remarks>
internal static class FastRowParser
{
    private static readonly double[] PowersOfTen =
    [
        1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11,
        1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
    ];

    /// <summary>Parses a whole row into <paramref name="row"/>, or returns false.</summary>
    /// <param name="line">The row's bytes.</param>
    /// <param name="delimiter">The single-byte delimiter (not whitespace).</param>
    /// <param name="separator">The decimal separator.</param>
    /// <param name="row">Receives exactly row.Length values.</param>
    /// <param name="trackedColumn">A column whose printed resolution is tracked (the time column), or -1.</param>
    /// <param name="maxLastDigitExponent">Raised to the power of ten of the tracked column's last digit when larger.</param>
    public static bool TryParse(ReadOnlySpan<byte> line, byte delimiter, byte separator, Span<double> row, int trackedColumn, ref int maxLastDigitExponent)
    {
        var i = 0;
        var length = line.Length;
        for (var k = 0; k < row.Length; k++)
        {
            if (k > 0)
            {
                if (i >= length || line[i] != delimiter)
                {
                    return false;
                }

                i++;
            }

            var negative = false;
            if (i < length && (line[i] == (byte)'-' || line[i] == (byte)'+'))
            {
                negative = line[i] == (byte)'-';
                i++;
            }

            ulong mantissa = 0;
            var digits = 0;
            var fraction = 0;
            uint d;
            while (i < length && (d = (uint)(line[i] - '0')) <= 9)
            {
                mantissa = (mantissa * 10) + d;
                digits++;
                i++;
            }

            if (i < length && line[i] == separator)
            {
                i++;
                while (i < length && (d = (uint)(line[i] - '0')) <= 9)
                {
                    mantissa = (mantissa * 10) + d;
                    digits++;
                    fraction++;
                    i++;
                }
            }

            if (digits == 0 || digits > 19)
            {
                return false;
            }

            var exponent = 0;
            if (i < length && (line[i] | 0x20) == (byte)'e')
            {
                i++;
                var exponentNegative = false;
                if (i < length && (line[i] == (byte)'-' || line[i] == (byte)'+'))
                {
                    exponentNegative = line[i] == (byte)'-';
                    i++;
                }

                var exponentDigits = 0;
                while (i < length && (d = (uint)(line[i] - '0')) <= 9)
                {
                    exponent = (exponent * 10) + (int)d;
                    if (++exponentDigits > 4)
                    {
                        return false;
                    }

                    i++;
                }

                if (exponentDigits == 0)
                {
                    return false;
                }

                if (exponentNegative)
                {
                    exponent = -exponent;
                }
            }

            var scale = exponent - fraction;
            if (mantissa > (1UL << 53) || scale > 22 || scale < -22)
            {
                return false;
            }

            double value = mantissa;
            value = scale >= 0 ? value * PowersOfTen[scale] : value / PowersOfTen[-scale];
            row[k] = negative ? -value : value;
            if (k == trackedColumn && scale > maxLastDigitExponent)
            {
                maxLastDigitExponent = scale;
            }
        }

        // Trailing delimiters (and nothing else) may follow the last field.
        for (; i < length; i++)
        {
            if (line[i] != delimiter)
            {
                return false;
            }
        }

        return true;
    }
}
