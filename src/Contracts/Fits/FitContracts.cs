using System.Text.Json;
using System.Text.Json.Serialization;
using Patchproof.Contracts.Captures;

namespace Patchproof.Contracts.Fits;

/// <summary>Where a fit job stands.</summary>
[JsonConverter(typeof(JsonStringEnumConverter<FitState>))]
public enum FitState
{
    /// <summary>Waiting for a server process to take it.</summary>
    Queued,

    /// <summary>A server process is running it.</summary>
    Running,

    /// <summary>Finished with a result.</summary>
    Succeeded,

    /// <summary>Finished without a result; <see cref="FitResponse.Error"/> says why.</summary>
    Failed,

    /// <summary>Stopped at someone's request.</summary>
    Cancelled,
}

/// <summary>The body of <c>POST /api/fits</c>: which design version to fit against which captures.</summary>
/// <param name="BoardId">The board.</param>
/// <param name="DesignVersion">A version of the board's design.</param>
/// <param name="CaptureIds">One or more captures of the same board.</param>
/// <param name="IgnoreBenchCalibration">True to fit with every channel at the stated probe tolerance instead of the bench's
/// newest probe calibration; optional, false (use the calibration) when left out.</param>
/// <param name="Mapping">Which channel records which of the design's variables, with its sign; optional: left out or empty,
/// the channels are taken in file order for the variables in equation order, all with sign +1. A variable no channel
/// records is left out (it is fitted as a hidden state).</param>
public sealed record StartFitRequest(
    Guid BoardId,
    int DesignVersion,
    IReadOnlyList<Guid> CaptureIds,
    bool IgnoreBenchCalibration = false,
    IReadOnlyList<ChannelMappingEntry>? Mapping = null);

/// <summary>A fit job: its state, its progress and, once done, whether a result is there.</summary>
/// <param name="Id">The fit's identifier.</param>
/// <param name="BoardId">The board.</param>
/// <param name="DesignVersion">The design version fitted.</param>
/// <param name="CaptureIds">The captures fitted.</param>
/// <param name="State">Where the job stands.</param>
/// <param name="Progress">Fraction done, 0 to 1.</param>
/// <param name="Stage">What the job is doing now, in words, or null.</param>
/// <param name="CancelRequested">True once someone asked to cancel a running job.</param>
/// <param name="Attempts">How many times a server process took the job (more than 1 after a process stopped mid-fit).</param>
/// <param name="Error">Why the job failed, or null.</param>
/// <param name="HasResult">True when <c>GET /api/fits/{id}/result</c> has a result.</param>
/// <param name="CreatedAt">When the fit was requested (UTC).</param>
/// <param name="StartedAt">When a process last took it (UTC), or null.</param>
/// <param name="FinishedAt">When it reached a final state (UTC), or null.</param>
/// <param name="IgnoreBenchCalibration">True when the fit was asked not to use the bench's probe calibration.</param>
/// <param name="Mapping">The channel mapping the fit was started with, or null when it was started without one (file order).</param>
public sealed record FitResponse(
    Guid Id,
    Guid BoardId,
    int DesignVersion,
    IReadOnlyList<Guid> CaptureIds,
    FitState State,
    double Progress,
    string? Stage,
    bool CancelRequested,
    int Attempts,
    string? Error,
    bool HasResult,
    DateTimeOffset CreatedAt,
    DateTimeOffset? StartedAt,
    DateTimeOffset? FinishedAt,
    bool IgnoreBenchCalibration = false,
    IReadOnlyList<ChannelMappingEntry>? Mapping = null);

/// <summary>The result of a finished fit as the fit engine wrote it.</summary>
/// <param name="FitId">The fit.</param>
/// <param name="FinishedAt">When it finished (UTC).</param>
/// <param name="Result">The engine's result document (JSON).</param>
public sealed record FitResultResponse(Guid FitId, DateTimeOffset FinishedAt, JsonElement Result);
