using System.Text.Json;
using Patchproof.Client.Models;
using Patchproof.Client.Services;

namespace Patchproof.Client.Tests.Services;

public sealed class ReportDocumentReaderTests
{
    // Invented demo values (the QH-L4 story of the demo scenario), shaped as docs/web-app.md describes the result document.
    private const string Document = """
        {
          "summary": "R5 behaves about 10 % high.",
          "findings": [
            { "part": "R5", "role": "input resistor from x into the y integrator", "nominal": 35700, "effective": 39300,
              "intervalHalfWidth": 420, "unit": "Ohm", "driftPercent": 10.1, "verdict": "drifted", "probability": 0.97,
              "advice": "Replace R5.", "runnerUp": "C2 5 % low (0.02)" }
          ],
          "coefficients": [ { "equation": "dy/dt", "term": "x", "nominal": 2800, "estimate": 2543, "standardError": 12 } ],
          "timeScale": { "nominalSeconds": 0.001, "estimateSeconds": 0.001002, "standardErrorSeconds": 0.000001 },
          "structureCheck": { "passed": true, "message": "No missing term." },
          "plots": { "phasePlanes": [ { "title": "x against z", "xLabel": "x (V)", "yLabel": "z (V)",
                     "traces": [ { "role": "capture", "x": [0, 1], "y": [2, 3] }, { "role": "fitted", "x": [0, 1], "y": [2, 3.1] } ] } ] }
        }
        """;

    [Fact]
    public void Read_ChannelGains_KeepsEachGainWithItsSourceAndAnOlderDocumentHasNone()
    {
        using var json = JsonDocument.Parse("""
            { "summary": "ok", "channels": [ { "channel": "CH2", "variable": "y", "sign": -1, "gain": 1.0183, "gainSdPercent": "NaN",
              "gainSource": "calibration against CH1 (2026-11-30), ± 0.20 %", "isCalibrated": true, "offsetVolts": 0.01, "residualRmsVolts": 0.02 } ] }
            """);
        using var older = JsonDocument.Parse(Document);

        var channel = Assert.Single(ReportDocumentReader.Read(json.RootElement).Value.Channels);

        Assert.Equal(("CH2", "y", -1, 1.0183, true), (channel.Channel, channel.Variable, channel.Sign, channel.Gain, channel.IsCalibrated));
        Assert.True(double.IsNaN(channel.GainSdPercent));
        Assert.StartsWith("calibration against CH1", channel.GainSource, StringComparison.Ordinal);
        Assert.Empty(ReportDocumentReader.Read(older.RootElement).Value.Channels);
    }

    [Fact]
    public void Read_FittedMapping_KeepsItAndAnOlderDocumentHasNone()
    {
        using var json = JsonDocument.Parse("""
            { "summary": "ok", "fitted": { "captureFileName": "tern.csv", "mapping": [ "CH1 = x", "CH2 = z" ], "converged": true } }
            """);
        using var older = JsonDocument.Parse(Document);

        Assert.Equal(["CH1 = x", "CH2 = z"], ReportDocumentReader.Read(json.RootElement).Value.Mapping);
        Assert.Empty(ReportDocumentReader.Read(older.RootElement).Value.Mapping);
    }

    [Fact]
    public void Read_FullDocument_ReadsEverySection()
    {
        using var json = JsonDocument.Parse(Document);

        var sections = ReportDocumentReader.Read(json.RootElement).Value;

        var finding = Assert.Single(sections.Findings);
        Assert.Equal("R5", finding.Part);
        Assert.Equal(FindingVerdict.Drifted, finding.Verdict);
        Assert.Equal(420, finding.IntervalHalfWidth);
        Assert.Equal(-9.18, Assert.Single(sections.Coefficients).DeviationPercent, 2);
        Assert.Equal(0.2, sections.TimeScale!.DeviationPercent, 6);
        Assert.True(sections.StructureCheck!.Passed);
        var plane = Assert.Single(sections.Plots.PhasePlanes);
        Assert.Equal([TraceRole.Capture, TraceRole.Fitted], plane.Traces.Select(t => t.Role));
        Assert.Empty(sections.Offsets);
        Assert.Null(sections.Plots.ReturnMap);
    }

    [Fact]
    public void Read_WarningsNotesAndNonFiniteErrors_AreKept()
    {
        using var json = JsonDocument.Parse("""
            { "coefficients": [ { "equation": "dz/dt", "term": "z", "nominal": -2670, "estimate": -2650, "standardError": "NaN" } ],
              "warnings": ["The fit stopped before converging."], "notes": ["The fit used a.csv."] }
            """);

        var sections = ReportDocumentReader.Read(json.RootElement).Value;

        Assert.True(double.IsNaN(Assert.Single(sections.Coefficients).StandardError));
        Assert.Equal(["The fit stopped before converging."], sections.Warnings);
        Assert.Equal(["The fit used a.csv."], sections.Notes);
    }

    [Fact]
    public void Read_EmptyObject_GivesEmptySections()
    {
        using var json = JsonDocument.Parse("{}");

        var sections = ReportDocumentReader.Read(json.RootElement).Value;

        Assert.Empty(sections.Findings);
        Assert.True(sections.Plots.IsEmpty);
    }

    [Fact]
    public void Read_NotAnObject_IsAProblem()
    {
        using var json = JsonDocument.Parse("[1, 2]");

        var result = ReportDocumentReader.Read(json.RootElement);

        Assert.False(result.Succeeded);
        Assert.Contains("not a JSON object", result.Problem!.Title, StringComparison.Ordinal);
    }

    [Fact]
    public void Read_WrongTypeInAField_IsAProblemNamingThePath()
    {
        using var json = JsonDocument.Parse("""{ "findings": [ { "part": "R5", "nominal": "lots" } ] }""");

        var result = ReportDocumentReader.Read(json.RootElement);

        Assert.False(result.Succeeded);
        Assert.Contains("findings", result.Problem!.Detail, StringComparison.Ordinal);
    }
}
