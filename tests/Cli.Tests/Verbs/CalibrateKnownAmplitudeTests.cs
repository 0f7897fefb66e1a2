using System.Text.Json;
using Patchproof.TestSupport;

namespace Patchproof.Cli.Tests.Verbs;

/// <summary><c>calibrate --known-amplitude</c> on a square wave made by <c>design simulate --square-wave</c>: invented data with
/// probe gains known by construction (CH1 +2 %, CH2 -1 %, CH3 +0.5 %).</summary>
public sealed class CalibrateKnownAmplitudeTests
{
    private static readonly Lazy<string> SquareWave = new(() =>
    {
        var path = Temp("csv");
        var (exitCode, _, error) = CliRun.Invoke("design", "simulate", Repository("designs", "qh-r1-gannet.json"), "--seed", "5", "--t-end", "20ms",
            "--window", "CH1=16V@0.5V,CH2=16V@0.5V,CH3=16V@0.5V", "--probe-gains", "CH1=+2%,CH2=-1%,CH3=+0.5%", "--noise", "20mV",
            "--square-wave", "10V@-4V", "--out", path);
        Assert.True(exitCode == 0, error);
        return path;
    });

    [Fact]
    public void Calibrate_SquareWaveOfKnownAmplitude_WritesAbsoluteGains()
    {
        var output = Temp("json");

        var (exitCode, text, error) = CliRun.Invoke("calibrate", SquareWave.Value, "--known-amplitude", "10V", "--amplitude-accuracy", "0.1%", "--json", output);

        Assert.True(exitCode == 0, text + error);
        Assert.Contains("Absolute gains against the 10 V step", text, StringComparison.Ordinal);
        using var document = JsonDocument.Parse(File.ReadAllText(output));
        var root = document.RootElement;
        Assert.Equal("absolute", root.GetProperty("gainScale").GetString());
        var known = root.GetProperty("knownAmplitude");
        Assert.Equal(10, known.GetProperty("volts").GetDouble());
        Assert.Equal(0.001, known.GetProperty("relativeSd").GetDouble(), 12);
        var gain = known.GetProperty("referenceGain").GetDouble();
        var sd = known.GetProperty("referenceGainSd").GetDouble();
        Assert.InRange(gain, 1.02 - (3 * sd), 1.02 + (3 * sd));
        Assert.True(sd >= 0.001 * gain);
    }

    [Fact]
    public void Fit_WithAbsoluteCalibration_SaysTheGainsAreAbsolute()
    {
        var calibration = Temp("json");
        Assert.Equal(0, CliRun.Invoke("calibrate", SquareWave.Value, "--known-amplitude", "10V", "--amplitude-accuracy", "0.001", "--json", calibration).ExitCode);

        var (exitCode, output, error) = CliRun.Invoke("fit", "--design", Repository("designs", "qh-r1-gannet.json"), Repository("sample-captures", "qh-r1-gannet.csv"), "--calibration", calibration);

        Assert.True(exitCode is 0 or 3, error);
        Assert.Matches(@"CH1 = x: .* gain 1\.0[12]\d\d from absolute calibration against a 10 V step on CH1", output);
        Assert.DoesNotContain("reference probe's own gain", output, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("--known-amplitude", "-10V", "--amplitude-accuracy", "0.1%", "--known-amplitude -10V")]
    [InlineData("--known-amplitude", "0V", "--amplitude-accuracy", "0.1%", "--known-amplitude 0V")]
    [InlineData("--known-amplitude", "ten", "--amplitude-accuracy", "0.1%", "--known-amplitude ten")]
    [InlineData("--known-amplitude", "10V", "--amplitude-accuracy", "1.5", "--amplitude-accuracy 1.5")]
    [InlineData("--known-amplitude", "10V", "--amplitude-accuracy", "-0.1%", "--amplitude-accuracy -0.1%")]
    [InlineData("--known-amplitude", "10V", "--amplitude-accuracy", "fine", "--amplitude-accuracy fine")]
    public void Calibrate_BadKnownAmplitude_ExitsTwoNamingTheOptionAndWritesNothing(string amplitudeOption, string amplitude, string accuracyOption, string accuracy, string named)
    {
        var output = Temp("json");

        var (exitCode, _, error) = CliRun.Invoke("calibrate", SquareWave.Value, amplitudeOption, amplitude, accuracyOption, accuracy, "--json", output);

        Assert.Equal(2, exitCode);
        Assert.StartsWith(named + ":", error, StringComparison.Ordinal);
        Assert.False(File.Exists(output));
    }

    [Fact]
    public void Calibrate_AmplitudeWithoutAccuracy_ExitsTwo()
    {
        var (exitCode, _, error) = CliRun.Invoke("calibrate", SquareWave.Value, "--known-amplitude", "10V");

        Assert.Equal(2, exitCode);
        Assert.Contains("--amplitude-accuracy", error, StringComparison.Ordinal);
    }

    [Fact]
    public void Calibrate_KnownAmplitudeOnANodeThatIsNotASquareWave_ExitsThree()
    {
        var (exitCode, text, _) = CliRun.Invoke("calibrate", Repository("sample-captures", "qh-r1-gannet-probe-calibration.csv"), "--known-amplitude", "10V", "--amplitude-accuracy", "0.1%");

        Assert.Equal(3, exitCode);
        Assert.Contains("not a usable square wave", text, StringComparison.Ordinal);
    }

    [Fact]
    public void Help_NamesTheKnownAmplitudeOptions()
    {
        var (_, text, _) = CliRun.Invoke("calibrate", "--help");

        Assert.Contains("--known-amplitude", text, StringComparison.Ordinal);
        Assert.Contains("--amplitude-accuracy", text, StringComparison.Ordinal);
    }

    private static string Repository(params string[] parts) => Path.Combine([ReferenceDataFiles.RepositoryRoot, .. parts]);

    private static string Temp(string extension) => Path.Combine(Path.GetTempPath(), $"abs-{Guid.NewGuid():N}.{extension}");
}
