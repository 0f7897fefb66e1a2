namespace Patchproof.Contracts.Captures;

/// <summary>A stored capture: the file as received and what the capture checks found.</summary>
/// <param name="Id">The capture's identifier.</param>
/// <param name="BoardId">The board it was taken from.</param>
/// <param name="FileName">The file name the uploader gave, kept as a label only (never used as a path).</param>
/// <param name="Sha256">The SHA-256 of the file's bytes in lower-case hex; the file is stored under it.</param>
/// <param name="SizeBytes">The file's length in bytes.</param>
/// <param name="RowCount">How many sample rows the reader took.</param>
/// <param name="ChannelNames">The channels, in file order.</param>
/// <param name="SampleIntervalSeconds">The sample interval, or null when the time base is not uniform.</param>
/// <param name="DurationSeconds">Time from the first to the last sample.</param>
/// <param name="Checks">What the reader and the capture checks reported: warnings and notes with their place in the file.</param>
/// <param name="UploadedAt">When it was stored (UTC).</param>
public sealed record CaptureResponse(
    Guid Id,
    Guid BoardId,
    string FileName,
    string Sha256,
    long SizeBytes,
    long RowCount,
    IReadOnlyList<string> ChannelNames,
    double? SampleIntervalSeconds,
    double DurationSeconds,
    IReadOnlyList<CaptureCheck> Checks,
    DateTimeOffset UploadedAt);

/// <summary>One finding of the capture reader or the capture checks, with its place in the file.</summary>
/// <param name="Severity">"info", "warning" or "error".</param>
/// <param name="Line">The 1-based line, or 0 when it concerns the whole file.</param>
/// <param name="Column">The 1-based column, or 0 when it concerns the whole line.</param>
/// <param name="Message">One sentence a person can act on.</param>
public sealed record CaptureCheck(string Severity, int Line, int Column, string Message);
