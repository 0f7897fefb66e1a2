using System.Net;
using System.Net.Http.Json;
using Patchproof.Contracts.Boards;
using Patchproof.Contracts.Designs;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Apis;

public abstract class DesignsApiTests(ServerDatabase database)
{
    [Fact]
    public async Task CreateDesign_TwoVersions_AreNumberedAndListedNewestFirst()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();

        var first = await api.CreateDesignAsync(board.Id);
        var second = await api.CreateDesignAsync(board.Id, RevisedDesign);
        var listed = await api.Client.GetFromJsonAsync<List<DesignVersionSummary>>($"/api/boards/{board.Id}/designs", ApiTest.Token);
        var boardNow = await api.Client.GetFromJsonAsync<BoardResponse>($"/api/boards/{board.Id}", ApiTest.Token);

        Assert.Equal((1, 2), (first.Version, second.Version));
        Assert.Equal([2, 1], listed!.Select(d => d.Version));
        Assert.Equal(2, boardNow!.LatestDesignVersion);
    }

    [Fact]
    public async Task GetDesign_ByVersionAndLatest_ReturnsTheStoredDocument()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();
        await api.CreateDesignAsync(board.Id);
        using var content = new StringContent(RevisedDesign, System.Text.Encoding.UTF8, "application/json");
        (await api.Client.PostAsync($"/api/boards/{board.Id}/designs?note=R5%20replaced", content, ApiTest.Token)).Dispose();

        var first = await api.Client.GetFromJsonAsync<DesignVersionResponse>($"/api/boards/{board.Id}/designs/1", ApiTest.Token);
        var latest = await api.Client.GetFromJsonAsync<DesignVersionResponse>($"/api/boards/{board.Id}/designs/latest", ApiTest.Token);

        Assert.Equal("Wren", first!.Document.GetProperty("title").GetString());
        Assert.Equal(2, latest!.Version);
        Assert.Equal("R5 replaced", latest.Note);
        Assert.Equal("Wren rev b", latest.Document.GetProperty("title").GetString());
    }

    [Fact]
    public async Task CreateDesign_MalformedJson_AnswersLineAndColumnAndStoresNothing()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();

        var broken = ApiTest.DemoDesign.Replace("\"title\": \"Wren\",", "\"title\": \"Wren\",,", StringComparison.Ordinal);
        using var content = new StringContent(broken, System.Text.Encoding.UTF8, "application/json");
        using var response = await api.Client.PostAsync($"/api/boards/{board.Id}/designs", content, ApiTest.Token);

        var problem = await ApiTest.ReadProblemAsync(response, HttpStatusCode.UnprocessableEntity);
        Assert.Equal(5, problem.GetProperty("line").GetInt32());
        Assert.Equal(19, problem.GetProperty("column").GetInt32()); // the second comma after "Wren"
        var listed = await api.Client.GetFromJsonAsync<List<DesignVersionSummary>>($"/api/boards/{board.Id}/designs", ApiTest.Token);
        Assert.Empty(listed!);
    }

    [Fact]
    public async Task CreateDesign_JsonThatIsNoDesign_IsRefusedWithTheReadersErrors()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();

        using var content = new StringContent("""{"rev":"a"}""", System.Text.Encoding.UTF8, "application/json");
        using var response = await api.Client.PostAsync($"/api/boards/{board.Id}/designs", content, ApiTest.Token);

        var problem = await ApiTest.ReadProblemAsync(response, HttpStatusCode.UnprocessableEntity);
        Assert.NotEqual(0, problem.GetProperty("errors").GetArrayLength());
    }

    [Fact]
    public async Task CreateDesign_JsonArray_IsRefused()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();

        using var content = new StringContent("[1,2]", System.Text.Encoding.UTF8, "application/json");
        using var response = await api.Client.PostAsync($"/api/boards/{board.Id}/designs", content, ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.UnprocessableEntity);
    }

    [Fact]
    public async Task CreateDesign_NotJsonMediaType_AnswersUnsupportedMediaType()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();

        using var content = new StringContent("{}", System.Text.Encoding.UTF8, "text/plain");
        using var response = await api.Client.PostAsync($"/api/boards/{board.Id}/designs", content, ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.UnsupportedMediaType);
    }

    [Fact]
    public async Task CreateDesign_UnknownBoard_AnswersNotFound()
    {
        await using var api = ApiTest.Start(database);

        using var content = new StringContent("{}", System.Text.Encoding.UTF8, "application/json");
        using var response = await api.Client.PostAsync($"/api/boards/{Guid.NewGuid()}/designs", content, ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.NotFound);
    }

    [Fact]
    public async Task GetDesign_UnknownVersion_AnswersNotFound()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync();

        using var version = await api.Client.GetAsync($"/api/boards/{board.Id}/designs/3", ApiTest.Token);
        using var latest = await api.Client.GetAsync($"/api/boards/{board.Id}/designs/latest", ApiTest.Token);
        using var list = await api.Client.GetAsync($"/api/boards/{Guid.NewGuid()}/designs", ApiTest.Token);

        await ApiTest.ReadProblemAsync(version, HttpStatusCode.NotFound);
        await ApiTest.ReadProblemAsync(latest, HttpStatusCode.NotFound);
        await ApiTest.ReadProblemAsync(list, HttpStatusCode.NotFound);
    }

    private static string RevisedDesign { get; } = ApiTest.DemoDesign.Replace("\"title\": \"Wren\"", "\"title\": \"Wren rev b\"", StringComparison.Ordinal);

    public sealed class OnSqlite() : DesignsApiTests(ServerDatabase.Sqlite);

    public sealed class OnPostgres() : DesignsApiTests(ServerDatabase.Postgres);
}
