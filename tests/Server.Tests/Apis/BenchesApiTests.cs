using System.Net;
using System.Net.Http.Json;
using Patchproof.Contracts.Benches;
using Patchproof.Contracts.Boards;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Apis;

public abstract class BenchesApiTests(ServerDatabase database)
{
    [Fact]
    public async Task ListBenches_FirstStart_HasTheDemoBenchWithItsBoards()
    {
        await using var api = ApiTest.Start(database);

        var benches = await api.Client.GetFromJsonAsync<List<BenchResponse>>("/api/benches", ApiTest.Token);
        var lab = Assert.Single(benches!, b => b.Name == "Analog Lab B");
        var boards = await api.Client.GetFromJsonAsync<List<BoardResponse>>($"/api/benches/{lab.Id}/boards", ApiTest.Token);

        Assert.Equal("Quillhaven Polytechnic", lab.Institution);
        Assert.Equal(["QH-D2", "QH-L3", "QH-L4", "QH-L5", "QH-L9", "QH-R1"], boards!.Select(b => b.Code));
        Assert.Equal(6, lab.BoardCount);
    }

    [Fact]
    public async Task Restart_OnSameData_DoesNotSeedTheDemoTwice()
    {
        await using var data = database.CreateData();
        await using (var first = ApiTest.StartOn(data))
        {
            await first.Client.GetAsync("/api/health", ApiTest.Token);
        }

        await using var second = ApiTest.StartOn(data);
        var benches = await second.Client.GetFromJsonAsync<List<BenchResponse>>("/api/benches", ApiTest.Token);

        Assert.Equal(6, Assert.Single(benches!, b => b.Name == "Analog Lab B").BoardCount);
    }

    [Fact]
    public async Task CreateBench_ValidRequest_IsStoredAndReadable()
    {
        await using var api = ApiTest.Start(database);

        var created = await api.CreateBenchAsync("Bench 4");
        var read = await api.Client.GetFromJsonAsync<BenchResponse>($"/api/benches/{created.Id}", ApiTest.Token);

        Assert.Equal(created, read);
        Assert.Equal(api.Host.Time.GetUtcNow(), read!.CreatedAt);
    }

    [Fact]
    public async Task CreateBench_DuplicateName_AnswersConflict()
    {
        await using var api = ApiTest.Start(database);

        using var response = await api.Client.PostAsJsonAsync("/api/benches", new CreateBenchRequest("Analog Lab B"), ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.Conflict);
    }

    [Fact]
    public async Task CreateBench_EmptyName_AnswersValidationProblemNamingTheField()
    {
        await using var api = ApiTest.Start(database);

        using var response = await api.Client.PostAsJsonAsync("/api/benches", new CreateBenchRequest(" "), ApiTest.Token);

        var problem = await ApiTest.ReadProblemAsync(response, HttpStatusCode.BadRequest);
        Assert.True(problem.GetProperty("errors").TryGetProperty("name", out _));
    }

    [Fact]
    public async Task CreateBench_MalformedJson_AnswersProblemDetails()
    {
        await using var api = ApiTest.Start(database);

        using var content = new StringContent("{\"name\": ", System.Text.Encoding.UTF8, "application/json");
        using var response = await api.Client.PostAsync("/api/benches", content, ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.BadRequest);
    }

    [Fact]
    public async Task GetBench_Unknown_AnswersNotFound()
    {
        await using var api = ApiTest.Start(database);

        using var response = await api.Client.GetAsync($"/api/benches/{Guid.NewGuid()}", ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.NotFound);
    }

    [Fact]
    public async Task CreateBoard_OnBench_IsListedAndReadable()
    {
        await using var api = ApiTest.Start(database);
        var bench = await api.CreateBenchAsync();

        var board = await api.CreateBoardAsync(bench.Id, "QH-L8");
        var listed = await api.Client.GetFromJsonAsync<List<BoardResponse>>($"/api/benches/{bench.Id}/boards", ApiTest.Token);
        var read = await api.Client.GetFromJsonAsync<BoardResponse>($"/api/boards/{board.Id}", ApiTest.Token);

        Assert.Equal(board, Assert.Single(listed!));
        Assert.Equal(board, read);
        Assert.Null(read!.LatestDesignVersion);
    }

    [Fact]
    public async Task CreateBoard_DuplicateCodeOnBench_AnswersConflict()
    {
        await using var api = ApiTest.Start(database);
        var board = await api.CreateBoardAsync(code: "QH-L8");

        using var response = await api.Client.PostAsJsonAsync($"/api/benches/{board.BenchId}/boards", new CreateBoardRequest("QH-L8", "Other"), ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.Conflict);
    }

    [Fact]
    public async Task CreateBoard_UnknownBench_AnswersNotFound()
    {
        await using var api = ApiTest.Start(database);

        using var response = await api.Client.PostAsJsonAsync($"/api/benches/{Guid.NewGuid()}/boards", new CreateBoardRequest("QH-L8", "Petrel"), ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.NotFound);
    }

    [Fact]
    public async Task ListBoards_UnknownBench_AnswersNotFound()
    {
        await using var api = ApiTest.Start(database);

        using var response = await api.Client.GetAsync($"/api/benches/{Guid.NewGuid()}/boards", ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.NotFound);
    }

    [Fact]
    public async Task GetBoard_Unknown_AnswersNotFound()
    {
        await using var api = ApiTest.Start(database);

        using var response = await api.Client.GetAsync($"/api/boards/{Guid.NewGuid()}", ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.NotFound);
    }

    public sealed class OnSqlite() : BenchesApiTests(ServerDatabase.Sqlite);

    public sealed class OnPostgres() : BenchesApiTests(ServerDatabase.Postgres);
}
