using Microsoft.AspNetCore.Http.HttpResults;
using Patchproof.Core;

namespace Patchproof.Server.Apis;

/// <summary>Problem details for unreadable input: each error with its line and column.</summary>
internal static class LocatedProblems
{
    public static ProblemHttpResult Unreadable(string title, string? fileName, IReadOnlyList<SourceDiagnostic> errors, int statusCode = StatusCodes.Status422UnprocessableEntity)
    {
        var first = errors[0];
        var detail = errors.Count == 1
            ? $"Line {first.Line}, column {first.Column}: {first.Message}"
            : $"Line {first.Line}, column {first.Column}: {first.Message} ({errors.Count - 1} more errors listed)";
        var extensions = new Dictionary<string, object?>
        {
            ["file"] = fileName,
            ["line"] = first.Line,
            ["column"] = first.Column,
            ["errors"] = errors.Take(100).Select(e => new { line = e.Line, column = e.Column, message = e.Message }).ToList(),
        };
        return TypedResults.Problem(statusCode: statusCode, title: title, detail: detail, extensions: extensions);
    }
}
