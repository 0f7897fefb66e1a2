using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using Patchproof.Contracts.Designs;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Apis;

public abstract class DesignSheetsApiTests(ServerDatabase database)
{
    [Fact]
    public async Task GetSheet_OfAStoredDemoDesign_ListsItsBlocksAndPartsWithTheirValues()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { SeedDemo = false });
        var board = await api.CreateBoardAsync(code: "QH-S1");
        await api.CreateDesignAsync(board.Id);

        var sheet = await api.Client.GetFromJsonAsync<DesignSheetDocument>($"/api/boards/{board.Id}/designs/1/sheet", ApiTest.Token);
        var latest = await api.Client.GetFromJsonAsync<DesignSheetDocument>($"/api/boards/{board.Id}/designs/latest/sheet", ApiTest.Token);

        Assert.Equal("lorenz", sheet!.ModelName);
        var r3 = Assert.Single(sheet.Parts, p => p.Reference == "R3");
        Assert.Equal(3570, r3.Nominal, 6); // designs/qh-l3-wren.json: "3.57k", E96 (1 %)
        Assert.Equal(1, r3.TolerancePercent, 6);
        Assert.Equal("Ohm", r3.Unit);
        Assert.StartsWith("I", r3.Block, StringComparison.Ordinal);
        Assert.Equal(sheet.Parts.Count, latest!.Parts.Count);
    }

    [Fact]
    public async Task SaveSheet_WithAnEditedPart_StoresADesignFileWithTheNewValue()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { SeedDemo = false });
        var board = await api.CreateBoardAsync(code: "QH-S2");
        await api.CreateDesignAsync(board.Id);
        var sheet = (await api.Client.GetFromJsonAsync<DesignSheetDocument>($"/api/boards/{board.Id}/designs/1/sheet", ApiTest.Token))!;
        var edited = sheet with { Parts = sheet.Parts.Select(p => p.Reference == "R3" ? p with { Nominal = 3650, TolerancePercent = 0.5 } : p).ToList() };

        using var saved = await api.Client.PostAsJsonAsync($"/api/boards/{board.Id}/designs?note=R3%20replaced", edited, ApiTest.Token);
        var again = await api.Client.GetFromJsonAsync<DesignSheetDocument>($"/api/boards/{board.Id}/designs/2/sheet", ApiTest.Token);
        var stored = await api.Client.GetFromJsonAsync<JsonElement>($"/api/boards/{board.Id}/designs/2", ApiTest.Token);

        Assert.Equal(HttpStatusCode.Created, saved.StatusCode);
        var r3 = Assert.Single(again!.Parts, p => p.Reference == "R3");
        Assert.Equal(3650, r3.Nominal, 6);
        Assert.Equal(0.5, r3.TolerancePercent, 6);
        Assert.Equal("patchproof-design", stored.GetProperty("document").GetProperty("format").GetString());
    }

    [Fact]
    public async Task SaveSheet_WithBadValues_NamesTheFieldAndStoresNothing()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { SeedDemo = false });
        var board = await api.CreateBoardAsync(code: "QH-S3");
        await api.CreateDesignAsync(board.Id);
        var sheet = (await api.Client.GetFromJsonAsync<DesignSheetDocument>($"/api/boards/{board.Id}/designs/1/sheet", ApiTest.Token))!;
        var edited = sheet with { Parts = sheet.Parts.Select((p, i) => i == 2 ? p with { Nominal = -5 } : p).ToList() };

        using var saved = await api.Client.PostAsJsonAsync($"/api/boards/{board.Id}/designs", edited, ApiTest.Token);
        using var unknownPart = await api.Client.PostAsJsonAsync($"/api/boards/{board.Id}/designs", sheet with { Parts = [new DesignSheetPart("R99", "resistor", "I1", 1e3, "Ohm", 1)] }, ApiTest.Token);

        var problem = await ApiTest.ReadProblemAsync(saved, HttpStatusCode.BadRequest);
        Assert.True(problem.GetProperty("errors").TryGetProperty("parts[2].nominal", out _), problem.GetRawText());
        var unknown = await ApiTest.ReadProblemAsync(unknownPart, HttpStatusCode.BadRequest);
        Assert.Contains("R99", unknown.GetProperty("errors").GetProperty("parts[0].reference")[0].GetString(), StringComparison.Ordinal);
        var versions = await api.Client.GetFromJsonAsync<List<DesignVersionSummary>>($"/api/boards/{board.Id}/designs", ApiTest.Token);
        Assert.Single(versions!);
    }

    [Fact]
    public async Task CheckDesign_SheetWithAWrongValue_NamesThePart()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { SeedDemo = false });
        using var generated = await api.Client.PostAsync("/api/models/lorenz/design", null, ApiTest.Token);
        var sheet = (await generated.Content.ReadFromJsonAsync<DesignSheetDocument>(ApiTest.Token))!;
        var healthy = await CheckAsync(api, sheet);
        var resistor = sheet.Parts.First(p => p.Kind == "resistor");
        var wrong = sheet with { Parts = sheet.Parts.Select(p => p.Reference == resistor.Reference ? p with { Nominal = p.Nominal * 1.5 } : p).ToList() };

        var notes = await CheckAsync(api, wrong);

        Assert.DoesNotContain(healthy, n => n.Severity == "error");
        var error = Assert.Single(notes, n => n.Severity == "error");
        Assert.Contains(resistor.Reference, error.Message.Split(["parts on its path: "], StringSplitOptions.None)[1].Split(", "));
    }

    [Fact]
    public async Task CheckDesign_UnreadableFileOrWrongType_AnswersProblemsWithLineAndColumn()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { SeedDemo = false });
        using var body = new StringContent("{\n  \"format\": \"patchproof-design\",\n  \"version\": 1,\n  \"timeScale\": \"1 ms\",\n  \"variables\": [], \"parts\": [{ \"id\": \"R1\", \"value\": \"10\" }], \"blocks\": []\n}", System.Text.Encoding.UTF8, "application/json");
        using var text = new StringContent("hello", System.Text.Encoding.UTF8, "text/plain");

        using var unreadable = await api.Client.PostAsync("/api/designs/check", body, ApiTest.Token);
        using var wrongType = await api.Client.PostAsync("/api/designs/check", text, ApiTest.Token);

        var problem = await ApiTest.ReadProblemAsync(unreadable, HttpStatusCode.UnprocessableEntity);
        Assert.True(problem.GetProperty("line").GetInt32() > 0);
        Assert.True(problem.GetProperty("column").GetInt32() > 0);
        await ApiTest.ReadProblemAsync(wrongType, HttpStatusCode.UnsupportedMediaType);
    }

    [Fact]
    public async Task GetSheet_Unknown_AnswersNotFound()
    {
        await using var api = ApiTest.Start(database, new TestServerSettings { SeedDemo = false });
        var board = await api.CreateBoardAsync(code: "QH-S4");

        using var none = await api.Client.GetAsync($"/api/boards/{board.Id}/designs/latest/sheet", ApiTest.Token);
        using var missing = await api.Client.GetAsync($"/api/boards/{board.Id}/designs/3/sheet", ApiTest.Token);

        await ApiTest.ReadProblemAsync(none, HttpStatusCode.NotFound);
        await ApiTest.ReadProblemAsync(missing, HttpStatusCode.NotFound);
    }

    private static async Task<List<DesignCheckNoteResponse>> CheckAsync(ApiTest api, DesignSheetDocument sheet)
    {
        using var response = await api.Client.PostAsJsonAsync("/api/designs/check", sheet, ApiTest.Token);
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        return (await response.Content.ReadFromJsonAsync<List<DesignCheckNoteResponse>>(ApiTest.Token))!;
    }

    public sealed class OnSqlite() : DesignSheetsApiTests(ServerDatabase.Sqlite);

    public sealed class OnPostgres() : DesignSheetsApiTests(ServerDatabase.Postgres);
}
