using Patchproof.Client.Models;

namespace Patchproof.Client.Tests.Fakes;

/// <summary>Invented demo records (the Quillhaven Analog Lab B scenario) for component tests.</summary>
internal static class DemoData
{
    public static readonly Guid BenchId = Guid.Parse("6d3c7a10-0000-4000-8000-000000000001");
    public static readonly Guid BoardId = Guid.Parse("6d3c7a10-0000-4000-8000-000000000002");
    public static readonly Guid CaptureId = Guid.Parse("6d3c7a10-0000-4000-8000-000000000003");
    public static readonly Guid FitId = Guid.Parse("6d3c7a10-0000-4000-8000-000000000004");
    public static readonly DateTimeOffset At = new(2026, 11, 30, 14, 5, 0, TimeSpan.Zero);

    public static BenchSummary Bench => new(BenchId, "Analog Lab B", "Quillhaven Polytechnic", "Twelve benches.", 2);

    public static BoardSummary Board => new(BoardId, BenchId, "QH-L4", "Plover", "student team Heron", "The attractor looks lopsided.", 1, 1, 0, At);

    public static CaptureEntry Capture(params CaptureCheckEntry[] checks) =>
        new(CaptureId, BoardId, "plover-xyz.csv", 1_200_000, 20_001, ["CH1", "CH2", "CH3"], 1e-5, 0.2, checks, At);

    public static FitJob FitJob(FitJobState state, double progress = 0, bool cancelRequested = false) =>
        new(FitId, BoardId, 1, [CaptureId], state, progress, state == FitJobState.Running ? "multiple shooting" : null, cancelRequested,
            state == FitJobState.Failed ? "The capture is shorter than one Lyapunov time." : null, state == FitJobState.Succeeded, At, null);

    public static DesignSheet LorenzDesign => new(
        "Lorenz",
        ["dx/dt = sigma*(y - x)", "dy/dt = x*(rho - z) - y", "dz/dt = x*y - beta*z"],
        1e-3,
        [new("I1", "integrator", "x"), new("I2", "integrator", "y"), new("I3", "integrator", "z"), new("M1", "multiplier", "x*z"), new("M2", "multiplier", "x*y")],
        [
            new("R1", "resistor", "I1", 10_000, "Ohm", 1),
            new("R5", "resistor", "I2", 35_700, "Ohm", 1),
            new("C2", "capacitor", "I2", 10e-9, "F", 5),
            new("C3", "capacitor", "I3", 10e-9, "F", 20),
        ]);

    public static OverlayPlot Plane(string title) => new(title, "x (V)", "z (V)",
    [
        new(TraceRole.Capture, [0.0, 1, 2, 3], [0.0, 1, 0, 1]),
        new(TraceRole.Nominal, [0.0, 1.1, 2.1, 3.1], [0.0, 1, 0, 1]),
        new(TraceRole.Fitted, [0.0, 1, 2, 3.05], [0.0, 1.02, 0, 1]),
    ]);

    public static FitReportView Report => new(
        FitId,
        Board,
        1,
        [Capture()],
        "R5 behaves about 10 % high; every other part is within its tolerance.",
        [
            new("R5", "input resistor from x into the y integrator", 35_700, 39_300, 420, "Ohm", 10.1, FindingVerdict.Drifted, 0.97,
                "Measure R5 out of circuit and replace it with a 35.7 kOhm 1 % part.", "C2 5 % low (probability 0.02)"),
            new("C3", "capacitor of the z integrator", 10e-9, 10.1e-9, 0.2e-9, "F", 1.0, FindingVerdict.WithinTolerance, 0.97, "Nothing to do.", null),
        ],
        [new("dy/dt", "x", 2800, 2543, 12), new("dy/dt", "x*z", -1000, -1001, 4)],
        [new("y", 1.8, 0.3)],
        new(1e-3, 1.002e-3, 0.001e-3),
        [new("largest Lyapunov exponent", 905, 910, "1/s")],
        new(true, "No missing or extra term: the design's structure explains the capture."),
        new([Plane("x against z")], [], null, [], []),
        new($"api/fits/{FitId}/report", $"api/fits/{FitId}/report.csv", $"api/fits/{FitId}/report.html"));

    public static ProbeCalibrationView ProbeCalibration(double gain = 1.0183, bool followsReference = true) => new(
        BenchId,
        "CH1",
        At,
        At.AddMinutes(2),
        "x integrator output, QH-L4",
        20_000,
        0.2,
        ["cal.csv"],
        [
            new ProbeChannelView("CH1", true, 1, 0, 0, 0, 1, 0, 0.016, null),
            new ProbeChannelView("CH2", false, gain, 4.1e-5, -0.0251, 0.00022, 0.99997, 0.0161, 0.0158, followsReference),
        ],
        []);
}
