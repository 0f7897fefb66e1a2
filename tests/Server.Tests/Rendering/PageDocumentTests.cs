using System.Net;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Rendering;

public sealed class PageDocumentTests
{
    [Fact]
    public async Task StartPage_IsRenderedOnTheServer_WithTheApisAnswersAndTheirHandOver()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite);

        using var response = await api.Client.GetAsync("/", ApiTest.Token);
        var page = await response.Content.ReadAsStringAsync(ApiTest.Token);

        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        Assert.Equal("text/html", response.Content.Headers.ContentType?.MediaType);
        // The demo bench and the health answer, read by the client's own code over HTTP while the server rendered.
        Assert.Contains("Server ready · core", page, StringComparison.Ordinal);
        Assert.Contains(">Analog Lab B</a>", page, StringComparison.Ordinal);
        Assert.Contains("<!--Blazor-WebAssembly-Component-State:", page, StringComparison.Ordinal);
        Assert.Contains("_framework/blazor.web.", page, StringComparison.Ordinal);
        Assert.DoesNotContain("Loading Patchproof", page, StringComparison.Ordinal);
    }

    [Fact]
    public async Task StartPage_HandsTheClientNoAddressOfTheStaticFileList()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite);

        var page = await api.Client.GetStringAsync("/", ApiTest.Token);

        // The handed-over state is base64 of JSON whose values are base64 again; ClientAssetList leaves the address out.
        var state = System.Text.RegularExpressions.Regex.Match(page, "<!--Blazor-WebAssembly-Component-State:([A-Za-z0-9+/=]+)-->").Groups[1].Value;
        var entries = System.Text.Json.JsonSerializer.Deserialize<Dictionary<string, string>>(Convert.FromBase64String(state))!;
        var values = entries.Values.Select(value => System.Text.Encoding.UTF8.GetString(Convert.FromBase64String(value)));
        Assert.Contains(values, value => value.Contains("Analog Lab B", StringComparison.Ordinal));
        Assert.DoesNotContain(values, value => value.Contains("resource-collection", StringComparison.Ordinal));
    }

    [Fact]
    public async Task MissingFile_AnswersAPlainNotFound()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite);

        using var response = await api.Client.GetAsync("/favicon.ico", ApiTest.Token);

        Assert.Equal(HttpStatusCode.NotFound, response.StatusCode);
        Assert.DoesNotContain("blazor.web", await response.Content.ReadAsStringAsync(ApiTest.Token), StringComparison.Ordinal);
    }

    [Fact]
    public async Task OtherPage_IsLeftToTheClient_WithANoticeUntilItRuns()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite);

        using var response = await api.Client.GetAsync("/how-to/capture", ApiTest.Token);
        var page = await response.Content.ReadAsStringAsync(ApiTest.Token);

        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        Assert.Contains("Loading Patchproof…", page, StringComparison.Ordinal);
        Assert.Contains("_framework/blazor.web.", page, StringComparison.Ordinal);
        Assert.DoesNotContain("How to capture a board", page, StringComparison.Ordinal);
    }

    [Fact]
    public async Task UnknownAddress_AnswersNotFound_WithTheDocumentForTheClientToSaySo()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite);

        using var response = await api.Client.GetAsync("/boards/anything", ApiTest.Token);
        var page = await response.Content.ReadAsStringAsync(ApiTest.Token);

        Assert.Equal(HttpStatusCode.NotFound, response.StatusCode);
        Assert.Equal("text/html", response.Content.Headers.ContentType?.MediaType);
        Assert.Contains("_framework/blazor.web.", page, StringComparison.Ordinal);
    }

    [Fact]
    public async Task UnknownApiAddress_StillAnswersAProblem()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite);

        using var response = await api.Client.GetAsync("/api/nowhere", ApiTest.Token);

        await ApiTest.ReadProblemAsync(response, HttpStatusCode.NotFound);
    }
}
