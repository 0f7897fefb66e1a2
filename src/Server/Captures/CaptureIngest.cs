using System.Security.Cryptography;
using System.Text.Json;
using Microsoft.AspNetCore.WebUtilities;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Options;
using Microsoft.Net.Http.Headers;
using Patchproof.Contracts.Captures;
using Patchproof.Core;
using Patchproof.Server.Data;
using Patchproof.Server.Storage;

namespace Patchproof.Server.Captures;

/// <summary>Takes one capture upload from the request stream to a stored, checked capture, or to a problem with nothing kept.</summary>
/// <remarks>
/// The file part is copied to a temporary file while its SHA-256 is computed, so memory use does not
/// grow with the file. Only when the reader accepts the file are the file and its samples moved into
/// the content-addressed store, and the row is written last, in one transaction.
/// </remarks>
internal sealed class CaptureIngest(
    PatchproofDbContext db,
    CaptureStore store,
    ICaptureFileReader reader,
    TimeProvider time,
    IOptions<PatchproofOptions> options)
{
    private const int CopyBufferBytes = 128 * 1024;
    private const int TextSniffBytes = 8192;

    private static readonly string[] AcceptedPartTypes =
        ["text/", "application/csv", "application/vnd.ms-excel", "application/octet-stream", "application/x-csv"];

    private CaptureLimits Limits => options.Value.Captures;

    public async Task<CaptureIngestOutcome> IngestMultipartAsync(Guid boardId, HttpRequest request, CancellationToken cancellationToken)
    {
        if (!MediaTypeHeaderValue.TryParse(request.ContentType, out var mediaType)
            || !mediaType.MediaType.Equals("multipart/form-data", StringComparison.OrdinalIgnoreCase)
            || HeaderUtilities.RemoveQuotes(mediaType.Boundary).Value is not { Length: > 0 } boundary)
        {
            return CaptureIngestOutcome.Problem(StatusCodes.Status415UnsupportedMediaType, "Unsupported media type",
                "Upload a capture as multipart/form-data with the file in a part named 'file'.");
        }

        if (request.ContentLength > Limits.MaxUploadBytes + 1024 * 1024)
        {
            return TooLarge();
        }

        var multipart = new MultipartReader(boundary, request.Body) { BodyLengthLimit = Limits.MaxUploadBytes + 1 };
        MultipartSection? section;
        while ((section = await multipart.ReadNextSectionAsync(cancellationToken)) is not null)
        {
            if (ContentDispositionHeaderValue.TryParse(section.ContentDisposition, out var disposition)
                && disposition.IsFileDisposition()
                && string.Equals(HeaderUtilities.RemoveQuotes(disposition.Name).Value, "file", StringComparison.OrdinalIgnoreCase))
            {
                var fileName = HeaderUtilities.RemoveQuotes(disposition.FileNameStar.HasValue ? disposition.FileNameStar : disposition.FileName).Value ?? "capture.csv";
                if (section.ContentType is { } partType && !AcceptedPartTypes.Any(t => partType.StartsWith(t, StringComparison.OrdinalIgnoreCase)))
                {
                    return CaptureIngestOutcome.Problem(StatusCodes.Status415UnsupportedMediaType, "Not a capture file",
                        $"'{Label(fileName)}' was sent as {partType}; a capture is a CSV text file.");
                }

                return await IngestFileAsync(boardId, Label(fileName), section.Body, cancellationToken);
            }
        }

        return CaptureIngestOutcome.Problem(StatusCodes.Status400BadRequest, "No file", "The upload has no file part named 'file'.");
    }

    /// <summary>Stores a capture from a stream that holds just the file (the demo data, for one).</summary>
    public async Task<CaptureIngestOutcome> IngestFileAsync(Guid boardId, string fileName, Stream body, CancellationToken cancellationToken)
    {
        var tempCsv = store.NewTempPath(".csv");
        var tempSamples = store.NewTempPath(".samples");
        try
        {
            var copied = await CopyHashingAsync(body, tempCsv, cancellationToken);
            if (copied.Problem is { } copyProblem)
            {
                return copyProblem;
            }

            var reading = await reader.ReadAsync(tempCsv, fileName, tempSamples, cancellationToken);
            if (!reading.Success)
            {
                return CaptureIngestOutcome.Unreadable(fileName, reading.Errors);
            }

            if (reading.RowCount > Limits.MaxRows)
            {
                return CaptureIngestOutcome.Problem(StatusCodes.Status413PayloadTooLarge, "Capture too long",
                    $"'{fileName}' has {reading.RowCount} rows; at most {Limits.MaxRows} are accepted.");
            }

            store.Commit(tempCsv, store.CsvPathOf(copied.Sha256));
            store.Commit(tempSamples, store.SamplesPathOf(copied.Sha256));

            var capture = new CaptureRecord
            {
                Id = Guid.NewGuid(),
                BoardId = boardId,
                FileName = fileName,
                Sha256 = copied.Sha256,
                SizeBytes = copied.Length,
                RowCount = reading.RowCount,
                ChannelsJson = JsonSerializer.Serialize(reading.Channels),
                SampleIntervalSeconds = reading.SampleIntervalSeconds,
                DurationSeconds = reading.DurationSeconds,
                ChecksJson = JsonSerializer.Serialize(reading.Checks),
                UploadedAtUnixMs = TimeStamps.ToUnixMs(time.GetUtcNow()),
            };
            db.Captures.Add(capture);
            await db.SaveChangesAsync(cancellationToken);
            return CaptureIngestOutcome.Stored(ToResponse(capture));
        }
        catch (InvalidDataException)
        {
            // The multipart reader's own length limit on the section.
            return TooLarge();
        }
        catch (BadHttpRequestException exception) when (exception.StatusCode == StatusCodes.Status413PayloadTooLarge)
        {
            return TooLarge();
        }
        finally
        {
            CaptureStore.DeleteQuietly(tempCsv);
            CaptureStore.DeleteQuietly(tempSamples);
        }
    }

    private async Task<CopyResult> CopyHashingAsync(Stream body, string path, CancellationToken cancellationToken)
    {
        using var hash = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);
        var buffer = new byte[CopyBufferBytes];
        long length = 0;
        await using (var file = new FileStream(path, FileMode.CreateNew, FileAccess.Write, FileShare.None, 1, FileOptions.Asynchronous))
        {
            int read;
            while ((read = await body.ReadAsync(buffer, cancellationToken)) > 0)
            {
                if (length == 0 && Array.IndexOf(buffer, (byte)0, 0, Math.Min(read, TextSniffBytes)) >= 0)
                {
                    return new CopyResult(string.Empty, 0, CaptureIngestOutcome.Problem(StatusCodes.Status415UnsupportedMediaType, "Not a capture file",
                        "The file holds binary data; a capture is a CSV text file."));
                }

                length += read;
                if (length > Limits.MaxUploadBytes)
                {
                    return new CopyResult(string.Empty, 0, TooLarge());
                }

                hash.AppendData(buffer, 0, read);
                await file.WriteAsync(buffer.AsMemory(0, read), cancellationToken);
            }

            await file.FlushAsync(cancellationToken);
        }

        if (length == 0)
        {
            return new CopyResult(string.Empty, 0, CaptureIngestOutcome.Problem(StatusCodes.Status422UnprocessableEntity, "Empty capture", "The file is empty."));
        }

        return new CopyResult(Convert.ToHexStringLower(hash.GetHashAndReset()), length, null);
    }

    private CaptureIngestOutcome TooLarge() =>
        CaptureIngestOutcome.Problem(StatusCodes.Status413PayloadTooLarge, "Capture too large",
            $"A capture file may have at most {Limits.MaxUploadBytes} bytes.");

    // The name is kept only as a label: strip any folder part and control characters.
    private static string Label(string fileName)
    {
        var name = Path.GetFileName(fileName.Replace('\\', '/'));
        name = new string(name.Where(c => !char.IsControl(c)).ToArray());
        return string.IsNullOrWhiteSpace(name) ? "capture.csv" : name.Length > 200 ? name[..200] : name;
    }

    internal static CaptureResponse ToResponse(CaptureRecord capture) =>
        new(capture.Id, capture.BoardId, capture.FileName, capture.Sha256, capture.SizeBytes, capture.RowCount,
            JsonSerializer.Deserialize<List<CaptureChannelInfo>>(capture.ChannelsJson) ?? [],
            capture.SampleIntervalSeconds, capture.DurationSeconds,
            JsonSerializer.Deserialize<List<CaptureCheck>>(capture.ChecksJson) ?? [],
            TimeStamps.FromUnixMs(capture.UploadedAtUnixMs));

    private sealed record CopyResult(string Sha256, long Length, CaptureIngestOutcome? Problem);
}

/// <summary>The end of an upload: a stored capture, or a problem to answer with.</summary>
internal sealed record CaptureIngestOutcome(CaptureResponse? Capture, IResult? ProblemResult)
{
    public static CaptureIngestOutcome Stored(CaptureResponse capture) => new(capture, null);

    public static CaptureIngestOutcome Problem(int statusCode, string title, string detail) =>
        new(null, TypedResults.Problem(statusCode: statusCode, title: title, detail: detail));

    public static CaptureIngestOutcome Unreadable(string fileName, IReadOnlyList<SourceDiagnostic> errors) =>
        new(null, Apis.LocatedProblems.Unreadable($"'{fileName}' cannot be read as a capture", fileName, errors));
}
