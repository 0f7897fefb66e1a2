using System.Net;
using System.Net.Http.Json;
using Patchproof.Contracts.Health;

namespace Patchproof.Server.Tests.Apis;

public sealed class HealthApiTests(PatchproofServerFactory factory) : IClassFixture<PatchproofServerFactory>
{
    [Fact]
    public async Task GetHealth_ServerUp_AnswersOkWithCoreVersion()
    {
        using var client = factory.CreateClient();

        var health = await client.GetFromJsonAsync<HealthResponse>("/api/health", TestContext.Current.CancellationToken);

        Assert.NotNull(health);
        Assert.Equal("ok", health.Status);
        Assert.Equal(Patchproof.Core.CoreAssembly.Version, health.Version);
    }

    [Fact]
    public async Task UnknownApiRoute_AnswersProblemDetails404_NotTheClientPage()
    {
        using var client = factory.CreateClient();

        using var response = await client.GetAsync("/api/no-such-resource", TestContext.Current.CancellationToken);

        Assert.Equal(HttpStatusCode.NotFound, response.StatusCode);
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
    }

    [Fact]
    public async Task ClientRoute_ServesTheStartPage()
    {
        using var client = factory.CreateClient();

        var page = await client.GetStringAsync("/boards/anything", TestContext.Current.CancellationToken);

        Assert.Contains("<div id=\"app\">", page, StringComparison.Ordinal);
        Assert.Contains("_framework/blazor.webassembly.js", page, StringComparison.Ordinal);
    }

    [Fact]
    public async Task OpenApiDocument_DescribesTheHealthEndpoint()
    {
        using var client = factory.CreateClient();

        var document = await client.GetStringAsync("/api/openapi/v1.json", TestContext.Current.CancellationToken);

        Assert.Contains("/api/health", document, StringComparison.Ordinal);
    }
}
