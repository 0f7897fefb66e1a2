using Patchproof.Core.Captures;

namespace Patchproof.Core.Tests.Captures;

/// <summary>The dialect matrix: files the test writes in each variation alone and in combinations, read back exactly.</summary>
public sealed class CaptureReaderDialectTests
{
    private const int Rows = 200;

    public static TheoryData<DialectSpec> SingleVariations()
    {
        var plain = new DialectSpec();
        return new TheoryData<DialectSpec>
        {
            plain,
            plain with { Delimiter = ';' },
            plain with { Delimiter = '\t' },
            plain with { Delimiter = ' ' },
            plain with { Delimiter = ';', DecimalComma = true },
            plain with { Metadata = MetadataShape.KeyCommaValue },
            plain with { Metadata = MetadataShape.KeySemicolonValueUnit },
            plain with { Metadata = MetadataShape.KeyEqualsValue },
            plain with { Metadata = MetadataShape.KeyColonValue },
            plain with { Metadata = MetadataShape.HashComments },
            plain with { Metadata = MetadataShape.BracketedSections },
            plain with { SeparatorLine = true, Metadata = MetadataShape.KeyColonValue },
            plain with { Header = HeaderStyle.Brackets },
            plain with { Header = HeaderStyle.UnitsRow },
            plain with { Header = HeaderStyle.NoUnits },
            plain with { TimeUnit = "ms" },
            plain with { TimeUnit = "us" },
            plain with { TimeUnit = "µs" },
            plain with { TimeUnit = "ns" },
            plain with { TimeColumn = false, Metadata = MetadataShape.KeyColonValue },
            plain with { TimeColumn = false, Metadata = MetadataShape.KeyEqualsValue },
            plain with { IndexColumn = true },
            plain with { IndexColumn = true, TimeColumn = false, Metadata = MetadataShape.HashComments },
            plain with { Quoted = true },
            plain with { ByteOrderMark = true },
            plain with { CrLf = true },
            plain with { TrailingDelimiter = true },
            plain with { ChannelUnit = "mV" },
        };
    }

    public static TheoryData<DialectSpec> CombinedVariations() => new()
    {
        new DialectSpec { Delimiter = ';', DecimalComma = true, Metadata = MetadataShape.KeySemicolonValueUnit, Header = HeaderStyle.UnitsRow, TimeUnit = "ms", ByteOrderMark = true, CrLf = true, TrailingDelimiter = true },
        new DialectSpec { Delimiter = '\t', DecimalComma = true, Metadata = MetadataShape.KeyColonValue, Header = HeaderStyle.Brackets, TimeUnit = "µs", Quoted = true },
        new DialectSpec { Delimiter = ' ', Metadata = MetadataShape.HashComments, Header = HeaderStyle.NoUnits, CrLf = true },
        new DialectSpec { Delimiter = ' ', DecimalComma = true, Metadata = MetadataShape.KeyEqualsValue, TimeColumn = false, ChannelUnit = "mV" },
        new DialectSpec { Quoted = true, Metadata = MetadataShape.BracketedSections, IndexColumn = true, TimeUnit = "ns", TrailingDelimiter = true, CrLf = true, ByteOrderMark = true },
        new DialectSpec { Delimiter = ';', DecimalComma = true, Quoted = true, Metadata = MetadataShape.BracketedSections, TimeColumn = false, IndexColumn = true, ChannelUnit = "mV", Header = HeaderStyle.UnitsRow },
        new DialectSpec { SeparatorLine = true, Metadata = MetadataShape.KeyCommaValue, Header = HeaderStyle.UnitsRow, TimeUnit = "us", ChannelUnit = "mV", TrailingDelimiter = true },
    };

    [Theory]
    [MemberData(nameof(SingleVariations))]
    public void ReadFile_EachVariationAlone_ReadsTheKnownValues(DialectSpec spec) => AssertReadsBack(spec);

    [Theory]
    [MemberData(nameof(CombinedVariations))]
    public void ReadFile_VariationsCombined_ReadsTheKnownValues(DialectSpec spec) => AssertReadsBack(spec);

    [Fact]
    public void ReadFile_SimulatorStyleHeaderWithoutUnits_TakesSecondsAndVoltsWithNotes()
    {
        var path = CaptureFileBuilder.WriteTemp("# board: QH-L3\n# model: lorenz\nt,x,y,z\n0,1,2,3\n0.002,1.1,2.1,3.1\n0.004,1.2,2.2,3.2\n");

        var result = CaptureReader.ReadFile(path);

        Assert.True(result.Success, string.Join("; ", result.Errors));
        var capture = result.Value;
        Assert.Equal(["x", "y", "z"], capture.Channels.Select(c => c.Name));
        var uniform = Assert.IsType<UniformTimeBase>(capture.TimeBase);
        Assert.Equal(0.002, uniform.IntervalSeconds, 12);
        Assert.Contains(result.Warnings, w => w.Severity == DiagnosticSeverity.Info && w.Message.Contains("taken as seconds", StringComparison.Ordinal));
        Assert.Equal(3, result.Warnings.Count(w => w.Severity == DiagnosticSeverity.Info && w.Message.Contains("taken as volts", StringComparison.Ordinal)));
        Assert.Equal(2, capture.Metadata.Count);
        Assert.Equal("board", capture.Metadata[0].Key);
        Assert.Equal("QH-L3", capture.Metadata[0].Value);
    }

    [Theory]
    [InlineData("CH1 (V)", "CH1", "V")]
    [InlineData("Voltage [mV]", "Voltage", "mV")]
    [InlineData("t / ms", "t", "ms")]
    [InlineData("Time_s", "Time", "s")]
    [InlineData("CH2 {uV}", "CH2", "uV")]
    [InlineData("x", "x", null)]
    public void ColumnHeader_UsualSpellings_SplitNameAndUnit(string field, string name, string? unit)
    {
        var header = Core.Captures.Reading.ColumnHeader.Parse(field);

        Assert.Equal(name, header.Name);
        Assert.Equal(unit, header.Unit);
    }

    [Fact]
    public void ReadFiles_OneFilePerChannel_MergesOnTheTimeBase()
    {
        var a = CaptureFileBuilder.WriteTemp(CaptureFileBuilder.Build(new DialectSpec(), Rows, 1), "ch1.csv");
        var b = CaptureFileBuilder.WriteTemp(CaptureFileBuilder.Build(new DialectSpec { Delimiter = ';', DecimalComma = true }, Rows, 1), "ch2.csv");

        var result = CaptureReader.ReadFiles([a, b]);

        Assert.True(result.Success, string.Join("; ", result.Errors));
        Assert.Equal(2, result.Value.Channels.Count);
        Assert.Equal(["ch1.csv:CH1", "ch2.csv:CH1"], result.Value.Channels.Select(c => c.Name));
        Assert.Equal([a, b], result.Value.Channels.Select(c => c.SourceFile));
    }

    [Fact]
    public void ReadFile_ProbeFactorAndUnitGiven_ScalesTheChannels()
    {
        var path = CaptureFileBuilder.WriteTemp("t,CH1,CH2\n0,0.5,100\n1,0.25,200\n2,0.125,300\n");
        var options = new CaptureReadOptions
        {
            ProbeFactors = new Dictionary<string, double> { ["CH1"] = 10 },
            ChannelUnits = new Dictionary<string, string> { ["2"] = "mV" },
        };

        var result = CaptureReader.ReadFile(path, options);

        Assert.True(result.Success, string.Join("; ", result.Errors));
        Assert.Equal([5f, 2.5f, 1.25f], result.Value.Channels[0].Samples.ToArray());
        Assert.Equal(10, result.Value.Channels[0].ProbeFactor);
        Assert.Equal([0.1f, 0.2f, 0.3f], result.Value.Channels[1].Samples.ToArray());
    }

    [Fact]
    public void ReadFile_LongStampsThatRepeatPastTenSeconds_RebuildsTheTimeBaseFromTheMetadata()
    {
        // With %.6e, seven significant digits cannot resolve a 2 µs step once t passes 10 s (shared/BENCHMARKS.md section 2).
        var sb = new System.Text.StringBuilder("Sample interval,2e-6\nt,x\n");
        const int rows = 3000;
        for (var i = 0; i < rows; i++)
        {
            var t = 10.0 + (i * 2e-6);
            sb.Append(t.ToString("E6", System.Globalization.CultureInfo.InvariantCulture)).Append(',').Append((i % 7).ToString(System.Globalization.CultureInfo.InvariantCulture)).Append('\n');
        }

        var result = CaptureReader.ReadFile(CaptureFileBuilder.WriteTemp(sb.ToString()));

        Assert.True(result.Success, string.Join("; ", result.Errors));
        var uniform = Assert.IsType<UniformTimeBase>(result.Value.TimeBase);
        Assert.Equal(2e-6, uniform.IntervalSeconds);
        Assert.Equal(10.0, uniform.StartSeconds);
        Assert.Contains(result.Warnings, w => w.Message.Contains("repeat", StringComparison.Ordinal) && w.Message.Contains("metadata", StringComparison.Ordinal));
    }

    private static void AssertReadsBack(DialectSpec spec)
    {
        var path = CaptureFileBuilder.WriteTemp(CaptureFileBuilder.Build(spec, Rows));

        var result = CaptureReader.ReadFile(path);

        Assert.True(result.Success, $"{spec}: {string.Join("; ", result.Errors)}");
        var capture = result.Value;
        Assert.Equal(Rows, capture.SampleCount);
        Assert.Equal(3, capture.Channels.Count);
        if (spec.Header != HeaderStyle.NoHeader)
        {
            Assert.Equal(["CH1", "CH2", "CH3"], capture.Channels.Select(c => c.Name));
        }

        var uniform = Assert.IsType<UniformTimeBase>(capture.TimeBase);
        Assert.Equal(CaptureFileBuilder.IntervalSeconds, uniform.IntervalSeconds, 1e-6 * CaptureFileBuilder.IntervalSeconds);
        Assert.Equal(0, uniform.StartSeconds, 1e-12);
        for (var k = 0; k < 3; k++)
        {
            var channel = capture.Channels[k];
            Assert.Equal("V", channel.Unit);
            Assert.Equal(k + 1 + (spec.TimeColumn ? 1 : 0) + (spec.IndexColumn ? 1 : 0), channel.SourceColumn);
            var samples = channel.Samples.Span;
            for (var i = 0; i < Rows; i++)
            {
                var expected = (float)CaptureFileBuilder.PrintedVolts(k, i, spec.ChannelUnit);
                Assert.True(Math.Abs(samples[i] - expected) <= 1e-6 * Math.Max(1, Math.Abs(expected)), $"{spec}: channel {k} sample {i}: {samples[i]} vs {expected}");
            }
        }
    }
}
