using Bunit;
using Microsoft.Extensions.DependencyInjection;
using Patchproof.Client.Components.Pages.Designs;
using Patchproof.Client.Models;
using Patchproof.Client.Services;
using Patchproof.Client.Tests.Fakes;

namespace Patchproof.Client.Tests.Components.Pages.Designs;

public sealed class DesignPageTests : BunitContext
{
    private readonly FakePatchproofApi api = new();

    public DesignPageTests() => Services.AddSingleton<IPatchproofApi>(api);

    private IRenderedComponent<DesignPage> RenderPage() => Render<DesignPage>(ps => ps.Add(p => p.BoardId, DemoData.BoardId));

    [Fact]
    public void Render_WhileLoading_ShowsPending()
    {
        api.Design = _ => FakePatchproofApi.Never<DesignSheet>();

        var cut = RenderPage();

        Assert.Contains("Loading the design", cut.Find("[role=status]").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void Render_LoadFails_ShowsTheProblem()
    {
        api.Design = _ => FakePatchproofApi.Problem<DesignSheet>(500, "Database unavailable");

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Contains("The design could not be loaded.", cut.Find("[role=alert]").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void Render_NoDesign_OffersTheBuiltInModels()
    {
        api.Design = _ => FakePatchproofApi.Problem<DesignSheet>(404, "Not found on the server");
        api.Models = FakePatchproofApi.Ok<IReadOnlyList<BuiltInModelEntry>>([new("lorenz", "Lorenz system", "sigma 10, rho 28, beta 8/3", DemoData.LorenzDesign.Equations)]);

        var cut = RenderPage();

        cut.WaitForAssertion(() =>
        {
            Assert.Contains("This board has no design yet", cut.Markup, StringComparison.Ordinal);
            Assert.Contains("Lorenz system", cut.Find(".model-picker").TextContent, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Render_NoDesign_OffersGenerationOnlyForModelsTheServerCanGenerate()
    {
        api.Design = _ => FakePatchproofApi.Problem<DesignSheet>(404, "Not found on the server");
        api.Models = FakePatchproofApi.Ok<IReadOnlyList<BuiltInModelEntry>>(
        [
            new("lorenz", "Lorenz system", "", []),
            new("chua", "Chua circuit", "", []) { CanGenerateDesign = false },
        ]);

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Equal(2, cut.FindAll(".model-picker li").Count));
        var buttons = cut.FindAll(".model-picker button");
        Assert.Equal("Generate a design from the Lorenz system", Assert.Single(buttons).GetAttribute("aria-label"));
        Assert.Contains("No design can be generated", cut.FindAll(".model-picker li")[1].TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void Save_AGeneratedDesign_SendsBackTheDesignFileItCameWith()
    {
        using var file = System.Text.Json.JsonDocument.Parse("""{ "format": "patchproof-design", "version": 1 }""");
        api.Design = _ => FakePatchproofApi.Problem<DesignSheet>(404, "Not found on the server");
        api.Models = FakePatchproofApi.Ok<IReadOnlyList<BuiltInModelEntry>>([new("lorenz", "Lorenz system", "", [])]);
        api.GenerateDesign = _ => FakePatchproofApi.Ok(DemoData.LorenzDesign with { Document = file.RootElement.Clone() });
        DesignSheet? sent = null;
        api.SaveDesign = (sheet, _) =>
        {
            sent = sheet;
            return FakePatchproofApi.Ok(new DesignVersionEntry(1, null, DateTimeOffset.UnixEpoch));
        };
        var cut = RenderPage();
        cut.WaitForAssertion(() => cut.Find(".model-picker button"));
        cut.Find(".model-picker button").Click();
        cut.WaitForAssertion(() => cut.Find("table.parts"));

        cut.FindAll("button").First(b => b.TextContent.Contains("Save as a new version", StringComparison.Ordinal)).Click();

        cut.WaitForAssertion(() => Assert.NotNull(sent));
        Assert.Equal("patchproof-design", sent!.Document!.Value.GetProperty("format").GetString());
    }

    [Fact]
    public void Generate_FromAModel_ShowsItsPartsForEditing()
    {
        api.Design = _ => FakePatchproofApi.Problem<DesignSheet>(404, "Not found on the server");
        api.Models = FakePatchproofApi.Ok<IReadOnlyList<BuiltInModelEntry>>([new("lorenz", "Lorenz system", "", [])]);
        string? asked = null;
        api.GenerateDesign = id =>
        {
            asked = id;
            return FakePatchproofApi.Ok(DemoData.LorenzDesign);
        };
        var cut = RenderPage();
        cut.WaitForAssertion(() => cut.Find(".model-picker button"));

        cut.Find(".model-picker button").Click();

        Assert.Equal("lorenz", asked);
        cut.WaitForAssertion(() => Assert.Equal(4, cut.FindAll("table.parts tbody tr:not(.block-row)").Count));
        Assert.Contains("35.7 kOhm", cut.Find("table.parts").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void Check_ShowsEachResultBesideThePartItConcerns()
    {
        api.Design = _ => FakePatchproofApi.Ok(DemoData.LorenzDesign);
        api.CheckDesign = _ => FakePatchproofApi.Ok<IReadOnlyList<DesignCheckNote>>(
        [
            new(CheckSeverity.Warning, "C3", "A 20 % capacitor sets the z time scale; the fit cannot tell it from the time base."),
            new(CheckSeverity.Note, "", "Every integrator has a capacitor."),
        ]);
        var cut = RenderPage();
        cut.WaitForAssertion(() => cut.Find("table.parts"));

        cut.FindAll(".design-actions button")[0].Click();

        cut.WaitForAssertion(() =>
        {
            var c3Row = cut.FindAll("table.parts tbody tr").Single(r => r.QuerySelector("th")?.TextContent == "C3");
            Assert.Contains("Check: A 20 % capacitor", c3Row.TextContent, StringComparison.Ordinal);
            Assert.Contains("Every integrator has a capacitor.", cut.Find(".general-notes").TextContent, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Save_AfterEditingAPart_SendsTheNewValueAsANewVersion()
    {
        api.Design = _ => FakePatchproofApi.Ok(DemoData.LorenzDesign);
        DesignSheet? saved = null;
        api.SaveDesign = (sheet, _) =>
        {
            saved = sheet;
            return FakePatchproofApi.Ok(new DesignVersionEntry(2, "R5 measured", DemoData.At));
        };
        var cut = RenderPage();
        cut.WaitForAssertion(() => cut.Find("table.parts"));

        cut.Find("input[aria-label='Nominal value of R5 in Ohm']").Change("39000");
        cut.FindAll(".design-actions button")[1].Click();

        cut.WaitForAssertion(() => Assert.Contains("Saved as version 2.", cut.Find(".status").TextContent, StringComparison.Ordinal));
        Assert.Equal(39_000, saved!.Parts.Single(p => p.Reference == "R5").Nominal);
        Assert.Equal(3, saved.Equations.Count);
    }

    [Fact]
    public void Check_ServerCannotCheck_SaysSo()
    {
        api.Design = _ => FakePatchproofApi.Ok(DemoData.LorenzDesign);
        api.CheckDesign = _ => FakePatchproofApi.Problem<IReadOnlyList<DesignCheckNote>>(404, "Not found on the server");
        var cut = RenderPage();
        cut.WaitForAssertion(() => cut.Find("table.parts"));

        cut.FindAll(".design-actions button")[0].Click();

        cut.WaitForAssertion(() => Assert.Contains("This server cannot do this yet.", cut.Find(".problem-notice").TextContent, StringComparison.Ordinal));
    }
}
