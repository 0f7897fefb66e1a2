using System.Text.Json;
using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.EntityFrameworkCore;
using Patchproof.Contracts.Designs;
using Patchproof.Contracts.Fits;
using Patchproof.Contracts.Reports;
using Patchproof.Server.Captures;
using Patchproof.Server.Data;

namespace Patchproof.Server.Apis;

/// <summary>Reports of finished fits.</summary>
internal static class ReportsApi
{
    public static IEndpointRouteBuilder MapReportEndpoints(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/api/fits/{fitId:guid}/report", GetJsonAsync)
            .WithTags("Reports").WithName("GetFitReport")
            .WithSummary("The report of a fit that succeeded, as JSON: board, design version, captures with their checks, and the result.");
        return routes;
    }

    private static async Task<Results<Ok<FitReportResponse>, ProblemHttpResult>> GetJsonAsync(Guid fitId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var fit = await FitsApi.FindAsync(db, fitId, cancellationToken);
        if (fit is null)
        {
            return ApiProblems.NotFound("fit", fitId);
        }

        var job = await db.FitJobs.AsNoTracking().Include(j => j.DesignVersion).SingleAsync(j => j.Id == fitId, cancellationToken);
        if (fit.State != FitState.Succeeded || job.ResultJson is null)
        {
            return ApiProblems.Conflict("No report", $"The fit is {fit.State}; only a fit that succeeded has a report.");
        }

        var board = await BoardsApi.QueryResponses(db.Boards.Where(b => b.Id == fit.BoardId)).SingleAsync(cancellationToken);
        var design = job.DesignVersion!;
        var captures = await db.Captures.AsNoTracking().Where(c => fit.CaptureIds.Contains(c.Id)).ToListAsync(cancellationToken);
        using var result = JsonDocument.Parse(job.ResultJson);
        return TypedResults.Ok(new FitReportResponse(
            fit,
            board,
            new DesignVersionSummary(design.BoardId, design.Version, design.Note, design.Document.Length, TimeStamps.FromUnixMs(design.CreatedAtUnixMs)),
            fit.CaptureIds.Select(id => CaptureIngest.ToResponse(captures.Single(c => c.Id == id))).ToList(),
            result.RootElement.Clone()));
    }
}
