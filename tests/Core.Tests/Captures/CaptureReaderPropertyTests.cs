using System.Globalization;
using FsCheck.Xunit;
using Patchproof.Core.Captures;
using Patchproof.Core.Captures.Reading;

namespace Patchproof.Core.Tests.Captures;

/// <summary>Property tests: damaged files give a capture or the reader's own error, never another exception; numbers parse exactly.</summary>
public sealed class CaptureReaderPropertyTests
{
    private static readonly DialectSpec[] Specs =
    [
        new DialectSpec(),
        new DialectSpec { Delimiter = ';', DecimalComma = true, Metadata = MetadataShape.KeySemicolonValueUnit, Header = HeaderStyle.UnitsRow, CrLf = true },
        new DialectSpec { Delimiter = '\t', Metadata = MetadataShape.KeyColonValue, TimeColumn = false, Quoted = true },
        new DialectSpec { Delimiter = ' ', Metadata = MetadataShape.HashComments, Header = HeaderStyle.NoUnits, ByteOrderMark = true },
        new DialectSpec { Metadata = MetadataShape.BracketedSections, IndexColumn = true, TrailingDelimiter = true },
    ];

    private static readonly byte[] Interesting = "0123456789.,;\t \"-+eE\r\nNaInf#[]=:x\0\u00ff"u8.ToArray();

    [Property(MaxTest = 300)]
    public void Read_RandomMutationsOfAValidFile_GiveACaptureOrLocatedErrors(int specSeed, int mutationSeed, byte mutations)
    {
        var spec = Specs[Math.Abs(specSeed % Specs.Length)];
        var bytes = new List<byte>(CaptureFileBuilder.Build(spec, rows: 40));
        var random = new Random(mutationSeed);
        var count = 1 + (mutations % 8);
        for (var m = 0; m < count && bytes.Count > 0; m++)
        {
            var at = random.Next(bytes.Count);
            switch (random.Next(6))
            {
                case 0:
                    bytes.RemoveAt(at);
                    break;
                case 1:
                    bytes.Insert(at, Interesting[random.Next(Interesting.Length)]);
                    break;
                case 2:
                    bytes[at] = Interesting[random.Next(Interesting.Length)];
                    break;
                case 3:
                    bytes.RemoveRange(at, bytes.Count - at);
                    break;
                case 4:
                    bytes[at] = (byte)random.Next(256);
                    break;
                default:
                    var length = Math.Min(30, bytes.Count - at);
                    bytes.InsertRange(at, bytes.GetRange(at, length));
                    break;
            }
        }

        using var stream = new MemoryStream(bytes.ToArray());
        var result = CaptureReader.Read(stream, "mutated.csv");

        if (result.Success)
        {
            var capture = result.Value;
            Assert.All(capture.Channels, c => Assert.Equal(capture.SampleCount, c.SampleCount));
            Assert.True(capture.SampleCount > 0);
        }
        else
        {
            Assert.NotEmpty(result.Errors);
            Assert.All(result.Errors, e => Assert.Equal(DiagnosticSeverity.Error, e.Severity));
            Assert.All(result.Errors, e => Assert.False(string.IsNullOrWhiteSpace(e.Message)));
        }
    }

    [Property(MaxTest = 2000)]
    public void NumberParser_AnyDouble_ParsesToTheSameDoubleAsTheRuntime(double value, byte digits, bool comma)
    {
        // double.Parse with the invariant culture is correctly rounded (IEEE 754-2008 conversion); the fast path must agree bit for bit.
        if (!double.IsFinite(value))
        {
            return;
        }

        var format = (digits % 4) switch { 0 => "R", 1 => "E6", 2 => "0.000000e+00", _ => "F" + (digits % 12) };
        var text = value.ToString(format, CultureInfo.InvariantCulture);
        var expected = double.Parse(text, NumberStyles.Float, CultureInfo.InvariantCulture);
        var written = comma ? text.Replace('.', ',') : text;

        var status = NumberParser.Parse(System.Text.Encoding.ASCII.GetBytes(written), comma ? (byte)',' : (byte)'.', out var parsed, out _);

        Assert.Equal(FieldStatus.Number, status);
        Assert.Equal(BitConverter.DoubleToInt64Bits(expected), BitConverter.DoubleToInt64Bits(parsed));
    }

    [Property(MaxTest = 2000)]
    public void FastRowParser_RowsOfDoubles_AgreeWithTheRuntime(double a, double b, byte digits)
    {
        if (!double.IsFinite(a) || !double.IsFinite(b))
        {
            return;
        }

        var format = (digits % 3) switch { 0 => "0.000000e+00", 1 => "R", _ => "F" + (digits % 9) };
        var ta = a.ToString(format, CultureInfo.InvariantCulture);
        var tb = b.ToString(format, CultureInfo.InvariantCulture);
        var row = new double[2];
        var exponent = int.MinValue;

        if (FastRowParser.TryParse(System.Text.Encoding.ASCII.GetBytes(ta + "," + tb), (byte)',', (byte)'.', row, 0, ref exponent))
        {
            Assert.Equal(double.Parse(ta, CultureInfo.InvariantCulture), row[0]);
            Assert.Equal(double.Parse(tb, CultureInfo.InvariantCulture), row[1]);
        }
    }

    [Theory]
    [InlineData("1.5", 1.5)]
    [InlineData("-0.25", -0.25)]
    [InlineData("+3", 3)]
    [InlineData(".5", 0.5)]
    [InlineData("5.", 5)]
    [InlineData("1e3", 1000)]
    [InlineData("\"2.5\"", 2.5)]
    [InlineData("  7  ", 7)]
    [InlineData("9007199254740993", 9007199254740992)]
    [InlineData("1.7976931348623157e308", double.MaxValue)]
    [InlineData("4.9406564584124654e-324", double.Epsilon)]
    [InlineData("0.1000000000000000055511151231257827", 0.1)]
    public void NumberParser_Spellings_ParseExactly(string text, double expected)
    {
        // 9007199254740993 = 2^53 + 1 rounds to even, 2^53 (IEEE 754 round-half-even).
        var status = NumberParser.Parse(System.Text.Encoding.ASCII.GetBytes(text), (byte)'.', out var value, out _);

        Assert.Equal(FieldStatus.Number, status);
        Assert.Equal(expected, value);
    }

    [Theory]
    [InlineData("abc", "NotANumber")]
    [InlineData("1.2.3", "NotANumber")]
    [InlineData("1e", "NotANumber")]
    [InlineData("NaN", "NonFinite")]
    [InlineData("-inf", "NonFinite")]
    [InlineData("Infinity", "NonFinite")]
    [InlineData("1e400", "NonFinite")]
    [InlineData("1,5", "OtherDecimalSeparator")]
    [InlineData("", "Empty")]
    [InlineData("\"\"", "Empty")]
    public void NumberParser_NonNumbers_AreClassified(string text, string expected)
    {
        Assert.Equal(expected, NumberParser.Parse(System.Text.Encoding.ASCII.GetBytes(text), (byte)'.', out _, out _).ToString());
    }

    [Property(MaxTest = 100)]
    public void RoundTrip_QuantizedSignals_ReadBackWithinHalfAStep(int seed, byte bitsSeed)
    {
        // Write 8 to 12 bit quantized channels (as a scope stores them), read them back, compare within half a step.
        var bits = 8 + (bitsSeed % 5);
        var step = 20.0 / (1 << bits);
        var random = new Random(seed);
        const int rows = 500;
        var values = new double[rows, 2];
        var sb = new System.Text.StringBuilder("Sample interval: 1 us\nCH1 (V);CH2 (mV)\n");
        for (var i = 0; i < rows; i++)
        {
            values[i, 0] = Math.Round((8 * Math.Sin(i * 0.05) + random.NextDouble()) / step) * step;
            values[i, 1] = Math.Round(((2 * Math.Cos(i * 0.02)) + (0.1 * random.NextDouble())) / step) * step;
            sb.Append(values[i, 0].ToString("R", CultureInfo.InvariantCulture).Replace('.', ','))
              .Append(';')
              .Append((values[i, 1] * 1e3).ToString("G10", CultureInfo.InvariantCulture).Replace('.', ','))
              .Append('\n');
        }

        var result = CaptureReader.ReadFile(CaptureFileBuilder.WriteTemp(sb.ToString()));

        Assert.True(result.Success, string.Join("; ", result.Errors));
        var capture = result.Value;
        Assert.Equal(1e-6, Assert.IsType<UniformTimeBase>(capture.TimeBase).IntervalSeconds);
        for (var i = 0; i < rows; i++)
        {
            Assert.InRange(capture.Channels[0].Samples.Span[i] - values[i, 0], -step / 2, step / 2);
            Assert.InRange(capture.Channels[1].Samples.Span[i] - values[i, 1], -step / 2, step / 2);
        }
    }
}
