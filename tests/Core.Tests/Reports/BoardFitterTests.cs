using Microsoft.Extensions.Time.Testing;
using Patchproof.Core.Circuits.Files;
using Patchproof.Core.Diagnosis;
using Patchproof.Core.Estimation;
using Patchproof.Core.Reports;
using Patchproof.TestSupport;

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
        Assert.DoesNotContain(report.Warnings, w => w.Contains("does not reproduce", StringComparison.Ordinal));
    }

    [Fact]
    public void Fit_TwoChannelCaptureReadInFileOrder_WarnsThatTheFitDoesNotReproduceTheChannels()
    {
        // x and z recorded on CH1 and CH3; without a mapping the channels are taken in order, so CH3 is read as y.
        // Neither the mapping check nor the structure check can run with a variable unrecorded: the residuals must say it.
        var design = SyntheticBoardCapture.LoadDesign("qh-l3-wren.json");
        var capture = SyntheticBoardCapture.Simulate(design, seed: 23, problemUnits: 10, recorded: [0, 2]);

        var report = BoardFitter.Fit(design, capture, new BoardFitOptions { CompareInvariants = false }, Clock).Value;

        Assert.Contains(report.Warnings, w => w.Contains("does not reproduce CH3", StringComparison.Ordinal) && w.Contains("channel mapping", StringComparison.Ordinal));
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
    public void Fit_TwentyPercentCapacitorFifteenPercentLow_ReportsItFarFromNominalBesideAWithinToleranceVerdict()
    {
        // QH-L5's z integrator has a 20 % capacitor: 15 % low is inside its tolerance, yet it speeds that integrator up by 18 %.
        var design = SyntheticBoardCapture.LoadDesign("qh-l5-tern.json");
        var capacitor = design.Integrators.Single(i => i.Variable == "z").CapacitorId;
        var asBuilt = design.WithPartValues(new Dictionary<string, double> { [capacitor] = 0.85 * design.NominalOf(capacitor) });
        var capture = SyntheticBoardCapture.Simulate(asBuilt, seed: 16);

        var report = BoardFitter.Fit(design, capture, new BoardFitOptions { CompareInvariants = false }, Clock).Value;

        Assert.Equal(DiagnosisOutcome.WithinTolerance, report.Diagnosis.Outcome);
        var finding = Assert.Single(report.Diagnosis.Findings);
        Assert.Equal(capacitor, finding.PartId);
        Assert.Equal(PartVerdict.WithinTolerance, finding.Verdict);
        Assert.InRange(finding.EffectiveValue / (0.85 * design.NominalOf(capacitor)), 0.99, 1.01);
        Assert.Contains($"but {capacitor} (-1", report.Diagnosis.Summary, StringComparison.Ordinal);
        Assert.Contains("closer-tolerance part", finding.Sentence, StringComparison.Ordinal);
    }

    [Fact]
    public void Fit_TwentyPercentCapacitorAtNominal_ReportsNoFinding()
    {
        var design = SyntheticBoardCapture.LoadDesign("qh-l5-tern.json");
        var capture = SyntheticBoardCapture.Simulate(design, seed: 16);

        var report = BoardFitter.Fit(design, capture, new BoardFitOptions { CompareInvariants = false }, Clock).Value;

        Assert.Equal(DiagnosisOutcome.WithinTolerance, report.Diagnosis.Outcome);
        Assert.Empty(report.Diagnosis.Findings);
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
    public void Fit_HealthyBoard_StructureCheckFindsTheDesignsTerms()
    {
        var design = SyntheticBoardCapture.LoadDesign("qh-l3-wren.json");
        var capture = SyntheticBoardCapture.Simulate(design, seed: 17, channelOffsetsVolts: [0.02, 0.04, -0.03]);

        var report = BoardFitter.Fit(design, capture, new BoardFitOptions(), Clock).Value;

        Assert.True(report.StructureCheck.Passed, report.StructureCheck.Message);
        Assert.True(report.MappingCheck.Performed);
        Assert.False(report.MappingCheck.BetterMappingFound, report.MappingCheck.Message);
    }

    [Fact]
    public void Fit_ProbesOfXAndZSwappedInTheMapping_MappingCheckNamesTheRightReading()
    {
        var design = SyntheticBoardCapture.LoadDesign("qh-l3-wren.json");
        var capture = SyntheticBoardCapture.Simulate(design, seed: 19, problemUnits: 10);
        var swapped = ChannelAssignment.ParseList("CH3=x,CH2=y,CH1=z").Value;

        var report = BoardFitter.Fit(design, capture, new BoardFitOptions { Mapping = swapped }, Clock).Value;

        Assert.True(report.MappingCheck.BetterMappingFound, report.MappingCheck.Message);
        Assert.Contains(report.MappingCheck.Best, new[] { "x=CH1, y=CH2, z=CH3", "x=-CH1, y=-CH2, z=CH3" });
        Assert.Equal("x=CH3, y=CH2, z=CH1", report.MappingCheck.Used);
        Assert.Contains(report.Warnings, w => w.Contains("far better", StringComparison.Ordinal));
    }

    [Fact]
    public void Fit_InputWireMovedToTheWrongIntegrator_StructureCheckNamesBothEnds()
    {
        // R4 (the y integrator's input from y) wired into the z integrator instead: y' loses its -y term, z' gains one.
        var path = Path.Combine(ReferenceDataFiles.RepositoryRoot, "designs", "qh-l3-wren.json");
        var text = File.ReadAllText(path);
        var moved = text
            .Replace("""{ "from": "y", "resistor": "R4" },""", "", StringComparison.Ordinal)
            .Replace("""{ "from": "z", "resistor": "R7" } ] },""", """{ "from": "z", "resistor": "R7" }, { "from": "y", "resistor": "R4" } ] },""", StringComparison.Ordinal);
        Assert.NotEqual(text, moved);
        var asBuilt = DesignFileReader.Read(moved, "miswired.json").Value;
        var design = SyntheticBoardCapture.LoadDesign("qh-l3-wren.json");
        var capture = SyntheticBoardCapture.Simulate(asBuilt, seed: 18);

        var report = BoardFitter.Fit(design, capture, new BoardFitOptions(), Clock).Value;

        var findings = report.StructureCheck.Findings;
        Assert.Contains(findings, f => (f.Equation, f.Term, f.Kind) == ("y", "y", StructureFindingKind.MissingTerm));
        Assert.Contains(findings, f => (f.Equation, f.Term, f.Kind) == ("z", "y", StructureFindingKind.UnexpectedTerm));
        Assert.False(report.FindingsAreSafe);
        Assert.Contains(report.Warnings, w => w.Contains("structure check", StringComparison.Ordinal));
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

    [Fact]
    public void Fit_WholeFitWithComparison_ProgressNeverDecreasesAndNamesEachComparisonPart()
    {
        var design = SyntheticBoardCapture.LoadDesign("qh-l3-wren.json");
        var capture = SyntheticBoardCapture.Simulate(design, seed: 21, problemUnits: 10);
        var seen = new List<BoardFitProgress>();

        var report = BoardFitter.Fit(design, capture, new BoardFitOptions { Progress = new Recorder(seen, _ => { }) }, Clock).Value;

        Assert.NotNull(report.Comparison);
        for (var i = 1; i < seen.Count; i++)
        {
            Assert.True(seen[i].Fraction >= seen[i - 1].Fraction, $"'{seen[i].Stage}' fell from {seen[i - 1].Fraction} to {seen[i].Fraction}");
        }

        Assert.Equal(("done", 1.0), (seen[^1].Stage, seen[^1].Fraction));
        var parts = seen.Where(p => p.Stage.StartsWith("comparing the capture with the designs: ", StringComparison.Ordinal)).ToList();
        Assert.Equal(12, parts.Count);
        Assert.All(parts, p => Assert.InRange(p.Fraction, 0.9, 0.99));
        Assert.Contains(parts, p => p.Stage.Contains("correlation dimension of the capture done", StringComparison.Ordinal));
        Assert.EndsWith("done (12 of 12 parts)", parts[^1].Stage, StringComparison.Ordinal);
    }

    [Fact]
    public void Fit_CancelledWhenTheComparisonBegins_StopsWithOperationCanceledAndReportsNothingMore()
    {
        var design = SyntheticBoardCapture.LoadDesign("qh-l3-wren.json");
        var capture = SyntheticBoardCapture.Simulate(design, seed: 22, problemUnits: 10);
        using var source = new CancellationTokenSource();
        var seen = new List<BoardFitProgress>();
        var progress = new Recorder(seen, p =>
        {
            if (p.Stage.StartsWith("comparing", StringComparison.Ordinal))
            {
                source.Cancel();
            }
        });

        Assert.ThrowsAny<OperationCanceledException>(() => BoardFitter.Fit(design, capture, new BoardFitOptions { Progress = progress, Cancellation = source.Token }, Clock));
        Assert.Equal("comparing the capture with the designs", seen[^1].Stage);
    }

    /// <summary>Keeps every report and hands it to a callback on the reporting thread.</summary>
    private sealed class Recorder(List<BoardFitProgress> seen, Action<BoardFitProgress> then) : IProgress<BoardFitProgress>
    {
        public void Report(BoardFitProgress value)
        {
            seen.Add(value);
            then(value);
        }
    }
}
