using System.Collections.Immutable;

namespace Patchproof.Core.Circuits;

/// <summary>A preferred-number series for resistors and capacitors (E6 ... E96) and rounding to it.</summary>
/// <remarks>
/// <para><see cref="Mantissas"/> holds the values of one decade as printed in the standard: two
/// significant digits for E6 ... E24 (10 ... 91), three for E48 and E96 (100 ... 976). A part value
/// v is on the series when v = m * 10^k for some listed m and integer k.</para>
/// <para>Rounding picks the listed value nearest in ratio (|ln(v / candidate)| smallest), the usual
/// sense of "nearest preferred value" since the series are geometric. A tie goes to the larger value.</para>
/// <para>References: (1) IEC 60063:2015, Preferred number series for resistors and capacitors, Tables 1 and 2.</para>
/// </remarks>
public sealed class ESeries
{
    private readonly int mantissaDivisor;

    private ESeries(string name, double tolerancePercent, ImmutableArray<int> mantissas)
    {
        Name = name;
        TolerancePercent = tolerancePercent;
        Mantissas = mantissas;
        mantissaDivisor = mantissas[0] >= 100 ? 100 : 10;
    }

    /// <summary>The E6 series (6 values per decade, 20 % tolerance class).</summary>
    public static ESeries E6 { get; } = new("E6", 20, [10, 15, 22, 33, 47, 68]);

    /// <summary>The E12 series (12 values per decade, 10 % tolerance class).</summary>
    public static ESeries E12 { get; } = new("E12", 10, [10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82]);

    /// <summary>The E24 series (24 values per decade, 5 % tolerance class).</summary>
    public static ESeries E24 { get; } = new("E24", 5, [10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91]);

    /// <summary>The E48 series (48 values per decade, 2 % tolerance class).</summary>
    public static ESeries E48 { get; } = new("E48", 2, [100, 105, 110, 115, 121, 127, 133, 140, 147, 154, 162, 169, 178, 187, 196, 205, 215, 226, 237, 249, 261, 274, 287, 301, 316, 332, 348, 365, 383, 402, 422, 442, 464, 487, 511, 536, 562, 590, 619, 649, 681, 715, 750, 787, 825, 866, 909, 953]);

    /// <summary>The E96 series (96 values per decade, 1 % tolerance class).</summary>
    public static ESeries E96 { get; } = new("E96", 1, [100, 102, 105, 107, 110, 113, 115, 118, 121, 124, 127, 130, 133, 137, 140, 143, 147, 150, 154, 158, 162, 165, 169, 174, 178, 182, 187, 191, 196, 200, 205, 210, 215, 221, 226, 232, 237, 243, 249, 255, 261, 267, 274, 280, 287, 294, 301, 309, 316, 324, 332, 340, 348, 357, 365, 374, 383, 392, 402, 412, 422, 432, 442, 453, 464, 475, 487, 499, 511, 523, 536, 549, 562, 576, 590, 604, 619, 634, 649, 665, 681, 698, 715, 732, 750, 768, 787, 806, 825, 845, 866, 887, 909, 931, 953, 976]);

    /// <summary>Every series this type knows, coarsest first.</summary>
    public static ImmutableArray<ESeries> All { get; } = [E6, E12, E24, E48, E96];

    /// <summary>The series name, for example <c>E24</c>.</summary>
    public string Name { get; }

    /// <summary>The tolerance class the series goes with, in percent (E24: 5).</summary>
    public double TolerancePercent { get; }

    /// <summary>The tolerance class as a fraction (E24: 0.05).</summary>
    public double Tolerance => TolerancePercent / 100;

    /// <summary>The values of one decade as the standard prints them (E24: 10, 11, ..., 91).</summary>
    public ImmutableArray<int> Mantissas { get; }

    /// <summary>The number of values per decade.</summary>
    public int Count => Mantissas.Length;

    /// <summary>Half the nominal ratio between neighbours, 10^(1/(2N)) - 1: the largest relative error rounding to this series causes (E24: about 4.9 %).</summary>
    public double HalfStep => Math.Pow(10, 1.0 / (2 * Count)) - 1;

    /// <summary>Finds a series by name (<c>E24</c>, case-insensitive).</summary>
    /// <param name="name">The series name.</param>
    /// <param name="series">The series, or null when the name is unknown.</param>
    /// <returns>True when the name is known.</returns>
    public static bool TryFind(string? name, out ESeries series)
    {
        series = All.FirstOrDefault(candidate => string.Equals(candidate.Name, name?.Trim(), StringComparison.OrdinalIgnoreCase))!;
        return series is not null;
    }

    /// <summary>The series value nearest to <paramref name="value"/> in ratio.</summary>
    /// <param name="value">A positive value in any unit (ohms, farads).</param>
    /// <returns>The nearest preferred value, in the same unit.</returns>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="value"/> is not a positive finite number.</exception>
    public double Nearest(double value)
    {
        Preconditions.CheckArgumentRange(nameof(value), value > 0 && double.IsFinite(value), "must be a positive finite number");
        var decade = Math.Floor(Math.Log10(value));
        var best = double.NaN;
        var bestDistance = double.PositiveInfinity;
        for (var shift = -1; shift <= 1; shift++)
        {
            foreach (var mantissa in Mantissas)
            {
                var candidate = ValueOf(mantissa, (int)decade + shift);
                var distance = Math.Abs(Math.Log(value / candidate));
                if (distance < bestDistance - 1e-12 || (Math.Abs(distance - bestDistance) <= 1e-12 && candidate > best))
                {
                    best = candidate;
                    bestDistance = distance;
                }
            }
        }

        return best;
    }

    /// <summary>True when <paramref name="value"/> is a series value (to a relative 1e-9).</summary>
    /// <param name="value">A positive value in any unit.</param>
    /// <returns>True when the value is on the series.</returns>
    public bool Contains(double value) =>
        value > 0 && double.IsFinite(value) && Math.Abs(Nearest(value) / value - 1) <= 1e-9;

    /// <inheritdoc/>
    public override string ToString() => Name;

    private double ValueOf(int mantissa, int decade)
    {
        // Implementation note: one division of two exact integers-as-doubles, so 4.7e3 comes out as
        // the double nearest 4700 and 10n as the double nearest 1e-8.
        return decade >= 0
            ? mantissa * Math.Pow(10, decade) / mantissaDivisor
            : mantissa / (mantissaDivisor * Math.Pow(10, -decade));
    }
}
