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

    [Fact]
    public async Task Seed_ProbeCalibrationCaptureBesideABoardCapture_SeedsOnlyTheBoardCapture()
    {
        await using var data = database.CreateData();
        var folder = Path.Combine(data.DataFolder, "demo-captures");
        Directory.CreateDirectory(folder);
        var samples = Path.Combine(Patchproof.TestSupport.ReferenceDataFiles.RepositoryRoot, "sample-captures");
        File.Copy(Path.Combine(samples, "qh-r1-gannet.csv"), Path.Combine(folder, "qh-r1-gannet.csv"));
        File.Copy(Path.Combine(samples, "qh-r1-gannet-probe-calibration.csv"), Path.Combine(folder, "qh-r1-gannet-probe-calibration.csv"));

        await using var server = ApiTest.StartOn(data, new TestServerSettings { DemoDesignsFolder = DesignsFolder, DemoCapturesFolder = folder });
        var lab = (await server.Client.GetFromJsonAsync<List<BenchResponse>>("/api/benches", ApiTest.Token))!.Single(b => b.Name == "Analog Lab B");
        var boards = await server.Client.GetFromJsonAsync<List<BoardResponse>>($"/api/benches/{lab.Id}/boards", ApiTest.Token);
        var gannet = boards!.Single(b => b.Code == "QH-R1");
        var captures = await server.Client.GetFromJsonAsync<List<System.Text.Json.JsonElement>>($"/api/boards/{gannet.Id}/captures", ApiTest.Token);

        var only = Assert.Single(captures!);
        Assert.Contains("qh-r1-gannet.csv", only.GetRawText(), StringComparison.Ordinal);
    }

    [Fact]
    public async Task Seed_SquareWaveCalibrationCaptureBesideABoardCapture_SeedsOnlyTheBoardCapture()
    {
        await using var data = database.CreateData();
        var folder = Path.Combine(data.DataFolder, "demo-captures");
        Directory.CreateDirectory(folder);
        var samples = Path.Combine(Patchproof.TestSupport.ReferenceDataFiles.RepositoryRoot, "sample-captures");
        foreach (var name in new[] { "qh-r1-gannet.csv", "qh-r1-gannet-probe-calibration.csv", "qh-r1-gannet-square-wave-probe-calibration.csv" })
        {
            File.Copy(Path.Combine(samples, name), Path.Combine(folder, name));
        }

        await using var server = ApiTest.StartOn(data, new TestServerSettings { DemoDesignsFolder = DesignsFolder, DemoCapturesFolder = folder });
        var lab = (await server.Client.GetFromJsonAsync<List<BenchResponse>>("/api/benches", ApiTest.Token))!.Single(b => b.Name == "Analog Lab B");
        var boards = await server.Client.GetFromJsonAsync<List<BoardResponse>>($"/api/benches/{lab.Id}/boards", ApiTest.Token);
        var gannet = boards!.Single(b => b.Code == "QH-R1");
        var captures = await server.Client.GetFromJsonAsync<List<System.Text.Json.JsonElement>>($"/api/boards/{gannet.Id}/captures", ApiTest.Token);

        var only = Assert.Single(captures!);
        Assert.Contains("qh-r1-gannet.csv", only.GetRawText(), StringComparison.Ordinal);
        Assert.DoesNotContain("square-wave", only.GetRawText(), StringComparison.Ordinal);
    }

    public sealed class OnSqlite() : DemoScenarioSeederTests(ServerDatabase.Sqlite);

    public sealed class OnPostgres() : DemoScenarioSeederTests(ServerDatabase.Postgres);
}
