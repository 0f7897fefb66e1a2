using System.Net;
using System.Net.Http.Json;
using Microsoft.Extensions.Time.Testing;
using Patchproof.Contracts.Fits;
using Patchproof.Contracts.Reports;
using Patchproof.Server.Fits;
using Patchproof.Server.Reports;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Fits;

public sealed class BoardFitJobExecutorTests : IDisposable
{
    private readonly string folder = Directory.CreateTempSubdirectory("patchproof-executor-tests").FullName;

    public void Dispose() => Directory.Delete(folder, recursive: true);

    [Fact]
    public async Task Execute_DunlinWithTheResistorFromXIntoYTenPercentHigh_NamesThatResistor()
    {
        var input = Input("qh-d2-dunlin.json", SyntheticBoardCaptures.Csv("qh-d2-dunlin.json", new Dictionary<string, double> { ["R2"] = 1.10 }, seed: 31));
        var stages = new List<FitJobProgress>();

        var outcome = await Executor().ExecuteAsync(input, new ImmediateProgress<FitJobProgress>(stages.Add), TestContext.Current.CancellationToken);

        Assert.Null(outcome.Error);
        var document = FitResultJson.TryRead(outcome.Result!.Value);
        Assert.NotNull(document);
        // The diagnosis may call it "cannot decide" (the capacitor and probe gains could share the blame); the part named must be R2.
        Assert.Contains(document.Outcome, new[] { "partsNamed", "cannotDecide" });
        var finding = Assert.Single(document.Findings);
        Assert.Equal("R2", finding.Part);
        Assert.NotEqual(FindingVerdictCode.WithinTolerance, finding.Verdict);
        Assert.InRange(finding.Effective / 110e3, 0.98, 1.02);
        Assert.Equal(3, document.Coefficients.Count);
        Assert.Equal(2, document.Offsets.Count);
        Assert.True(document.Fitted.Converged, document.Fitted.ExitReason);
        Assert.Equal(["reading the design", "reading the capture", "capture checks"], stages.Take(3).Select(s => s.Stage));
        Assert.Contains(stages, s => s.Stage.StartsWith("multiple shooting, iteration", StringComparison.Ordinal));
        Assert.True(stages.Zip(stages.Skip(1)).All(pair => pair.Second.Fraction >= pair.First.Fraction), "progress never goes back");
    }

    [Fact]
    public async Task Execute_TwoCaptures_FitsTheFirstAndSaysSo()
    {
        var healthy = SyntheticBoardCaptures.Csv("qh-d2-dunlin.json", new Dictionary<string, double>(), seed: 32, problemUnits: 10);
        var input = Input("qh-d2-dunlin.json", healthy, healthy);

        var outcome = await Executor().ExecuteAsync(input, new ImmediateProgress<FitJobProgress>(_ => { }), TestContext.Current.CancellationToken);

        var document = FitResultJson.TryRead(outcome.Result!.Value)!;
        Assert.Equal(input.Captures[0].CaptureId, document.Fitted.CaptureId);
        Assert.Contains(document.Notes, n => n.Contains("the first of the 2 captures", StringComparison.Ordinal));
    }

    [Fact]
    public async Task Execute_CancelledDuringMultipleShooting_StopsWithCancellation()
    {
        var input = Input("qh-d2-dunlin.json", SyntheticBoardCaptures.Csv("qh-d2-dunlin.json", new Dictionary<string, double> { ["R2"] = 1.10 }, seed: 33));
        using var cancellation = new CancellationTokenSource();
        var progress = new ImmediateProgress<FitJobProgress>(p =>
        {
            if (p.Stage.StartsWith("multiple shooting, iteration", StringComparison.Ordinal))
            {
                cancellation.Cancel();
            }
        });

        await Assert.ThrowsAnyAsync<OperationCanceledException>(() => Executor().ExecuteAsync(input, progress, cancellation.Token));
    }

    [Fact]
    public async Task Execute_DesignThatDoesNotRead_FailsWithLineAndColumn()
    {
        var input = Input("qh-d2-dunlin.json", SyntheticBoardCaptures.Csv("qh-d2-dunlin.json", new Dictionary<string, double>(), seed: 35, problemUnits: 6)) with
        {
            DesignDocument = "{\n  \"format\": \"patchproof-design\",\n  \"version\": 1,\n  \"timeScale\": \"1 ms\",\n  \"variables\": 3\n}",
        };

        var outcome = await Executor().ExecuteAsync(input, new ImmediateProgress<FitJobProgress>(_ => { }), TestContext.Current.CancellationToken);

        Assert.Null(outcome.Result);
        Assert.Matches(@"design version 1:\d+:\d+: ", outcome.Error);
    }

    [Fact]
    public async Task StartFit_ThroughTheApi_SucceedsAndTheReportNamesTheDriftedPart()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite);
        var board = await api.CreateBoardAsync(code: "QH-D7");
        var design = await api.CreateDesignAsync(board.Id, SyntheticBoardCaptures.DesignText("qh-d2-dunlin.json"));
        using var upload = await api.UploadAsync(board.Id, SyntheticBoardCaptures.Csv("qh-d2-dunlin.json", new Dictionary<string, double> { ["R2"] = 1.10 }, seed: 36), "dunlin-r2.csv");
        var capture = (await upload.Content.ReadFromJsonAsync<Contracts.Captures.CaptureResponse>(ApiTest.Token))!;

        var started = await api.StartFitAsync(board.Id, design.Version, capture.Id);
        var done = await api.WaitForFitAsync(started.Id, ApiTest.IsFinal, TimeSpan.FromMinutes(3));
        var report = await api.Client.GetFromJsonAsync<FitReportResponse>($"/api/fits/{started.Id}/report", ApiTest.Token);

        Assert.Equal(FitState.Succeeded, done.State);
        Assert.Equal(1.0, done.Progress);
        var document = FitResultJson.TryRead(report!.Result)!;
        Assert.Equal("R2", Assert.Single(document.Findings).Part);
    }

    [Fact]
    public async Task CancelFit_ThroughTheApiWhileShooting_EndsCancelled()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite);
        var board = await api.CreateBoardAsync(code: "QH-L7");
        var design = await api.CreateDesignAsync(board.Id);
        using var upload = await api.UploadAsync(board.Id, SyntheticBoardCaptures.Csv("qh-l3-wren.json", new Dictionary<string, double> { ["R4"] = 1.1 }, seed: 37, problemUnits: 40), "wren.csv");
        var capture = (await upload.Content.ReadFromJsonAsync<Contracts.Captures.CaptureResponse>(ApiTest.Token))!;

        var started = await api.StartFitAsync(board.Id, design.Version, capture.Id);
        await api.WaitForFitAsync(started.Id, f => f.Stage?.StartsWith("multiple shooting, iteration", StringComparison.Ordinal) == true || ApiTest.IsFinal(f), TimeSpan.FromMinutes(2));
        using var cancel = await api.Client.PostAsync($"/api/fits/{started.Id}/cancel", null, ApiTest.Token);
        var done = await api.WaitForFitAsync(started.Id, ApiTest.IsFinal, TimeSpan.FromMinutes(2));

        Assert.Equal(HttpStatusCode.Accepted, cancel.StatusCode);
        Assert.Equal(FitState.Cancelled, done.State);
        Assert.False(done.HasResult);
    }

    [Fact]
    public async Task Execute_TernWithTheMappingItWasRecordedWith_ConvergesAndListsThatMapping()
    {
        // The demo capture of QH-L5 records x on CH1 and z on CH2 (y is not recorded); file order would read CH2 as y.
        var capture = File.ReadAllBytes(Path.Combine(Patchproof.TestSupport.ReferenceDataFiles.RepositoryRoot, "sample-captures", "qh-l5-tern.csv"));
        var input = Input("qh-l5-tern.json", capture) with { Mapping = [new("CH1", "x", 1), new("CH2", "z", 1)] };

        var outcome = await Executor().ExecuteAsync(input, new ImmediateProgress<FitJobProgress>(_ => { }), TestContext.Current.CancellationToken);

        Assert.Null(outcome.Error);
        var document = FitResultJson.TryRead(outcome.Result!.Value);
        Assert.NotNull(document);
        Assert.True(document.Fitted.Converged, document.Fitted.ExitReason);
        Assert.Equal(["CH1 = x", "CH2 = z"], document.Fitted.Mapping);
        // The scenario's C3 came in about 15 % low, so the z integrator's gain (1/RC) is about 1/0.85 = 1.18 of nominal
        // on its recorded term; a channel read as the wrong variable would not give that (demo data, not a reference value).
        var beta = Assert.Single(document.Coefficients, c => c.Equation == "dz/dt" && c.Term == "z");
        Assert.InRange(beta.ProblemEstimate / beta.ProblemNominal, 1.10, 1.26);
    }

    private static BoardFitJobExecutor Executor() => new(new FakeTimeProvider(new DateTimeOffset(2026, 12, 1, 12, 0, 0, TimeSpan.Zero)));

    private FitJobInput Input(string designFile, params byte[][] captures)
    {
        var stored = captures.Select((bytes, i) =>
        {
            var path = Path.Combine(folder, $"capture-{i}.csv");
            File.WriteAllBytes(path, bytes);
            return new FitJobCapture(Guid.NewGuid(), $"capture-{i}.csv", path, path + ".samples");
        }).ToList();
        return new FitJobInput(Guid.NewGuid(), Guid.NewGuid(), 1, SyntheticBoardCaptures.DesignText(designFile), stored, 1);
    }

    private sealed class ImmediateProgress<T>(Action<T> onReport) : IProgress<T>
    {
        public void Report(T value) => onReport(value);
    }
}
