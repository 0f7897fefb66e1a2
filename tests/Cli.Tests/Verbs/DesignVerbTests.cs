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
    public void New_SprottJerkFromTheCatalog_WritesADesignThatChecksAgainstItsModel()
    {
        var path = Path.Combine(Path.GetTempPath(), $"jerk-{Guid.NewGuid():N}.json");
        try
        {
            var (exitCode, output, error) = CliRun.Invoke("design", "new", "--model", "sprott-jerk", "--out", path);
            var (checkCode, checkOutput, _) = CliRun.Invoke("design", "check", path);

            Assert.True(exitCode is 0 or 3, error);
            Assert.Contains("Ranges found by simulating the model from its initial state", output, StringComparison.Ordinal);
            Assert.Equal(0, checkCode);
            Assert.Contains("checked against sprott-jerk", checkOutput, StringComparison.Ordinal);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void New_ChuaFromTheCatalog_ExitsTwoNamingTheDiodeTerm()
    {
        var (exitCode, _, error) = CliRun.Invoke("design", "new", "--model", "chua");

        Assert.Equal(2, exitCode);
        Assert.Contains("equation x' (line 8), term", error, StringComparison.Ordinal);
        Assert.Contains("piecewise-linear", error, StringComparison.Ordinal);
        Assert.Contains("lotka-volterra", error, StringComparison.Ordinal);
    }

    [Fact]
    public void New_Help_ListsTheRealizableCatalogModels()
    {
        var (_, output, _) = CliRun.Invoke("design", "new", "--help");

        Assert.Contains("lorenz, rossler, damped-oscillator, sprott-jerk, lotka-volterra", output, StringComparison.Ordinal);
        Assert.Contains("--file", output, StringComparison.Ordinal);
    }

    [Fact]
    public void New_OwnModelFile_WritesADesignNamedAfterTheFile()
    {
        var directory = Directory.CreateTempSubdirectory("model-");
        var model = Path.Combine(directory.FullName, "pendulum.model");
        var design = Path.Combine(directory.FullName, "pendulum.json");
        File.WriteAllText(model, "# small-angle pendulum with damping\nstate x = 1, v = 0\nk = 4\nd = 0.5\nx' = v\nv' = -k*x - d*v\n");
        try
        {
            var (exitCode, output, error) = CliRun.Invoke("design", "new", "--file", model, "--out", design);

            Assert.Equal(0, exitCode);
            Assert.Equal(string.Empty, error);
            Assert.Contains("Design for pendulum", output, StringComparison.Ordinal);
            Assert.Contains("dv/dt: x", output, StringComparison.Ordinal);
            Assert.Contains("\"name\": \"pendulum\"", File.ReadAllText(design), StringComparison.Ordinal);
            var (checkCode, checkOutput, _) = CliRun.Invoke("design", "check", design, "--model-file", model);
            Assert.Equal(0, checkCode);
            Assert.Contains("checked against pendulum", checkOutput, StringComparison.Ordinal);
            Assert.Contains("none: every model term is realized", checkOutput, StringComparison.Ordinal);
        }
        finally
        {
            directory.Delete(recursive: true);
        }
    }

    [Fact]
    public void New_BrokenModelFile_ExitsTwoWithFileLineColumn()
    {
        var directory = Directory.CreateTempSubdirectory("model-");
        var model = Path.Combine(directory.FullName, "broken.model");
        File.WriteAllText(model, "state x = 1\nx' = -k*x\n");
        try
        {
            var (exitCode, output, error) = CliRun.Invoke("design", "new", "--file", model);

            Assert.Equal(2, exitCode);
            Assert.Matches(@"broken\.model:2:7: unknown name 'k'", error);
            Assert.DoesNotContain("Design for", output, StringComparison.Ordinal);
        }
        finally
        {
            directory.Delete(recursive: true);
        }
    }

    [Fact]
    public void New_ModelFileWithASineTerm_ExitsTwoNamingEquationAndTerm()
    {
        var directory = Directory.CreateTempSubdirectory("model-");
        var model = Path.Combine(directory.FullName, "swing.model");
        File.WriteAllText(model, "state x = 1, y = 0\nk = 2\nx' = y\ny' = -k*sin(x)\n");
        try
        {
            var (exitCode, _, error) = CliRun.Invoke("design", "new", "--file", model);

            Assert.Equal(2, exitCode);
            Assert.Contains("swing.model:4: equation y' (line 4), term (-k) * sin(x): sin(x) is not a polynomial", error, StringComparison.Ordinal);
        }
        finally
        {
            directory.Delete(recursive: true);
        }
    }

    [Fact]
    public void New_BothOrNeitherOfModelAndFile_ExitsTwo()
    {
        Assert.Equal(2, CliRun.Invoke("design", "new").ExitCode);
        Assert.Equal(2, CliRun.Invoke("design", "new", "--model", "lorenz", "--file", "x.model").ExitCode);
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
