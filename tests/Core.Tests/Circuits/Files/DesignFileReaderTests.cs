using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Files;

namespace Patchproof.Core.Tests.Circuits.Files;

public sealed class DesignFileReaderTests
{
    private const string Minimal = """
        {
          "format": "patchproof-design",
          "version": 1,
          "board": "T-1",
          "timeScale": "1 ms",
          "variables": [ { "name": "v", "scale": "1 V" } ],
          "parts": [
            { "id": "R1", "kind": "resistor", "value": "100k", "tolerance": "1 %" },
            { "id": "C1", "kind": "capacitor", "value": "10n", "tolerance": "5 %" }
          ],
          "blocks": [
            { "kind": "integrator", "output": "v", "capacitor": "C1", "inputs": [ { "from": "v", "resistor": "R1" } ] }
          ]
        }
        """;

    [Fact]
    public void Read_MinimalDesign_GivesTheDesign()
    {
        var result = DesignFileReader.Read(Minimal, "t.json");

        Assert.True(result.Success, string.Join("\n", result.Errors));
        var design = result.Value;
        Assert.Equal(1e-3, design.TimeScaleSeconds, 15);
        Assert.Equal(100e3, design.NominalOf("R1"));
        Assert.Equal(-1000.0, Assert.Single(design.Terms()).NominalCoefficient, 9);
        Assert.Empty(result.Warnings);
    }

    [Fact]
    public void Read_WrittenDesign_RoundTrips()
    {
        var original = DesignSamples.Demo("qh-l3-wren.json");

        var again = DesignFileReader.Read(DesignFileWriter.Write(original)).Value;

        Assert.Equal(original.Parts.ToArray(), again.Parts.ToArray());
        Assert.Equal(original.Variables.ToArray(), again.Variables.ToArray());
        Assert.Equal(
            original.Terms().Select(term => (term.Variable, term.Basis.Key, term.NominalCoefficient)).ToArray(),
            again.Terms().Select(term => (term.Variable, term.Basis.Key, term.NominalCoefficient)).ToArray());
    }

    [Fact]
    public void Read_UnknownBlock_NamesTheFieldAndLine()
    {
        var json = Minimal.Replace("\"kind\": \"integrator\"", "\"kind\": \"integrater\"", StringComparison.Ordinal);

        var error = SingleError(json);

        Assert.Contains("$.blocks[0].kind", error.Message, StringComparison.Ordinal);
        Assert.Contains("unknown block 'integrater'", error.Message, StringComparison.Ordinal);
        Assert.Equal(12, error.Line);
        Assert.True(error.Column > 1);
    }

    [Fact]
    public void Read_IntegratorWithoutCapacitor_SaysSo()
    {
        var json = Minimal.Replace("\"capacitor\": \"C1\", ", string.Empty, StringComparison.Ordinal);

        var errors = DesignFileReader.Read(json, "t.json").Errors;

        Assert.Contains(errors, error => error.Message.Contains("$.blocks[0].capacitor", StringComparison.Ordinal) && error.Message.Contains("has no capacitor", StringComparison.Ordinal));
    }

    [Fact]
    public void Read_MissingPart_NamesTheReference()
    {
        var json = Minimal.Replace("\"resistor\": \"R1\"", "\"resistor\": \"R7\"", StringComparison.Ordinal);

        var errors = DesignFileReader.Read(json, "t.json").Errors;

        Assert.Contains(errors, error => error.Message.Contains("$.blocks[0].inputs[0].resistor", StringComparison.Ordinal) && error.Message.Contains("'R7' is not in the parts list", StringComparison.Ordinal));
        Assert.All(errors, error => Assert.Equal(12, error.Line));
    }

    [Fact]
    public void Read_InputFromUnknownVariable_NamesIt()
    {
        var json = Minimal.Replace("\"from\": \"v\"", "\"from\": \"w\"", StringComparison.Ordinal);

        var error = SingleError(json);

        Assert.Contains("$.blocks[0].inputs[0].from", error.Message, StringComparison.Ordinal);
        Assert.Contains("no variable or block output is named 'w'", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Read_CapacitorWithoutUnit_IsRefused()
    {
        var json = Minimal.Replace("\"value\": \"10n\"", "\"value\": \"10\"", StringComparison.Ordinal);

        var error = SingleError(json);

        Assert.Contains("$.parts[1].value", error.Message, StringComparison.Ordinal);
        Assert.Contains("needs a unit", error.Message, StringComparison.Ordinal);
        Assert.Equal(9, error.Line);
    }

    [Fact]
    public void Read_BrokenJson_GivesLineAndColumn()
    {
        var json = Minimal.Replace("\"board\": \"T-1\",", "\"board\": \"T-1\"", StringComparison.Ordinal);

        var error = SingleError(json);

        Assert.Contains("not valid JSON", error.Message, StringComparison.Ordinal);
        Assert.Equal(5, error.Line);
        Assert.Equal("t.json", error.File);
    }

    [Fact]
    public void Read_WrongFormat_IsRefused()
    {
        var error = SingleError(Minimal.Replace("patchproof-design", "something-else", StringComparison.Ordinal));

        Assert.Contains("$.format", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Read_UnknownField_IsAWarning()
    {
        var json = Minimal.Replace("\"board\": \"T-1\",", "\"board\": \"T-1\", \"colour\": \"blue\",", StringComparison.Ordinal);

        var result = DesignFileReader.Read(json, "t.json");

        Assert.True(result.Success);
        Assert.Contains(result.Warnings, warning => warning.Message.Contains("$.colour", StringComparison.Ordinal));
    }

    [Fact]
    public void Read_PartUsedTwice_IsRefused()
    {
        var json = Minimal.Replace("\"inputs\": [ { \"from\": \"v\", \"resistor\": \"R1\" } ]", "\"inputs\": [ { \"from\": \"v\", \"resistor\": \"R1\" }, { \"from\": \"v\", \"resistor\": \"R1\" } ]", StringComparison.Ordinal);

        var error = SingleError(json);

        Assert.Contains("already used", error.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("qh-l3-wren.json")]
    [InlineData("qh-l4-plover.json")]
    [InlineData("qh-l5-tern.json")]
    [InlineData("qh-r1-gannet.json")]
    [InlineData("qh-d2-dunlin.json")]
    [InlineData("qh-l9-skua.json")]
    public void ReadFile_DemoDesigns_ReadWithoutWarnings(string fileName)
    {
        var result = DesignFileReader.ReadFile(Path.Combine(Patchproof.TestSupport.ReferenceDataFiles.RepositoryRoot, "designs", fileName));

        Assert.True(result.Success, string.Join("\n", result.Errors));
        Assert.Empty(result.Warnings);
    }

    private static SourceDiagnostic SingleError(string json)
    {
        var result = DesignFileReader.Read(json, "t.json");
        Assert.False(result.Success);
        return Assert.Single(result.Errors);
    }
}
