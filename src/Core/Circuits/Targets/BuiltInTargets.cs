using System.Collections.Immutable;

namespace Patchproof.Core.Circuits.Targets;

/// <summary>The systems the demo boards realize, in coefficient-times-basis form.</summary>
/// <remarks>
/// <para>Lorenz: x' = sigma (y - x), y' = rho x - y - x z, z' = x y - beta z; sigma 10, rho 28,
/// beta 8/3 (1). Rössler: x' = -y - z, y' = x + a y, z' = b + x z - c z; a 0.2, b 0.2, c 5.7 (2).
/// Damped oscillator: x' = y, y' = -k x - d y; k 1, d 0.2 (values chosen for the demo).</para>
/// <para>Typical ranges are max |x| on the attractor from the default start, rounded up (from
/// simulation; used only to size scales when no range is given).</para>
/// <para>References: (1) E. N. Lorenz, Deterministic nonperiodic flow, J. Atmos. Sci. 20 (1963)
/// 130-141. (2) O. E. Rössler, An equation for continuous chaos, Phys. Lett. A 57 (1976) 397-398.</para>
/// </remarks>
public static class BuiltInTargets
{
    /// <summary>The Lorenz system.</summary>
    public static TargetSystem Lorenz { get; } = new(
        "lorenz",
        ["x", "y", "z"],
        [new("sigma", 10.0), new("rho", 28.0), new("beta", 8.0 / 3.0)],
        [
            new("x", TermBasis.Product("y"), 1, "sigma"),
            new("x", TermBasis.Product("x"), -1, "sigma"),
            new("y", TermBasis.Product("x"), 1, "rho"),
            new("y", TermBasis.Product("y"), -1),
            new("y", TermBasis.Product("x", "z"), -1),
            new("z", TermBasis.Product("x", "y"), 1),
            new("z", TermBasis.Product("z"), -1, "beta"),
        ],
        [1.0, 1.0, 1.0],
        [20.0, 27.0, 48.0]);

    /// <summary>The Rössler system.</summary>
    public static TargetSystem Rossler { get; } = new(
        "rossler",
        ["x", "y", "z"],
        [new("a", 0.2), new("b", 0.2), new("c", 5.7)],
        [
            new("x", TermBasis.Product("y"), -1),
            new("x", TermBasis.Product("z"), -1),
            new("y", TermBasis.Product("x"), 1),
            new("y", TermBasis.Product("y"), 1, "a"),
            new("z", TermBasis.One, 1, "b"),
            new("z", TermBasis.Product("x", "z"), 1),
            new("z", TermBasis.Product("z"), -1, "c"),
        ],
        [1.0, 1.0, 0.0],
        [12.0, 11.0, 24.0]);

    /// <summary>The damped harmonic oscillator.</summary>
    public static TargetSystem DampedOscillator { get; } = new(
        "damped-oscillator",
        ["x", "y"],
        [new("k", 1.0), new("d", 0.2)],
        [
            new("x", TermBasis.Product("y"), 1),
            new("y", TermBasis.Product("x"), -1, "k"),
            new("y", TermBasis.Product("y"), -1, "d"),
        ],
        [1.0, 0.0],
        [1.0, 1.0]);

    /// <summary>Every built-in system.</summary>
    public static ImmutableArray<TargetSystem> All { get; } = [Lorenz, Rossler, DampedOscillator];

    /// <summary>Finds a built-in system by name (case-insensitive; <c>roessler</c> and <c>rössler</c> find Rössler).</summary>
    /// <param name="name">The name.</param>
    /// <param name="system">The system, or null.</param>
    /// <returns>True when found.</returns>
    public static bool TryFind(string? name, out TargetSystem system)
    {
        var key = (name ?? string.Empty).Trim().ToLowerInvariant().Replace("ö", "o", StringComparison.Ordinal).Replace("oe", "o", StringComparison.Ordinal);
        system = All.FirstOrDefault(candidate => candidate.Name == key || (key is "oscillator" or "damped" && candidate == DampedOscillator))!;
        return system is not null;
    }
}
