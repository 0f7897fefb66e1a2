namespace Patchproof.Client.Models;

/// <summary>Where a fit stands.</summary>
public enum FitJobState
{
    /// <summary>Waiting for the server to take it.</summary>
    Queued,

    /// <summary>Running.</summary>
    Running,

    /// <summary>Finished with a report.</summary>
    Succeeded,

    /// <summary>Finished without a report; the job says why.</summary>
    Failed,

    /// <summary>Stopped at someone's request.</summary>
    Cancelled,
}

/// <summary>A fit as its progress screen and the board history show it.</summary>
/// <param name="Id">The fit's identifier.</param>
/// <param name="BoardId">The board.</param>
/// <param name="DesignVersion">The design version fitted.</param>
/// <param name="CaptureIds">The captures fitted.</param>
/// <param name="State">Where it stands.</param>
/// <param name="Progress">Fraction done, 0 to 1.</param>
/// <param name="Stage">What it is doing now, in words, or null.</param>
/// <param name="CancelRequested">True once someone asked to stop it.</param>
/// <param name="Error">Why it failed, or null.</param>
/// <param name="HasReport">True when its report can be read.</param>
/// <param name="CreatedAt">When it was asked for.</param>
/// <param name="FinishedAt">When it ended, or null.</param>
public sealed record FitJob(
    Guid Id,
    Guid BoardId,
    int DesignVersion,
    IReadOnlyList<Guid> CaptureIds,
    FitJobState State,
    double Progress,
    string? Stage,
    bool CancelRequested,
    string? Error,
    bool HasReport,
    DateTimeOffset CreatedAt,
    DateTimeOffset? FinishedAt)
{
    /// <summary>True when the fit was asked not to use the bench's probe calibration.</summary>
    public bool IgnoresBenchCalibration { get; init; }

    /// <summary>The channel mapping the fit was started with, or null when it was started without one (file order).</summary>
    public IReadOnlyList<ChannelMapping>? Mapping { get; init; }

    /// <summary>True while the fit can still change: queued or running.</summary>
    public bool IsActive => State is FitJobState.Queued or FitJobState.Running;
}

/// <summary>Where a report can be downloaded in each export format.</summary>
/// <param name="JsonUrl">The report as JSON.</param>
/// <param name="CsvUrl">The coefficients and findings as CSV.</param>
/// <param name="HtmlUrl">A self-contained printable HTML page.</param>
public sealed record ReportExportLinks(string JsonUrl, string CsvUrl, string HtmlUrl);
