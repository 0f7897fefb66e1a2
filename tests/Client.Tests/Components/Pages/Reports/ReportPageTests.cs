using Bunit;
using Microsoft.Extensions.DependencyInjection;
using Patchproof.Client.Components.Pages.Reports;
using Patchproof.Client.Models;
using Patchproof.Client.Services;
using Patchproof.Client.Tests.Fakes;

namespace Patchproof.Client.Tests.Components.Pages.Reports;

public sealed class ReportPageTests : BunitContext
{
    private readonly FakePatchproofApi api = new();

    public ReportPageTests()
    {
        JSInterop.Mode = JSRuntimeMode.Loose;
        Services.AddSingleton<IPatchproofApi>(api);
    }

    private IRenderedComponent<ReportPage> RenderPage() => Render<ReportPage>(ps => ps.Add(p => p.FitId, DemoData.FitId));

    [Fact]
    public void Render_WhileLoading_ShowsPending()
    {
        api.Report = FakePatchproofApi.Never<FitReportView>();

        var cut = RenderPage();

        Assert.Contains("Loading the report", cut.Find("[role=status]").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void Render_WithTheMappingFitted_SaysWhichChannelWasWhichVariable()
    {
        api.Report = FakePatchproofApi.Ok(DemoData.Report with { Mapping = ["CH1 = x", "CH2 = -z"] });

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Equal("Channels fitted: CH1 = x, CH2 = -z.", cut.Find(".fitted-mapping").TextContent));
    }

    [Fact]
    public void Render_NotFinished_ShowsTheServersReason()
    {
        api.Report = FakePatchproofApi.Problem<FitReportView>(409, "No report", "The fit is Running; only a fit that succeeded has a report.");

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Contains("only a fit that succeeded has a report", cut.Find("[role=alert]").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void Render_WithWarnings_ShowsThemBesideTheFindingsAndTheNotesAfter()
    {
        api.Report = FakePatchproofApi.Ok(DemoData.Report with
        {
            Warnings = ["The fit stopped before converging (MaxIterations); treat its numbers as rough."],
            Notes = ["The fit used plover.csv, the first of the 2 captures chosen."],
        });

        var cut = RenderPage();

        cut.WaitForAssertion(() =>
        {
            var warnings = cut.Find(".findings .warnings");
            Assert.Contains("may be unsafe", warnings.TextContent, StringComparison.Ordinal);
            Assert.Contains("stopped before converging", warnings.TextContent, StringComparison.Ordinal);
            Assert.Contains("first of the 2 captures", cut.Find(".notes").TextContent, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Render_WithoutWarnings_ShowsNoWarningBox()
    {
        api.Report = FakePatchproofApi.Ok(DemoData.Report);

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.NotNull(cut.Find(".finding")));
        Assert.Empty(cut.FindAll(".warnings"));
        Assert.Empty(cut.FindAll(".notes"));
    }

    [Fact]
    public void Render_Loaded_PutsTheFindingsFirstWithHowFarHowSureAndWhatToDo()
    {
        api.Report = FakePatchproofApi.Ok(DemoData.Report);

        var cut = RenderPage();

        cut.WaitForAssertion(() =>
        {
            var headings = cut.FindAll("h2").Select(h => h.TextContent).ToList();
            Assert.Equal("Findings", headings[0]);
            var first = cut.Find(".finding");
            Assert.Equal("R5", first.QuerySelector(".part")!.TextContent);
            Assert.Contains("35.7 kOhm nominal behaves like 39.3 kOhm ± 420 Ohm", first.TextContent, StringComparison.Ordinal);
            Assert.Contains("+10.1 %", first.TextContent, StringComparison.Ordinal);
            Assert.Contains("probability 0.97; next best: C2 5 % low", first.TextContent, StringComparison.Ordinal);
            Assert.Contains("Measure R5 out of circuit", first.TextContent, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Render_Loaded_ShowsNumbersExportsAndComparison()
    {
        api.Report = FakePatchproofApi.Ok(DemoData.Report);

        var cut = RenderPage();

        cut.WaitForAssertion(() =>
        {
            Assert.Contains("−9.2 %", cut.FindAll("table.data")[0].TextContent, StringComparison.Ordinal);
            Assert.Contains("+0.2 %", cut.Find(".timescale").TextContent, StringComparison.Ordinal);
            Assert.Contains("Passed:", cut.Markup, StringComparison.Ordinal);
            Assert.Equal(["JSON", "CSV of coefficients and findings", "Printable page"], cut.FindAll(".exports a").Select(a => a.TextContent));
            Assert.Contains("report.csv", cut.FindAll(".exports a")[1].GetAttribute("href"), StringComparison.Ordinal);
            Assert.Equal("Phase planes (1)", cut.Find("[role=tab][aria-selected=true]").TextContent);
            Assert.Single(cut.FindAll(".overlay-chart"));
        });
    }

    [Fact]
    public void Render_NoFindingsNoPlots_SaysSo()
    {
        api.Report = FakePatchproofApi.Ok(DemoData.Report with { Findings = [], Plots = ComparisonPlots.Empty });

        var cut = RenderPage();

        cut.WaitForAssertion(() =>
        {
            Assert.Contains("The diagnosis names no part.", cut.Markup, StringComparison.Ordinal);
            Assert.Contains("This report carries no comparison series.", cut.Markup, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Render_WithChannelGains_ShowsEachGainAndWhereItCameFrom()
    {
        api.Report = FakePatchproofApi.Ok(DemoData.Report with
        {
            Channels =
            [
                new ChannelGainView("CH1", "x", 1, 1, 0.2, "calibration against CH1 (2026-11-30), ± 0.20 %; the shared reference probe at its 2 % tolerance", true),
                new ChannelGainView("CH2", "y", -1, 1.0183, 0.2, "calibration against CH1 (2026-11-30), ± 0.20 %; the shared reference probe at its 2 % tolerance", true),
            ],
        });

        var cut = RenderPage();

        cut.WaitForAssertion(() =>
        {
            var rows = cut.FindAll(".channel-gains tbody tr");
            Assert.Equal(2, rows.Count);
            Assert.Contains("−y", rows[1].TextContent, StringComparison.Ordinal);
            Assert.Contains("1.0183", rows[1].TextContent, StringComparison.Ordinal);
            Assert.Contains("calibration against CH1", rows[1].TextContent, StringComparison.Ordinal);
            Assert.DoesNotContain("No probe calibration was used", cut.Find(".channel-gains").TextContent, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Render_GainsFromTheProbeTolerance_SaysNoCalibrationWasUsed()
    {
        api.Report = FakePatchproofApi.Ok(DemoData.Report with
        {
            Channels = [new ChannelGainView("CH1", "x", 1, 1, 0.5, "probe tolerance 2 %, ± 0.50 %", false)],
        });

        var cut = RenderPage();

        cut.WaitForAssertion(() =>
        {
            Assert.Contains("probe tolerance 2 %", cut.Find(".channel-gains tbody").TextContent, StringComparison.Ordinal);
            Assert.Contains("No probe calibration was used", cut.Find(".channel-gains").TextContent, StringComparison.Ordinal);
        });
    }
}
