using System.Text;
using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.AspNetCore.WebUtilities;
using Microsoft.EntityFrameworkCore;
using Microsoft.Net.Http.Headers;
using Patchproof.Core;
using Patchproof.Core.Captures;
using Patchproof.Contracts.Benches;
using Patchproof.Core.Captures.Calibration;
using Patchproof.Server.Data;
using Patchproof.Server.Storage;

namespace Patchproof.Server.Apis;

/// <summary>A bench's probe calibrations (docs/probe-calibration.md): upload one made by <c>patchproof calibrate</c>, or a
/// calibration capture for the server to calibrate; list them; read the newest. Fits of the bench's boards use the newest one.</summary>
internal static class ProbeCalibrationsApi
{
    private const int MaxDocumentBytes = 1 << 20;

    // A calibration capture is a few seconds of three channels: tens of megabytes at most, far below the board capture limit.
    private const long MaxCaptureBytes = 64L << 20;

    public static IEndpointRouteBuilder MapProbeCalibrationEndpoints(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/benches/{benchId:guid}/probe-calibrations").WithTags("Probe calibrations");
        group.MapPost("/", UploadAsync).WithName("UploadProbeCalibration").WithSummary("Stores a probe calibration file for the bench; later fits of its boards use the newest one.");
        group.MapGet("/", ListAsync).WithName("ListProbeCalibrations").WithSummary("Lists the bench's probe calibrations, newest first, with each channel's gain and check.");
        group.MapPost("/from-capture", CalibrateCaptureAsync).WithName("CalibrateProbeCapture")
            .WithSummary("Calibrates the probes from one capture CSV (multipart/form-data, part 'file'; every probe on one node) and stores the result when it is usable.")
            .Produces<ProbeCalibrationSummary>(StatusCodes.Status201Created)
            .ProducesProblem(StatusCodes.Status413PayloadTooLarge)
            .ProducesProblem(StatusCodes.Status415UnsupportedMediaType)
            .ProducesProblem(StatusCodes.Status422UnprocessableEntity)
            .DisableAntiforgery();
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

        var document = await BoundedRequestBody.ReadTextAsync(request, MaxDocumentBytes, cancellationToken);
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
        return TypedResults.Created($"/api/benches/{benchId}/probe-calibrations/newest", Summary(benchId, calibration, uploaded, []));
    }

    private static async Task<Results<Ok<List<ProbeCalibrationSummary>>, ProblemHttpResult>> ListAsync(Guid benchId, PatchproofDbContext db, ProbeCalibrationStore store, CancellationToken cancellationToken)
    {
        if (!await db.Benches.AnyAsync(b => b.Id == benchId, cancellationToken))
        {
            return ApiProblems.NotFound("bench", benchId);
        }

        return TypedResults.Ok(store.All(benchId).Select(entry => Summary(benchId, entry.Calibration, entry.UploadedAt, [])).ToList());
    }

    /// <summary>Reads the calibration capture into a temporary file, calibrates it and stores the calibration only when it is usable.</summary>
    /// <remarks>With <c>knownAmplitude</c> (the square wave's peak to peak, <c>10V</c>) and <c>amplitudeAccuracy</c> (<c>0.1%</c>), an
    /// absolute calibration: every probe on a square wave of known amplitude.</remarks>
    private static async Task<Results<Created<ProbeCalibrationSummary>, ValidationProblem, ProblemHttpResult>> CalibrateCaptureAsync(
        Guid benchId, HttpRequest request, string? note, string? reference, string? knownAmplitude, string? amplitudeAccuracy,
        PatchproofDbContext db, ProbeCalibrationStore store, TimeProvider time, CancellationToken cancellationToken)
    {
        var known = KnownAmplitudeNotation.Read(Blank(knownAmplitude), Blank(amplitudeAccuracy), "knownAmplitude", "amplitudeAccuracy");
        if (!known.IsValid)
        {
            return ApiProblems.Invalid(known.ErrorField!, known.Error!);
        }

        if (!MediaTypeHeaderValue.TryParse(request.ContentType, out var mediaType)
            || !mediaType.MediaType.Equals("multipart/form-data", StringComparison.OrdinalIgnoreCase)
            || HeaderUtilities.RemoveQuotes(mediaType.Boundary).Value is not { Length: > 0 } boundary)
        {
            return TypedResults.Problem(statusCode: StatusCodes.Status415UnsupportedMediaType, title: "Unsupported media type",
                detail: "Upload the calibration capture as multipart/form-data with the CSV in a part named 'file'.");
        }

        if (!await db.Benches.AnyAsync(b => b.Id == benchId, cancellationToken))
        {
            return ApiProblems.NotFound("bench", benchId);
        }

        var multipart = new MultipartReader(boundary, request.Body) { BodyLengthLimit = MaxCaptureBytes + 1 };
        MultipartSection? section;
        while ((section = await multipart.ReadNextSectionAsync(cancellationToken)) is not null)
        {
            if (ContentDispositionHeaderValue.TryParse(section.ContentDisposition, out var disposition)
                && disposition.IsFileDisposition()
                && string.Equals(HeaderUtilities.RemoveQuotes(disposition.Name).Value, "file", StringComparison.OrdinalIgnoreCase))
            {
                var fileName = Label(HeaderUtilities.RemoveQuotes(disposition.FileNameStar.HasValue ? disposition.FileNameStar : disposition.FileName).Value);
                var options = new ProbeCalibrationOptions
                {
                    ReferenceChannel = Blank(reference),
                    Note = Blank(note) ?? "",
                    KnownAmplitudeVolts = known.AmplitudeVolts,
                    KnownAmplitudeRelativeSd = known.RelativeSd,
                };
                return await CalibrateFileAsync(benchId, fileName, section.Body, options, store, time, cancellationToken);
            }
        }

        return TypedResults.Problem(statusCode: StatusCodes.Status400BadRequest, title: "No file", detail: "The upload has no file part named 'file'.");
    }

    private static async Task<Results<Created<ProbeCalibrationSummary>, ValidationProblem, ProblemHttpResult>> CalibrateFileAsync(
        Guid benchId, string fileName, Stream body, ProbeCalibrationOptions options, ProbeCalibrationStore store, TimeProvider time, CancellationToken cancellationToken)
    {
        var tempPath = store.NewTempPath();
        try
        {
            long length;
            try
            {
                length = await CopyLimitedAsync(body, tempPath, cancellationToken);
            }
            catch (InvalidDataException)
            {
                length = -1;
            }

            if (length < 0)
            {
                return TypedResults.Problem(statusCode: StatusCodes.Status413PayloadTooLarge, title: "Calibration capture too large",
                    detail: $"A calibration capture may have at most {MaxCaptureBytes / (1 << 20)} MiB; a few seconds of signal is enough.");
            }

            if (length == 0)
            {
                return TypedResults.Problem(statusCode: StatusCodes.Status422UnprocessableEntity, title: "Empty capture", detail: $"'{fileName}' is empty.");
            }

            ParseResult<Capture> read;
            await using (var stream = new FileStream(tempPath, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan))
            {
                read = CaptureReader.Read(stream, fileName);
            }

            if (!read.TryGetValue(out var capture))
            {
                return LocatedProblems.Unreadable("The calibration capture cannot be read", fileName, read.Errors);
            }

            var result = ProbeCalibrator.Calibrate(capture, [fileName], options, time);
            if (!result.IsUsable)
            {
                return TypedResults.Problem(
                    statusCode: StatusCodes.Status422UnprocessableEntity,
                    title: "The calibration capture is not usable",
                    detail: $"'{fileName}': {result.Findings.FirstOrDefault() ?? result.Status.ToString()} Nothing was stored.",
                    extensions: new Dictionary<string, object?>
                    {
                        ["file"] = fileName,
                        ["calibrationStatus"] = result.Status.ToString(),
                        ["errors"] = result.Findings,
                    });
            }

            var uploaded = store.Save(benchId, ProbeCalibrationFile.Write(result.Calibration!));
            return TypedResults.Created($"/api/benches/{benchId}/probe-calibrations/newest", Summary(benchId, result.Calibration!, uploaded, result.Findings));
        }
        finally
        {
            try
            {
                File.Delete(tempPath);
            }
            catch (IOException)
            {
                // A leftover temporary file is harmless; the upload's answer matters more.
            }
        }
    }

    private static async Task<long> CopyLimitedAsync(Stream body, string path, CancellationToken cancellationToken)
    {
        var buffer = new byte[1 << 16];
        long length = 0;
        await using var file = new FileStream(path, FileMode.CreateNew, FileAccess.Write, FileShare.None, 1, FileOptions.Asynchronous);
        int read;
        while ((read = await body.ReadAsync(buffer, cancellationToken)) > 0)
        {
            length += read;
            if (length > MaxCaptureBytes)
            {
                return -1;
            }

            await file.WriteAsync(buffer.AsMemory(0, read), cancellationToken);
        }

        return length;
    }

    private static string? Blank(string? text) => string.IsNullOrWhiteSpace(text) ? null : text.Trim();

    // The name is kept only as a label: strip any folder part and control characters.
    private static string Label(string? fileName)
    {
        var name = Path.GetFileName((fileName ?? "").Replace('\\', '/'));
        name = new string(name.Where(c => !char.IsControl(c)).ToArray());
        return string.IsNullOrWhiteSpace(name) ? "calibration.csv" : name.Length > 200 ? name[..200] : name;
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

    private static ProbeCalibrationSummary Summary(Guid benchId, ProbeCalibration calibration, DateTimeOffset uploaded, IReadOnlyList<string> findings)
    {
        var limits = new ProbeCalibrationOptions();
        return new ProbeCalibrationSummary(benchId, calibration.ReferenceChannel, calibration.Channels.Select(c => c.Channel).ToList(), calibration.CreatedAt, uploaded)
        {
            Note = calibration.Note,
            SampleCount = calibration.SampleCount,
            DurationSeconds = calibration.DurationSeconds,
            SourceFiles = calibration.SourceFiles,
            ChannelDetails = calibration.Channels.Select(c =>
            {
                var isReference = string.Equals(c.Channel, calibration.ReferenceChannel, StringComparison.OrdinalIgnoreCase);
                // A hand-written file may leave out the check's figures; then the check is unknown rather than failed.
                bool? follows = isReference || c.ExpectedResidualRmsVolts <= 0 ? null : ProbeCalibrator.FollowsReference(c, limits);
                return new ProbeChannelCalibrationSummary(c.Channel, isReference, c.Gain, c.GainSd, c.OffsetVolts, c.OffsetSdVolts, c.Correlation, c.ResidualRmsVolts, c.ExpectedResidualRmsVolts, follows);
            }).ToList(),
            Findings = findings,
            KnownAmplitude = calibration.Absolute is { } absolute
                ? new ProbeCalibrationKnownAmplitudeSummary(absolute.KnownAmplitudeVolts, absolute.KnownAmplitudeRelativeSd, absolute.HighLevelVolts, absolute.LowLevelVolts, absolute.ReferenceGain, absolute.ReferenceGainSd)
                : null,
        };
    }
}

