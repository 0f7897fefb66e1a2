namespace Patchproof.Core.Models;

/// <summary>A model of the built-in library: its equation text, a hand-written twin, and what to simulate by default.</summary>
/// <remarks>
/// The equation text and <see cref="HandWritten"/> describe the same system with the same state and
/// parameter order; the hand-written class is the performance reference and a cross-check of the
/// compiler. <see cref="DefaultInitialState"/> equals the initial values in the text.
/// </remarks>
/// <param name="Name">The short name used on the command line, for example <c>lorenz</c>.</param>
/// <param name="Title">The system's usual name, for example <c>Lorenz system</c>.</param>
/// <param name="Description">One sentence on what it is and what it shows.</param>
/// <param name="Source">Where the equations and parameter values come from.</param>
/// <param name="EquationText">The model in the equation language.</param>
/// <param name="DefaultInitialState">A starting state on or near the attractor or orbit of interest (for the Sprott jerk system a point on the attractor, found by integrating from (-1, 0, 0): its basin is thin and most starts near the origin escape; computed).</param>
/// <param name="SuggestedDuration">A simulation length, in problem time units, that shows the behaviour well.</param>
/// <param name="HandWritten">The same system written by hand.</param>
public sealed record BuiltInModel(
    string Name,
    string Title,
    string Description,
    string Source,
    string EquationText,
    IReadOnlyList<double> DefaultInitialState,
    double SuggestedDuration,
    IOdeSystem HandWritten)
{
    /// <summary>The parsed equation text (built-in texts always parse).</summary>
    public EquationModel Parse() => ModelParser.Parse(EquationText, Name + ".model").Value;

    /// <summary>The nominal (published) parameter values, in parameter order.</summary>
    public double[] NominalParameters() => Parse().NominalParameters();
}
