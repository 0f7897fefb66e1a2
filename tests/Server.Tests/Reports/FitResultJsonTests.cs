using Microsoft.Extensions.Time.Testing;
using Patchproof.Client.Models;
using Patchproof.Client.Services;
using Patchproof.Contracts.Reports;
using Patchproof.Core.Reports;
using Patchproof.Server.Reports;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Reports;

/// <summary>The server writes the result document and the client's reader reads it: both sides of the wire agree.</summary>
public sealed class FitResultJsonTests
{
    [Fact]
    public void ToElement_OfARealFit_IsReadByTheClientsReaderSectionForSection()
    {
        var design = SyntheticBoardCaptures.Design("qh-d2-dunlin.json");
        var csv = SyntheticBoardCaptures.Csv("qh-d2-dunlin.json", new Dictionary<string, double> { ["R2"] = 1.10 }, seed: 41);
        var capture = Patchproof.Core.Captures.CaptureReader.Read(new MemoryStream(csv), "dunlin.csv").Value;
        var report = BoardFitter.Fit(design, capture, new BoardFitOptions(), new FakeTimeProvider()).Value;
        var document = FitResultMapper.Map(report, Guid.NewGuid(), "dunlin.csv", ["a server note"]);

        var sections = ReportDocumentReader.Read(FitResultJson.ToElement(document));

        Assert.True(sections.Succeeded, sections.Problem?.Detail);
        var read = sections.Value;
        Assert.Equal(document.Summary, read.Summary);
        Assert.Equal(document.Findings.Select(f => (f.Part, f.Role, f.Nominal, f.Effective, f.IntervalHalfWidth, f.Unit, f.DriftPercent, f.Probability, f.Advice, f.RunnerUp)),
            read.Findings.Select(f => (f.Part, f.Role, f.Nominal, f.Effective, f.IntervalHalfWidth, f.Unit, f.DriftPercent, f.Probability, f.Advice, f.RunnerUp)));
        Assert.Equal(document.Findings.Select(f => f.Verdict.ToString()), read.Findings.Select(f => f.Verdict.ToString()));
        Assert.Equal("R2", read.Findings[0].Part);
        Assert.Equal(document.Coefficients.Select(c => (c.Equation, c.Term, c.Nominal, c.Estimate, c.StandardError)),
            read.Coefficients.Select(c => (c.Equation, c.Term, c.Nominal, c.Estimate, c.StandardError)));
        Assert.Equal(document.Offsets.Select(o => (o.Variable, o.EquivalentInputMillivolts, o.StandardErrorMillivolts)),
            read.Offsets.Select(o => (o.Variable, o.EquivalentInputMillivolts, o.StandardErrorMillivolts)));
        Assert.Equal(document.TimeScale!.EstimateSeconds, read.TimeScale!.EstimateSeconds);
        Assert.Equal(document.Warnings, read.Warnings);
        Assert.Contains("a server note", read.Notes);
        Assert.Equal(document.Plots.PhasePlanes.Select(p => (p.Title, p.Traces.Count)), read.Plots.PhasePlanes.Select(p => (p.Title, p.Traces.Count)));
        Assert.Equal(document.Plots.TimeSeries.Count, read.Plots.TimeSeries.Count);
        Assert.Equal(document.Plots.Spectra.Count, read.Plots.Spectra.Count);
        Assert.Equal(document.Invariants.Select(i => i.Name), read.Invariants.Select(i => i.Name));
        Assert.Equal(report.StructureCheck.Passed, read.StructureCheck?.Passed);
        Assert.Contains(report.MappingCheck.Message, read.Notes);
        Assert.Equal(report.Channels.Select(c => (c.Channel, c.Variable, c.Sign, Math.Abs(c.Gain), c.GainSource, c.IsCalibrated)),
            read.Channels.Select(c => (c.Channel, c.Variable, c.Sign, c.Gain, c.GainSource, c.IsCalibrated)));
        Assert.All(read.Channels, c => Assert.StartsWith("probe tolerance", c.GainSource, StringComparison.Ordinal));
    }

    [Fact]
    public void Map_OfARealFitWithItsComparison_HasOverlaysOfEveryRoleWithinThePointLimit()
    {
        var design = SyntheticBoardCaptures.Design("qh-d2-dunlin.json");
        var csv = SyntheticBoardCaptures.Csv("qh-d2-dunlin.json", new Dictionary<string, double>(), seed: 42, problemUnits: 12);
        var capture = Patchproof.Core.Captures.CaptureReader.Read(new MemoryStream(csv), "dunlin.csv").Value;
        var report = BoardFitter.Fit(design, capture, new BoardFitOptions(), new FakeTimeProvider()).Value;

        var document = FitResultMapper.Map(report, Guid.NewGuid(), "dunlin.csv", []);

        Assert.True(report.Comparison is { Computed: true }, report.Comparison?.Reason);
        var plane = Assert.Single(document.Plots.PhasePlanes);
        Assert.Equal([TraceRoleCode.Capture, TraceRoleCode.Nominal, TraceRoleCode.Fitted], plane.Traces.Select(t => t.Role));
        Assert.Equal(2, document.Plots.TimeSeries.Count);
        Assert.All(document.Plots.PhasePlanes.Concat(document.Plots.TimeSeries).SelectMany(p => p.Traces), t =>
        {
            Assert.Equal(t.X.Count, t.Y.Count);
            Assert.InRange(t.X.Count, 2, ComparisonMapper.MaxPointsPerTrace);
        });
        Assert.Equal(report.Comparison!.Invariants.Count, document.Invariants.Count);
    }

    [Fact]
    public void ToElement_WithNonFiniteNumbersAndPlots_ReadsBackOnBothSides()
    {
        var document = new FitResultDocument(
            FitResultDocument.FormatName, FitResultDocument.CurrentVersion, "Cannot decide.", "cannotDecide",
            [new FindingDocument("C3", "capacitor of the z integrator", 10e-9, 8.5e-9, double.PositiveInfinity, "F", -15, FindingVerdictCode.CannotDecide, 0.6, "Record longer.", null, "C3 ...")],
            [new CoefficientDocument("dz/dt", "z", "1/s", -2670, -3100, double.NaN, -2.67, -3.1, true)],
            [new OffsetDocument("z", double.NaN, double.NaN, 0)],
            null,
            [],
            [new InvariantDocument("largest Lyapunov exponent", 905, null, "1/s")],
            new StructureCheckDocument(false, "A term is missing."),
            new PlotsDocument(
                [new OverlayPlotDocument("x against z", "x (V)", "z (V)", [new TraceDocument(TraceRoleCode.Capture, [0, 1], [2, 3]), new TraceDocument(TraceRoleCode.Nominal, [0, 1], [2, 2.9])])],
                [],
                null,
                [new DensityDifferenceDocument("x against z", "x (V)", "z (V)", [0, 1], [0], [[0.1, -0.1]])],
                []),
            ["The fit stopped before converging."],
            [],
            new FitRunDocument(Guid.NewGuid(), "tern.csv", ["CH1 = x", "CH2 = z"], "multiple shooting", 60, false, "MaxIterations", 8.7, "0.1.0"));

        var element = FitResultJson.ToElement(document);
        var read = ReportDocumentReader.Read(element).Value;
        var back = FitResultJson.TryRead(element)!;

        Assert.Equal(FindingVerdict.CannotDecide, read.Findings[0].Verdict);
        Assert.True(double.IsPositiveInfinity(read.Findings[0].IntervalHalfWidth));
        Assert.True(double.IsNaN(read.Coefficients[0].StandardError));
        Assert.Null(read.Invariants[0].FromModel);
        Assert.False(read.StructureCheck!.Passed);
        Assert.Equal([TraceRole.Capture, TraceRole.Nominal], read.Plots.PhasePlanes[0].Traces.Select(t => t.Role));
        Assert.Equal([0.1, -0.1], read.Plots.DensityDifferences[0].Difference[0]);
        Assert.Equal(document.Fitted, back.Fitted with { Mapping = document.Fitted.Mapping });
        Assert.Equal(document.Findings[0].Sentence, back.Findings[0].Sentence);
    }
}
