using System.Net;
using System.Net.Http.Headers;
using System.Net.Http.Json;
using System.Text.Json;
using System.Text.Json.Serialization.Metadata;
using Patchproof.Client.Models;
using Patchproof.Client.Services.Wire;
using Patchproof.Contracts.Benches;
using Patchproof.Contracts.Fits;
using Patchproof.Contracts.Health;
using ChannelMappingEntry = Patchproof.Contracts.Captures.ChannelMappingEntry;

namespace Patchproof.Client.Services;

/// <summary>Calls the server's REST API and turns its answers (or its problem details) into view models.</summary>
public sealed class PatchproofApi(HttpClient http) : IPatchproofApi
{
    // The start page's types come from compile-time metadata (StartPageJsonContext), the rest by reflection.
    private static readonly JsonSerializerOptions Json = new(JsonSerializerDefaults.Web)
    {
        TypeInfoResolver = JsonTypeInfoResolver.Combine(StartPageJsonContext.Default, new DefaultJsonTypeInfoResolver()),
    };

    /// <inheritdoc />
    public async Task<HealthResponse> GetHealthAsync(CancellationToken cancellationToken = default) =>
        await http.GetFromJsonAsync("api/health", StartPageJsonContext.Default.HealthResponse, cancellationToken)
        ?? throw new InvalidOperationException("The server sent an empty health answer.");

    /// <inheritdoc />
    public Task<ApiResult<IReadOnlyList<BenchSummary>>> ListBenchesAsync(CancellationToken cancellationToken = default) =>
        GetListAsync<BenchWire, BenchSummary>("api/benches", w => w.ToView(), cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<BenchSummary>> GetBenchAsync(Guid benchId, CancellationToken cancellationToken = default) =>
        SendAsync<BenchWire, BenchSummary>(() => new HttpRequestMessage(HttpMethod.Get, $"api/benches/{benchId}"), w => w.ToView(), cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<BenchSummary>> CreateBenchAsync(NewBench bench, CancellationToken cancellationToken = default) =>
        SendAsync<BenchWire, BenchSummary>(() => PostJson("api/benches", bench), w => w.ToView(), cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<IReadOnlyList<ProbeCalibrationView>>> ListProbeCalibrationsAsync(Guid benchId, CancellationToken cancellationToken = default) =>
        GetListAsync<ProbeCalibrationSummary, ProbeCalibrationView>($"api/benches/{benchId}/probe-calibrations", w => w.ToView(), cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<ProbeCalibrationView>> CalibrateProbesAsync(Guid benchId, UploadFile file, CalibrationCaptureDetails details, CancellationToken cancellationToken = default) =>
        SendAsync<ProbeCalibrationSummary, ProbeCalibrationView>(
            () =>
            {
                var body = new StreamContent(file.OpenRead());
                body.Headers.ContentType = new MediaTypeHeaderValue(string.IsNullOrEmpty(file.ContentType) ? "text/csv" : file.ContentType);
                var form = new MultipartFormDataContent { { body, "file", file.FileName } };
                var parameters = new (string Name, string? Value)[] { ("note", details.Note), ("knownAmplitude", details.KnownAmplitude), ("amplitudeAccuracy", details.AmplitudeAccuracy) }
                    .Where(p => !string.IsNullOrWhiteSpace(p.Value))
                    .Select(p => p.Name + "=" + Uri.EscapeDataString(p.Value!.Trim()))
                    .ToList();
                var query = parameters.Count == 0 ? "" : "?" + string.Join("&", parameters);
                return new HttpRequestMessage(HttpMethod.Post, $"api/benches/{benchId}/probe-calibrations/from-capture{query}") { Content = form };
            },
            w => w.ToView(),
            cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<IReadOnlyList<BoardSummary>>> ListBoardsAsync(Guid benchId, CancellationToken cancellationToken = default) =>
        GetListAsync<BoardWire, BoardSummary>($"api/benches/{benchId}/boards", w => w.ToView(), cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<BoardSummary>> CreateBoardAsync(Guid benchId, NewBoard board, CancellationToken cancellationToken = default) =>
        SendAsync<BoardWire, BoardSummary>(() => PostJson($"api/benches/{benchId}/boards", board), w => w.ToView(), cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<BoardSummary>> GetBoardAsync(Guid boardId, CancellationToken cancellationToken = default) =>
        SendAsync<BoardWire, BoardSummary>(() => new HttpRequestMessage(HttpMethod.Get, $"api/boards/{boardId}"), w => w.ToView(), cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<IReadOnlyList<DesignVersionEntry>>> ListDesignVersionsAsync(Guid boardId, CancellationToken cancellationToken = default) =>
        GetListAsync<DesignVersionSummaryWire, DesignVersionEntry>($"api/boards/{boardId}/designs", w => w.ToView(), cancellationToken);

    /// <inheritdoc />
    public async Task<ApiResult<DesignSheet>> GetDesignAsync(Guid boardId, int? version, CancellationToken cancellationToken = default)
    {
        var path = version is { } v ? $"api/boards/{boardId}/designs/{v}/sheet" : $"api/boards/{boardId}/designs/latest/sheet";
        var answer = await SendAsync<DesignSheet, DesignSheet>(() => new HttpRequestMessage(HttpMethod.Get, path), sheet => sheet, cancellationToken);
        return answer.Succeeded
            ? ApiResult<DesignSheet>.Ok(answer.Value with { Equations = answer.Value.Equations ?? [], Blocks = answer.Value.Blocks ?? [], Parts = answer.Value.Parts ?? [] })
            : answer;
    }

    /// <inheritdoc />
    public Task<ApiResult<DesignVersionEntry>> SaveDesignAsync(Guid boardId, DesignSheet design, string? note, CancellationToken cancellationToken = default)
    {
        var path = $"api/boards/{boardId}/designs" + (string.IsNullOrWhiteSpace(note) ? "" : "?note=" + Uri.EscapeDataString(note));
        return SendAsync<DesignVersionSummaryWire, DesignVersionEntry>(() => PostJson(path, design), w => w.ToView(), cancellationToken);
    }

    /// <inheritdoc />
    public Task<ApiResult<IReadOnlyList<DesignCheckNote>>> CheckDesignAsync(DesignSheet design, CancellationToken cancellationToken = default) =>
        SendAsync<List<DesignCheckNoteWire>, IReadOnlyList<DesignCheckNote>>(() => PostJson("api/designs/check", design), w => w.Select(n => n.ToView()).ToList(), cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<IReadOnlyList<BuiltInModelEntry>>> ListModelsAsync(CancellationToken cancellationToken = default) =>
        GetListAsync<BuiltInModelWire, BuiltInModelEntry>("api/models", w => w.ToView(), cancellationToken);

    /// <inheritdoc />
    public async Task<ApiResult<DesignSheet>> GenerateDesignAsync(string modelId, CancellationToken cancellationToken = default) =>
        await SendAsync<DesignSheet, DesignSheet>(() => new HttpRequestMessage(HttpMethod.Post, $"api/models/{Uri.EscapeDataString(modelId)}/design"), d => d with { Equations = d.Equations ?? [], Blocks = d.Blocks ?? [], Parts = d.Parts ?? [] }, cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<IReadOnlyList<CaptureEntry>>> ListCapturesAsync(Guid boardId, CancellationToken cancellationToken = default) =>
        GetListAsync<CaptureWire, CaptureEntry>($"api/boards/{boardId}/captures", w => w.ToView(), cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<CaptureEntry>> UploadCaptureAsync(Guid boardId, UploadFile file, IProgress<UploadProgress>? progress, CancellationToken cancellationToken = default) =>
        SendAsync<CaptureWire, CaptureEntry>(
            () =>
            {
                var body = new StreamContent(new ProgressReportingStream(file.OpenRead(), file.SizeBytes,
                    sent => progress?.Report(new UploadProgress(file.FileName, sent, file.SizeBytes))));
                body.Headers.ContentType = new MediaTypeHeaderValue(string.IsNullOrEmpty(file.ContentType) ? "text/csv" : file.ContentType);
                var form = new MultipartFormDataContent { { body, "file", file.FileName } };
                return new HttpRequestMessage(HttpMethod.Post, $"api/boards/{boardId}/captures") { Content = form };
            },
            w => w.ToView(),
            cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<MappingCheck>> CheckMappingAsync(Guid captureId, int designVersion, IReadOnlyList<ChannelMapping> mapping, CancellationToken cancellationToken = default) =>
        SendAsync<MappingCheckWire, MappingCheck>(
            () => PostJson($"api/captures/{captureId}/mapping-check", new MappingCheckRequestWire(designVersion, mapping.Select(m => new ChannelMappingWire(m.Channel, m.Variable, m.Sign)).ToList())),
            w => new MappingCheck(w.AgreesWithGiven, (w.Suggested ?? []).Select(s => s.ToView()).ToList(), w.Message),
            cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<IReadOnlyList<FitJob>>> ListFitsAsync(Guid boardId, CancellationToken cancellationToken = default) =>
        GetListAsync<FitResponse, FitJob>($"api/boards/{boardId}/fits", w => w.ToView(), cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<FitJob>> StartFitAsync(
        Guid boardId,
        int designVersion,
        IReadOnlyList<Guid> captureIds,
        bool ignoreBenchCalibration = false,
        IReadOnlyList<ChannelMapping>? mapping = null,
        CancellationToken cancellationToken = default)
    {
        var used = (mapping ?? []).Where(m => m.IsUsed).Select(m => new ChannelMappingEntry(m.Channel, m.Variable, m.Sign)).ToList();
        return SendAsync<FitResponse, FitJob>(
            () => PostJson("api/fits", new StartFitRequest(boardId, designVersion, captureIds, ignoreBenchCalibration, used.Count > 0 ? used : null)),
            w => w.ToView(),
            cancellationToken);
    }

    /// <inheritdoc />
    public Task<ApiResult<FitJob>> GetFitAsync(Guid fitId, CancellationToken cancellationToken = default) =>
        SendAsync<FitResponse, FitJob>(() => new HttpRequestMessage(HttpMethod.Get, $"api/fits/{fitId}"), w => w.ToView(), cancellationToken);

    /// <inheritdoc />
    public Task<ApiResult<FitJob>> CancelFitAsync(Guid fitId, CancellationToken cancellationToken = default) =>
        SendAsync<FitResponse, FitJob>(() => new HttpRequestMessage(HttpMethod.Post, $"api/fits/{fitId}/cancel"), w => w.ToView(), cancellationToken);

    /// <inheritdoc />
    public async Task<ApiResult<FitReportView>> GetReportAsync(Guid fitId, CancellationToken cancellationToken = default)
    {
        var answer = await SendAsync<FitReportWire, FitReportWire>(() => new HttpRequestMessage(HttpMethod.Get, $"api/fits/{fitId}/report"), w => w, cancellationToken);
        if (!answer.Succeeded)
        {
            return ApiResult<FitReportView>.Fail(answer.Problem!);
        }

        var wire = answer.Value;
        var sections = ReportDocumentReader.Read(wire.Result);
        if (!sections.Succeeded)
        {
            return ApiResult<FitReportView>.Fail(sections.Problem!);
        }

        var s = sections.Value;
        return ApiResult<FitReportView>.Ok(new FitReportView(
            fitId, wire.Board.ToView(), wire.Design.Version, (wire.Captures ?? []).Select(c => c.ToView()).ToList(),
            s.Summary, s.Findings, s.Coefficients, s.Offsets, s.TimeScale, s.Invariants, s.StructureCheck, s.Plots, ExportLinks(fitId))
        {
            Warnings = s.Warnings,
            Notes = s.Notes,
            Channels = s.Channels,
            Mapping = s.Mapping,
        });
    }

    /// <inheritdoc />
    public ReportExportLinks ExportLinks(Guid fitId) =>
        new($"api/fits/{fitId}/report", $"api/fits/{fitId}/report.csv", $"api/fits/{fitId}/report.html");

    private static HttpRequestMessage PostJson<TBody>(string path, TBody body) =>
        new(HttpMethod.Post, path) { Content = JsonContent.Create(body, options: Json) };

    private async Task<ApiResult<IReadOnlyList<TView>>> GetListAsync<TWire, TView>(string path, Func<TWire, TView> map, CancellationToken cancellationToken) =>
        await SendAsync<List<TWire>, IReadOnlyList<TView>>(() => new HttpRequestMessage(HttpMethod.Get, path), list => list.Select(map).ToList(), cancellationToken);

    private async Task<ApiResult<TView>> SendAsync<TWire, TView>(Func<HttpRequestMessage> request, Func<TWire, TView> map, CancellationToken cancellationToken)
    {
        try
        {
            using var message = request();
            using var response = await http.SendAsync(message, cancellationToken);
            if (!response.IsSuccessStatusCode)
            {
                return ApiResult<TView>.Fail(await ProblemReader.ReadAsync(response, cancellationToken));
            }

            var wire = await response.Content.ReadFromJsonAsync<TWire>(Json, cancellationToken);
            return wire is null
                ? ApiResult<TView>.Fail((int)response.StatusCode, "The server sent an empty answer")
                : ApiResult<TView>.Ok(map(wire));
        }
        catch (HttpRequestException ex)
        {
            return ApiResult<TView>.Fail(0, "The server did not answer", ex.Message);
        }
        catch (JsonException ex)
        {
            return ApiResult<TView>.Fail(0, "The server's answer could not be read", ex.Message);
        }
        catch (NotSupportedException ex)
        {
            return ApiResult<TView>.Fail(0, "The server answered in an unexpected format", ex.Message);
        }
        catch (TaskCanceledException) when (!cancellationToken.IsCancellationRequested)
        {
            return ApiResult<TView>.Fail((int)HttpStatusCode.RequestTimeout, "The server took too long to answer");
        }
    }
}
