using System.Text;
using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.EntityFrameworkCore;
using Patchproof.Contracts.Benches;
using Patchproof.Core.Captures.Calibration;
using Patchproof.Server.Data;
using Patchproof.Server.Storage;

namespace Patchproof.Server.Apis;

/// <summary>A bench's probe calibrations (docs/probe-calibration.md): upload one made by <c>patchproof calibrate</c>, read the newest.
/// Fits of the bench's boards use the newest one.</summary>
internal static class ProbeCalibrationsApi
{
    private const int MaxDocumentBytes = 1 << 20;

    public static IEndpointRouteBuilder MapProbeCalibrationEndpoints(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/benches/{benchId:guid}/probe-calibrations").WithTags("Probe calibrations");
        group.MapPost("/", UploadAsync).WithName("UploadProbeCalibration").WithSummary("Stores a probe calibration file for the bench; later fits of its boards use the newest one.");
        group.MapGet("/newest", NewestAsync).WithName("GetNewestProbeCalibration").WithSummary("Reads the bench's newest probe calibration file.");
        return routes;
    }

    private static async Task<Results<Created<ProbeCalibrationSummary>, ProblemHttpResult>> UploadAsync(
        Guid benchId, HttpRequest request, PatchproofDbContext db, ProbeCalibrationStore store, CancellationToken cancellationToken)
    {
        if (request.ContentType is null || !request.ContentType.StartsWith("application/json", StringComparison.OrdinalIgnoreCase))
        {
            return TypedResults.Problem(statusCode: StatusCodes.Status415UnsupportedMediaType, title: "Unsupported media type",
                detail: "Send the calibration file as application/json.");
        }

        if (!await db.Benches.AnyAsync(b => b.Id == benchId, cancellationToken))
        {
            return ApiProblems.NotFound("bench", benchId);
        }

        var document = await ReadBodyAsync(request, cancellationToken);
        if (document is null)
        {
            return TypedResults.Problem(statusCode: StatusCodes.Status413PayloadTooLarge, title: "Calibration too large",
                detail: $"A calibration file may have at most {MaxDocumentBytes} bytes.");
        }

        var read = ProbeCalibrationFile.Read(document);
        if (!read.TryGetValue(out var calibration))
        {
            return LocatedProblems.Unreadable("The probe calibration cannot be stored", null, read.Errors);
        }

        var uploaded = store.Save(benchId, document);
        return TypedResults.Created($"/api/benches/{benchId}/probe-calibrations/newest", Summary(benchId, calibration, uploaded));
    }

    private static async Task<Results<ContentHttpResult, ProblemHttpResult>> NewestAsync(Guid benchId, PatchproofDbContext db, ProbeCalibrationStore store, CancellationToken cancellationToken)
    {
        if (!await db.Benches.AnyAsync(b => b.Id == benchId, cancellationToken))
        {
            return ApiProblems.NotFound("bench", benchId);
        }

        return store.Newest(benchId) is { } newest
            ? TypedResults.Text(newest.Document, "application/json", Encoding.UTF8)
            : ApiProblems.NotFound("probe calibration of bench", benchId);
    }

    private static ProbeCalibrationSummary Summary(Guid benchId, ProbeCalibration calibration, DateTimeOffset uploaded) =>
        new(benchId, calibration.ReferenceChannel, calibration.Channels.Select(c => c.Channel).ToList(), calibration.CreatedAt, uploaded);

    private static async Task<string?> ReadBodyAsync(HttpRequest request, CancellationToken cancellationToken)
    {
        if (request.ContentLength > MaxDocumentBytes)
        {
            return null;
        }

        using var buffer = new MemoryStream();
        var chunk = new byte[16384];
        int read;
        while ((read = await request.Body.ReadAsync(chunk, cancellationToken)) > 0)
        {
            if (buffer.Length + read > MaxDocumentBytes)
            {
                return null;
            }

            buffer.Write(chunk, 0, read);
        }

        return Encoding.UTF8.GetString(buffer.GetBuffer(), 0, (int)buffer.Length).TrimStart('\uFEFF');
    }
}

