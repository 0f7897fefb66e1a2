using System.Collections.Immutable;

namespace Patchproof.Core.Circuits.Targets;

/// <summary>A model turned into a board target, or every reason it cannot be.</summary>
/// <param name="Target">The target, or null when a term is refused.</param>
/// <param name="Refusals">What the board cannot realize; empty when <see cref="Target"/> is set.</param>
public sealed record ModelTargetResult(TargetSystem? Target, ImmutableArray<TargetRefusal> Refusals)
{
    /// <summary>True when every term can be realized.</summary>
    public bool IsRealizable => Target is not null;
}
