namespace Patchproof.Server.Seeding;

/// <summary>The invented demo scenario: Quillhaven Polytechnic, Analog Lab B, and its boards.</summary>
internal static class DemoScenario
{
    public const string BenchName = "Analog Lab B";

    public const string Institution = "Quillhaven Polytechnic";

    public const string BenchDescription =
        "A teaching lab with twelve benches: a ±15 V bench supply, a four-channel scope that exports CSV, and a kit of op-amp integrators, four-quadrant multipliers (output XY/10 V) and inverters at each.";

    public static IReadOnlyList<DemoBoard> Boards { get; } =
    [
        new("QH-L3", "Wren", "student team Cormorant", "Lorenz system (sigma 10, rho 28, beta 8/3): three integrators, two multipliers. A healthy build; all parts within tolerance."),
        new("QH-L4", "Plover", "student team Heron", "Same Lorenz design as QH-L3. The attractor looks lopsided."),
        new("QH-L5", "Tern", "bench technician's repair queue", "Same Lorenz design as QH-L3, captured with only the x and z channels."),
        new("QH-R1", "Gannet", "physics annex", "Rössler system (a 0.2, b 0.2, c 5.7) with one multiplier, calibrated as a noise source."),
        new("QH-D2", "Dunlin", "first-year lab", "Damped harmonic oscillator: two integrators and an inverter. A healthy reference board; two channels."),
        new("QH-L9", "Skua", "demo bench", "Lorenz system on a slow time scale (470 nF integrator capacitors)."),
    ];
}

/// <summary>One demo board.</summary>
internal sealed record DemoBoard(string Code, string Name, string BuiltBy, string Description);
