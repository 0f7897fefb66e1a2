using System.Globalization;
using System.Text;
using System.Text.Json;
using Patchproof.TestSupport;

namespace Patchproof.Cli.Tests.Verbs;

public sealed class CalibrateVerbTests
{
    [Fact]
    public void Calibrate_ThreeProbesOnOneNode_WritesTheCalibrationFileWithTheKnownGainRatios()
    {
        // Known by construction: CH2 reads 1.015 and CH3 0.990 times CH1.
        var capture = WriteCapture([1.0, 1.015, 0.990], sameNode: true);
        var output = Path.Combine(Path.GetTempPath(), $"cal-{Guid.NewGuid():N}.json");

        var (exitCode, text, error) = CliRun.Invoke("calibrate", capture, "--note", "x integrator output", "--json", output);

        Assert.Equal(0, exitCode);
        Assert.Equal(string.Empty, error);
        Assert.Contains("against CH1", text, StringComparison.Ordinal);
        using var document = JsonDocument.Parse(File.ReadAllText(output));
        var root = document.RootElement;
        Assert.Equal("patchproof-probe-calibration", root.GetProperty("format").GetString());
        Assert.Equal(1, root.GetProperty("version").GetInt32());
        Assert.Equal("x integrator output", root.GetProperty("note").GetString());
        var channels = root.GetProperty("channels");
        Assert.Equal(1.015, channels[1].GetProperty("gain").GetDouble(), 1e-3);
        Assert.Equal(0.990, channels[2].GetProperty("gain").GetDouble(), 1e-3);
    }

    [Fact]
    public void Calibrate_ProbesOnDifferentNodes_ExitsThreeAndWritesNothing()
    {
        var capture = WriteCapture([1.0, 1.0, 1.0], sameNode: false);
        var output = Path.Combine(Path.GetTempPath(), $"cal-{Guid.NewGuid():N}.json");

        var (exitCode, text, _) = CliRun.Invoke("calibrate", capture, "--json", output);

        Assert.Equal(3, exitCode);
        Assert.Contains("did not see one signal", text, StringComparison.Ordinal);
        Assert.False(File.Exists(output));
    }

    [Fact]
    public void Calibrate_UnreadableCapture_ExitsTwoWithFileLineColumn()
    {
        var path = Path.Combine(Path.GetTempPath(), $"cal-{Guid.NewGuid():N}.csv");
        File.WriteAllText(path, "t,CH1,CH2\n0,1,1\n1,2,2\n2,3,3\n3,4,abc\n");

        var (exitCode, _, error) = CliRun.Invoke("calibrate", path);

        Assert.Equal(2, exitCode);
        Assert.StartsWith($"{path}:5:5: ", error, StringComparison.Ordinal);
    }

    [Fact]
    public void Fit_CalibrationFileWithAMissingGain_ExitsTwoNamingFileLineAndColumn()
    {
        var calibration = Path.Combine(Path.GetTempPath(), $"cal-{Guid.NewGuid():N}.json");
        File.WriteAllText(calibration, "{\n  \"format\": \"patchproof-probe-calibration\",\n  \"version\": 1,\n  \"referenceChannel\": \"CH1\",\n  \"channels\": [\n    { \"channel\": \"CH1\", \"gain\": 1, \"gainSd\": 0 },\n    { \"channel\": \"CH2\", \"gainSd\": 0 }\n  ]\n}\n");

        var (exitCode, _, error) = CliRun.Invoke("fit", "--design", Repository("designs", "qh-l3-wren.json"), Repository("sample-captures", "qh-l3-wren.csv"), "--calibration", calibration);

        Assert.Equal(2, exitCode);
        Assert.Equal($"{calibration}:7:5: the field \"gain\" is missing", error.Trim());
    }

    [Fact]
    public void Fit_WithCalibration_SaysTheGainsCameFromIt()
    {
        var calibration = Path.Combine(Path.GetTempPath(), $"cal-{Guid.NewGuid():N}.json");
        Assert.Equal(0, CliRun.Invoke("calibrate", WriteCapture([1.0, 1.004, 0.997], sameNode: true), "--json", calibration).ExitCode);

        var (exitCode, output, error) = CliRun.Invoke("fit", "--design", Repository("designs", "qh-l3-wren.json"), Repository("sample-captures", "qh-l3-wren.csv"), "--calibration", calibration);

        Assert.True(exitCode is 0 or 3, error);
        Assert.Matches(@"CH2 = y: .* gain 1\.00[345]\d from calibration against CH1", output);
    }

    private static string Repository(params string[] parts) => Path.Combine([ReferenceDataFiles.RepositoryRoot, .. parts]);

    /// <summary>A slow two-tone node (or, for the other channels, different nodes) through each channel's gain, 8-bit steps over ±5 V.</summary>
    private static string WriteCapture(double[] gains, bool sameNode)
    {
        var random = new Random(31);
        var text = new StringBuilder("t,CH1,CH2,CH3\n");
        var step = 10.0 / 255;
        for (var i = 0; i < 20_000; i++)
        {
            text.Append(CultureInfo.InvariantCulture, $"{i * 1e-5:0.#####}");
            for (var c = 0; c < gains.Length; c++)
            {
                var phase = sameNode ? 0 : 1.3 * c;
                var node = 4 * ((0.7 * Math.Sin((2 * Math.PI * i / 997.0) + phase)) + (0.3 * Math.Sin((2 * Math.PI * i / 313.0) + 1 + (2 * phase))));
                var volts = (gains[c] * node) + (0.01 * GaussianNoise.Next(random));
                text.Append(CultureInfo.InvariantCulture, $",{Math.Round(volts / step) * step:0.000000}");
            }

            text.Append('\n');
        }

        var path = Path.Combine(Path.GetTempPath(), $"cal-{Guid.NewGuid():N}.csv");
        File.WriteAllText(path, text.ToString());
        return path;
    }
}
