namespace Patchproof.Client.Models;

/// <summary>How serious a capture check is.</summary>
public enum CheckSeverity
{
    /// <summary>Worth knowing; nothing to do.</summary>
    Note,

    /// <summary>The capture can be used, but a result may be less certain.</summary>
    Warning,

    /// <summary>The capture cannot be used as it is.</summary>
    Error,
}

/// <summary>One thing the capture checks found, with its place in the file.</summary>
/// <param name="Severity">How serious it is.</param>
/// <param name="Line">The 1-based line, or 0 for the whole file.</param>
/// <param name="Column">The 1-based column, or 0 for the whole line.</param>
/// <param name="Message">One sentence a person can act on.</param>
public sealed record CaptureCheckEntry(CheckSeverity Severity, int Line, int Column, string Message)
{
    /// <summary>"line 12, column 3", "line 12" or "whole file".</summary>
    public string Place => (Line, Column) switch
    {
        (0, _) => "whole file",
        (_, 0) => $"line {Line}",
        _ => $"line {Line}, column {Column}",
    };
}

/// <summary>A stored capture as the board history and the upload screen show it.</summary>
/// <param name="Id">The capture's identifier.</param>
/// <param name="BoardId">The board it was taken from.</param>
/// <param name="FileName">The uploaded file's name (a label only).</param>
/// <param name="SizeBytes">The file's length in bytes.</param>
/// <param name="RowCount">How many sample rows were read.</param>
/// <param name="ChannelNames">The channels in file order.</param>
/// <param name="SampleIntervalSeconds">The sample interval, or null when the time base is not uniform.</param>
/// <param name="DurationSeconds">From the first to the last sample.</param>
/// <param name="Checks">What the capture checks found.</param>
/// <param name="UploadedAt">When it was stored.</param>
public sealed record CaptureEntry(
    Guid Id,
    Guid BoardId,
    string FileName,
    long SizeBytes,
    long RowCount,
    IReadOnlyList<string> ChannelNames,
    double? SampleIntervalSeconds,
    double DurationSeconds,
    IReadOnlyList<CaptureCheckEntry> Checks,
    DateTimeOffset UploadedAt)
{
    /// <summary>True when a check says the capture cannot be used.</summary>
    public bool HasErrors => Checks.Any(c => c.Severity == CheckSeverity.Error);

    /// <summary>True when a check warns.</summary>
    public bool HasWarnings => Checks.Any(c => c.Severity == CheckSeverity.Warning);
}

/// <summary>A file picked for upload, read through a stream so large files never sit in memory twice.</summary>
/// <param name="FileName">The file's name as the person's computer has it.</param>
/// <param name="SizeBytes">Its length in bytes.</param>
/// <param name="ContentType">Its media type as the browser reports it, or empty.</param>
/// <param name="OpenRead">Opens the file's bytes for reading.</param>
public sealed record UploadFile(string FileName, long SizeBytes, string ContentType, Func<Stream> OpenRead);

/// <summary>How far an upload has come.</summary>
/// <param name="FileName">The file being sent.</param>
/// <param name="SentBytes">Bytes sent so far.</param>
/// <param name="TotalBytes">The file's length in bytes.</param>
public sealed record UploadProgress(string FileName, long SentBytes, long TotalBytes)
{
    /// <summary>Fraction sent, 0 to 1.</summary>
    public double Fraction => TotalBytes <= 0 ? 1 : Math.Clamp((double)SentBytes / TotalBytes, 0, 1);
}

/// <summary>One channel's place in the model: which variable it shows, and with which sign.</summary>
/// <param name="Channel">The channel's name in the capture.</param>
/// <param name="Variable">The model variable it carries, or empty when it is not used.</param>
/// <param name="Sign">+1 when the channel shows the variable, -1 when it shows its negative (a board often outputs -y).</param>
public sealed record ChannelMapping(string Channel, string Variable, int Sign)
{
    /// <summary>"ch1 = -y", how a mapping reads on screen.</summary>
    public string ToText() => string.IsNullOrEmpty(Variable) ? $"{Channel} unused" : $"{Channel} = {(Sign < 0 ? "-" : "+")}{Variable}";

    /// <summary>True when the channel carries a variable.</summary>
    public bool IsUsed => !string.IsNullOrEmpty(Variable);
}

/// <summary>What the mapping check found: whether the person's mapping is the one that fits best.</summary>
/// <param name="AgreesWithGiven">True when no other assignment fits clearly better.</param>
/// <param name="Suggested">The assignment that fits best.</param>
/// <param name="Message">The check's conclusion in one or two sentences.</param>
public sealed record MappingCheck(bool AgreesWithGiven, IReadOnlyList<ChannelMapping> Suggested, string Message);
