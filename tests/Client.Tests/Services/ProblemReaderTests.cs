using Patchproof.Client.Services;

namespace Patchproof.Client.Tests.Services;

public sealed class ProblemReaderTests
{
    [Fact]
    public void Parse_ProblemWithLocatedErrors_KeepsLineAndColumn()
    {
        // RFC 9457 problem details, with an "errors" extension member of located messages.
        const string body = """{ "title": "The capture could not be read", "status": 422, "detail": "2 rows are malformed.", "errors": [ { "line": 14, "column": 3, "message": "'1.2.3' is not a number." } ] }""";

        var problem = ProblemReader.Parse(422, body, "fallback");

        Assert.Equal("The capture could not be read: 2 rows are malformed.", problem.ToText());
        Assert.Equal(["line 14, column 3: '1.2.3' is not a number."], problem.Locations);
    }

    [Fact]
    public void Parse_ProblemNamingItsFile_PutsTheFileBesideEachLocatedError()
    {
        const string body = """{ "title": "The calibration capture cannot be read", "file": "cal.csv", "line": 5, "column": 2, "errors": [ { "line": 5, "column": 2, "message": "'x' is not a number." } ] }""";

        var problem = ProblemReader.Parse(422, body, "fallback");

        Assert.Equal(["cal.csv, line 5, column 2: 'x' is not a number."], problem.Locations);
    }

    [Fact]
    public void Parse_ValidationDictionary_FlattensFieldMessages()
    {
        const string body = """{ "title": "One or more validation errors occurred.", "errors": { "Name": ["Required."] } }""";

        var problem = ProblemReader.Parse(400, body, "fallback");

        Assert.Equal(["Name: Required."], problem.Locations);
    }

    [Fact]
    public void Parse_BodyNotJson_UsesTheFallbackTitleAndKeepsTheText()
    {
        var problem = ProblemReader.Parse(502, "Bad gateway", "The server answered 502");

        Assert.Equal("The server answered 502", problem.Title);
        Assert.Equal("Bad gateway", problem.Detail);
    }

    [Fact]
    public void Parse_EmptyBody404_IsNotAvailable()
    {
        var problem = ProblemReader.Parse(404, "", "Not found on the server");

        Assert.True(problem.IsNotAvailable);
        Assert.Empty(problem.Locations);
    }
}
