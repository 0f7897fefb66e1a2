using System.Net;
using System.Net.Http.Json;
using Patchproof.Contracts.Designs;
using Patchproof.Contracts.Models;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Apis;

public sealed class ModelsApiTests
{
    [Fact]
    public async Task ListModels_GivesTheBuiltInsWithEquationsAndWhichCanBeGenerated()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite, new TestServerSettings { SeedDemo = false });

        var models = await api.Client.GetFromJsonAsync<List<BuiltInModelResponse>>("/api/models", ApiTest.Token);

        var lorenz = Assert.Single(models!, m => m.Id == "lorenz");
        Assert.Equal("Lorenz system", lorenz.Name);
        // E. N. Lorenz, Deterministic nonperiodic flow, J. Atmos. Sci. 20 (1963) 130-141: x' = sigma (y - x), y' = x (rho - z) - y, z' = x y - beta z.
        Assert.Equal(["dx/dt = sigma*(y - x)", "dy/dt = x*(rho - z) - y", "dz/dt = x*y - beta*z"], lorenz.Equations);
        Assert.True(lorenz.CanGenerateDesign);
        Assert.False(Assert.Single(models!, m => m.Id == "chua").CanGenerateDesign);
        Assert.Equal(8, models!.Count);
    }

    [Fact]
    public async Task GenerateDesign_Lorenz_GivesASheetWhoseDesignFileCanBeStored()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite, new TestServerSettings { SeedDemo = false });
        var board = await api.CreateBoardAsync(code: "QH-G1");

        using var generated = await api.Client.PostAsync("/api/models/lorenz/design", null, ApiTest.Token);
        var sheet = (await generated.Content.ReadFromJsonAsync<DesignSheetDocument>(ApiTest.Token))!;
        using var saved = await api.Client.PostAsJsonAsync($"/api/boards/{board.Id}/designs", sheet, ApiTest.Token);

        Assert.Equal(HttpStatusCode.OK, generated.StatusCode);
        Assert.Equal("lorenz", sheet.ModelName);
        Assert.Equal(1e-3, sheet.TimeScaleSeconds);
        Assert.Equal(3, sheet.Blocks.Count(b => b.Kind == "integrator"));
        Assert.Equal(2, sheet.Blocks.Count(b => b.Kind == "multiplier"));
        Assert.All(sheet.Parts, p => Assert.False(string.IsNullOrEmpty(p.Block), p.Reference + " serves no block"));
        Assert.Equal("patchproof-design", sheet.Document!.Value.GetProperty("format").GetString());
        Assert.Equal(HttpStatusCode.Created, saved.StatusCode);
    }

    [Fact]
    public async Task ListModels_MarksEveryModelTheBoardCanRealize()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite, new TestServerSettings { SeedDemo = false });

        var models = await api.Client.GetFromJsonAsync<List<BuiltInModelResponse>>("/api/models", ApiTest.Token);

        // Lotka-Volterra and Sprott's jerk system are quadratic; Chua's diode, Van der Pol's x^2*y and Duffing's x^3 and forcing are not realizable by the builder.
        Assert.Equal(["damped-oscillator", "lorenz", "lotka-volterra", "rossler", "sprott-jerk"], models!.Where(m => m.CanGenerateDesign).Select(m => m.Id).Order(StringComparer.Ordinal));
    }

    [Theory]
    [InlineData("lotka-volterra", 2, 2)]
    [InlineData("sprott-jerk", 3, 1)]
    public async Task GenerateDesign_QuadraticCatalogModel_GivesASheetWithItsIntegratorsAndMultipliers(string model, int integrators, int multipliers)
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite, new TestServerSettings { SeedDemo = false });

        using var generated = await api.Client.PostAsync($"/api/models/{model}/design", null, ApiTest.Token);
        var sheet = (await generated.Content.ReadFromJsonAsync<DesignSheetDocument>(ApiTest.Token))!;

        Assert.Equal(HttpStatusCode.OK, generated.StatusCode);
        Assert.Equal(model, sheet.ModelName);
        Assert.Equal(integrators, sheet.Blocks.Count(b => b.Kind == "integrator"));
        Assert.Equal(multipliers, sheet.Blocks.Count(b => b.Kind == "multiplier"));
    }

    [Fact]
    public async Task GenerateDesign_VanDerPol_NamesTheCubicTerm()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite, new TestServerSettings { SeedDemo = false });

        using var refused = await api.Client.PostAsync("/api/models/van-der-pol/design", null, ApiTest.Token);

        var problem = await ApiTest.ReadProblemAsync(refused, HttpStatusCode.UnprocessableEntity);
        Assert.Contains("equation y' (line 5), term (-mu) * x^2*y", problem.GetProperty("detail").GetString(), StringComparison.Ordinal);
    }

    [Fact]
    public async Task GenerateDesign_UnknownOrUnsupportedModelOrBadTimeScale_AnswersProblems()
    {
        await using var api = ApiTest.Start(ServerDatabase.Sqlite, new TestServerSettings { SeedDemo = false });

        using var unknown = await api.Client.PostAsync("/api/models/lorenzz/design", null, ApiTest.Token);
        using var unsupported = await api.Client.PostAsync("/api/models/chua/design", null, ApiTest.Token);
        using var badScale = await api.Client.PostAsync("/api/models/lorenz/design?timeScaleSeconds=-1", null, ApiTest.Token);

        await ApiTest.ReadProblemAsync(unknown, HttpStatusCode.NotFound);
        var problem = await ApiTest.ReadProblemAsync(unsupported, HttpStatusCode.UnprocessableEntity);
        Assert.Contains("lorenz", problem.GetProperty("detail").GetString(), StringComparison.Ordinal);
        var invalid = await ApiTest.ReadProblemAsync(badScale, HttpStatusCode.BadRequest);
        Assert.True(invalid.GetProperty("errors").TryGetProperty("timeScaleSeconds", out _));
    }
}
