using System.Net;
using System.Net.Http.Json;
using Patchproof.Contracts.Health;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Apis;

public sealed class HealthApiTests
{
    [Fact]
    public async Task GetHealth_ServerUp_AnswersOkWithCoreVersion()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite);

        var health = await api.Client.GetFromJsonAsync<HealthResponse>("/api/health", ApiTest.Token);

        Assert.NotNull(health);
        Assert.Equal("ok", health.Status);
        Assert.Equal(Patchproof.Core.CoreAssembly.Version, health.Version);
    }

    [Fact]
    public async Task UnknownApiRoute_AnswersProblemDetails404_NotTheClientPage()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite);

        using var response = await api.Client.GetAsync("/api/no-such-resource", ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.NotFound);
    }

    [Fact]
    public async Task OpenApiDocument_DescribesEveryResource()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite);

        var document = await api.Client.GetStringAsync("/api/openapi/v1.json", ApiTest.Token);

        foreach (var path in new[] { "/api/health", "/api/benches", "/api/boards/{boardId}", "/api/boards/{boardId}/designs", "/api/boards/{boardId}/captures", "/api/fits", "/api/fits/{fitId}/cancel", "/api/fits/{fitId}/report" })
        {
            Assert.Contains($"\"{path}\"", document, StringComparison.Ordinal);
        }
    }
}
