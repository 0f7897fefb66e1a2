using Patchproof.Core.Captures.Calibration;

namespace Patchproof.Core.Tests.Captures.Calibration;

public sealed class ProbeCalibrationFileAbsoluteTests
{
    private static readonly ProbeCalibration Relative = new(
        "CH1",
        [
            new ChannelCalibration("CH1", 1, 0, 0, 0, 1, 0, 0.011, 0.0627),
            new ChannelCalibration("CH2", 0.9706, 1.1e-3, 0.0051, 2.2e-4, 0.99997, 0.0161, 0.0158, 0.0627),
        ],
        25_000,
        0.02,
        ["square.csv"],
        new DateTimeOffset(2026, 12, 1, 12, 0, 0, TimeSpan.Zero),
        "10 V reference square wave");

    private static readonly ProbeCalibration Absolute = Relative with
    {
        Absolute = new KnownAmplitudeReference(10, 0.001, 6.118, -4.082, 0.0031, 24_000, 1.02, 1.02 * Math.Sqrt((0.00031 * 0.00031) + 1e-6)),
    };

    [Fact]
    public void Write_ThenRead_AbsoluteCalibration_KeepsTheKnownAmplitudeAndTheReferenceGain()
    {
        var text = ProbeCalibrationFile.Write(Absolute);

        var read = ProbeCalibrationFile.Read(text, "square-cal.json");

        Assert.True(read.Success, string.Join("; ", read.Errors));
        Assert.Empty(read.Warnings);
        Assert.Equal(Absolute.Absolute, read.Value.Absolute);
        Assert.True(read.Value.IsAbsolute);
        Assert.Equal(1.02 * 0.9706, read.Value.AbsoluteGainOf(read.Value.Channels[1]), 12);
        using var document = System.Text.Json.JsonDocument.Parse(text);
        Assert.Equal(1, document.RootElement.GetProperty("version").GetInt32());
        Assert.Equal("absolute", document.RootElement.GetProperty("gainScale").GetString());
    }

    [Fact]
    public void Write_RelativeCalibration_IsWrittenWithoutTheNewFields()
    {
        using var document = System.Text.Json.JsonDocument.Parse(ProbeCalibrationFile.Write(Relative));

        Assert.Equal(1, document.RootElement.GetProperty("version").GetInt32());
        Assert.False(document.RootElement.TryGetProperty("gainScale", out _));
        Assert.False(document.RootElement.TryGetProperty("knownAmplitude", out _));
    }

    [Fact]
    public void Read_GainScaleRelative_ReadsAsRelative()
    {
        var text = ProbeCalibrationFile.Write(Relative).Replace("\"version\": 1,", "\"version\": 1,\n  \"gainScale\": \"relative\",", StringComparison.Ordinal);

        var read = ProbeCalibrationFile.Read(text, "cal.json");

        Assert.True(read.Success, string.Join("; ", read.Errors));
        Assert.False(read.Value.IsAbsolute);
    }

    [Fact]
    public void Read_AbsoluteWithoutKnownAmplitude_NamesTheLine()
    {
        var text = "{\n  \"format\": \"patchproof-probe-calibration\",\n  \"version\": 1,\n  \"gainScale\": \"absolute\",\n  \"referenceChannel\": \"CH1\",\n  \"channels\": [ { \"channel\": \"CH1\", \"gain\": 1, \"gainSd\": 0 } ]\n}\n";

        var read = ProbeCalibrationFile.Read(text, "cal.json");

        Assert.False(read.Success);
        Assert.Contains(read.Errors, e => e.ToString().StartsWith("cal.json:1:1: absolute gains need \"knownAmplitude\"", StringComparison.Ordinal));
    }

    [Fact]
    public void Read_ReferenceGainSdBelowTheAmplitudeAccuracy_IsAnError()
    {
        var text = ProbeCalibrationFile.Write(Absolute with { Absolute = Absolute.Absolute! with { ReferenceGainSd = 1e-4 } });

        var read = ProbeCalibrationFile.Read(text, "cal.json");

        Assert.False(read.Success);
        Assert.Contains(read.Errors, e => e.ToString().Contains("smaller than the amplitude's own accuracy", StringComparison.Ordinal));
    }

    [Theory]
    [InlineData("\"relativeSd\": 0.001", "\"relativeSd\": 1.5", "a fraction below 1")]
    [InlineData("\"volts\": 10", "\"volts\": -10", "a positive number of volts")]
    [InlineData("\"gainScale\": \"absolute\"", "\"gainScale\": \"absolut\"", "expected \"relative\" or \"absolute\"")]
    public void Read_BadKnownAmplitudeField_IsAnErrorWithFileLineAndColumn(string good, string bad, string message)
    {
        var text = ProbeCalibrationFile.Write(Absolute);
        Assert.Contains(good, text, StringComparison.Ordinal);

        var read = ProbeCalibrationFile.Read(text.Replace(good, bad, StringComparison.Ordinal), "cal.json");

        Assert.False(read.Success);
        var error = Assert.Single(read.Errors, e => e.ToString().Contains(message, StringComparison.Ordinal));
        Assert.Matches(@"^cal\.json:\d+:\d+: ", error.ToString());
    }

    [Fact]
    public void Read_KnownAmplitudeWithRelativeGains_IsAnError()
    {
        var text = ProbeCalibrationFile.Write(Absolute).Replace("\"gainScale\": \"absolute\",", "", StringComparison.Ordinal);

        var read = ProbeCalibrationFile.Read(text, "cal.json");

        Assert.False(read.Success);
        Assert.Contains(read.Errors, e => e.ToString().Contains("\"knownAmplitude\" belongs to absolute gains", StringComparison.Ordinal));
    }
}
