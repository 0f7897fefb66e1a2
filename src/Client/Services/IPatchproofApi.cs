using Patchproof.Client.Models;
using Patchproof.Contracts.Health;

namespace Patchproof.Client.Services;

/// <summary>The client's only way to the server: typed calls over HTTP.</summary>
/// <remarks>
/// Every call but the health check returns an <see cref="ApiResult{T}"/>: the value, or the problem the
/// server (or the network) reported. Pages show the problem in words; nothing here throws for a refusal.
/// </remarks>
public interface IPatchproofApi
{
    /// <summary>Reads <c>/api/health</c>.</summary>
    Task<HealthResponse> GetHealthAsync(CancellationToken cancellationToken = default);

    /// <summary>Lists the benches and classes.</summary>
    Task<ApiResult<IReadOnlyList<BenchSummary>>> ListBenchesAsync(CancellationToken cancellationToken = default);

    /// <summary>Reads one bench.</summary>
    Task<ApiResult<BenchSummary>> GetBenchAsync(Guid benchId, CancellationToken cancellationToken = default);

    /// <summary>Records a new bench or class.</summary>
    Task<ApiResult<BenchSummary>> CreateBenchAsync(NewBench bench, CancellationToken cancellationToken = default);

    /// <summary>Lists a bench's probe calibrations, newest (the one fits use) first; empty when it has none.</summary>
    Task<ApiResult<IReadOnlyList<ProbeCalibrationView>>> ListProbeCalibrationsAsync(Guid benchId, CancellationToken cancellationToken = default);

    /// <summary>Sends a calibration capture (one CSV, every probe on one node) for the server to calibrate and, when usable, keep as the bench's newest calibration.</summary>
    /// <param name="benchId">The bench.</param>
    /// <param name="file">The capture file.</param>
    /// <param name="details">The note, and for a square wave of known amplitude that amplitude and its accuracy.</param>
    /// <param name="cancellationToken">Stops the call.</param>
    Task<ApiResult<ProbeCalibrationView>> CalibrateProbesAsync(Guid benchId, UploadFile file, CalibrationCaptureDetails details, CancellationToken cancellationToken = default);

    /// <summary>Lists the boards of a bench.</summary>
    Task<ApiResult<IReadOnlyList<BoardSummary>>> ListBoardsAsync(Guid benchId, CancellationToken cancellationToken = default);

    /// <summary>Records a new board on a bench.</summary>
    Task<ApiResult<BoardSummary>> CreateBoardAsync(Guid benchId, NewBoard board, CancellationToken cancellationToken = default);

    /// <summary>Reads one board.</summary>
    Task<ApiResult<BoardSummary>> GetBoardAsync(Guid boardId, CancellationToken cancellationToken = default);

    /// <summary>Lists a board's design versions, newest first.</summary>
    Task<ApiResult<IReadOnlyList<DesignVersionEntry>>> ListDesignVersionsAsync(Guid boardId, CancellationToken cancellationToken = default);

    /// <summary>Reads one design version; null <paramref name="version"/> reads the newest.</summary>
    Task<ApiResult<DesignSheet>> GetDesignAsync(Guid boardId, int? version, CancellationToken cancellationToken = default);

    /// <summary>Stores a design as the board's next version.</summary>
    Task<ApiResult<DesignVersionEntry>> SaveDesignAsync(Guid boardId, DesignSheet design, string? note, CancellationToken cancellationToken = default);

    /// <summary>Runs the design check on a design (saved or not) and returns its results.</summary>
    Task<ApiResult<IReadOnlyList<DesignCheckNote>>> CheckDesignAsync(DesignSheet design, CancellationToken cancellationToken = default);

    /// <summary>Lists the built-in models a design can be generated from.</summary>
    Task<ApiResult<IReadOnlyList<BuiltInModelEntry>>> ListModelsAsync(CancellationToken cancellationToken = default);

    /// <summary>Generates a design (blocks and parts with nominal values) from a built-in model.</summary>
    Task<ApiResult<DesignSheet>> GenerateDesignAsync(string modelId, CancellationToken cancellationToken = default);

    /// <summary>Lists a board's captures, newest first.</summary>
    Task<ApiResult<IReadOnlyList<CaptureEntry>>> ListCapturesAsync(Guid boardId, CancellationToken cancellationToken = default);

    /// <summary>Uploads one capture file as a streamed multipart body, reporting progress as bytes go out.</summary>
    Task<ApiResult<CaptureEntry>> UploadCaptureAsync(Guid boardId, UploadFile file, IProgress<UploadProgress>? progress, CancellationToken cancellationToken = default);

    /// <summary>Runs the mapping check of a capture against a design version with the person's mapping.</summary>
    Task<ApiResult<MappingCheck>> CheckMappingAsync(Guid captureId, int designVersion, IReadOnlyList<ChannelMapping> mapping, CancellationToken cancellationToken = default);

    /// <summary>Lists a board's fits, newest first.</summary>
    Task<ApiResult<IReadOnlyList<FitJob>>> ListFitsAsync(Guid boardId, CancellationToken cancellationToken = default);

    /// <summary>Queues a fit of a design version against captures of the board.</summary>
    /// <param name="boardId">The board.</param>
    /// <param name="designVersion">The design version to fit.</param>
    /// <param name="captureIds">The captures to fit.</param>
    /// <param name="ignoreBenchCalibration">True to fit with every channel at the probe tolerance instead of the bench's newest probe calibration.</param>
    /// <param name="mapping">Which channel shows which variable, with its sign; channels marked unused are left out. Null or empty: the server takes the file order.</param>
    /// <param name="cancellationToken">Stops the call.</param>
    Task<ApiResult<FitJob>> StartFitAsync(
        Guid boardId,
        int designVersion,
        IReadOnlyList<Guid> captureIds,
        bool ignoreBenchCalibration = false,
        IReadOnlyList<ChannelMapping>? mapping = null,
        CancellationToken cancellationToken = default);

    /// <summary>Reads a fit's state and progress.</summary>
    Task<ApiResult<FitJob>> GetFitAsync(Guid fitId, CancellationToken cancellationToken = default);

    /// <summary>Asks the server to stop a fit.</summary>
    Task<ApiResult<FitJob>> CancelFitAsync(Guid fitId, CancellationToken cancellationToken = default);

    /// <summary>Reads the report of a fit that succeeded.</summary>
    Task<ApiResult<FitReportView>> GetReportAsync(Guid fitId, CancellationToken cancellationToken = default);

    /// <summary>Where the report of a fit can be downloaded.</summary>
    ReportExportLinks ExportLinks(Guid fitId);
}
