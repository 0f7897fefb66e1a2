using System.Text.Json;
using Patchproof.Core.Circuits;
using Patchproof.TestSupport;

namespace Patchproof.Core.Tests.Circuits;

public sealed class ESeriesTests
{
    public static TheoryData<string> SeriesNames => ["E6", "E12", "E24", "E48", "E96"];

    [Theory]
    [MemberData(nameof(SeriesNames))]
    public void Mantissas_MatchIec60063Tables_Exactly(string name)
    {
        // Source: IEC 60063:2015 Tables 1 and 2, as transcribed in tests/ReferenceData/e-series.json.
        using var document = JsonDocument.Parse(File.ReadAllText(ReferenceDataFiles.PathOf("e-series.json")));
        var entry = document.RootElement.GetProperty("series").GetProperty(name);
        var expected = entry.GetProperty("values").EnumerateArray().Select(value => value.GetInt32()).ToArray();

        Assert.True(ESeries.TryFind(name, out var series));

        Assert.Equal(expected, series.Mantissas.ToArray());
        Assert.Equal(entry.GetProperty("tolerance_percent").GetDouble(), series.TolerancePercent);
    }

    [Fact]
    public void E96_FollowsTheRoundingRule()
    {
        // IEC 60063: E96 = round(100 * 10^(i/96)), i = 0..95 (rule verified in CHECKS.md).
        var expected = Enumerable.Range(0, 96).Select(i => (int)Math.Round(100 * Math.Pow(10, i / 96.0))).ToArray();

        Assert.Equal(expected, ESeries.E96.Mantissas.ToArray());
    }

    [Theory]
    [InlineData("E24", 4600.0, 4700.0)]
    [InlineData("E12", 5.0, 4.7)]
    [InlineData("E24", 5.0, 5.1)]
    [InlineData("E96", 1234.0, 1240.0)]
    public void Nearest_PublishedExamples_PickThePreferredValue(string name, double value, double expected)
    {
        // Source: nearest preferred values read from the IEC 60063 lists (CHECKS.md, "derived").
        Assert.True(ESeries.TryFind(name, out var series));

        Assert.Equal(expected, series.Nearest(value), 12);
    }

    [Theory]
    [InlineData(10e-9)]
    [InlineData(470e-9)]
    [InlineData(2.2e-12)]
    [InlineData(1e6)]
    [InlineData(0.047)]
    public void Nearest_ValueOnTheSeries_ReturnsItExactly(double value)
    {
        Assert.Equal(value, ESeries.E12.Nearest(value));
        Assert.True(ESeries.E12.Contains(value));
    }

    [Fact]
    public void Contains_ValueBetweenNeighbours_IsFalse()
    {
        Assert.False(ESeries.E24.Contains(4600));
        Assert.True(ESeries.E96.Contains(3570));
    }

    [Fact]
    public void HalfStep_E24_IsAboutFivePercent()
    {
        Assert.Equal(Math.Pow(10, 1.0 / 48) - 1, ESeries.E24.HalfStep, 15);
        Assert.InRange(ESeries.E24.HalfStep, 0.048, 0.05);
    }
}
