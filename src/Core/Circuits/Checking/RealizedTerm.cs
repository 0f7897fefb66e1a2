namespace Patchproof.Core.Circuits.Checking;

/// <summary>One term as the parts realize it, next to the model's term it should match.</summary>
/// <remarks>Coefficients in problem units are de-scaled from machine units with the design's scales
/// and time scale (see <see cref="BoardDesign.ToProblemCoefficient"/>). The relative error is
/// realized / expected - 1; <see cref="AllowedRelativeError"/> is the rounding its parts allow: the
/// sum over the path's parts of the half-step of each part's E-series (0.5 % for a part without one).</remarks>
/// <param name="Term">The design term (machine units, with part paths); null for a model term the board lacks.</param>
/// <param name="Variable">The equation.</param>
/// <param name="Basis">The basis.</param>
/// <param name="RealizedProblemCoefficient">The coefficient the parts give, in problem units (0 when missing).</param>
/// <param name="ExpectedProblemCoefficient">The model's coefficient, or null for a term the model lacks.</param>
/// <param name="AllowedRelativeError">How far rounding to standard parts may move it (fraction).</param>
public sealed record RealizedTerm(
    DesignTerm? Term,
    string Variable,
    TermBasis Basis,
    double RealizedProblemCoefficient,
    double? ExpectedProblemCoefficient,
    double AllowedRelativeError)
{
    /// <summary>realized / expected - 1, or null when either side is missing.</summary>
    public double? RelativeError => ExpectedProblemCoefficient is { } expected && Term is not null && expected != 0
        ? (RealizedProblemCoefficient / expected) - 1
        : null;

    /// <summary>The term as text, for example <c>dy/dt: x*z</c>.</summary>
    public string Label => $"d{Variable}/dt: {Basis.Key}";
}
