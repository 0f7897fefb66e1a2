namespace Patchproof.Core.Circuits.Checking;

/// <summary>One thing a design check found: what, where (equation, term or part) and a sentence for a person.</summary>
/// <param name="Kind">What was found.</param>
/// <param name="Subject">The term (<c>dy/dt: x*z</c>), part (<c>R9</c>) or variable concerned.</param>
/// <param name="Message">One sentence a person can act on.</param>
/// <param name="IsError">True when the board does not realize its model; false for a note (an unused part, a range).</param>
public sealed record DesignFinding(DesignFindingKind Kind, string Subject, string Message, bool IsError);
