using Patchproof.Contracts.Fits;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Fits;

public abstract class FitJobRunnerTests(ServerDatabase database)
{
    [Fact]
    public async Task Restart_WhileAFitRuns_TheJobGoesBackToTheQueueAndFinishesOnTheNextStart()
    {
        await using var data = database.CreateData();
        var blocked = new ScriptedFitExecutor { Script = FitScript.BlockUntilReleased };
        Guid fitId;
        Guid captureId;
        await using (var first = ApiTest.StartOn(data, new TestServerSettings { Executor = blocked }))
        {
            var (board, design, capture) = await first.CreateFittableBoardAsync();
            captureId = capture;
            fitId = (await first.StartFitAsync(board.Id, design.Version, capture)).Id;
            await blocked.StartedAsync(fitId).WaitAsync(TimeSpan.FromSeconds(30), ApiTest.Token);
        }

        var finishing = new ScriptedFitExecutor();
        await using var second = ApiTest.StartOn(data, new TestServerSettings { Executor = finishing });
        var done = await second.WaitForFitAsync(fitId, ApiTest.IsFinal);
        using var file = await second.Client.GetAsync($"/api/captures/{captureId}/file", ApiTest.Token);

        Assert.Equal(FitState.Succeeded, done.State);
        Assert.Equal(1, finishing.RunsOf(fitId));
        Assert.Equal(System.Net.HttpStatusCode.OK, file.StatusCode);
    }

    [Fact]
    public async Task Crash_WhileAFitRuns_AnotherProcessTakesTheJobOnceTheLeaseRunsOut()
    {
        await using var data = database.CreateData();
        var stuck = new ScriptedFitExecutor { Script = FitScript.BlockIgnoringCancellation };
        Guid fitId;
        await using (var crashing = ApiTest.StartOn(data, new TestServerSettings { Executor = stuck, ShutdownTimeout = TimeSpan.FromMilliseconds(200) }))
        {
            var (board, design, capture) = await crashing.CreateFittableBoardAsync();
            fitId = (await crashing.StartFitAsync(board.Id, design.Version, capture)).Id;
            await stuck.StartedAsync(fitId).WaitAsync(TimeSpan.FromSeconds(30), ApiTest.Token);
        }

        // The stuck run never wrote anything back: its lease still stands until the clock passes it.
        var finishing = new ScriptedFitExecutor();
        await using var survivor = ApiTest.StartOn(data, new TestServerSettings { Executor = finishing });
        var beforeExpiry = await survivor.GetFitAsync(fitId);
        survivor.Host.Time.Advance(TimeSpan.FromSeconds(31));
        var done = await survivor.WaitForFitAsync(fitId, ApiTest.IsFinal);
        stuck.Release.SetResult();

        Assert.Equal(FitState.Running, beforeExpiry.State);
        Assert.Equal(FitState.Succeeded, done.State);
        Assert.Equal(1, finishing.RunsOf(fitId));
        Assert.Equal(2, done.Attempts);
    }

    [Fact]
    public async Task Crash_OnTheLastAllowedAttempt_MarksTheFitFailedInsteadOfLosingIt()
    {
        await using var data = database.CreateData();
        var stuck = new ScriptedFitExecutor { Script = FitScript.BlockIgnoringCancellation };
        var settings = new TestServerSettings
        {
            Executor = stuck,
            ShutdownTimeout = TimeSpan.FromMilliseconds(200),
            Extra = new Dictionary<string, string?> { ["Patchproof:Fits:MaxAttempts"] = "1" },
        };
        Guid fitId;
        await using (var crashing = ApiTest.StartOn(data, settings))
        {
            var (board, design, capture) = await crashing.CreateFittableBoardAsync();
            fitId = (await crashing.StartFitAsync(board.Id, design.Version, capture)).Id;
            await stuck.StartedAsync(fitId).WaitAsync(TimeSpan.FromSeconds(30), ApiTest.Token);
        }

        var finishing = new ScriptedFitExecutor();
        await using var survivor = ApiTest.StartOn(data, settings with { Executor = finishing });
        survivor.Host.Time.Advance(TimeSpan.FromSeconds(31));
        var done = await survivor.WaitForFitAsync(fitId, ApiTest.IsFinal);
        stuck.Release.SetResult();

        Assert.Equal(FitState.Failed, done.State);
        Assert.Contains("interrupted", done.Error, StringComparison.Ordinal);
        Assert.Equal(0, finishing.RunsOf(fitId));
    }

    [Fact]
    public async Task TwoServers_OnOneDatabase_RunEachFitOfABatchExactlyOnce()
    {
        await using var data = database.CreateData();
        var shared = new ScriptedFitExecutor();
        var settings = new TestServerSettings { Executor = shared, Workers = 2 };
        await using var first = ApiTest.StartOn(data, settings);
        await using var second = ApiTest.StartOn(data, settings with { SeedDemo = false });
        var (board, design, capture) = await first.CreateFittableBoardAsync();

        var fits = new List<Guid>();
        for (var i = 0; i < 24; i++)
        {
            var via = i % 2 == 0 ? first : second;
            fits.Add((await via.StartFitAsync(board.Id, design.Version, capture)).Id);
        }

        var finished = new List<FitResponse>();
        foreach (var id in fits)
        {
            finished.Add(await first.WaitForFitAsync(id, ApiTest.IsFinal, TimeSpan.FromSeconds(60)));
        }

        Assert.All(finished, f => Assert.Equal(FitState.Succeeded, f.State));
        Assert.All(fits, id => Assert.Equal(1, shared.RunsOf(id)));
        Assert.All(finished, f => Assert.Equal(1, f.Attempts));
        Assert.Equal(fits.Count, shared.Runs.Count);
    }

    public sealed class OnSqlite() : FitJobRunnerTests(ServerDatabase.Sqlite);

    public sealed class OnPostgres() : FitJobRunnerTests(ServerDatabase.Postgres);
}
