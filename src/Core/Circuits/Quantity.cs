namespace Patchproof.Core.Circuits;

/// <summary>What a written value measures, which decides the units it may carry.</summary>
public enum Quantity
{
    /// <summary>Ohms: <c>100k</c>, <c>4k7</c>, <c>1M</c>, <c>10 kΩ</c>, <c>470R</c>; a bare number is ohms.</summary>
    Resistance,

    /// <summary>Farads: <c>10n</c>, <c>4.7 µF</c>, <c>2000 pF</c>, <c>2n2</c>; a bare number is refused.</summary>
    Capacitance,

    /// <summary>Volts: <c>1 V</c>, <c>-10V</c>, <c>400 mV</c>; a bare number is volts.</summary>
    Voltage,

    /// <summary>Amperes: <c>80 nA</c>; a bare number is refused.</summary>
    Current,

    /// <summary>Seconds: <c>1 ms</c>, <c>47ms</c>, <c>2 s</c>; a bare number is refused.</summary>
    Time,

    /// <summary>A multiplier's scale factor in 1/V: <c>0.1 /V</c>, <c>0.1/V</c>; a bare number is per volt.</summary>
    PerVolt,

    /// <summary>An amplitude scale in volts per problem unit: <c>0.4 V</c>, <c>400 mV</c>; a bare number is volts per unit.</summary>
    VoltsPerUnit,

    /// <summary>A fraction: <c>5 %</c>, <c>0.05</c>, <c>-4 %</c>, <c>500 ppm</c>.</summary>
    Fraction,
}
