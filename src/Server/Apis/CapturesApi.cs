using Microsoft.AspNetCore.Http.Features;
using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Options;
using Patchproof.Contracts.Captures;
using Patchproof.Server.Captures;
using Patchproof.Server.Data;
using Patchproof.Server.Storage;

namespace Patchproof.Server.Apis;

/// <summary>Captures: upload (multipart, streamed to disk and checked), list, read, download as received.</summary>
internal static class CapturesApi
{
    public static IEndpointRouteBuilder MapCaptureEndpoints(this IEndpointRouteBuilder routes)
    {
        var boardCaptures = routes.MapGroup("/api/boards/{boardId:guid}/captures").WithTags("Captures");
        boardCaptures.MapPost("/", UploadAsync).WithName("UploadCapture")
            .WithSummary("Uploads one capture CSV (multipart/form-data, part 'file'); answers with the capture checks.")
            .Produces<CaptureResponse>(StatusCodes.Status201Created)
            .ProducesProblem(StatusCodes.Status413PayloadTooLarge)
            .ProducesProblem(StatusCodes.Status415UnsupportedMediaType)
            .ProducesProblem(StatusCodes.Status422UnprocessableEntity)
            .DisableAntiforgery();
        boardCaptures.MapGet("/", ListAsync).WithName("ListCaptures").WithSummary("Lists a board's captures, newest first.");

        var captures = routes.MapGroup("/api/captures").WithTags("Captures");
        captures.MapGet("/{captureId:guid}", GetAsync).WithName("GetCapture").WithSummary("Reads one capture with its checks.");
        captures.MapGet("/{captureId:guid}/file", DownloadAsync).WithName("DownloadCapture").WithSummary("Downloads the capture file exactly as it was received.");
        return routes;
    }

    private static async Task<IResult> UploadAsync(Guid boardId, HttpContext context, PatchproofDbContext db, CaptureIngest ingest, IOptions<PatchproofOptions> options, CancellationToken cancellationToken)
    {
        if (!await db.Boards.AnyAsync(b => b.Id == boardId, cancellationToken))
        {
            return ApiProblems.NotFound("board", boardId);
        }

        if (context.Features.Get<IHttpMaxRequestBodySizeFeature>() is { IsReadOnly: false } bodyLimit)
        {
            // Room for the multipart framing around the file itself.
            bodyLimit.MaxRequestBodySize = options.Value.Captures.MaxUploadBytes + (1024 * 1024);
        }

        var outcome = await ingest.IngestMultipartAsync(boardId, context.Request, cancellationToken);
        return outcome.Capture is { } capture
            ? TypedResults.Created($"/api/captures/{capture.Id}", capture)
            : outcome.ProblemResult!;
    }

    private static async Task<Results<Ok<List<CaptureResponse>>, ProblemHttpResult>> ListAsync(Guid boardId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        if (!await db.Boards.AnyAsync(b => b.Id == boardId, cancellationToken))
        {
            return ApiProblems.NotFound("board", boardId);
        }

        var captures = await db.Captures.AsNoTracking().Where(c => c.BoardId == boardId).OrderByDescending(c => c.UploadedAtUnixMs).ToListAsync(cancellationToken);
        return TypedResults.Ok(captures.Select(CaptureIngest.ToResponse).ToList());
    }

    private static async Task<Results<Ok<CaptureResponse>, ProblemHttpResult>> GetAsync(Guid captureId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var capture = await db.Captures.AsNoTracking().SingleOrDefaultAsync(c => c.Id == captureId, cancellationToken);
        return capture is null ? ApiProblems.NotFound("capture", captureId) : TypedResults.Ok(CaptureIngest.ToResponse(capture));
    }

    private static async Task<Results<PhysicalFileHttpResult, ProblemHttpResult>> DownloadAsync(Guid captureId, PatchproofDbContext db, CaptureStore store, CancellationToken cancellationToken)
    {
        var capture = await db.Captures.AsNoTracking().SingleOrDefaultAsync(c => c.Id == captureId, cancellationToken);
        if (capture is null)
        {
            return ApiProblems.NotFound("capture", captureId);
        }

        var path = store.CsvPathOf(capture.Sha256);
        if (!File.Exists(path))
        {
            return TypedResults.Problem(statusCode: StatusCodes.Status410Gone, title: "Capture file missing", detail: "The stored file of this capture is no longer in the data folder.");
        }

        return TypedResults.PhysicalFile(path, "text/csv", capture.FileName);
    }
}
