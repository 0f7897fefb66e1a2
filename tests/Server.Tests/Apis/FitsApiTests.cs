using System.Net;
using System.Net.Http.Json;
using Patchproof.Contracts.Fits;
using Patchproof.Contracts.Reports;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Apis;

public abstract class FitsApiTests(ServerDatabase database)
{
    [Fact]
    public async Task StartFit_EngineSucceeds_EndsSucceededWithResultAndReport()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { Executor = new ScriptedFitExecutor() });
        var (board, design, capture) = await api.CreateFittableBoardAsync();

        var started = await api.StartFitAsync(board.Id, design.Version, capture);
        var done = await api.WaitForFitAsync(started.Id, ApiTest.IsFinal);
        var result = await api.Client.GetFromJsonAsync<FitResultResponse>($"/api/fits/{started.Id}/result", ApiTest.Token);
        var report = await api.Client.GetFromJsonAsync<FitReportResponse>($"/api/fits/{started.Id}/report", ApiTest.Token);
        var listed = await api.Client.GetFromJsonAsync<List<FitResponse>>($"/api/boards/{board.Id}/fits", ApiTest.Token);

        Assert.Equal(FitState.Queued, started.State);
        Assert.Equal(FitState.Succeeded, done.State);
        Assert.Equal(1.0, done.Progress);
        Assert.Equal(1, done.Attempts);
        Assert.Equal(started.Id.ToString(), result!.Result.GetProperty("fitId").GetString());
        Assert.Equal(1, result.Result.GetProperty("designVersion").GetInt32());
        Assert.Equal(board.Id, report!.Board.Id);
        Assert.Equal(capture, Assert.Single(report.Captures).Id);
        Assert.Equal(started.Id, Assert.Single(listed!).Id);
        Assert.Equal(1, api.Host.Executor!.RunsOf(started.Id));
    }

    [Fact]
    public async Task StartFit_ToldToIgnoreTheBenchCalibration_KeepsTheChoiceAndHandsItToTheEngine()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { Executor = new ScriptedFitExecutor() });
        var (board, design, capture) = await api.CreateFittableBoardAsync();

        using var response = await api.Client.PostAsJsonAsync("/api/fits", new StartFitRequest(board.Id, design.Version, [capture], IgnoreBenchCalibration: true), ApiTest.Token);
        var started = (await response.Content.ReadFromJsonAsync<FitResponse>(ApiTest.Token))!;
        var done = await api.WaitForFitAsync(started.Id, ApiTest.IsFinal);

        Assert.Equal(HttpStatusCode.Accepted, response.StatusCode);
        Assert.True(started.IgnoreBenchCalibration);
        Assert.True(done.IgnoreBenchCalibration);
        Assert.True(api.Host.Executor!.InputOf(started.Id)!.IgnoreBenchCalibration);
    }

    [Fact]
    public async Task StartFit_RequestWithoutTheCalibrationField_UsesTheBenchCalibration()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { Executor = new ScriptedFitExecutor() });
        var (board, design, capture) = await api.CreateFittableBoardAsync();

        // The body as clients written before the field existed send it.
        using var response = await api.Client.PostAsJsonAsync("/api/fits", new { boardId = board.Id, designVersion = design.Version, captureIds = new[] { capture } }, ApiTest.Token);
        var started = (await response.Content.ReadFromJsonAsync<FitResponse>(ApiTest.Token))!;
        await api.WaitForFitAsync(started.Id, ApiTest.IsFinal);

        Assert.Equal(HttpStatusCode.Accepted, response.StatusCode);
        Assert.False(started.IgnoreBenchCalibration);
        var input = api.Host.Executor!.InputOf(started.Id)!;
        Assert.False(input.IgnoreBenchCalibration);
        Assert.NotNull(input.BenchId);
    }

    [Fact]
    public async Task GetFit_WhileRunning_ShowsTheEnginesProgress()
    {
        var executor = new ScriptedFitExecutor { Script = FitScript.BlockUntilReleased };
        await using var api = ApiTest.Start(database, new TestServerSettings { Executor = executor });
        var (board, design, capture) = await api.CreateFittableBoardAsync();

        var started = await api.StartFitAsync(board.Id, design.Version, capture);
        var running = await api.WaitForFitAsync(started.Id, f => f.Stage is not null);
        using var early = await api.Client.GetAsync($"/api/fits/{started.Id}/result", ApiTest.Token);
        executor.Release.SetResult();
        var done = await api.WaitForFitAsync(started.Id, ApiTest.IsFinal);

        Assert.Equal(FitState.Running, running.State);
        Assert.Equal((0.25, "waiting for the test"), (running.Progress, running.Stage));
        await ApiTest.ReadProblemAsync(early, HttpStatusCode.Conflict);
        Assert.Equal(FitState.Succeeded, done.State);
    }

    [Fact]
    public async Task CancelFit_Running_EndsCancelledWithoutResult()
    {
        var executor = new ScriptedFitExecutor { Script = FitScript.BlockUntilReleased };
        await using var api = ApiTest.Start(database, new TestServerSettings { Executor = executor });
        var (board, design, capture) = await api.CreateFittableBoardAsync();
        var started = await api.StartFitAsync(board.Id, design.Version, capture);
        await executor.StartedAsync(started.Id).WaitAsync(TimeSpan.FromSeconds(30), ApiTest.Token);

        using var cancel = await api.Client.PostAsync($"/api/fits/{started.Id}/cancel", null, ApiTest.Token);
        var done = await api.WaitForFitAsync(started.Id, ApiTest.IsFinal);
        using var result = await api.Client.GetAsync($"/api/fits/{started.Id}/result", ApiTest.Token);

        Assert.Equal(HttpStatusCode.Accepted, cancel.StatusCode);
        Assert.Equal(FitState.Cancelled, done.State);
        Assert.True(done.CancelRequested);
        Assert.False(done.HasResult);
        await ApiTest.ReadProblemAsync(result, HttpStatusCode.Conflict);
    }

    [Fact]
    public async Task CancelFit_Queued_IsCancelledAtOnceAndNeverRuns()
    {
        var executor = new ScriptedFitExecutor();
        await using var api = ApiTest.Start(database, new TestServerSettings { Executor = executor, Workers = 0 });
        var (board, design, capture) = await api.CreateFittableBoardAsync();
        var started = await api.StartFitAsync(board.Id, design.Version, capture);

        using var cancel = await api.Client.PostAsync($"/api/fits/{started.Id}/cancel", null, ApiTest.Token);
        var fit = await cancel.Content.ReadFromJsonAsync<FitResponse>(ApiTest.Token);

        Assert.Equal(FitState.Cancelled, fit!.State);
        Assert.NotNull(fit.FinishedAt);
        Assert.Equal(0, executor.RunsOf(started.Id));
    }

    [Fact]
    public async Task CancelFit_AlreadySucceeded_AnswersConflict()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { Executor = new ScriptedFitExecutor() });
        var (board, design, capture) = await api.CreateFittableBoardAsync();
        var started = await api.StartFitAsync(board.Id, design.Version, capture);
        await api.WaitForFitAsync(started.Id, ApiTest.IsFinal);

        using var cancel = await api.Client.PostAsync($"/api/fits/{started.Id}/cancel", null, ApiTest.Token);

        await ApiTest.ReadProblemAsync(cancel, HttpStatusCode.Conflict);
    }

    [Fact]
    public async Task StartFit_EngineReportsFailure_EndsFailedWithItsMessage()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { Executor = new ScriptedFitExecutor { Script = FitScript.Fail } });
        var (board, design, capture) = await api.CreateFittableBoardAsync();

        var started = await api.StartFitAsync(board.Id, design.Version, capture);
        var done = await api.WaitForFitAsync(started.Id, ApiTest.IsFinal);
        using var report = await api.Client.GetAsync($"/api/fits/{started.Id}/report", ApiTest.Token);

        Assert.Equal(FitState.Failed, done.State);
        Assert.Equal("The scripted engine was told to fail.", done.Error);
        await ApiTest.ReadProblemAsync(report, HttpStatusCode.Conflict);
    }

    [Fact]
    public async Task StartFit_EngineThrows_EndsFailedWithoutInternalDetail()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { Executor = new ScriptedFitExecutor { Script = FitScript.Throw } });
        var (board, design, capture) = await api.CreateFittableBoardAsync();

        var started = await api.StartFitAsync(board.Id, design.Version, capture);
        var done = await api.WaitForFitAsync(started.Id, ApiTest.IsFinal);

        Assert.Equal(FitState.Failed, done.State);
        Assert.DoesNotContain("Secret", done.Error, StringComparison.Ordinal);
        Assert.Contains("internal error", done.Error, StringComparison.Ordinal);
    }

    [Fact]
    public async Task StartFit_NoEngineRegistered_AnswersNotImplemented()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { WithoutEngine = true });
        var (board, design, capture) = await api.CreateFittableBoardAsync();

        using var response = await api.Client.PostAsJsonAsync("/api/fits", new StartFitRequest(board.Id, design.Version, [capture]), ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.NotImplemented);
    }

    [Fact]
    public async Task StartFit_BadReferences_AnswerProblemsAndQueueNothing()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { Executor = new ScriptedFitExecutor(), Workers = 0 });
        var (board, design, capture) = await api.CreateFittableBoardAsync();
        var other = await api.CreateFittableBoardAsync("QH-L8");

        async Task<HttpStatusCode> StartAsync(StartFitRequest request)
        {
            using var response = await api.Client.PostAsJsonAsync("/api/fits", request, ApiTest.Token);
            await ApiTest.ReadProblemAsync(response, response.StatusCode);
            return response.StatusCode;
        }

        Assert.Equal(HttpStatusCode.NotFound, await StartAsync(new StartFitRequest(Guid.NewGuid(), 1, [capture])));
        Assert.Equal(HttpStatusCode.NotFound, await StartAsync(new StartFitRequest(board.Id, design.Version + 1, [capture])));
        Assert.Equal(HttpStatusCode.NotFound, await StartAsync(new StartFitRequest(board.Id, design.Version, [other.CaptureId])));
        Assert.Equal(HttpStatusCode.BadRequest, await StartAsync(new StartFitRequest(board.Id, design.Version, [])));
        Assert.Equal(HttpStatusCode.BadRequest, await StartAsync(new StartFitRequest(board.Id, design.Version, [capture, capture])));
        Assert.Equal(0, await api.WithDbAsync(db => Task.FromResult(db.FitJobs.Count())));
    }

    [Fact]
    public async Task GetFit_Unknown_AnswersNotFoundOnEveryFitRoute()
    {
        await using var api = ApiTest.Start(database);
        var id = Guid.NewGuid();

        foreach (var path in new[] { $"/api/fits/{id}", $"/api/fits/{id}/result", $"/api/fits/{id}/report", $"/api/boards/{id}/fits" })
        {
            using var response = await api.Client.GetAsync(path, ApiTest.Token);
            await ApiTest.ReadProblemAsync(response, HttpStatusCode.NotFound);
        }

        using var cancel = await api.Client.PostAsync($"/api/fits/{id}/cancel", null, ApiTest.Token);
        await ApiTest.ReadProblemAsync(cancel, HttpStatusCode.NotFound);
    }

    public sealed class OnSqlite() : FitsApiTests(ServerDatabase.Sqlite);

    public sealed class OnPostgres() : FitsApiTests(ServerDatabase.Postgres);
}
