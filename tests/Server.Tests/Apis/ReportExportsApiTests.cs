using System.Net;
using System.Net.Http.Json;
using Patchproof.Contracts.Captures;
using Patchproof.Contracts.Fits;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Apis;

public sealed class ReportExportsApiTests
{
    private static async Task<(ApiTest Api, Guid FitId)> FittedDunlinAsync()
    {
        var api = ApiTest.Start(ServerDatabase.Sqlite, new TestServerSettings { SeedDemo = false });
        var board = await api.CreateBoardAsync(code: "QH-E1");
        var design = await api.CreateDesignAsync(board.Id, SyntheticBoardCaptures.DesignText("qh-d2-dunlin.json"));
        using var upload = await api.UploadAsync(board.Id, SyntheticBoardCaptures.Csv("qh-d2-dunlin.json", new Dictionary<string, double> { ["R2"] = 1.10 }, seed: 61), "dunlin-r2.csv");
        var capture = (await upload.Content.ReadFromJsonAsync<CaptureResponse>(ApiTest.Token))!;
        var fit = await api.StartFitAsync(board.Id, design.Version, capture.Id);
        var done = await api.WaitForFitAsync(fit.Id, ApiTest.IsFinal, TimeSpan.FromMinutes(3));
        Assert.Equal(FitState.Succeeded, done.State);
        return (api, fit.Id);
    }

    [Fact]
    public async Task ReportCsv_OfAFit_HasAHeaderTheFindingAndEveryCoefficient()
    {
        var (api, fitId) = await FittedDunlinAsync();
        await using var owned = api;

        using var response = await api.Client.GetAsync($"/api/fits/{fitId}/report.csv", ApiTest.Token);
        var lines = (await response.Content.ReadAsStringAsync(ApiTest.Token)).Split('\n', StringSplitOptions.RemoveEmptyEntries).Select(l => l.TrimEnd('\r')).ToList();

        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        Assert.Equal("text/csv", response.Content.Headers.ContentType?.MediaType);
        Assert.Equal("attachment", response.Content.Headers.ContentDisposition?.DispositionType);
        Assert.StartsWith("section,board,part_or_equation", lines[0], StringComparison.Ordinal);
        Assert.Single(lines, l => l.StartsWith("finding,QH-E1,R2,", StringComparison.Ordinal));
        Assert.Equal(3, lines.Count(l => l.StartsWith("coefficient,", StringComparison.Ordinal)));
        var yx = Assert.Single(lines, l => l.StartsWith("coefficient,QH-E1,dy/dt,x,1/s,", StringComparison.Ordinal)).Split(',');
        Assert.Equal(-1000, double.Parse(yx[5], System.Globalization.CultureInfo.InvariantCulture), 6); // designs/qh-d2-dunlin.json: -1/(100 kOhm * 10 nF)
        Assert.Equal(2, lines.Count(l => l.StartsWith("offset,", StringComparison.Ordinal)));
    }

    [Fact]
    public async Task ReportHtml_OfAFit_IsOneSelfContainedPageNamingThePart()
    {
        var (api, fitId) = await FittedDunlinAsync();
        await using var owned = api;

        using var response = await api.Client.GetAsync($"/api/fits/{fitId}/report.html", ApiTest.Token);
        var html = await response.Content.ReadAsStringAsync(ApiTest.Token);

        Assert.Equal("text/html", response.Content.Headers.ContentType?.MediaType);
        Assert.StartsWith("<!DOCTYPE html>", html, StringComparison.Ordinal);
        Assert.Contains("<span class=\"part\">R2</span>", html, StringComparison.Ordinal);
        Assert.Contains("<style>", html, StringComparison.Ordinal);
        Assert.DoesNotMatch("(src|href)=\"(https?:)?//", html);
        Assert.DoesNotContain("<script", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("<link", html, StringComparison.OrdinalIgnoreCase);
        Assert.Contains("<svg", html, StringComparison.Ordinal);
        Assert.Contains("capture (black, solid)", html, StringComparison.Ordinal);
        Assert.Contains("<h2>Channel gains assumed</h2>", html, StringComparison.Ordinal);
        Assert.Contains("<td>probe tolerance 2 %", html, StringComparison.Ordinal);
    }

    [Fact]
    public async Task ReportExports_UnknownUnfinishedOrForeignResult_AnswerProblems()
    {
        var executor = new ScriptedFitExecutor();
        await using var api = ApiTest.Start(ServerDatabase.Sqlite, new TestServerSettings { SeedDemo = false, Executor = executor });
        var (board, design, capture) = await api.CreateFittableBoardAsync();
        var fit = await api.StartFitAsync(board.Id, design.Version, capture);
        await api.WaitForFitAsync(fit.Id, ApiTest.IsFinal);

        foreach (var kind in new[] { "csv", "html" })
        {
            using var unknown = await api.Client.GetAsync($"/api/fits/{Guid.NewGuid()}/report.{kind}", ApiTest.Token);
            using var foreign = await api.Client.GetAsync($"/api/fits/{fit.Id}/report.{kind}", ApiTest.Token);
            await ApiTest.ReadProblemAsync(unknown, HttpStatusCode.NotFound);
            await ApiTest.ReadProblemAsync(foreign, HttpStatusCode.Conflict);
        }
    }
}
