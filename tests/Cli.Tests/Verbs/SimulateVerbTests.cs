using System.Globalization;
using System.Text.Json;

namespace Patchproof.Cli.Tests.Verbs;

public sealed class SimulateVerbTests
{
    private static string TempPath(string extension) => Path.Combine(Path.GetTempPath(), $"patchproof-simulate-{Guid.NewGuid():N}{extension}");

    private static string WriteModel(string text)
    {
        var path = TempPath(".model");
        File.WriteAllText(path, text);
        return path;
    }

    [Fact]
    public void Simulate_Lorenz_WritesACsvThatInspectReadsBack()
    {
        // Arrange
        var csv = TempPath(".csv");

        // Act
        var (exitCode, output, error) = CliRun.Invoke("simulate", "--model", "lorenz", "--t-end", "2", "--every", "0.01", "--out", csv);
        var (inspectExit, inspectOutput, inspectError) = CliRun.Invoke("inspect", csv);

        // Assert
        Assert.Equal(0, exitCode);
        Assert.Equal(string.Empty, error);
        Assert.Contains("201 rows", output, StringComparison.Ordinal);
        var lines = File.ReadAllLines(csv);
        Assert.Equal("# model: lorenz", lines[0]);
        Assert.Equal("t,x,y,z", lines.First(line => !line.StartsWith('#')));
        Assert.Equal("0,1,1,1", lines.SkipWhile(line => line != "t,x,y,z").ElementAt(1));
        Assert.Equal(0, inspectExit);
        Assert.Equal(string.Empty, inspectError);
        Assert.Contains("201 samples", inspectOutput, StringComparison.Ordinal);
    }

    [Fact]
    public void Simulate_ToStandardOutput_WritesRoundTripNumbersThatMatchTheReferenceTrajectory()
    {
        // Lorenz (10, 28, 8/3) from (1, 1, 1) at t = 10: (-4.9026875411346457, -3.7438729218029196,
        // 24.690858102790555), the project's 40-digit reference (computed with mpmath). At rtol 1e-10
        // the check values allow 1e-5.
        var (exitCode, output, _) = CliRun.Invoke("simulate", "--model", "lorenz", "--t-end", "10", "--every", "5", "--rtol", "1e-10", "--atol", "1e-10");

        Assert.Equal(0, exitCode);
        var last = output.Split('\n', StringSplitOptions.RemoveEmptyEntries)[^1].Split(',').Select(field => double.Parse(field, CultureInfo.InvariantCulture)).ToArray();
        Assert.Equal(10.0, last[0]);
        Assert.Equal(-4.9026875411346457, last[1], 1e-5);
        Assert.Equal(-3.7438729218029196, last[2], 1e-5);
        Assert.Equal(24.690858102790555, last[3], 1e-5);
    }

    [Fact]
    public void Simulate_Json_SummarizesOutcomeStatisticsAndFinalState()
    {
        var (exitCode, output, _) = CliRun.Invoke("simulate", "--model", "damped-oscillator", "--t-end", "1", "--json", "--set", "zeta=0.1", "--x0", "1,0");

        Assert.Equal(0, exitCode);
        using var document = JsonDocument.Parse(output);
        var root = document.RootElement;
        Assert.Equal("patchproof.simulate", root.GetProperty("format").GetString());
        Assert.Equal(1, root.GetProperty("version").GetInt32());
        Assert.Equal("Succeeded", root.GetProperty("outcome").GetProperty("status").GetString());
        Assert.True(root.GetProperty("statistics").GetProperty("acceptedSteps").GetInt64() > 0);
        // Damped oscillator zeta = 0.1, omega0 = 2 pi from (1, 0): x(1) = 0.53153512372717173 (closed form, project check values).
        Assert.Equal(0.53153512372717173, root.GetProperty("finalState").GetProperty("x").GetDouble(), 1e-6);
        Assert.Equal(0.10608522530432260, root.GetProperty("finalState").GetProperty("v").GetDouble(), 1e-6);
    }

    [Fact]
    public void Simulate_SetAndX0_AreApplied()
    {
        var (exitCode, output, _) = CliRun.Invoke("simulate", "--model", "lorenz", "--t-end", "0.1", "--every", "0.1", "--set", "sigma=10.5", "--x0", "2,3,4");

        Assert.Equal(0, exitCode);
        Assert.Contains("# parameters: sigma=10.5; rho=28; beta=2.6666666666666665", output, StringComparison.Ordinal);
        Assert.Contains("\n0,2,3,4\n", output.Replace("\r\n", "\n", StringComparison.Ordinal), StringComparison.Ordinal);
    }

    [Fact]
    public void Simulate_File_ReadsTheEquationLanguage()
    {
        var model = WriteModel("state x = 1\nk = 2\nx' = -k*x\n");

        var (exitCode, output, _) = CliRun.Invoke("simulate", "--file", model, "--t-end", "1", "--every", "1", "--json");

        Assert.Equal(0, exitCode);
        using var document = JsonDocument.Parse(output);
        Assert.Equal(Math.Exp(-2), document.RootElement.GetProperty("finalState").GetProperty("x").GetDouble(), 1e-7);
    }

    [Theory]
    [InlineData("--model", "no-such-model", "--t-end", "1")]
    [InlineData("--model", "lorenz", "--t-end", "1", "--set", "kappa=2")]
    [InlineData("--model", "lorenz", "--t-end", "1", "--set", "sigma")]
    [InlineData("--model", "lorenz", "--t-end", "1", "--set", "sigma=abc")]
    [InlineData("--model", "lorenz", "--t-end", "1", "--x0", "1,1")]
    [InlineData("--model", "lorenz", "--t-end", "1", "--x0", "1,x,1")]
    [InlineData("--model", "lorenz", "--t-end", "-1")]
    [InlineData("--model", "lorenz", "--t-end", "ten")]
    [InlineData("--model", "lorenz")]
    [InlineData("--model", "lorenz", "--t-end", "1", "--rtol", "0")]
    [InlineData("--model", "lorenz", "--t-end", "1", "--every", "0")]
    [InlineData("--t-end", "1")]
    public void Simulate_BadInput_ExitsTwoWithAMessage(params string[] arguments)
    {
        var (exitCode, output, error) = CliRun.Invoke(["simulate", .. arguments]);

        Assert.Equal(2, exitCode);
        Assert.NotEqual(string.Empty, error.Trim());
        Assert.Equal(string.Empty, output);
    }

    [Fact]
    public void Simulate_FileWithErrors_PrintsFileLineColumnAndExitsTwo()
    {
        var model = WriteModel("state x, y\nx' = rho*x\n");

        var (exitCode, _, error) = CliRun.Invoke("simulate", "--file", model, "--t-end", "1");

        Assert.Equal(2, exitCode);
        var lines = error.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.StartsWith($"{model}:1:10: the state 'y' has no equation", lines[0], StringComparison.Ordinal);
        Assert.StartsWith($"{model}:2:6: unknown name 'rho'", lines[1], StringComparison.Ordinal);
    }

    [Fact]
    public void Simulate_BlowUp_StopsEarlyAndSaysWhereAndWhy()
    {
        // x' = x^2 from x(0) = 1 blows up at t = 1 (x = 1/(1 - t)).
        var model = WriteModel("state x = 1\nx' = x^2\n");

        var (exitCode, output, error) = CliRun.Invoke("simulate", "--file", model, "--t-end", "2", "--json");

        Assert.Equal(1, exitCode);
        using var document = JsonDocument.Parse(output);
        var outcome = document.RootElement.GetProperty("outcome");
        Assert.False(outcome.GetProperty("reachedEndTime").GetBoolean());
        Assert.True(outcome.GetProperty("finalTime").GetDouble() is > 0.99 and < 1.01);
        Assert.Contains("the solver stopped early", error, StringComparison.Ordinal);
    }
}
