namespace Patchproof.Core.Tests;

public sealed class ParseResultTests
{
    [Fact]
    public void Value_OnFailure_ThrowsWithTheFirstErrorsLocation()
    {
        var result = ParseResult<int>.ForError(SourceDiagnostic.ErrorAt("run.csv", 12, 3, "not a number"));

        var exception = Assert.Throws<InvalidOperationException>(() => result.Value);

        Assert.Contains("run.csv:12:3: not a number", exception.Message, StringComparison.Ordinal);
        Assert.False(result.TryGetValue(out _));
    }

    [Fact]
    public void ForValue_KeepsWarnings()
    {
        var warning = SourceDiagnostic.WarningAt("run.csv", 5, 0, "skipped 1 row");

        var result = ParseResult<int>.ForValue(42, [warning]);

        Assert.True(result.TryGetValue(out var value));
        Assert.Equal(42, value);
        Assert.Equal([warning], result.Warnings);
        Assert.Empty(result.Errors);
    }

    [Fact]
    public void ForErrors_Empty_IsACallersMistake()
    {
        Assert.Throws<ArgumentException>(() => ParseResult<int>.ForErrors([]));
    }
}
