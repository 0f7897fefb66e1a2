using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.DependencyInjection;
using Patchproof.Contracts.Benches;
using Patchproof.Contracts.Boards;
using Patchproof.Contracts.Captures;
using Patchproof.Contracts.Designs;
using Patchproof.Contracts.Fits;
using Patchproof.Server.Data;
using Patchproof.Server.Storage;

namespace Patchproof.Server.Tests.Hosting;

/// <summary>One test's server: its data, the host and a client; disposing stops the server and removes the data.</summary>
internal sealed class ApiTest : IAsyncDisposable
{
    private readonly bool ownsData;

    private ApiTest(ServerData data, TestServerHost host, bool ownsData)
    {
        Data = data;
        Host = host;
        this.ownsData = ownsData;
        Client = host.CreateClient();
    }

    public ServerData Data { get; }

    public TestServerHost Host { get; }

    public HttpClient Client { get; }

    public static CancellationToken Token => TestContext.Current.CancellationToken;

    public static ApiTest Start(ServerDatabase database, TestServerSettings? settings = null)
    {
        var data = database.CreateData();
        return new(data, new TestServerHost(data, settings), ownsData: true);
    }

    /// <summary>A server on data that already exists (a second process, or the same one after a restart).</summary>
    public static ApiTest StartOn(ServerData data, TestServerSettings? settings = null) => new(data, new TestServerHost(data, settings), ownsData: false);

    public async ValueTask DisposeAsync()
    {
        Client.Dispose();
        await Host.DisposeAsync();
        if (ownsData)
        {
            await Data.DisposeAsync();
        }
    }

    public T Service<T>()
        where T : notnull => Host.Services.GetRequiredService<T>();

    public async Task<T> WithDbAsync<T>(Func<PatchproofDbContext, Task<T>> use)
    {
        await using var db = await Service<IDbContextFactory<PatchproofDbContext>>().CreateDbContextAsync(Token);
        return await use(db);
    }

    public async Task<BenchResponse> CreateBenchAsync(string name = "Bench 7")
    {
        using var response = await Client.PostAsJsonAsync("/api/benches", new CreateBenchRequest(name, "Quillhaven Polytechnic"), Token);
        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        return (await response.Content.ReadFromJsonAsync<BenchResponse>(Token))!;
    }

    public async Task<BoardResponse> CreateBoardAsync(Guid? benchId = null, string code = "QH-L7")
    {
        benchId ??= (await CreateBenchAsync($"Bench for {code}")).Id;
        using var response = await Client.PostAsJsonAsync($"/api/benches/{benchId}/boards", new CreateBoardRequest(code, "Petrel", "student team Auk"), Token);
        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        return (await response.Content.ReadFromJsonAsync<BoardResponse>(Token))!;
    }

    /// <summary>The demo design of QH-L3, a valid document of the design schema.</summary>
    public static string DemoDesign { get; } = File.ReadAllText(Path.Combine(Patchproof.TestSupport.ReferenceDataFiles.RepositoryRoot, "designs", "qh-l3-wren.json"));

    public async Task<DesignVersionSummary> CreateDesignAsync(Guid boardId, string? document = null)
    {
        document ??= DemoDesign;
        using var content = new StringContent(document, System.Text.Encoding.UTF8, "application/json");
        using var response = await Client.PostAsync($"/api/boards/{boardId}/designs", content, Token);
        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        return (await response.Content.ReadFromJsonAsync<DesignVersionSummary>(Token))!;
    }

    public async Task<HttpResponseMessage> UploadAsync(Guid boardId, byte[] bytes, string fileName = "capture.csv", string partType = "text/csv")
    {
        using var form = new MultipartFormDataContent();
        var file = new ByteArrayContent(bytes);
        file.Headers.ContentType = new System.Net.Http.Headers.MediaTypeHeaderValue(partType);
        form.Add(file, "file", fileName);
        return await Client.PostAsync($"/api/boards/{boardId}/captures", form, Token);
    }

    public async Task<CaptureResponse> UploadCaptureAsync(Guid boardId, byte[]? bytes = null)
    {
        using var response = await UploadAsync(boardId, bytes ?? CaptureFiles.TwoChannelScopeExport(2000));
        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        return (await response.Content.ReadFromJsonAsync<CaptureResponse>(Token))!;
    }

    public async Task<(BoardResponse Board, DesignVersionSummary Design, Guid CaptureId)> CreateFittableBoardAsync(string code = "QH-L7")
    {
        var board = await CreateBoardAsync(code: code);
        var design = await CreateDesignAsync(board.Id);
        var capture = await UploadCaptureAsync(board.Id);
        return (board, design, capture.Id);
    }

    public async Task<FitResponse> StartFitAsync(Guid boardId, int designVersion, params Guid[] captureIds)
    {
        using var response = await Client.PostAsJsonAsync("/api/fits", new StartFitRequest(boardId, designVersion, captureIds), Token);
        Assert.Equal(HttpStatusCode.Accepted, response.StatusCode);
        return (await response.Content.ReadFromJsonAsync<FitResponse>(Token))!;
    }

    public async Task<FitResponse> GetFitAsync(Guid fitId) => (await Client.GetFromJsonAsync<FitResponse>($"/api/fits/{fitId}", Token))!;

    /// <summary>Polls a fit until <paramref name="done"/> holds (real time: the workers run on their own).</summary>
    public async Task<FitResponse> WaitForFitAsync(Guid fitId, Func<FitResponse, bool> done, TimeSpan? timeout = null)
    {
        var deadline = DateTime.UtcNow + (timeout ?? TimeSpan.FromSeconds(30));
        while (true)
        {
            var fit = await GetFitAsync(fitId);
            if (done(fit))
            {
                return fit;
            }

            if (DateTime.UtcNow > deadline)
            {
                Assert.Fail($"Fit {fitId} did not get there in time; it is {fit.State} at {fit.Progress:P0} ({fit.Stage}).");
            }

            await Task.Delay(25, Token);
        }
    }

    public static bool IsFinal(FitResponse fit) => fit.State is FitState.Succeeded or FitState.Failed or FitState.Cancelled;

    /// <summary>Reads a problem details answer and checks its media type and that it carries no stack trace.</summary>
    public static async Task<JsonElement> ReadProblemAsync(HttpResponseMessage response, HttpStatusCode expected)
    {
        Assert.Equal(expected, response.StatusCode);
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
        var text = await response.Content.ReadAsStringAsync(Token);
        Assert.DoesNotMatch(@"\bat [\w.`<>]+\(", text);
        Assert.DoesNotContain("Exception", text, StringComparison.Ordinal);
        using var document = JsonDocument.Parse(text);
        Assert.Equal((int)expected, document.RootElement.GetProperty("status").GetInt32());
        return document.RootElement.Clone();
    }
}
