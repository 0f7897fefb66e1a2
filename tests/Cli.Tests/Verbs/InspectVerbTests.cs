using System.Text.Json;

namespace Patchproof.Cli.Tests.Verbs;

public sealed class InspectVerbTests
{
    [Fact]
    public void Inspect_ReadableFile_ExitsZeroAndShowsChannelsAndChecks()
    {
        var path = Write("# board: QH-D2 Dunlin\nt,x,v\n" + Rows(400));

        var (exitCode, output, error) = CliRun.Invoke("inspect", path);

        Assert.Equal(0, exitCode);
        Assert.Equal(string.Empty, error);
        Assert.Contains("400 samples", output, StringComparison.Ordinal);
        Assert.Contains("x [V]", output, StringComparison.Ordinal);
        Assert.Contains("time-base", output, StringComparison.Ordinal);
        Assert.Contains("board: QH-D2 Dunlin", output, StringComparison.Ordinal);
    }

    [Fact]
    public void Inspect_UnreadableFile_ExitsTwoWithFileLineColumnOnStandardError()
    {
        var path = Write("t,a\n0,1\n1,2\n2,3\n3,abc\n");

        var (exitCode, _, error) = CliRun.Invoke("inspect", path);

        Assert.Equal(2, exitCode);
        Assert.StartsWith($"{path}:5:3: ", error, StringComparison.Ordinal);
    }

    [Fact]
    public void Inspect_Json_PrintsTheVersionedForm()
    {
        var path = Write("t,x,v\n" + Rows(300));

        var (exitCode, output, _) = CliRun.Invoke("inspect", path, "--json", "--probe", "v=x10", "--unit", "x=mV");

        Assert.Equal(0, exitCode);
        using var document = JsonDocument.Parse(output);
        var root = document.RootElement;
        Assert.Equal("patchproof.inspect", root.GetProperty("format").GetString());
        Assert.Equal(1, root.GetProperty("version").GetInt32());
        Assert.Equal("uniform", root.GetProperty("timeBase").GetProperty("kind").GetString());
        var channels = root.GetProperty("channels");
        Assert.Equal(2, channels.GetArrayLength());
        Assert.Equal(300, channels[0].GetProperty("sampleCount").GetInt32());
        Assert.Equal(10, channels[1].GetProperty("probeFactor").GetDouble());
        var check = root.GetProperty("checks")[0];
        Assert.Equal("time-base", check.GetProperty("id").GetString());
        Assert.Equal("info", check.GetProperty("severity").GetString());
        Assert.True(check.GetProperty("values").GetProperty("intervalSeconds").GetDouble() > 0);
    }

    [Fact]
    public void Inspect_BadProbeOption_ExitsTwo()
    {
        var path = Write("t,x\n" + "0,1\n1,2\n2,3\n");

        var (exitCode, _, error) = CliRun.Invoke("inspect", path, "--probe", "x=ten");

        Assert.Equal(2, exitCode);
        Assert.Contains("--probe", error, StringComparison.Ordinal);
    }

    [Fact]
    public void Inspect_MissingFile_ExitsTwo()
    {
        var (exitCode, _, error) = CliRun.Invoke("inspect", Path.Combine(Path.GetTempPath(), "patchproof-missing.csv"));

        Assert.Equal(2, exitCode);
        Assert.Contains("patchproof-missing.csv:0:0:", error, StringComparison.Ordinal);
    }

    private static string Rows(int count) =>
        string.Concat(Enumerable.Range(0, count).Select(i => FormattableString.Invariant($"{i * 0.001},{Math.Sin(i * 0.05):F4},{Math.Cos(i * 0.05):F4}\n")));

    private static string Write(string text)
    {
        var folder = Path.Combine(Path.GetTempPath(), "patchproof-cli-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(folder);
        var path = Path.Combine(folder, "capture.csv");
        File.WriteAllText(path, text);
        return path;
    }
}
