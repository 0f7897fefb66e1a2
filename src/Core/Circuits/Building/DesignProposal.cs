using System.Collections.Immutable;

namespace Patchproof.Core.Circuits.Building;

/// <summary>One part value the builder rounded to its series, and what the rounding costs.</summary>
/// <param name="PartId">The part.</param>
/// <param name="IdealValue">The exact value the coefficient asks for.</param>
/// <param name="ChosenValue">The series value picked.</param>
/// <param name="Serves">The term it serves (<c>dy/dt: x</c>) or the role (<c>integrator y</c>, <c>inverter -x</c>).</param>
/// <param name="CoefficientError">The relative error of the coefficient the rounding causes (ideal / chosen - 1 for an input resistor).</param>
public sealed record PartRounding(string PartId, double IdealValue, double ChosenValue, string Serves, double CoefficientError);

/// <summary>A proposed design with the rounding of each part and notes for the builder.</summary>
/// <param name="Design">The design.</param>
/// <param name="Roundings">Each rounded part.</param>
/// <param name="Notes">Warnings: a resistor outside 1 kΩ ... 10 MΩ, a term the builder cannot realize.</param>
public sealed record DesignProposal(BoardDesign Design, ImmutableArray<PartRounding> Roundings, ImmutableArray<string> Notes);
