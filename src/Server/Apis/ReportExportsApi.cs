using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.EntityFrameworkCore;
using Patchproof.Contracts.Fits;
using Patchproof.Contracts.Reports;
using Patchproof.Server.Data;
using Patchproof.Server.Reports;

namespace Patchproof.Server.Apis;

/// <summary>A finished fit's report as CSV (coefficients and findings) and as a printable, self-contained HTML page.</summary>
internal static class ReportExportsApi
{
    public static IEndpointRouteBuilder MapReportExportEndpoints(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/api/fits/{fitId:guid}/report.csv", GetCsvAsync)
            .WithTags("Reports").WithName("GetFitReportCsv").WithSummary("The findings, coefficients, offsets and warnings of a fit that succeeded, as one CSV file.");
        routes.MapGet("/api/fits/{fitId:guid}/report.html", GetHtmlAsync)
            .WithTags("Reports").WithName("GetFitReportHtml").WithSummary("The report of a fit that succeeded as one printable HTML page with inline styles and plots.");
        return routes;
    }

    private static async Task<Results<FileContentHttpResult, ProblemHttpResult>> GetCsvAsync(Guid fitId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var loaded = await LoadAsync(fitId, db, cancellationToken);
        if (loaded.Problem is { } problem)
        {
            return problem;
        }

        var csv = ReportCsvWriter.Write(loaded.BoardCode, loaded.Document!);
        return TypedResults.File(System.Text.Encoding.UTF8.GetBytes(csv), "text/csv; charset=utf-8", $"{FileStem(loaded.BoardCode)}-fit-{fitId:N}.csv");
    }

    private static async Task<Results<ContentHttpResult, ProblemHttpResult>> GetHtmlAsync(Guid fitId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var loaded = await LoadAsync(fitId, db, cancellationToken);
        if (loaded.Problem is { } problem)
        {
            return problem;
        }

        return TypedResults.Content(ReportHtmlWriter.Write(loaded.BoardCode, loaded.BoardName, loaded.DesignVersion, loaded.CaptureFiles, loaded.FinishedAt, loaded.Document!), "text/html; charset=utf-8");
    }

    private static async Task<Loaded> LoadAsync(Guid fitId, PatchproofDbContext db, CancellationToken cancellationToken)
    {
        var job = await db.FitJobs.AsNoTracking()
            .Include(j => j.Board)
            .Include(j => j.DesignVersion)
            .Include(j => j.Captures).ThenInclude(c => c.Capture)
            .SingleOrDefaultAsync(j => j.Id == fitId, cancellationToken);
        if (job is null)
        {
            return new Loaded(ApiProblems.NotFound("fit", fitId));
        }

        if (job.State != FitState.Succeeded || job.ResultJson is null)
        {
            return new Loaded(ApiProblems.Conflict("No report", $"The fit is {job.State}; only a fit that succeeded has a report."));
        }

        using var parsed = System.Text.Json.JsonDocument.Parse(job.ResultJson);
        var document = FitResultJson.TryRead(parsed.RootElement);
        if (document is null)
        {
            return new Loaded(ApiProblems.Conflict("Report in another form", "This fit's result was written by another fit engine; only its JSON report is available."));
        }

        return new Loaded(null)
        {
            Document = document,
            BoardCode = job.Board?.Code ?? string.Empty,
            BoardName = job.Board?.Name ?? string.Empty,
            DesignVersion = job.DesignVersion?.Version ?? 0,
            CaptureFiles = job.Captures.OrderBy(c => c.Position).Select(c => c.Capture?.FileName ?? "?").ToList(),
            FinishedAt = TimeStamps.FromUnixMs(job.FinishedAtUnixMs ?? 0),
        };
    }

    private static string FileStem(string code) => new(code.Select(c => char.IsAsciiLetterOrDigit(c) || c == '-' ? char.ToLowerInvariant(c) : '-').ToArray());

    private sealed record Loaded(ProblemHttpResult? Problem)
    {
        public FitResultDocument? Document { get; init; }

        public string BoardCode { get; init; } = string.Empty;

        public string BoardName { get; init; } = string.Empty;

        public int DesignVersion { get; init; }

        public IReadOnlyList<string> CaptureFiles { get; init; } = [];

        public DateTimeOffset FinishedAt { get; init; }
    }
}
