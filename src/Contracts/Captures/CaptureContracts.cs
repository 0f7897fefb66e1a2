namespace Patchproof.Contracts.Captures;

/// <summary>A stored capture: the file as received and what the reader and the capture checks found.</summary>
/// <param name="Id">The capture's identifier.</param>
/// <param name="BoardId">The board it was taken from.</param>
/// <param name="FileName">The file name the uploader gave, kept as a label only (never used as a path).</param>
/// <param name="Sha256">The SHA-256 of the file's bytes in lower-case hex; the file is stored under it.</param>
/// <param name="SizeBytes">The file's length in bytes.</param>
/// <param name="RowCount">How many samples per channel the reader took.</param>
/// <param name="Channels">The channels, in file order.</param>
/// <param name="SampleIntervalSeconds">The sample interval, or null when the time base is not uniform.</param>
/// <param name="DurationSeconds">Time from the first to the last sample.</param>
/// <param name="Checks">What the reader and the capture checks reported, in order.</param>
/// <param name="UploadedAt">When it was stored (UTC).</param>
public sealed record CaptureResponse(
    Guid Id,
    Guid BoardId,
    string FileName,
    string Sha256,
    long SizeBytes,
    long RowCount,
    IReadOnlyList<CaptureChannelInfo> Channels,
    double? SampleIntervalSeconds,
    double DurationSeconds,
    IReadOnlyList<CaptureCheck> Checks,
    DateTimeOffset UploadedAt);

/// <summary>One channel of a stored capture.</summary>
/// <param name="Name">The channel's name as the file gave it.</param>
/// <param name="Unit">"V" for voltages (already converted to volts and multiplied by the stated probe factor).</param>
/// <param name="SourceColumn">The 1-based column of the file that held it.</param>
public sealed record CaptureChannelInfo(string Name, string Unit, int SourceColumn);

/// <summary>One finding about a capture: a note of the reader with its place in the file, or the outcome of a capture check.</summary>
/// <param name="Id">"reader" for the reader's notes, otherwise the check's id (for example "clipping"; docs/captures.md lists them).</param>
/// <param name="Severity">"info", "warning" or "error".</param>
/// <param name="Channel">The channel concerned, or null for the whole capture.</param>
/// <param name="Line">The 1-based line in the file, or 0 when the finding is not about one line.</param>
/// <param name="Column">The 1-based column, or 0 when it concerns the whole line.</param>
/// <param name="Message">One sentence a person can act on.</param>
/// <param name="Values">The numbers behind the message, keyed by names that carry their unit; empty for reader notes.</param>
public sealed record CaptureCheck(
    string Id,
    string Severity,
    string? Channel,
    int Line,
    int Column,
    string Message,
    IReadOnlyDictionary<string, double> Values);
