using System.Collections.Immutable;
using Patchproof.Core.Models;

namespace Patchproof.Core.Circuits.Targets;

/// <summary>Every target a design can be generated from or checked against: the hand-written ones, then each realizable catalog model.</summary>
/// <remarks>The hand-written targets keep their names and parameters (the damped oscillator's k and d
/// differ from the catalog's zeta and omega0), so a name they answer to never reaches the catalog.</remarks>
public static class DesignTargets
{
    private static readonly Lazy<ImmutableArray<TargetSystem>> AllTargets = new(() =>
        [.. BuiltInTargets.All, .. ModelTargets.Catalog
            .Where(entry => entry.Result.IsRealizable && !BuiltInTargets.TryFind(entry.Model.Name, out _))
            .Select(entry => entry.Result.Target!)]);

    /// <summary>The hand-written targets and every realizable catalog model, in that order.</summary>
    public static ImmutableArray<TargetSystem> All => AllTargets.Value;

    /// <summary>The names of every target, without simulating: the hand-written ones, then each catalog model whose terms the board realizes.</summary>
    /// <returns>The names, in the order of <see cref="All"/>.</returns>
    public static ImmutableArray<string> Names() =>
        [.. BuiltInTargets.All.Select(target => target.Name), .. ModelCatalog.All
            .Where(model => !BuiltInTargets.TryFind(model.Name, out _) && ModelTargets.RefusalsOf(model.Parse()).IsEmpty)
            .Select(model => model.Name)];

    /// <summary>Finds a target by name: a hand-written one (<see cref="BuiltInTargets.TryFind"/>), else a realizable catalog model.</summary>
    /// <param name="name">The name.</param>
    /// <param name="target">The target, or null.</param>
    /// <returns>True when found.</returns>
    public static bool TryFind(string? name, out TargetSystem target)
    {
        if (BuiltInTargets.TryFind(name, out target))
        {
            return true;
        }

        target = ModelTargets.FromCatalog(name)?.Target!;
        return target is not null;
    }
}
