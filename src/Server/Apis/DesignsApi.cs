using System.Text;
using System.Text.Json;
using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.EntityFrameworkCore;
using Patchproof.Contracts.Designs;
using Patchproof.Server.Data;
using Patchproof.Server.Designs;

namespace Patchproof.Server.Apis;

/// <summary>A board's design versions: each POST stores the request body as the next version.</summary>
internal static class DesignsApi
{
    /// <summary>The largest design document accepted, in bytes.</summary>
    public const int MaxDocumentBytes = 4 * 1024 * 1024;

    public static IEndpointRouteBuilder MapDesignEndpoints(this IEndpointRouteBuilder routes)
    {
        var designs = routes.MapGroup("/api/boards/{boardId:guid}/designs").WithTags("Designs");
        designs.MapGet("/", ListAsync).WithName("ListDesignVersions").WithSummary("Lists a board's design versions, newest first.");
        designs.MapPost("/", CreateAsync).WithName("CreateDesignVersion")
            .WithSummary("Stores the JSON request body (application/json), a design file or a design sheet with its design file, as the board's next design version; ?note= says what changed.")
            .ProducesProblem(StatusCodes.Status422UnprocessableEntity)
            .ProducesProblem(StatusCodes.Status413PayloadTooLarge);
        designs.MapGet("/latest", GetLatestAsync).WithName("GetLatestDesignVersion").WithSummary("Reads the newest design version with its document.");
        designs.MapGet("/{version:int}", GetAsync).WithName("GetDesignVersion").WithSummary("Reads one design version with its document.");
        return routes;
    }

    private static async Task<Results<Ok<List<DesignVersionSummary>>, ProblemHttpResult>> ListAsync(Guid boardId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        if (!await db.Boards.AnyAsync(b => b.Id == boardId, cancellationToken))
        {
            return ApiProblems.NotFound("board", boardId);
        }

        var rows = await db.DesignVersions.AsNoTracking()
            .Where(d => d.BoardId == boardId)
            .OrderByDescending(d => d.Version)
            .Select(d => new { d.BoardId, d.Version, d.Note, Length = d.Document.Length, d.CreatedAtUnixMs })
            .ToListAsync(cancellationToken);
        return TypedResults.Ok(rows.Select(r => new DesignVersionSummary(r.BoardId, r.Version, r.Note, r.Length, TimeStamps.FromUnixMs(r.CreatedAtUnixMs))).ToList());
    }

    private static async Task<Results<Ok<DesignVersionResponse>, ProblemHttpResult>> GetAsync(Guid boardId, int version, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var design = await db.DesignVersions.AsNoTracking().SingleOrDefaultAsync(d => d.BoardId == boardId && d.Version == version, cancellationToken);
        return design is null ? ApiProblems.NotFound("design version", $"{boardId}/{version}") : TypedResults.Ok(ToResponse(design));
    }

    private static async Task<Results<Ok<DesignVersionResponse>, ProblemHttpResult>> GetLatestAsync(Guid boardId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var design = await db.DesignVersions.AsNoTracking()
            .Where(d => d.BoardId == boardId)
            .OrderByDescending(d => d.Version)
            .FirstOrDefaultAsync(cancellationToken);
        return design is null ? ApiProblems.NotFound("design for board", boardId) : TypedResults.Ok(ToResponse(design));
    }

    private static async Task<Results<Created<DesignVersionSummary>, ProblemHttpResult, ValidationProblem>> CreateAsync(
        Guid boardId,
        string? note,
        HttpRequest request,
        PatchproofDbContext db,
        IDesignDocumentValidator validator,
        TimeProvider time,
        CancellationToken cancellationToken)
    {
        if (note is { Length: > 2000 })
        {
            return ApiProblems.Invalid("note", "'note' is longer than 2000 characters.");
        }

        if (request.ContentType is null || !request.ContentType.StartsWith("application/json", StringComparison.OrdinalIgnoreCase))
        {
            return TypedResults.Problem(statusCode: StatusCodes.Status415UnsupportedMediaType, title: "Unsupported media type",
                detail: "Send the design document as application/json.");
        }

        if (!await db.Boards.AnyAsync(b => b.Id == boardId, cancellationToken))
        {
            return ApiProblems.NotFound("board", boardId);
        }

        var document = await BoundedRequestBody.ReadTextAsync(request, MaxDocumentBytes, cancellationToken);
        if (document is null)
        {
            return TypedResults.Problem(statusCode: StatusCodes.Status413PayloadTooLarge, title: "Design too large",
                detail: $"A design document may have at most {MaxDocumentBytes} bytes.");
        }

        // The design screen sends a sheet (its part values over the design file it came from); store the design file it makes.
        var file = DesignSheetsApi.DesignFileOf(document);
        if (!file.TryGetValue(out var designFile))
        {
            return DesignSheetsApi.AreFieldErrors(file.Errors)
                ? DesignSheetsApi.FieldProblem(file.Errors)
                : LocatedProblems.Unreadable("The design sheet cannot be stored", file.Errors[0].File, file.Errors);
        }

        document = designFile;
        var errors = validator.Validate(document);
        if (errors.Count > 0)
        {
            return LocatedProblems.Unreadable("The design document cannot be stored", null, errors);
        }

        // Two writers may pick the same next number; the unique index turns the loser into a retry.
        for (var attempt = 0; ; attempt++)
        {
            var next = (await db.DesignVersions.Where(d => d.BoardId == boardId).MaxAsync(d => (int?)d.Version, cancellationToken) ?? 0) + 1;
            var design = new DesignVersionRecord
            {
                Id = Guid.NewGuid(),
                BoardId = boardId,
                Version = next,
                Note = note,
                Document = document,
                CreatedAtUnixMs = TimeStamps.ToUnixMs(time.GetUtcNow()),
            };
            db.DesignVersions.Add(design);
            try
            {
                await db.SaveChangesAsync(cancellationToken);
                var summary = new DesignVersionSummary(boardId, next, note, document.Length, TimeStamps.FromUnixMs(design.CreatedAtUnixMs));
                return TypedResults.Created($"/api/boards/{boardId}/designs/{next}", summary);
            }
            catch (DbUpdateException) when (attempt < 4)
            {
                db.Entry(design).State = EntityState.Detached;
            }
        }
    }

    private static DesignVersionResponse ToResponse(DesignVersionRecord design)
    {
        using var parsed = JsonDocument.Parse(design.Document);
        return new DesignVersionResponse(design.BoardId, design.Version, design.Note, TimeStamps.FromUnixMs(design.CreatedAtUnixMs), parsed.RootElement.Clone());
    }
}
