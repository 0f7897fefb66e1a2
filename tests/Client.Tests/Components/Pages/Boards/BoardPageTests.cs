using Bunit;
using Microsoft.AspNetCore.Components;
using Microsoft.Extensions.DependencyInjection;
using Patchproof.Client.Components.Pages.Boards;
using Patchproof.Client.Models;
using Patchproof.Client.Services;
using Patchproof.Client.Tests.Fakes;

namespace Patchproof.Client.Tests.Components.Pages.Boards;

public sealed class BoardPageTests : BunitContext
{
    private readonly FakePatchproofApi api = new();

    public BoardPageTests() => Services.AddSingleton<IPatchproofApi>(api);

    private IRenderedComponent<BoardPage> RenderPage() => Render<BoardPage>(ps => ps.Add(p => p.BoardId, DemoData.BoardId));

    private void GiveHistory(IReadOnlyList<DesignVersionEntry> designs, IReadOnlyList<CaptureEntry> captures, IReadOnlyList<FitJob> fits)
    {
        api.Board = FakePatchproofApi.Ok(DemoData.Board);
        api.DesignVersions = FakePatchproofApi.Ok(designs);
        api.Captures = FakePatchproofApi.Ok(captures);
        api.Fits = FakePatchproofApi.Ok(fits);
    }

    [Fact]
    public void Render_WhileLoading_ShowsPending()
    {
        api.Board = FakePatchproofApi.Never<BoardSummary>();

        var cut = RenderPage();

        Assert.Contains("Loading the board", cut.Find("[role=status]").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void Render_BoardMissing_ShowsTheProblem()
    {
        api.Board = FakePatchproofApi.Problem<BoardSummary>(404, "No such board");

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Contains("No such board", cut.Find("[role=alert]").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void Render_EmptyHistory_SaysWhatToDoFirst()
    {
        GiveHistory([], [], []);
        api.Board = FakePatchproofApi.Ok(DemoData.Board with { LatestDesignVersion = null });

        var cut = RenderPage();

        cut.WaitForAssertion(() =>
        {
            Assert.Contains("A fit needs a design", cut.Find(".start-fit").TextContent, StringComparison.Ordinal);
            Assert.Equal(3, cut.FindAll(".history .empty").Count);
            Assert.Equal("Set up the design", cut.Find(".board-actions a").TextContent);
        });
    }

    [Fact]
    public void Render_HistoryLoaded_ShowsDesignsCapturesAndFits()
    {
        GiveHistory(
            [new DesignVersionEntry(2, "R5 replaced", DemoData.At), new DesignVersionEntry(1, null, DemoData.At)],
            [DemoData.Capture(new CaptureCheckEntry(CheckSeverity.Warning, 0, 0, "Channel 3 touches the scope's window."))],
            [DemoData.FitJob(FitJobState.Running, 0.4), DemoData.FitJob(FitJobState.Succeeded) with { Id = Guid.NewGuid() }]);

        var cut = RenderPage();

        cut.WaitForAssertion(() =>
        {
            var sections = cut.FindAll(".history section");
            Assert.Contains("R5 replaced", sections[0].TextContent, StringComparison.Ordinal);
            Assert.Contains("plover-xyz.csv", sections[1].TextContent, StringComparison.Ordinal);
            Assert.Contains("with warnings", sections[1].TextContent, StringComparison.Ordinal);
            Assert.Contains("running, 40 %", sections[2].TextContent, StringComparison.Ordinal);
            Assert.EndsWith("/report", sections[2].QuerySelectorAll("a")[1].GetAttribute("href"), StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Render_FitsRefused_ShowsTheProblemBesideTheRest()
    {
        GiveHistory([new DesignVersionEntry(1, null, DemoData.At)], [DemoData.Capture()], []);
        api.Fits = FakePatchproofApi.Problem<IReadOnlyList<FitJob>>(404, "Not found on the server");

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Contains("This server keeps no fits yet.", cut.Find(".history .problem-notice").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void StartFit_WithTheNewestUsableCapture_SendsItAndOpensTheFit()
    {
        var unusable = DemoData.Capture(new CaptureCheckEntry(CheckSeverity.Error, 3, 2, "Not a number.")) with { Id = Guid.NewGuid() };
        GiveHistory([new DesignVersionEntry(1, null, DemoData.At)], [unusable, DemoData.Capture()], []);
        (int Version, IReadOnlyList<Guid> Captures)? sent = null;
        api.StartFit = (version, captures) =>
        {
            sent = (version, captures);
            return FakePatchproofApi.Ok(DemoData.FitJob(FitJobState.Queued));
        };
        var cut = RenderPage();
        cut.WaitForAssertion(() => cut.Find(".start-fit form"));

        cut.Find(".start-fit form").Submit();

        Assert.Equal(1, sent!.Value.Version);
        Assert.Equal([DemoData.CaptureId], sent.Value.Captures);
        Assert.True(cut.FindAll(".capture-choice input")[0].HasAttribute("disabled"));
        Assert.EndsWith($"fits/{DemoData.FitId}", Services.GetRequiredService<NavigationManager>().Uri, StringComparison.Ordinal);
    }

    [Fact]
    public void StartFit_ServerCannotRunFits_SaysSo()
    {
        GiveHistory([new DesignVersionEntry(1, null, DemoData.At)], [DemoData.Capture()], []);
        api.StartFit = (_, _) => FakePatchproofApi.Problem<FitJob>(501, "The server cannot do this yet");
        var cut = RenderPage();
        cut.WaitForAssertion(() => cut.Find(".start-fit form"));

        cut.Find(".start-fit form").Submit();

        cut.WaitForAssertion(() => Assert.Contains("This server cannot run fits yet.", cut.Find(".start-fit .problem-notice").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void StartFit_BenchHasACalibration_SaysTheFitUsesItUnlessTold()
    {
        GiveHistory([new DesignVersionEntry(1, null, DemoData.At)], [DemoData.Capture()], []);
        api.Calibrations = FakePatchproofApi.Ok<IReadOnlyList<ProbeCalibrationView>>([DemoData.ProbeCalibration()]);
        api.StartFit = (_, _) => FakePatchproofApi.Ok(DemoData.FitJob(FitJobState.Queued));
        var cut = RenderPage();
        cut.WaitForAssertion(() => Assert.Contains("uses the bench's probe calibration of 2026-11-30 14:07 UTC", cut.Find(".calibration-status").TextContent, StringComparison.Ordinal));

        cut.Find(".start-fit form").Submit();

        Assert.False(api.LastFitIgnoredBenchCalibration);
    }

    [Fact]
    public void StartFit_WithoutTheBenchCalibration_AsksTheServerToLeaveItOut()
    {
        GiveHistory([new DesignVersionEntry(1, null, DemoData.At)], [DemoData.Capture()], []);
        api.Calibrations = FakePatchproofApi.Ok<IReadOnlyList<ProbeCalibrationView>>([DemoData.ProbeCalibration()]);
        api.StartFit = (_, _) => FakePatchproofApi.Ok(DemoData.FitJob(FitJobState.Queued));
        var cut = RenderPage();
        cut.WaitForAssertion(() => cut.Find("#fit-ignore-calibration"));

        cut.Find("#fit-ignore-calibration").Change(true);
        cut.Find(".start-fit form").Submit();

        Assert.True(api.LastFitIgnoredBenchCalibration);
    }

    [Fact]
    public void Render_BenchWithoutCalibration_SaysEveryChannelKeepsTheProbeTolerance()
    {
        GiveHistory([new DesignVersionEntry(1, null, DemoData.At)], [DemoData.Capture()], []);
        api.Calibrations = FakePatchproofApi.Ok<IReadOnlyList<ProbeCalibrationView>>([]);

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Contains("no probe calibration: every channel is taken at the stated probe tolerance", cut.Find(".calibration-status").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void StartFit_ChannelsRemapped_SendsTheMappingAsEdited()
    {
        // Two channels for three variables, as on QH-L5: CH1 shows x, CH2 shows z inverted, y is not recorded.
        var twoChannels = DemoData.Capture() with { ChannelNames = ["CH1", "CH2"] };
        GiveHistory([new DesignVersionEntry(1, null, DemoData.At)], [twoChannels], []);
        api.Design = _ => FakePatchproofApi.Ok(DemoData.LorenzDesign);
        api.StartFit = (_, _) => FakePatchproofApi.Ok(DemoData.FitJob(FitJobState.Queued));
        var cut = RenderPage();
        cut.WaitForAssertion(() => cut.Find("select[aria-label='Variable shown by CH2']"));
        Assert.Equal("y", cut.Find("select[aria-label='Variable shown by CH2']").GetAttribute("value"));

        cut.Find("select[aria-label='Variable shown by CH2']").Change("z");
        cut.Find("select[aria-label='Sign of CH2']").Change("-1");
        cut.Find(".start-fit form").Submit();

        Assert.Equal([new ChannelMapping("CH1", "x", 1), new ChannelMapping("CH2", "z", -1)], api.LastFitMapping);
        Assert.Contains("Not on any channel: y.", cut.Find(".mapping .unrecorded").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void StartFit_MappingLeftAsShown_SendsTheFileOrder()
    {
        GiveHistory([new DesignVersionEntry(1, null, DemoData.At)], [DemoData.Capture()], []);
        api.Design = _ => FakePatchproofApi.Ok(DemoData.LorenzDesign);
        api.StartFit = (_, _) => FakePatchproofApi.Ok(DemoData.FitJob(FitJobState.Queued));
        var cut = RenderPage();
        cut.WaitForAssertion(() => cut.Find(".start-fit .mapping table"));

        cut.Find(".start-fit form").Submit();

        Assert.Equal([new ChannelMapping("CH1", "x", 1), new ChannelMapping("CH2", "y", 1), new ChannelMapping("CH3", "z", 1)], api.LastFitMapping);
    }

    [Fact]
    public void StartFit_DesignVariablesUnreadable_SaysTheFileOrderIsUsedAndSendsNoMapping()
    {
        GiveHistory([new DesignVersionEntry(1, null, DemoData.At)], [DemoData.Capture()], []);
        api.StartFit = (_, _) => FakePatchproofApi.Ok(DemoData.FitJob(FitJobState.Queued));
        var cut = RenderPage();
        cut.WaitForAssertion(() => Assert.Contains("file order", cut.Find(".start-fit .mapping-scope").TextContent, StringComparison.Ordinal));

        cut.Find(".start-fit form").Submit();

        Assert.Null(api.LastFitMapping);
    }

    [Fact]
    public void Render_FitStartedWithAMapping_ListsIt()
    {
        var fit = DemoData.FitJob(FitJobState.Succeeded) with { Mapping = [new("CH1", "x", 1), new("CH2", "z", -1)] };
        GiveHistory([new DesignVersionEntry(1, null, DemoData.At)], [DemoData.Capture()], [fit]);

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Contains("CH1 = +x, CH2 = -z", cut.Find("#fits-heading + .timeline").TextContent, StringComparison.Ordinal));
    }
}
