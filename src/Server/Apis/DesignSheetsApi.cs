using System.Text.Json;
using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.EntityFrameworkCore;
using Patchproof.Contracts.Designs;
using Patchproof.Core;
using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Checking;
using Patchproof.Core.Circuits.Files;
using Patchproof.Core.Circuits.Targets;
using Patchproof.Server.Data;
using Patchproof.Server.Designs;

namespace Patchproof.Server.Apis;

/// <summary>The design screen's view of a design (the sheet) and the design check of a design not yet stored.</summary>
internal static class DesignSheetsApi
{
    public static IEndpointRouteBuilder MapDesignSheetEndpoints(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/api/boards/{boardId:guid}/designs/{version:int}/sheet", GetSheetAsync)
            .WithTags("Designs").WithName("GetDesignSheet").WithSummary("One design version as the design screen edits it: equations, blocks, parts, and the design file.");
        routes.MapGet("/api/boards/{boardId:guid}/designs/latest/sheet", GetLatestSheetAsync)
            .WithTags("Designs").WithName("GetLatestDesignSheet").WithSummary("The newest design version as a sheet.");
        routes.MapPost("/api/designs/check", CheckAsync)
            .WithTags("Designs").WithName("CheckDesign")
            .WithSummary("Runs the design check on a sheet (with its design file in 'document') or on a design file; nothing is stored.");
        return routes;
    }

    /// <summary>A request body that is a sheet (an object with <c>document</c> and <c>parts</c>) becomes its design file; any other body is taken as a design file.</summary>
    public static ParseResult<string> DesignFileOf(string body)
    {
        JsonDocument parsed;
        try
        {
            parsed = JsonDocument.Parse(body, new JsonDocumentOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true });
        }
        catch (JsonException)
        {
            return ParseResult<string>.ForValue(body); // The design file reader names the line and column.
        }

        using (parsed)
        {
            var root = parsed.RootElement;
            if (root.ValueKind != JsonValueKind.Object || !root.TryGetProperty("document", out _) || !root.TryGetProperty("parts", out _))
            {
                return ParseResult<string>.ForValue(body);
            }

            DesignSheetDocument? sheet;
            try
            {
                sheet = root.Deserialize<DesignSheetDocument>(JsonSerializerOptions.Web);
            }
            catch (JsonException ex)
            {
                return ParseResult<string>.ForError(SourceDiagnostic.ErrorAt(ex.Path ?? "$", (int)(ex.LineNumber ?? 0) + 1, (int)(ex.BytePositionInLine ?? 0) + 1, "the sheet cannot be read: " + ex.Message));
            }

            return sheet is null ? ParseResult<string>.ForError(SourceDiagnostic.ErrorAt("$", 1, 1, "the sheet is empty")) : DesignSheets.ToDocument(sheet);
        }
    }

    /// <summary>True when the errors of <see cref="DesignFileOf"/> are the sheet's own field errors (no line), not the design file's.</summary>
    public static bool AreFieldErrors(IReadOnlyList<SourceDiagnostic> errors) => errors.All(e => e.Line == 0);

    /// <summary>Field errors of a sheet as a validation problem (400), keyed by field.</summary>
    public static ValidationProblem FieldProblem(IReadOnlyList<SourceDiagnostic> errors) =>
        ApiProblems.Invalid(errors.GroupBy(e => e.File ?? "$").ToDictionary(g => g.Key, g => g.Select(e => e.Message).ToArray()));

    private static async Task<Results<Ok<DesignSheetDocument>, ProblemHttpResult>> GetSheetAsync(Guid boardId, int version, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var design = await db.DesignVersions.AsNoTracking().SingleOrDefaultAsync(d => d.BoardId == boardId && d.Version == version, cancellationToken);
        return design is null ? ApiProblems.NotFound("design version", $"{boardId}/{version}") : Sheet(design);
    }

    private static async Task<Results<Ok<DesignSheetDocument>, ProblemHttpResult>> GetLatestSheetAsync(Guid boardId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var design = await db.DesignVersions.AsNoTracking().Where(d => d.BoardId == boardId).OrderByDescending(d => d.Version).FirstOrDefaultAsync(cancellationToken);
        return design is null ? ApiProblems.NotFound("design for board", boardId) : Sheet(design);
    }

    private static Results<Ok<DesignSheetDocument>, ProblemHttpResult> Sheet(DesignVersionRecord design)
    {
        var read = DesignFileReader.Read(design.Document, $"design version {design.Version}");
        return read.TryGetValue(out var board)
            ? TypedResults.Ok(DesignSheets.ToSheet(board, design.Document))
            : LocatedProblems.Unreadable("The stored design cannot be read", $"design version {design.Version}", read.Errors);
    }

    private static async Task<Results<Ok<List<DesignCheckNoteResponse>>, ProblemHttpResult, ValidationProblem>> CheckAsync(HttpRequest request, CancellationToken cancellationToken)
    {
        if (request.ContentType is null || !request.ContentType.StartsWith("application/json", StringComparison.OrdinalIgnoreCase))
        {
            return TypedResults.Problem(statusCode: StatusCodes.Status415UnsupportedMediaType, title: "Unsupported media type", detail: "Send the sheet or the design file as application/json.");
        }

        var body = await BoundedRequestBody.ReadTextAsync(request, DesignsApi.MaxDocumentBytes, cancellationToken);
        if (body is null)
        {
            return TypedResults.Problem(statusCode: StatusCodes.Status413PayloadTooLarge, title: "Design too large", detail: $"A design document may have at most {DesignsApi.MaxDocumentBytes} bytes.");
        }

        var file = DesignFileOf(body);
        if (!file.TryGetValue(out var document))
        {
            return AreFieldErrors(file.Errors) ? FieldProblem(file.Errors) : LocatedProblems.Unreadable("The sheet cannot be checked", file.Errors[0].File, file.Errors);
        }

        var read = DesignFileReader.Read(document, "request body");
        if (!read.TryGetValue(out var design))
        {
            return LocatedProblems.Unreadable("The design cannot be checked", "request body", read.Errors);
        }

        TargetSystem? target = null;
        if (design.Model is { } model)
        {
            DesignTargets.TryFind(model.Name, out target);
        }

        var report = DesignCheck.Check(design, target);
        var notes = read.Warnings.Select(w => new DesignCheckNoteResponse("warning", string.Empty, $"{w.Message} (line {w.Line}, column {w.Column})"))
            .Concat(report.Findings.Select(f => Note(f, design, report)))
            .ToList();
        return TypedResults.Ok(notes);
    }

    /// <summary>A finding about a part goes beside that part; one about a term lists the parts on the term's path (any of them may be off) and belongs to the whole design.</summary>
    private static DesignCheckNoteResponse Note(DesignFinding finding, BoardDesign design, DesignCheckReport report)
    {
        var severity = finding.IsError ? "error" : "note";
        if (design.FindPart(finding.Subject) is not null)
        {
            return new DesignCheckNoteResponse(severity, finding.Subject, finding.Message);
        }

        var parts = report.Terms.FirstOrDefault(t => t.Label == finding.Subject)?.Term?.PartIds.ToList() ?? [];
        return new DesignCheckNoteResponse(severity, string.Empty, parts.Count == 0 ? finding.Message : $"{finding.Message}; parts on its path: {string.Join(", ", parts)}");
    }
}
