using Patchproof.Core.Captures;

namespace Patchproof.Core.Tests.Captures;

/// <summary>Every bad input of the capture reader gets a located error, or a warning that says what was done.</summary>
public sealed class CaptureReaderBadInputTests
{
    [Fact]
    public void ReadFile_EmptyFile_FailsAtLineOne()
    {
        var error = ReadError(string.Empty);

        Assert.Equal(1, error.Line);
        Assert.Contains("empty", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ReadFile_BinaryJunk_FailsNamingTheByte()
    {
        var path = CaptureFileBuilder.WriteTemp(new byte[] { 0x50, 0x4B, 0x03, 0x04, 0x14, 0x00, 0x00, 0x00, 0xFF, 0x10, 0x0A, 0x01 });

        var result = CaptureReader.ReadFile(path);

        var error = Assert.Single(result.Errors);
        Assert.Equal(path, error.File);
        Assert.Equal(1, error.Line);
        Assert.Equal(3, error.Column);
        Assert.Contains("not a text file", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ReadFile_OneColumnWithoutInterval_FailsAskingForATimeBase()
    {
        var error = ReadError("CH1\n0.1\n0.2\n0.3\n");

        Assert.Equal(1, error.Line);
        Assert.Contains("single column", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ReadFile_OneColumnWithRate_Reads()
    {
        var result = CaptureReader.ReadFile(CaptureFileBuilder.WriteTemp("Sample rate: 1 kHz\nCH1 (mV)\n100\n200\n300\n"));

        Assert.True(result.Success, string.Join("; ", result.Errors));
        var uniform = Assert.IsType<UniformTimeBase>(result.Value.TimeBase);
        Assert.Equal(1e-3, uniform.IntervalSeconds, 15);
        Assert.Equal([0.1f, 0.2f, 0.3f], result.Value.Channels[0].Samples.ToArray());
    }

    [Fact]
    public void ReadFile_ShortRowsWithTimeColumn_SkipsThemWithALocatedWarning()
    {
        var text = "t,a,b\n0,1,2\n1,1,2\n2,1\n3,1\n4,1\n5,1,2\n6,1,2\n";

        var result = CaptureReader.ReadFile(CaptureFileBuilder.WriteTemp(text));

        Assert.True(result.Success, string.Join("; ", result.Errors));
        Assert.Equal(4, result.Value.SampleCount);
        var warning = Assert.Single(result.Warnings, w => w.Severity == DiagnosticSeverity.Warning);
        Assert.Equal("Skipped 3 rows with missing values at lines 4-6.", warning.Message);
        Assert.Equal(4, warning.Line);
    }

    [Fact]
    public void ReadFile_RowWithExtraField_FailsAtThatField()
    {
        var error = ReadError("t,a,b\n0,1,2\n1,1,2\n2,1,2\n3,1,2,9\n");

        Assert.Equal(5, error.Line);
        Assert.Equal(7, error.Column);
        Assert.Contains("more fields", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ReadFile_TextInNumericField_FailsAtLineAndColumn()
    {
        var error = ReadError("t,a,b\n0,1,2\n1,1,2\n2,1,2\n3,1,2\n4,oops,2\n");

        Assert.Equal(6, error.Line);
        Assert.Equal(3, error.Column);
        Assert.Contains("'oops' in column 2 is not a number", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ReadFile_TextInFirstDataRow_FailsAtThatRowInsteadOfCallingItMetadata()
    {
        var error = ReadError("t,a,b\n0,x1,2\n1,1,2\n2,1,2\n3,1,2\n");

        Assert.Equal(2, error.Line);
        Assert.Equal(3, error.Column);
    }

    [Theory]
    [InlineData("NaN")]
    [InlineData("-Inf")]
    [InlineData("inf")]
    [InlineData("1e999")]
    public void ReadFile_NonFiniteValue_SkipsTheRowWithAWarning(string value)
    {
        var result = CaptureReader.ReadFile(CaptureFileBuilder.WriteTemp($"t,a\n0,1\n1,2\n2,{value}\n3,4\n4,5\n"));

        Assert.True(result.Success, string.Join("; ", result.Errors));
        Assert.Equal(4, result.Value.SampleCount);
        Assert.Contains(result.Warnings, w => w.Message == "Skipped 1 row with NaN or infinite values at line 4." && w.Line == 4);
    }

    [Fact]
    public void ReadFile_NonFiniteWithoutTimeColumn_FailsBecauseSkippingWouldShiftTime()
    {
        var error = ReadError("Sample interval: 1 ms\na;b\n1;2\n3;4\nNaN;5\n6;7\n");

        Assert.Equal(5, error.Line);
        Assert.Equal(1, error.Column);
        Assert.Contains("shift", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ReadFile_MixedDecimalStyles_FailsAtTheOddField()
    {
        var error = ReadError("t;a\n0,0;1,5\n0,1;2,5\n0,2;3,5\n0,3;4.5\n");

        Assert.Equal(5, error.Line);
        Assert.Equal(5, error.Column);
        Assert.Contains("mixed decimal styles", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ReadFile_TimeRunsBackwards_FailsAtTheRow()
    {
        var error = ReadError("t,a\n0,1\n1,2\n2,3\n1.5,4\n3,5\n");

        Assert.Equal(5, error.Line);
        Assert.Equal(1, error.Column);
        Assert.Contains("Time runs backwards", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ReadFiles_ChannelFilesOfDifferentLengths_FailNamingTheFile()
    {
        var a = CaptureFileBuilder.WriteTemp(CaptureFileBuilder.Build(new DialectSpec(), 100, 1), "a.csv");
        var b = CaptureFileBuilder.WriteTemp(CaptureFileBuilder.Build(new DialectSpec(), 98, 1), "b.csv");

        var result = CaptureReader.ReadFiles([a, b]);

        var error = Assert.Single(result.Errors);
        Assert.Equal(b, error.File);
        Assert.Contains("98 samples", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ReadFiles_ChannelFilesOfDifferentRates_FailNamingTheFile()
    {
        var a = CaptureFileBuilder.WriteTemp(CaptureFileBuilder.Build(new DialectSpec(), 100, 1), "a.csv");
        var b = CaptureFileBuilder.WriteTemp(
            "Time (us),CH1 (V)\n" + string.Concat(Enumerable.Range(0, 100).Select(i => $"{i * 4},{i % 3}\n")), "b.csv");

        var result = CaptureReader.ReadFiles([a, b]);

        var error = Assert.Single(result.Errors);
        Assert.Equal(b, error.File);
        Assert.Contains("samples every 4 µs but", error.Message, StringComparison.Ordinal);
        Assert.Contains("sample rates differ", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ReadFile_MissingFile_FailsNamingIt()
    {
        var path = Path.Combine(Path.GetTempPath(), "patchproof-no-such-file.csv");

        var result = CaptureReader.ReadFile(path);

        Assert.Equal(path, Assert.Single(result.Errors).File);
    }

    [Fact]
    public void ReadFile_ProbeForUnknownChannel_FailsListingTheChannels()
    {
        var options = new CaptureReadOptions { ProbeFactors = new Dictionary<string, double> { ["CH9"] = 10 } };

        var result = CaptureReader.ReadFile(CaptureFileBuilder.WriteTemp("t,CH1\n0,1\n1,2\n2,3\n"), options);

        Assert.Contains("CH9", Assert.Single(result.Errors).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ReadFile_NoRowsOfNumbers_Fails()
    {
        var error = ReadError("just,some\nwords,here\n");

        Assert.Contains("No rows of numbers", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ReadFile_MetadataIntervalDisagreesWithTimeColumn_WarnsAndUsesTheColumn()
    {
        var result = CaptureReader.ReadFile(CaptureFileBuilder.WriteTemp("Sample interval: 5 ms\nt,a\n0,1\n0.001,2\n0.002,3\n"));

        Assert.True(result.Success);
        Assert.Equal(0.001, Assert.IsType<UniformTimeBase>(result.Value.TimeBase).IntervalSeconds, 12);
        Assert.Contains(result.Warnings, w => w.Severity == DiagnosticSeverity.Warning && w.Line == 1);
    }

    private static SourceDiagnostic ReadError(string text)
    {
        var path = CaptureFileBuilder.WriteTemp(text);
        var result = CaptureReader.ReadFile(path);
        Assert.False(result.Success, "the reader accepted bad input");
        var error = Assert.Single(result.Errors);
        Assert.Equal(path, error.File);
        Assert.Equal(DiagnosticSeverity.Error, error.Severity);
        return error;
    }
}
