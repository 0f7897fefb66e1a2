using System.Net;
using System.Text;
using System.Text.Json;
using Patchproof.Client.Models;
using Patchproof.Client.Services;
using Patchproof.Contracts.Benches;
using Patchproof.Contracts.Captures;
using Patchproof.Contracts.Fits;
using Patchproof.Contracts.Health;

namespace Patchproof.Client.Tests.Services;

public sealed class PatchproofApiTests
{
    private static readonly Guid FitId = Guid.Parse("5d1c0f3e-3a55-4a57-9a8b-0c1f2e3d4a5b");
    private static readonly Guid BoardId = Guid.Parse("0b6f7e21-93d4-4c8e-8f0e-6a2f5c1d9e33");
    private static readonly Guid CaptureId = Guid.Parse("9e2a4c6b-1d3f-4b5a-8c7e-2f4a6b8c0d1e");
    private static readonly DateTimeOffset At = new(2026, 12, 1, 21, 30, 0, TimeSpan.Zero);

    [Theory]
    [InlineData(FitState.Queued, FitJobState.Queued)]
    [InlineData(FitState.Running, FitJobState.Running)]
    [InlineData(FitState.Succeeded, FitJobState.Succeeded)]
    [InlineData(FitState.Failed, FitJobState.Failed)]
    [InlineData(FitState.Cancelled, FitJobState.Cancelled)]
    public async Task GetFitAsync_ServersFitResponse_BecomesTheFitThePageShows(FitState state, FitJobState shown)
    {
        // The body is the shared contract record as the server writes it (web defaults, state as a string).
        var answer = new FitResponse(FitId, BoardId, 2, [CaptureId], state, 0.93, "comparing the capture with the designs: power spectra done (9 of 12 parts)",
            false, 1, null, state == FitState.Succeeded, At, At, state == FitState.Succeeded ? At.AddMinutes(1) : null);
        var api = new PatchproofApi(new HttpClient(new AnswerWith(JsonSerializer.Serialize(answer, JsonSerializerOptions.Web))) { BaseAddress = new Uri("http://localhost/") });

        var read = await api.GetFitAsync(FitId, TestContext.Current.CancellationToken);

        Assert.True(read.Succeeded);
        var fit = read.Value;
        Assert.Equal((FitId, BoardId, 2, shown, 0.93), (fit.Id, fit.BoardId, fit.DesignVersion, fit.State, fit.Progress));
        Assert.Equal([CaptureId], fit.CaptureIds);
        Assert.Equal(answer.Stage, fit.Stage);
        Assert.Equal(state == FitState.Succeeded, fit.HasReport);
        Assert.Equal(answer.FinishedAt, fit.FinishedAt);
    }

    [Fact]
    public async Task GetHealthAsync_ServersHealthResponse_IsRead()
    {
        // The start page's answers are read with compile-time metadata; the body is the contract as the server writes it.
        var answer = new HealthResponse("ok", "0.1.0");
        var api = new PatchproofApi(new HttpClient(new AnswerWith(JsonSerializer.Serialize(answer, JsonSerializerOptions.Web))) { BaseAddress = new Uri("http://localhost/") });

        Assert.Equal(answer, await api.GetHealthAsync(TestContext.Current.CancellationToken));
    }

    [Fact]
    public async Task ListBenchesAsync_ServersBenchResponses_BecomeTheBenchesThePageLists()
    {
        BenchResponse[] answer =
        [
            new(BoardId, "Bench 3, analog lab", "Teaching lab", "Two patch panels", 4, At),
            new(FitId, "Evening class", null, null, 0, At),
        ];
        var api = new PatchproofApi(new HttpClient(new AnswerWith(JsonSerializer.Serialize(answer, JsonSerializerOptions.Web))) { BaseAddress = new Uri("http://localhost/") });

        var read = await api.ListBenchesAsync(TestContext.Current.CancellationToken);

        Assert.True(read.Succeeded);
        Assert.Equal(
            [new BenchSummary(BoardId, "Bench 3, analog lab", "Teaching lab", "Two patch panels", 4), new BenchSummary(FitId, "Evening class", null, null, 0)],
            read.Value);
    }

    [Fact]
    public async Task CreateBenchAsync_SendsTheFieldsTheServerReads()
    {
        var answer = new BenchResponse(BoardId, "Bench 3, analog lab", "Teaching lab", null, 0, At);
        var handler = new AnswerWith(JsonSerializer.Serialize(answer, JsonSerializerOptions.Web));
        var api = new PatchproofApi(new HttpClient(handler) { BaseAddress = new Uri("http://localhost/") });

        var created = await api.CreateBenchAsync(new NewBench("Bench 3, analog lab", "Teaching lab", null), TestContext.Current.CancellationToken);

        Assert.Equal(new CreateBenchRequest("Bench 3, analog lab", "Teaching lab"), JsonSerializer.Deserialize<CreateBenchRequest>(handler.LastBody!, JsonSerializerOptions.Web));
        Assert.Equal(BoardId, created.Value.Id);
    }

    [Fact]
    public void FitResponseJson_StateIsWrittenAsItsName()
    {
        var answer = new FitResponse(FitId, BoardId, 1, [CaptureId], FitState.Running, 0.5, null, false, 1, null, false, At, null, null);

        using var document = JsonDocument.Parse(JsonSerializer.Serialize(answer, JsonSerializerOptions.Web));

        Assert.Equal("Running", document.RootElement.GetProperty("state").GetString());
    }

    [Fact]
    public async Task StartFitAsync_WithAMapping_SendsTheUsedChannelsAndReadsTheMappingBack()
    {
        ChannelMappingEntry[] stored = [new("CH1", "x", 1), new("CH2", "z", -1)];
        var answer = new FitResponse(FitId, BoardId, 1, [CaptureId], FitState.Queued, 0, null, false, 0, null, false, At, null, null, Mapping: stored);
        var handler = new AnswerWith(JsonSerializer.Serialize(answer, JsonSerializerOptions.Web));
        var api = new PatchproofApi(new HttpClient(handler) { BaseAddress = new Uri("http://localhost/") });

        var started = await api.StartFitAsync(BoardId, 1, [CaptureId], mapping: [new("CH1", "x", 1), new("CH2", "z", -1), new("CH3", "", 1)], cancellationToken: TestContext.Current.CancellationToken);

        var sent = JsonSerializer.Deserialize<StartFitRequest>(handler.LastBody!, JsonSerializerOptions.Web)!;
        Assert.Equal(stored, sent.Mapping);
        Assert.Equal([new ChannelMapping("CH1", "x", 1), new ChannelMapping("CH2", "z", -1)], started.Value.Mapping);
    }

    [Fact]
    public async Task StartFitAsync_WithoutAMapping_LeavesTheFieldForTheServersFileOrder()
    {
        var answer = new FitResponse(FitId, BoardId, 1, [CaptureId], FitState.Queued, 0, null, false, 0, null, false, At, null, null);
        var handler = new AnswerWith(JsonSerializer.Serialize(answer, JsonSerializerOptions.Web));
        var api = new PatchproofApi(new HttpClient(handler) { BaseAddress = new Uri("http://localhost/") });

        var started = await api.StartFitAsync(BoardId, 1, [CaptureId], mapping: [new("CH1", "", 1)], cancellationToken: TestContext.Current.CancellationToken);

        Assert.Null(JsonSerializer.Deserialize<StartFitRequest>(handler.LastBody!, JsonSerializerOptions.Web)!.Mapping);
        Assert.Null(started.Value.Mapping);
    }

    [Fact]
    public async Task CalibrateProbesAsync_WithAKnownAmplitude_SendsItAndItsAccuracyInTheQueryAndReadsTheAbsoluteGainBack()
    {
        var answer = new Patchproof.Contracts.Benches.ProbeCalibrationSummary(BoardId, "CH1", ["CH1", "CH2"], At, At)
        {
            KnownAmplitude = new Patchproof.Contracts.Benches.ProbeCalibrationKnownAmplitudeSummary(10, 0.001, 6.07, -4.03, 1.0102, 0.0027),
        };
        var handler = new AnswerWith(JsonSerializer.Serialize(answer, JsonSerializerOptions.Web));
        var api = new PatchproofApi(new HttpClient(handler) { BaseAddress = new Uri("http://localhost/") });
        var file = new UploadFile("square.csv", 12, "text/csv", () => new MemoryStream(Encoding.ASCII.GetBytes("t,CH1\n0,6\n")));

        var stored = await api.CalibrateProbesAsync(BoardId, file, new CalibrationCaptureDetails(" bench square wave ", "10V", "0.1%"), TestContext.Current.CancellationToken);

        Assert.Equal("?note=bench%20square%20wave&knownAmplitude=10V&amplitudeAccuracy=0.1%25", handler.LastUri!.Query);
        Assert.Equal(new KnownAmplitudeView(10, 0.001, 1.0102, 0.0027), stored.Value.KnownAmplitude);
    }

    /// <summary>Answers every request with 200 and the given JSON body, and keeps the last request's address and body.</summary>
    private sealed class AnswerWith(string json) : HttpMessageHandler
    {
        public string? LastBody { get; private set; }

        public Uri? LastUri { get; private set; }

        protected override async Task<HttpResponseMessage> SendAsync(HttpRequestMessage request, CancellationToken cancellationToken)
        {
            LastUri = request.RequestUri;
            LastBody = request.Content is null ? null : await request.Content.ReadAsStringAsync(cancellationToken);
            return new HttpResponseMessage(HttpStatusCode.OK) { Content = new StringContent(json, Encoding.UTF8, "application/json") };
        }
    }
}
