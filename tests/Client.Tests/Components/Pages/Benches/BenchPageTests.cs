using Bunit;
using Microsoft.AspNetCore.Components;
using Microsoft.Extensions.DependencyInjection;
using Patchproof.Client.Components.Pages.Benches;
using Patchproof.Client.Models;
using Patchproof.Client.Services;
using Patchproof.Client.Tests.Fakes;

namespace Patchproof.Client.Tests.Components.Pages.Benches;

public sealed class BenchPageTests : BunitContext
{
    private readonly FakePatchproofApi api = new();

    public BenchPageTests() => Services.AddSingleton<IPatchproofApi>(api);

    private IRenderedComponent<BenchPage> RenderPage() => Render<BenchPage>(ps => ps.Add(p => p.BenchId, DemoData.BenchId));

    [Fact]
    public void Render_WhileLoading_ShowsPending()
    {
        api.Bench = FakePatchproofApi.Never<BenchSummary>();

        var cut = RenderPage();

        Assert.Contains("Loading the bench", cut.Find("[role=status]").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void Render_BenchMissing_ShowsTheProblem()
    {
        api.Bench = FakePatchproofApi.Problem<BenchSummary>(404, "No such bench", "Nothing is recorded under that id.");

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Contains("Nothing is recorded under that id.", cut.Find("[role=alert]").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void Render_NoBoards_SaysSo()
    {
        api.Bench = FakePatchproofApi.Ok(DemoData.Bench);
        api.Boards = FakePatchproofApi.Ok<IReadOnlyList<BoardSummary>>([]);

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Contains("No board is recorded on this bench yet", cut.Markup, StringComparison.Ordinal));
    }

    [Fact]
    public void Render_BoardsLoaded_ShowsEachBoardWithItsDesignAndCounts()
    {
        api.Bench = FakePatchproofApi.Ok(DemoData.Bench);
        api.Boards = FakePatchproofApi.Ok<IReadOnlyList<BoardSummary>>([DemoData.Board, DemoData.Board with { Id = Guid.NewGuid(), Code = "QH-L9", Name = "Skua", LatestDesignVersion = null }]);

        var cut = RenderPage();

        cut.WaitForAssertion(() =>
        {
            var rows = cut.FindAll("table.boards tbody tr");
            Assert.Equal(2, rows.Count);
            Assert.Equal("QH-L4 Plover", rows[0].QuerySelector("th a")!.TextContent);
            Assert.Contains("v1", rows[0].TextContent, StringComparison.Ordinal);
            Assert.Contains("none", rows[1].TextContent, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Render_BoardsRefused_ShowsTheProblem()
    {
        api.Bench = FakePatchproofApi.Ok(DemoData.Bench);
        api.Boards = FakePatchproofApi.Problem<IReadOnlyList<BoardSummary>>(500, "Database unavailable");

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Contains("The boards could not be loaded.", cut.Find(".problem-notice").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void Submit_NewBoard_CreatesItAndOpensIt()
    {
        api.Bench = FakePatchproofApi.Ok(DemoData.Bench);
        api.Boards = FakePatchproofApi.Ok<IReadOnlyList<BoardSummary>>([]);
        NewBoard? sent = null;
        api.CreateBoard = board =>
        {
            sent = board;
            return FakePatchproofApi.Ok(DemoData.Board);
        };
        var cut = RenderPage();
        cut.WaitForAssertion(() => cut.Find(".new-board form"));

        var inputs = cut.FindAll(".new-board input");
        inputs[0].Change("QH-L4");
        cut.FindAll(".new-board input")[1].Change("Plover");
        cut.Find(".new-board form").Submit();

        Assert.Equal(new NewBoard("QH-L4", "Plover", null, null), sent);
        Assert.EndsWith($"boards/{DemoData.BoardId}", Services.GetRequiredService<NavigationManager>().Uri, StringComparison.Ordinal);
    }

    [Fact]
    public void Submit_ServerRefusesTheBoard_ShowsWhyAndStays()
    {
        api.Bench = FakePatchproofApi.Ok(DemoData.Bench);
        api.Boards = FakePatchproofApi.Ok<IReadOnlyList<BoardSummary>>([]);
        api.CreateBoard = _ => FakePatchproofApi.Problem<BoardSummary>(409, "Label taken", "QH-L4 is already on this bench.");
        var cut = RenderPage();
        cut.WaitForAssertion(() => cut.Find(".new-board form"));

        cut.FindAll(".new-board input")[0].Change("QH-L4");
        cut.FindAll(".new-board input")[1].Change("Plover");
        cut.Find(".new-board form").Submit();

        cut.WaitForAssertion(() => Assert.Contains("QH-L4 is already on this bench.", cut.Find(".new-board .problem-notice").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void Render_BenchLoaded_ShowsItsProbeCalibration()
    {
        api.Bench = FakePatchproofApi.Ok(DemoData.Bench);
        api.Boards = FakePatchproofApi.Ok<IReadOnlyList<BoardSummary>>([]);
        api.Calibrations = FakePatchproofApi.Ok<IReadOnlyList<ProbeCalibrationView>>([DemoData.ProbeCalibration()]);

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Contains("1.01830", cut.Find(".probe-calibration table.gains").TextContent, StringComparison.Ordinal));
    }
}
