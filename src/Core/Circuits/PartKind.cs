namespace Patchproof.Core.Circuits;

/// <summary>What kind of part a <see cref="Part"/> is, which fixes the unit of its value.</summary>
public enum PartKind
{
    /// <summary>A resistor; value in ohms.</summary>
    Resistor,

    /// <summary>A capacitor; value in farads.</summary>
    Capacitor,

    /// <summary>A four-quadrant multiplier; value is its scale factor kappa in 1/V (nominally 0.1).</summary>
    Multiplier,

    /// <summary>A reference voltage source for constant terms; value in volts, signed.</summary>
    Reference,
}
