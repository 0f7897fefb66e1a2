using Patchproof.Core.Captures.Calibration;

namespace Patchproof.Core.Tests.Captures.Calibration;

public sealed class ProbeCalibrationFileTests
{
    private static readonly ProbeCalibration Sample = new(
        "CH1",
        [
            new ChannelCalibration("CH1", 1, 0, 0, 0, 1, 0, 0.011, 0.0392),
            new ChannelCalibration("CH2", 1.0183, 4.1e-5, -0.0251, 2.2e-4, 0.99997, 0.0161, 0.0158, 0.0392),
        ],
        20_000,
        0.2,
        ["cal-ch1.csv", "cal-ch2.csv"],
        new DateTimeOffset(2026, 12, 1, 12, 0, 0, TimeSpan.Zero),
        "x integrator output, QH-L3");

    [Fact]
    public void Write_ThenRead_GivesTheSameCalibration()
    {
        var text = ProbeCalibrationFile.Write(Sample);

        var read = ProbeCalibrationFile.Read(text, "bench.json");

        Assert.True(read.Success, string.Join("; ", read.Errors));
        Assert.Empty(read.Warnings);
        var value = read.Value;
        Assert.Equal(Sample with { Channels = [], SourceFiles = [] }, value with { Channels = [], SourceFiles = [] });
        Assert.Equal(Sample.Channels, value.Channels);
        Assert.Equal(Sample.SourceFiles, value.SourceFiles);
    }

    [Fact]
    public void Write_StartsWithFormatAndVersion()
    {
        using var document = System.Text.Json.JsonDocument.Parse(ProbeCalibrationFile.Write(Sample));

        var first = document.RootElement.EnumerateObject().Take(2).Select(p => p.Name).ToList();

        Assert.Equal(["format", "version"], first);
        Assert.Equal("patchproof-probe-calibration", document.RootElement.GetProperty("format").GetString());
    }

    [Fact]
    public void Read_MissingGain_NamesFileLineAndColumn()
    {
        var text = "{\n  \"format\": \"patchproof-probe-calibration\",\n  \"version\": 1,\n  \"referenceChannel\": \"CH1\",\n  \"channels\": [\n    { \"channel\": \"CH1\", \"gain\": 1, \"gainSd\": 0 },\n    { \"channel\": \"CH2\", \"gainSd\": 0.001 }\n  ]\n}\n";

        var read = ProbeCalibrationFile.Read(text, "bench.json");

        var error = Assert.Single(read.Errors);
        Assert.Equal("bench.json:7:5: the field \"gain\" is missing", error.ToString());
    }

    [Fact]
    public void Read_NegativeGain_PointsAtTheValue()
    {
        var text = "{\"format\": \"patchproof-probe-calibration\", \"version\": 1, \"referenceChannel\": \"CH1\",\n\"channels\": [{\"channel\": \"CH1\", \"gain\": 1, \"gainSd\": 0}, {\"channel\": \"CH2\", \"gain\": -1.01, \"gainSd\": 0}]}";

        var read = ProbeCalibrationFile.Read(text, "bench.json");

        var error = Assert.Single(read.Errors);
        Assert.Equal(2, error.Line);
        Assert.Equal(text.Split('\n')[1].IndexOf("-1.01", StringComparison.Ordinal) + 1, error.Column);
        Assert.Contains("positive gain", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Read_BrokenJson_GivesTheSyntaxErrorPosition()
    {
        var read = ProbeCalibrationFile.Read("{\n  \"format\": \"patchproof-probe-calibration\",\n  \"version\": 1 \"x\"\n}", "bench.json");

        var error = Assert.Single(read.Errors);
        Assert.Equal(3, error.Line);
        Assert.StartsWith("not valid JSON", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Read_AnotherFormat_SaysItIsNotACalibration()
    {
        var read = ProbeCalibrationFile.Read("{\"format\": \"patchproof-design\", \"version\": 1}", "board.json");

        Assert.Contains("not a probe calibration file", Assert.Single(read.Errors).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Read_LaterVersion_IsRefused()
    {
        var read = ProbeCalibrationFile.Read("{\"format\": \"patchproof-probe-calibration\", \"version\": 2}", "bench.json");

        Assert.Contains("version 2 is not supported", Assert.Single(read.Errors).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Read_ReferenceNotAmongTheChannels_IsAnError()
    {
        var read = ProbeCalibrationFile.Read("{\"format\": \"patchproof-probe-calibration\", \"version\": 1, \"referenceChannel\": \"CH4\", \"channels\": [{\"channel\": \"CH1\", \"gain\": 1, \"gainSd\": 0}]}", "bench.json");

        Assert.Contains("'CH4' is not among the channels", Assert.Single(read.Errors).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Read_MisspeltField_IsAWarningWithItsPosition()
    {
        var text = "{\"format\": \"patchproof-probe-calibration\", \"version\": 1, \"referenceChannel\": \"CH1\",\n\"channels\": [{\"channel\": \"CH1\", \"gain\": 1, \"gainSd\": 0, \"gainsd\": 0.1}]}";

        var read = ProbeCalibrationFile.Read(text, "bench.json");

        Assert.True(read.Success);
        var warning = Assert.Single(read.Warnings);
        Assert.Equal(2, warning.Line);
        Assert.Contains("\"gainsd\"", warning.Message, StringComparison.Ordinal);
    }
}
