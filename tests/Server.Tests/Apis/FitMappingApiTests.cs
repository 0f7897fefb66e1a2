using System.Net;
using System.Net.Http.Json;
using Patchproof.Contracts.Captures;
using Patchproof.Contracts.Fits;
using Patchproof.Server.Tests.Hosting;
using Patchproof.TestSupport;

namespace Patchproof.Server.Tests.Apis;

/// <summary>A fit started with a channel mapping: kept with the job, handed to the engine, refused when it cannot be fitted.</summary>
/// <remarks>The board is the demo QH-L5 (design x, y, z; its sample capture records x on CH1 and z on CH2).</remarks>
public abstract class FitMappingApiTests(ServerDatabase database)
{
    private static async Task<(ApiTest Api, Guid BoardId, int DesignVersion, Guid CaptureId)> TernAsync(ScriptedFitExecutor executor, ServerDatabase database)
    {
        var api = ApiTest.Start(database, new TestServerSettings { Executor = executor, SeedDemo = false });
        var board = await api.CreateBoardAsync(code: "QH-L5");
        var design = await api.CreateDesignAsync(board.Id, File.ReadAllText(Path.Combine(ReferenceDataFiles.RepositoryRoot, "designs", "qh-l5-tern.json")));
        var capture = await api.UploadCaptureAsync(board.Id, File.ReadAllBytes(Path.Combine(ReferenceDataFiles.RepositoryRoot, "sample-captures", "qh-l5-tern.csv")));
        return (api, board.Id, design.Version, capture.Id);
    }

    [Fact]
    public async Task StartFit_WithAMapping_KeepsItShowsItAndHandsItToTheEngine()
    {
        var executor = new ScriptedFitExecutor();
        var (api, board, version, capture) = await TernAsync(executor, database);
        await using var owned = api;
        ChannelMappingEntry[] mapping = [new("CH1", "x", 1), new(" ch2 ", "z", -1)];

        using var response = await api.Client.PostAsJsonAsync("/api/fits", new StartFitRequest(board, version, [capture], Mapping: mapping), ApiTest.Token);
        var started = (await response.Content.ReadFromJsonAsync<FitResponse>(ApiTest.Token))!;
        var done = await api.WaitForFitAsync(started.Id, ApiTest.IsFinal);
        var listed = await api.Client.GetFromJsonAsync<List<FitResponse>>($"/api/boards/{board}/fits", ApiTest.Token);

        Assert.Equal(HttpStatusCode.Accepted, response.StatusCode);
        ChannelMappingEntry[] stored = [new("CH1", "x", 1), new("ch2", "z", -1)];
        Assert.Equal(stored, started.Mapping);
        Assert.Equal(stored, done.Mapping);
        Assert.Equal(stored, Assert.Single(listed!).Mapping);
        Assert.Equal(stored, executor.InputOf(started.Id)!.Mapping);
    }

    [Fact]
    public async Task StartFit_WithoutAMappingOrWithAnEmptyOne_LeavesTheFileOrder()
    {
        var executor = new ScriptedFitExecutor();
        var (api, board, version, capture) = await TernAsync(executor, database);
        await using var owned = api;

        // The body as clients written before the field existed send it, then an empty mapping.
        using var absent = await api.Client.PostAsJsonAsync("/api/fits", new { boardId = board, designVersion = version, captureIds = new[] { capture } }, ApiTest.Token);
        using var empty = await api.Client.PostAsJsonAsync("/api/fits", new StartFitRequest(board, version, [capture], Mapping: []), ApiTest.Token);

        foreach (var response in new[] { absent, empty })
        {
            Assert.Equal(HttpStatusCode.Accepted, response.StatusCode);
            var started = (await response.Content.ReadFromJsonAsync<FitResponse>(ApiTest.Token))!;
            await api.WaitForFitAsync(started.Id, ApiTest.IsFinal);
            Assert.Null(started.Mapping);
            Assert.Null(executor.InputOf(started.Id)!.Mapping);
        }
    }

    public static TheoryData<string, string> BadMappings => new()
    {
        { "CH1=x,CH3=z", "mapping[1].channel" },
        { "CH1=x,CH2=w", "mapping[1].variable" },
        { "CH1=x,CH2=x", "mapping[1].variable" },
        { "CH1=x,1=z", "mapping[1].channel" },
        { "CH1=x:0,CH2=z", "mapping[0].sign" },
        { "CH1=x,CH2=z:2", "mapping[1].sign" },
        { " =x", "mapping[0].channel" },
    };

    [Theory]
    [MemberData(nameof(BadMappings))]
    public async Task StartFit_AMappingThatCannotBeFitted_IsRefusedNamingTheFieldAndStoresNothing(string mapping, string field)
    {
        var executor = new ScriptedFitExecutor();
        var (api, board, version, capture) = await TernAsync(executor, database);
        await using var owned = api;

        using var response = await api.Client.PostAsJsonAsync("/api/fits", new StartFitRequest(board, version, [capture], Mapping: Parse(mapping)), ApiTest.Token);
        var problem = await ApiTest.ReadProblemAsync(response, HttpStatusCode.BadRequest);
        var listed = await api.Client.GetFromJsonAsync<List<FitResponse>>($"/api/boards/{board}/fits", ApiTest.Token);

        var errors = problem.GetProperty("errors");
        var only = Assert.Single(errors.EnumerateObject());
        Assert.Equal(field, only.Name);
        Assert.NotEmpty(only.Value[0].GetString()!);
        Assert.Empty(listed!);
        Assert.Empty(executor.Runs);
    }

    // "CH2=z:2" is channel CH2, variable z, sign 2: a sign the wire allows and the rules refuse.
    private static List<ChannelMappingEntry> Parse(string text) =>
        text.Split(',').Select(item =>
        {
            var (channel, rest) = (item.Split('=')[0], item.Split('=')[1]);
            var parts = rest.Split(':');
            return new ChannelMappingEntry(channel, parts[0], parts.Length > 1 ? int.Parse(parts[1], System.Globalization.CultureInfo.InvariantCulture) : 1);
        }).ToList();

    public sealed class OnSqlite() : FitMappingApiTests(ServerDatabase.Sqlite);

    public sealed class OnPostgres() : FitMappingApiTests(ServerDatabase.Postgres);
}
