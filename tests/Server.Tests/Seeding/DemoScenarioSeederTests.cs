using System.Net.Http.Json;
using Patchproof.Contracts.Benches;
using Patchproof.Contracts.Boards;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Seeding;

public abstract class DemoScenarioSeederTests(ServerDatabase database)
{
    private static readonly string DesignsFolder = Path.Combine(Patchproof.TestSupport.ReferenceDataFiles.RepositoryRoot, "designs");

    [Fact]
    public async Task Seed_WithTheDemoDesigns_GivesEveryDemoBoardItsDesignOnceAcrossRestarts()
    {
        await using var data = database.CreateData();
        var settings = new TestServerSettings { DemoDesignsFolder = DesignsFolder };
        await using (var first = ApiTest.StartOn(data, settings))
        {
            await first.Client.GetAsync("/api/health", ApiTest.Token);
        }

        await using var second = ApiTest.StartOn(data, settings);
        var lab = (await second.Client.GetFromJsonAsync<List<BenchResponse>>("/api/benches", ApiTest.Token))!.Single(b => b.Name == "Analog Lab B");
        var boards = await second.Client.GetFromJsonAsync<List<BoardResponse>>($"/api/benches/{lab.Id}/boards", ApiTest.Token);

        Assert.All(boards!, b => Assert.Equal(1, b.LatestDesignVersion));
    }

    public sealed class OnSqlite() : DemoScenarioSeederTests(ServerDatabase.Sqlite);

    public sealed class OnPostgres() : DemoScenarioSeederTests(ServerDatabase.Postgres);
}
