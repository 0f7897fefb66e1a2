using Patchproof.TestSupport;

namespace Patchproof.Cli.Tests.Verbs;

public sealed class DesignVerbTests
{
    private static string Design(string name) => Path.Combine(ReferenceDataFiles.RepositoryRoot, "designs", name);

    [Fact]
    public void Check_DemoDesign_ShowsParametersAndSucceeds()
    {
        var (exitCode, output, _) = CliRun.Invoke("design", "check", Design("qh-l3-wren.json"));

        Assert.Equal(0, exitCode);
        Assert.Contains("rho = 28.01", output, StringComparison.Ordinal);
        Assert.Contains("dz/dt: x*y", output, StringComparison.Ordinal);
    }

    [Fact]
    public void Check_AgainstAnotherModel_ExitsWithWarnings()
    {
        var (exitCode, output, _) = CliRun.Invoke("design", "check", Design("qh-l3-wren.json"), "--model", "rossler");

        Assert.Equal(3, exitCode);
        Assert.Contains("error", output, StringComparison.Ordinal);
    }

    [Fact]
    public void Check_BrokenFile_ExitsTwoWithFileLineColumn()
    {
        var path = Path.Combine(Path.GetTempPath(), $"design-{Guid.NewGuid():N}.json");
        File.WriteAllText(path, File.ReadAllText(Design("qh-d2-dunlin.json")).Replace("\"from\": \"-y\"", "\"from\": \"-w\"", StringComparison.Ordinal));
        try
        {
            var (exitCode, _, error) = CliRun.Invoke("design", "check", path);

            Assert.Equal(2, exitCode);
            Assert.Matches(@"design-[0-9a-f]+\.json:\d+:\d+: \$\.blocks\[0\]\.inputs\[0\]\.from", error);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void New_Lorenz_WritesADesignThatChecksClean()
    {
        var path = Path.Combine(Path.GetTempPath(), $"lorenz-{Guid.NewGuid():N}.json");
        try
        {
            var (exitCode, output, _) = CliRun.Invoke("design", "new", "--model", "lorenz", "--series", "E96", "--range", "x=20,y=27,z=48", "--out", path);

            Assert.Equal(0, exitCode);
            Assert.Contains("coefficient error", output, StringComparison.Ordinal);
            Assert.Equal(0, CliRun.Invoke("design", "check", path).ExitCode);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Simulate_TightWindow_WritesTheCaptureAndWarnsOfClipping()
    {
        var path = Path.Combine(Path.GetTempPath(), $"capture-{Guid.NewGuid():N}.csv");
        try
        {
            var (exitCode, _, error) = CliRun.Invoke("design", "simulate", Design("qh-l3-wren.json"), "--t-end", "5ms", "--samples", "2000", "--window", "CH3=4V@0V", "--out", path);

            Assert.Equal(3, exitCode);
            Assert.Contains("clipped", error, StringComparison.Ordinal);
            Assert.Equal(3 + 6 + 1 + 2000, File.ReadAllLines(path).Length);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void Simulate_UnknownPartInFaults_ExitsTwo()
    {
        var (exitCode, _, error) = CliRun.Invoke("design", "simulate", Design("qh-l3-wren.json"), "--t-end", "5ms", "--faults", "R99=+10%", "--out", "never.csv");

        Assert.Equal(2, exitCode);
        Assert.Contains("R99", error, StringComparison.Ordinal);
    }
}
