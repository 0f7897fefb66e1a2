using Microsoft.Extensions.Time.Testing;
using Patchproof.Core.Diagnosis;
using Patchproof.Core.Reports;

namespace Patchproof.Core.Tests.Reports;

public sealed class BoardFitterTests
{
    private static readonly FakeTimeProvider Clock = new(new DateTimeOffset(2026, 12, 1, 12, 0, 0, TimeSpan.Zero));

    [Fact]
    public void Fit_HealthyLorenzBoard_FindsEveryPartWithinTolerance()
    {
        var design = SyntheticBoardCapture.LoadDesign("qh-l3-wren.json");
        var capture = SyntheticBoardCapture.Simulate(design, seed: 11);

        var report = BoardFitter.Fit(design, capture, new BoardFitOptions(), Clock).Value;

        Assert.True(report.Quality.Converged, report.Quality.ExitReason);
        Assert.Equal(DiagnosisOutcome.WithinTolerance, report.Diagnosis.Outcome);
        Assert.Empty(report.Diagnosis.Findings);
    }

    [Fact]
    public void Fit_ResistorFromXIntoTheYIntegratorEightPercentHigh_NamesItWithinOnePercent()
    {
        var design = SyntheticBoardCapture.LoadDesign("qh-l3-wren.json");
        var resistor = design.Integrators.Single(i => i.Variable == "y").Inputs.Single(input => input.From.TrimStart('-') == "x").ResistorId;
        var asBuilt = design.WithPartValues(new Dictionary<string, double> { [resistor] = 1.08 * design.NominalOf(resistor) });
        var capture = SyntheticBoardCapture.Simulate(asBuilt, seed: 12, channelOffsetsVolts: [0.03, -0.02, 0.05]);

        var report = BoardFitter.Fit(design, capture, new BoardFitOptions(), Clock).Value;

        Assert.Equal(DiagnosisOutcome.PartsNamed, report.Diagnosis.Outcome);
        var finding = Assert.Single(report.Diagnosis.Findings);
        Assert.Equal(resistor, finding.PartId);
        Assert.InRange(finding.EffectiveValue / (1.08 * design.NominalOf(resistor)), 0.99, 1.01);
        Assert.Empty(report.Warnings);
    }

    [Fact]
    public void Fit_CapacitorTwelvePercentLow_NamesTheCapacitorNotItsResistors()
    {
        var design = SyntheticBoardCapture.LoadDesign("qh-l3-wren.json");
        var capacitor = design.Integrators.Single(i => i.Variable == "z").CapacitorId;
        var asBuilt = design.WithPartValues(new Dictionary<string, double> { [capacitor] = 0.88 * design.NominalOf(capacitor) });
        var capture = SyntheticBoardCapture.Simulate(asBuilt, seed: 13);

        var report = BoardFitter.Fit(design, capture, new BoardFitOptions(), Clock).Value;

        var finding = Assert.Single(report.Diagnosis.Findings);
        Assert.Equal(capacitor, finding.PartId);
        Assert.InRange(finding.Deviation, -13, -11);
    }

    [Fact]
    public void Fit_TooShortRecord_WarnsInsteadOfAConfidentFinding()
    {
        var design = SyntheticBoardCapture.LoadDesign("qh-l3-wren.json");
        var capture = SyntheticBoardCapture.Simulate(design, seed: 14, problemUnits: 2);

        var report = BoardFitter.Fit(design, capture, new BoardFitOptions(), Clock).Value;

        Assert.False(report.FindingsAreSafe);
        Assert.Contains(report.Warnings, warning => warning.Contains("Record longer", StringComparison.Ordinal));
    }

    [Fact]
    public void Fit_UnknownChannelInTheMapping_IsAClearErrorNamingIt()
    {
        var design = SyntheticBoardCapture.LoadDesign("qh-l3-wren.json");
        var capture = SyntheticBoardCapture.Simulate(design, seed: 15, problemUnits: 2);

        var result = BoardFitter.Fit(design, capture, new BoardFitOptions { Mapping = [new ChannelAssignment("CH9", "x", 1)] }, Clock);

        Assert.False(result.Success);
        Assert.Contains("CH9", result.Errors[0].Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Json_StartsWithFormatAndVersion()
    {
        var design = SyntheticBoardCapture.LoadDesign("qh-l3-wren.json");
        var capture = SyntheticBoardCapture.Simulate(design, seed: 16, problemUnits: 6);
        var report = BoardFitter.Fit(design, capture, new BoardFitOptions(), Clock).Value;

        var json = FitReportJson.Write(report);

        using var document = System.Text.Json.JsonDocument.Parse(json);
        var root = document.RootElement;
        Assert.Equal("patchproof-fit-report", root.GetProperty("format").GetString());
        Assert.Equal(1, root.GetProperty("version").GetInt32());
        Assert.Equal("QH-L3", root.GetProperty("board").GetString());
        Assert.True(root.GetProperty("diagnosis").TryGetProperty("outcome", out _));
    }
}
