namespace Patchproof.Core.Circuits;

/// <summary>One part of a board: its id as printed on the drawing, its kind, nominal value and tolerance.</summary>
/// <remarks>
/// <para>Units follow <see cref="Kind"/>: ohms, farads, 1/V (multiplier scale factor kappa, with
/// W = kappa * X * Y) or volts (a reference, signed). <see cref="Tolerance"/> is a fraction
/// (0.01 for a 1 % part). When the part was bought from an E-series, <see cref="Series"/> names it; a
/// part given only a series takes the series' tolerance class.</para>
/// <para>Which terms a part serves follows from the blocks that name it: see
/// <see cref="BoardDesign.TermsServedBy"/>.</para>
/// </remarks>
/// <param name="Id">The id on the drawing, for example <c>R5</c>, <c>C2</c>, <c>M1</c>, <c>VR1</c>.</param>
/// <param name="Kind">What the part is.</param>
/// <param name="NominalValue">The value as drawn, in the unit of <paramref name="Kind"/>.</param>
/// <param name="Tolerance">The tolerance as a fraction (0.05 for 5 %), at least 0.</param>
/// <param name="Series">The E-series the value was picked from, or null.</param>
public sealed record Part(string Id, PartKind Kind, double NominalValue, double Tolerance, ESeries? Series = null)
{
    /// <summary>The quantity the value measures (resistance for a resistor, and so on).</summary>
    public Quantity Quantity => Kind switch
    {
        PartKind.Resistor => Quantity.Resistance,
        PartKind.Capacitor => Quantity.Capacitance,
        PartKind.Multiplier => Quantity.PerVolt,
        _ => Quantity.Voltage,
    };

    /// <summary>The nominal value as people write it, for example <c>100 kΩ</c>.</summary>
    public string NominalText => ValueNotation.Format(NominalValue, Quantity);

    /// <summary>A copy with another nominal value.</summary>
    /// <param name="value">The new value in the unit of <see cref="Kind"/>.</param>
    /// <returns>The changed part.</returns>
    public Part WithNominalValue(double value) => this with { NominalValue = value };
}
