using Patchproof.Client.Models;
using Patchproof.Client.Services;
using Patchproof.Contracts.Health;

namespace Patchproof.Client.Tests.Fakes;

/// <summary>An <see cref="IPatchproofApi"/> whose every answer a test sets, and which records what it was asked.</summary>
/// <remarks>An answer a test did not set comes back as a 501 problem, so a page that asks for it shows that state.</remarks>
internal sealed class FakePatchproofApi : IPatchproofApi
{
    public Task<HealthResponse> Health { get; set; } = Task.FromResult(new HealthResponse("ok", "0.1.0"));

    public Task<ApiResult<IReadOnlyList<BenchSummary>>> Benches { get; set; } = NotSet<IReadOnlyList<BenchSummary>>();

    public Task<ApiResult<BenchSummary>> Bench { get; set; } = NotSet<BenchSummary>();

    public Func<NewBench, Task<ApiResult<BenchSummary>>> CreateBench { get; set; } = _ => NotSet<BenchSummary>();

    public Task<ApiResult<IReadOnlyList<ProbeCalibrationView>>> Calibrations { get; set; } = NotSet<IReadOnlyList<ProbeCalibrationView>>();

    public Func<UploadFile, CalibrationCaptureDetails, Task<ApiResult<ProbeCalibrationView>>> Calibrate { get; set; } = (_, _) => NotSet<ProbeCalibrationView>();

    public bool? LastFitIgnoredBenchCalibration { get; private set; }

    public IReadOnlyList<ChannelMapping>? LastFitMapping { get; private set; }

    public Task<ApiResult<IReadOnlyList<BoardSummary>>> Boards { get; set; } = NotSet<IReadOnlyList<BoardSummary>>();

    public Func<NewBoard, Task<ApiResult<BoardSummary>>> CreateBoard { get; set; } = _ => NotSet<BoardSummary>();

    public Task<ApiResult<BoardSummary>> Board { get; set; } = NotSet<BoardSummary>();

    public Task<ApiResult<IReadOnlyList<DesignVersionEntry>>> DesignVersions { get; set; } = NotSet<IReadOnlyList<DesignVersionEntry>>();

    public Func<int?, Task<ApiResult<DesignSheet>>> Design { get; set; } = _ => NotSet<DesignSheet>();

    public Func<DesignSheet, string?, Task<ApiResult<DesignVersionEntry>>> SaveDesign { get; set; } = (_, _) => NotSet<DesignVersionEntry>();

    public Func<DesignSheet, Task<ApiResult<IReadOnlyList<DesignCheckNote>>>> CheckDesign { get; set; } = _ => NotSet<IReadOnlyList<DesignCheckNote>>();

    public Task<ApiResult<IReadOnlyList<BuiltInModelEntry>>> Models { get; set; } = NotSet<IReadOnlyList<BuiltInModelEntry>>();

    public Func<string, Task<ApiResult<DesignSheet>>> GenerateDesign { get; set; } = _ => NotSet<DesignSheet>();

    public Task<ApiResult<IReadOnlyList<CaptureEntry>>> Captures { get; set; } = NotSet<IReadOnlyList<CaptureEntry>>();

    public Func<UploadFile, IProgress<UploadProgress>?, Task<ApiResult<CaptureEntry>>> Upload { get; set; } = (_, _) => NotSet<CaptureEntry>();

    public Func<IReadOnlyList<ChannelMapping>, Task<ApiResult<MappingCheck>>> MappingCheck { get; set; } = _ => NotSet<MappingCheck>();

    public Task<ApiResult<IReadOnlyList<FitJob>>> Fits { get; set; } = NotSet<IReadOnlyList<FitJob>>();

    public Func<int, IReadOnlyList<Guid>, Task<ApiResult<FitJob>>> StartFit { get; set; } = (_, _) => NotSet<FitJob>();

    public Func<Task<ApiResult<FitJob>>> Fit { get; set; } = () => NotSet<FitJob>();

    public Func<Task<ApiResult<FitJob>>> CancelFit { get; set; } = () => NotSet<FitJob>();

    public Task<ApiResult<FitReportView>> Report { get; set; } = NotSet<FitReportView>();

    public int FitReads { get; private set; }

    public int CancelCalls { get; private set; }

    public static Task<ApiResult<T>> NotSet<T>() =>
        Task.FromResult(ApiResult<T>.Fail(501, "Not set in this test"));

    public static Task<ApiResult<T>> Ok<T>(T value) => Task.FromResult(ApiResult<T>.Ok(value));

    public static Task<ApiResult<T>> Problem<T>(int status, string title, string? detail = null) =>
        Task.FromResult(ApiResult<T>.Fail(status, title, detail));

    public static Task<ApiResult<T>> Never<T>() => new TaskCompletionSource<ApiResult<T>>().Task;

    public Task<HealthResponse> GetHealthAsync(CancellationToken cancellationToken = default) => Health;

    public Task<ApiResult<IReadOnlyList<BenchSummary>>> ListBenchesAsync(CancellationToken cancellationToken = default) => Benches;

    public Task<ApiResult<BenchSummary>> GetBenchAsync(Guid benchId, CancellationToken cancellationToken = default) => Bench;

    public Task<ApiResult<BenchSummary>> CreateBenchAsync(NewBench bench, CancellationToken cancellationToken = default) => CreateBench(bench);

    public Task<ApiResult<IReadOnlyList<ProbeCalibrationView>>> ListProbeCalibrationsAsync(Guid benchId, CancellationToken cancellationToken = default) => Calibrations;

    public Task<ApiResult<ProbeCalibrationView>> CalibrateProbesAsync(Guid benchId, UploadFile file, CalibrationCaptureDetails details, CancellationToken cancellationToken = default) => Calibrate(file, details);

    public Task<ApiResult<IReadOnlyList<BoardSummary>>> ListBoardsAsync(Guid benchId, CancellationToken cancellationToken = default) => Boards;

    public Task<ApiResult<BoardSummary>> CreateBoardAsync(Guid benchId, NewBoard board, CancellationToken cancellationToken = default) => CreateBoard(board);

    public Task<ApiResult<BoardSummary>> GetBoardAsync(Guid boardId, CancellationToken cancellationToken = default) => Board;

    public Task<ApiResult<IReadOnlyList<DesignVersionEntry>>> ListDesignVersionsAsync(Guid boardId, CancellationToken cancellationToken = default) => DesignVersions;

    public Task<ApiResult<DesignSheet>> GetDesignAsync(Guid boardId, int? version, CancellationToken cancellationToken = default) => Design(version);

    public Task<ApiResult<DesignVersionEntry>> SaveDesignAsync(Guid boardId, DesignSheet design, string? note, CancellationToken cancellationToken = default) => SaveDesign(design, note);

    public Task<ApiResult<IReadOnlyList<DesignCheckNote>>> CheckDesignAsync(DesignSheet design, CancellationToken cancellationToken = default) => CheckDesign(design);

    public Task<ApiResult<IReadOnlyList<BuiltInModelEntry>>> ListModelsAsync(CancellationToken cancellationToken = default) => Models;

    public Task<ApiResult<DesignSheet>> GenerateDesignAsync(string modelId, CancellationToken cancellationToken = default) => GenerateDesign(modelId);

    public Task<ApiResult<IReadOnlyList<CaptureEntry>>> ListCapturesAsync(Guid boardId, CancellationToken cancellationToken = default) => Captures;

    public Task<ApiResult<CaptureEntry>> UploadCaptureAsync(Guid boardId, UploadFile file, IProgress<UploadProgress>? progress, CancellationToken cancellationToken = default) => Upload(file, progress);

    public Task<ApiResult<MappingCheck>> CheckMappingAsync(Guid captureId, int designVersion, IReadOnlyList<ChannelMapping> mapping, CancellationToken cancellationToken = default) => MappingCheck(mapping);

    public Task<ApiResult<IReadOnlyList<FitJob>>> ListFitsAsync(Guid boardId, CancellationToken cancellationToken = default) => Fits;

    public Task<ApiResult<FitJob>> StartFitAsync(
        Guid boardId,
        int designVersion,
        IReadOnlyList<Guid> captureIds,
        bool ignoreBenchCalibration = false,
        IReadOnlyList<ChannelMapping>? mapping = null,
        CancellationToken cancellationToken = default)
    {
        LastFitIgnoredBenchCalibration = ignoreBenchCalibration;
        LastFitMapping = mapping;
        return StartFit(designVersion, captureIds);
    }

    public Task<ApiResult<FitJob>> GetFitAsync(Guid fitId, CancellationToken cancellationToken = default)
    {
        FitReads++;
        return Fit();
    }

    public Task<ApiResult<FitJob>> CancelFitAsync(Guid fitId, CancellationToken cancellationToken = default)
    {
        CancelCalls++;
        return CancelFit();
    }

    public Task<ApiResult<FitReportView>> GetReportAsync(Guid fitId, CancellationToken cancellationToken = default) => Report;

    public ReportExportLinks ExportLinks(Guid fitId) => new($"api/fits/{fitId}/report", $"api/fits/{fitId}/report.csv", $"api/fits/{fitId}/report.html");
}
