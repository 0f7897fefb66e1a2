namespace Patchproof.Core.Circuits.Targets;

/// <summary>One part of a model the board's blocks cannot realize: which equation, which term, and why.</summary>
/// <param name="Variable">The equation's variable (the left-hand side of <c>x' = ...</c>).</param>
/// <param name="Line">The equation's line in the model text (1-based), or 0 when unknown.</param>
/// <param name="Term">The term as written after decomposition, for example <c>(-mu) * x^2*y</c>; empty when the whole equation is refused.</param>
/// <param name="Reason">Why the board cannot compute it.</param>
public sealed record TargetRefusal(string Variable, int Line, string Term, string Reason)
{
    /// <summary>For example <c>equation y' (line 5), term (-mu) * x^2*y: ...</c>.</summary>
    public override string ToString() =>
        $"equation {Variable}'{(Line > 0 ? $" (line {Line})" : string.Empty)}{(Term.Length > 0 ? $", term {Term}" : string.Empty)}: {Reason}";
}
