using System.Text.Json;
using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.EntityFrameworkCore;
using Patchproof.Contracts.Captures;
using Patchproof.Contracts.Fits;
using Patchproof.Core.Circuits.Files;
using Patchproof.Server.Data;
using Patchproof.Server.Fits;

namespace Patchproof.Server.Apis;

/// <summary>Fits: start one as a background job, follow its progress, cancel it, read its result.</summary>
internal static class FitsApi
{
    private const int MaxCapturesPerFit = 16;

    public static IEndpointRouteBuilder MapFitEndpoints(this IEndpointRouteBuilder routes)
    {
        var fits = routes.MapGroup("/api/fits").WithTags("Fits");
        fits.MapPost("/", StartAsync).WithName("StartFit").WithSummary("Queues a fit of a design version against one or more captures of a board.");
        fits.MapGet("/{fitId:guid}", GetAsync).WithName("GetFit").WithSummary("Reads a fit's state and progress (poll this while it runs).");
        fits.MapPost("/{fitId:guid}/cancel", CancelAsync).WithName("CancelFit").WithSummary("Cancels a fit: a queued one at once, a running one within a heartbeat.");
        fits.MapGet("/{fitId:guid}/result", GetResultAsync).WithName("GetFitResult").WithSummary("Reads the result of a fit that succeeded.");
        routes.MapGet("/api/boards/{boardId:guid}/fits", ListForBoardAsync)
            .WithTags("Fits").WithName("ListBoardFits").WithSummary("Lists a board's fits, newest first.");
        return routes;
    }

    internal static async Task<FitResponse?> FindAsync(PatchproofDbContext db, Guid fitId, CancellationToken cancellationToken)
    {
        var fit = await Query(db.FitJobs.Where(f => f.Id == fitId)).SingleOrDefaultAsync(cancellationToken);
        return fit is null ? null : ToResponse(fit);
    }

    private static async Task<Results<Accepted<FitResponse>, ValidationProblem, ProblemHttpResult>> StartAsync(
        StartFitRequest request,
        PatchproofDbContext db,
        FitJobSignal signal,
        TimeProvider time,
        IServiceProvider services,
        CancellationToken cancellationToken)
    {
        if (services.GetService<IFitJobExecutor>() is null)
        {
            return TypedResults.Problem(statusCode: StatusCodes.Status501NotImplemented, title: "Fitting is not available",
                detail: "This server has no fit engine; fits cannot be started.");
        }

        var captureIds = request.CaptureIds ?? [];
        if (captureIds.Count is 0 or > MaxCapturesPerFit || captureIds.Distinct().Count() != captureIds.Count)
        {
            return ApiProblems.Invalid("captureIds", $"Give 1 to {MaxCapturesPerFit} different captures.");
        }

        if (!await db.Boards.AnyAsync(b => b.Id == request.BoardId, cancellationToken))
        {
            return ApiProblems.NotFound("board", request.BoardId);
        }

        var design = await db.DesignVersions.AsNoTracking()
            .SingleOrDefaultAsync(d => d.BoardId == request.BoardId && d.Version == request.DesignVersion, cancellationToken);
        if (design is null)
        {
            return ApiProblems.NotFound("design version", $"{request.BoardId}/{request.DesignVersion}");
        }

        var found = await db.Captures.AsNoTracking().Where(c => captureIds.Contains(c.Id) && c.BoardId == request.BoardId)
            .Select(c => new { c.Id, c.FileName, c.ChannelsJson }).ToListAsync(cancellationToken);
        var missing = captureIds.Except(found.Select(c => c.Id)).ToList();
        if (missing.Count > 0)
        {
            return ApiProblems.NotFound("capture of this board", missing[0]);
        }

        var mapping = request.Mapping ?? [];
        if (mapping.Count > 0)
        {
            var read = DesignFileReader.Read(design.Document, $"design version {design.Version}");
            if (!read.TryGetValue(out var board))
            {
                return LocatedProblems.Unreadable("The stored design cannot be read", $"design version {design.Version}", read.Errors);
            }

            var channels = captureIds.Select(id => found.Single(c => c.Id == id))
                .Select(c => (c.FileName, (IReadOnlyList<string>)(JsonSerializer.Deserialize<List<CaptureChannelInfo>>(c.ChannelsJson) ?? []).Select(ch => ch.Name).ToList()))
                .ToList();
            var errors = FitMappingRules.Check(mapping, board.Variables.Select(v => v.Name).ToList(), channels);
            if (errors.Count > 0)
            {
                return ApiProblems.Invalid(errors);
            }
        }

        var fit = new FitJobRecord
        {
            Id = Guid.NewGuid(),
            BoardId = request.BoardId,
            DesignVersionId = design.Id,
            State = FitState.Queued,
            IgnoreBenchCalibration = request.IgnoreBenchCalibration,
            MappingJson = mapping.Count > 0 ? FitMappingJson.Write(mapping) : null,
            CreatedAtUnixMs = TimeStamps.ToUnixMs(time.GetUtcNow()),
            Captures = captureIds.Select((id, position) => new FitJobCaptureRecord { CaptureId = id, Position = position }).ToList(),
        };
        db.FitJobs.Add(fit);
        await db.SaveChangesAsync(cancellationToken);

        // The answer is the fit as accepted, built from what was just saved: a worker polling the queue may claim it
        // before the request ends, and a read-back would then race that claim.
        var response = ToResponse(new FitRow(fit.Id, fit.BoardId, design.Version, [.. captureIds], fit.State, fit.Progress, fit.Stage, fit.CancelRequested,
            fit.Attempts, fit.Error, HasResult: false, fit.CreatedAtUnixMs, fit.StartedAtUnixMs, fit.FinishedAtUnixMs, fit.IgnoreBenchCalibration, fit.MappingJson));
        signal.Notify();
        return TypedResults.Accepted($"/api/fits/{fit.Id}", response);
    }

    private static async Task<Results<Ok<FitResponse>, ProblemHttpResult>> GetAsync(Guid fitId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var fit = await FindAsync(db, fitId, cancellationToken);
        return fit is null ? ApiProblems.NotFound("fit", fitId) : TypedResults.Ok(fit);
    }

    private static async Task<Results<Ok<List<FitResponse>>, ProblemHttpResult>> ListForBoardAsync(Guid boardId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        if (!await db.Boards.AnyAsync(b => b.Id == boardId, cancellationToken))
        {
            return ApiProblems.NotFound("board", boardId);
        }

        var fits = await Query(db.FitJobs.Where(f => f.BoardId == boardId).OrderByDescending(f => f.CreatedAtUnixMs)).ToListAsync(cancellationToken);
        return TypedResults.Ok(fits.Select(ToResponse).ToList());
    }

    private static async Task<Results<Accepted<FitResponse>, ProblemHttpResult>> CancelAsync(Guid fitId, PatchproofDbContext db, FitJobQueue queue, CancellationToken cancellationToken)
    {
        var state = await queue.RequestCancelAsync(fitId, cancellationToken);
        if (state is null)
        {
            return ApiProblems.NotFound("fit", fitId);
        }

        var fit = (await FindAsync(db, fitId, cancellationToken))!;
        if (state is FitState.Succeeded or FitState.Failed)
        {
            return ApiProblems.Conflict("Fit already finished", $"The fit ended as {state} before the cancel request.");
        }

        return TypedResults.Accepted($"/api/fits/{fitId}", fit);
    }

    private static async Task<Results<Ok<FitResultResponse>, ProblemHttpResult>> GetResultAsync(Guid fitId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var fit = await db.FitJobs.AsNoTracking()
            .Where(f => f.Id == fitId)
            .Select(f => new { f.State, f.ResultJson, f.FinishedAtUnixMs })
            .SingleOrDefaultAsync(cancellationToken);
        if (fit is null)
        {
            return ApiProblems.NotFound("fit", fitId);
        }

        if (fit.State != FitState.Succeeded || fit.ResultJson is null)
        {
            return ApiProblems.Conflict("No result", $"The fit is {fit.State}; only a fit that succeeded has a result.");
        }

        using var result = JsonDocument.Parse(fit.ResultJson);
        return TypedResults.Ok(new FitResultResponse(fitId, TimeStamps.FromUnixMs(fit.FinishedAtUnixMs ?? 0), result.RootElement.Clone()));
    }

    private static IQueryable<FitRow> Query(IQueryable<FitJobRecord> fits) =>
        fits.AsNoTracking().Select(f => new FitRow(
            f.Id,
            f.BoardId,
            f.DesignVersion!.Version,
            f.Captures.OrderBy(c => c.Position).Select(c => c.CaptureId).ToList(),
            f.State,
            f.Progress,
            f.Stage,
            f.CancelRequested,
            f.Attempts,
            f.Error,
            f.ResultJson != null,
            f.CreatedAtUnixMs,
            f.StartedAtUnixMs,
            f.FinishedAtUnixMs,
            f.IgnoreBenchCalibration,
            f.MappingJson));

    private static FitResponse ToResponse(FitRow f) =>
        new(f.Id, f.BoardId, f.DesignVersion, f.CaptureIds, f.State, f.Progress, f.Stage, f.CancelRequested, f.Attempts, f.Error, f.HasResult,
            TimeStamps.FromUnixMs(f.CreatedAtUnixMs), TimeStamps.FromUnixMs(f.StartedAtUnixMs), TimeStamps.FromUnixMs(f.FinishedAtUnixMs), f.IgnoreBenchCalibration,
            FitMappingJson.Read(f.MappingJson));

    private sealed record FitRow(
        Guid Id,
        Guid BoardId,
        int DesignVersion,
        List<Guid> CaptureIds,
        FitState State,
        double Progress,
        string? Stage,
        bool CancelRequested,
        int Attempts,
        string? Error,
        bool HasResult,
        long CreatedAtUnixMs,
        long? StartedAtUnixMs,
        long? FinishedAtUnixMs,
        bool IgnoreBenchCalibration,
        string? MappingJson);
}
