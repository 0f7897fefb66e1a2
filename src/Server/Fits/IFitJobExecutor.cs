using System.Text.Json;
using Patchproof.Contracts.Captures;

namespace Patchproof.Server.Fits;

/// <summary>Runs one fit: the seam the fit engine plugs into.</summary>
/// <remarks>
/// The runner calls <see cref="ExecuteAsync"/> on a worker after claiming the job. The executor
/// reports progress through <see cref="IProgress{T}"/>; the runner saves it, renews the lease and
/// passes on a cancel request through the token. A job may run again in another process after a
/// crash, so an executor must not have side effects outside its returned outcome.
/// When no executor is registered, the server refuses to start fits (501) instead of pretending.
/// </remarks>
internal interface IFitJobExecutor
{
    Task<FitJobOutcome> ExecuteAsync(FitJobInput input, IProgress<FitJobProgress> progress, CancellationToken cancellationToken);
}

/// <summary>What a fit works on: the design document and the stored captures.</summary>
/// <param name="FitId">The job.</param>
/// <param name="BoardId">The board.</param>
/// <param name="DesignVersion">The design version number.</param>
/// <param name="DesignDocument">The design document (JSON text).</param>
/// <param name="Captures">The captures in the order requested.</param>
/// <param name="Attempt">1 on the first run; higher when a previous process stopped mid-fit.</param>
/// <param name="BenchId">The board's bench, whose newest probe calibration the fit uses; null when unknown.</param>
/// <param name="IgnoreBenchCalibration">True when the fit was asked to keep every channel at the probe tolerance instead.</param>
/// <param name="Mapping">Which channel records which variable, with its sign; null or empty for file order (sign +1).</param>
internal sealed record FitJobInput(
    Guid FitId,
    Guid BoardId,
    int DesignVersion,
    string DesignDocument,
    IReadOnlyList<FitJobCapture> Captures,
    int Attempt,
    Guid? BenchId = null,
    bool IgnoreBenchCalibration = false,
    IReadOnlyList<ChannelMappingEntry>? Mapping = null);

/// <summary>A capture as a fit sees it: the file as received and the parsed samples beside it.</summary>
/// <param name="CaptureId">The capture.</param>
/// <param name="FileName">The uploader's file name (a label only).</param>
/// <param name="CsvPath">The stored file.</param>
/// <param name="SamplesPath">The parsed samples beside it.</param>
internal sealed record FitJobCapture(Guid CaptureId, string FileName, string CsvPath, string SamplesPath);

/// <summary>Progress of a running fit.</summary>
/// <param name="Fraction">Fraction done, 0 to 1.</param>
/// <param name="Stage">What the fit is doing, in words.</param>
internal sealed record FitJobProgress(double Fraction, string Stage);

/// <summary>How a fit ended: a result document, or the reason there is none.</summary>
internal sealed record FitJobOutcome
{
    private FitJobOutcome(JsonElement? result, string? error)
    {
        Result = result;
        Error = error;
    }

    public JsonElement? Result { get; }

    public string? Error { get; }

    public static FitJobOutcome Succeeded(JsonElement result) => new(result, null);

    public static FitJobOutcome Failed(string error) => new(null, error);
}
