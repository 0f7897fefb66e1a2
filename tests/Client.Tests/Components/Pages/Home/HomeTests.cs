using Bunit;
using Microsoft.AspNetCore.Components;
using Microsoft.Extensions.DependencyInjection;
using Patchproof.Client.Models;
using Patchproof.Client.Services;
using Patchproof.Client.Tests.Fakes;
using Patchproof.Contracts.Health;
using HomePage = Patchproof.Client.Components.Pages.Home.Home;

namespace Patchproof.Client.Tests.Components.Pages.Home;

public sealed class HomeTests : BunitContext
{
    private readonly FakePatchproofApi api = new();

    public HomeTests() => Services.AddSingleton<IPatchproofApi>(api);

    [Fact]
    public void Render_WhileServerHasNotAnswered_ShowsPending()
    {
        api.Health = new TaskCompletionSource<HealthResponse>().Task;
        api.Benches = FakePatchproofApi.Never<IReadOnlyList<BenchSummary>>();

        var cut = Render<HomePage>();

        Assert.Contains("Asking the server", cut.Find(".server-state").TextContent, StringComparison.Ordinal);
        Assert.Contains("Loading the benches", cut.Markup, StringComparison.Ordinal);
    }

    [Fact]
    public void Render_ServerAnswers_ShowsReadyWithVersion()
    {
        api.Health = Task.FromResult(new HealthResponse("ok", "9.8.7"));
        api.Benches = FakePatchproofApi.Ok<IReadOnlyList<BenchSummary>>([]);

        var cut = Render<HomePage>();

        cut.WaitForAssertion(() => Assert.Contains("Server ready · core 9.8.7", cut.Find(".ok").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void Render_ServerUnreachable_ShowsTheReasonAsAlert()
    {
        api.Health = Task.FromException<HealthResponse>(new HttpRequestException("connection refused"));
        api.Benches = FakePatchproofApi.Ok<IReadOnlyList<BenchSummary>>([]);

        var cut = Render<HomePage>();

        cut.WaitForAssertion(() => Assert.Contains("connection refused", cut.Find(".server-state [role=alert]").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void Render_NoBenches_SaysSoAndOpensTheNewBenchForm()
    {
        api.Benches = FakePatchproofApi.Ok<IReadOnlyList<BenchSummary>>([]);

        var cut = Render<HomePage>();

        cut.WaitForAssertion(() => Assert.Contains("No bench or class is recorded yet", cut.Markup, StringComparison.Ordinal));
        Assert.True(cut.Find("details.new-bench").HasAttribute("open"));
    }

    [Fact]
    public void Render_BenchesLoaded_ListsEachWithALinkAndItsBoardCount()
    {
        api.Benches = FakePatchproofApi.Ok<IReadOnlyList<BenchSummary>>([DemoData.Bench]);

        var cut = Render<HomePage>();

        cut.WaitForAssertion(() =>
        {
            var link = cut.Find(".bench-list a");
            Assert.Equal("Analog Lab B", link.TextContent);
            Assert.Equal($"benches/{DemoData.BenchId}", link.GetAttribute("href"));
            Assert.Contains("2 boards", cut.Find(".bench-list").TextContent, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Render_BenchesListed_BuildsTheNewBenchFormOnlyOnceItsSectionIsOpened()
    {
        api.Benches = FakePatchproofApi.Ok<IReadOnlyList<BenchSummary>>([DemoData.Bench]);
        var cut = Render<HomePage>();
        cut.WaitForAssertion(() => cut.Find(".bench-list a"));
        Assert.False(cut.Find("details.new-bench").HasAttribute("open"));
        Assert.Empty(cut.FindAll("details.new-bench form"));

        cut.Find("details.new-bench").TriggerEvent("ontoggle", EventArgs.Empty);

        Assert.Equal(3, cut.FindAll("details.new-bench input").Count);
    }

    [Fact]
    public void Render_BenchesRefused_ShowsTheProblem()
    {
        api.Benches = FakePatchproofApi.Problem<IReadOnlyList<BenchSummary>>(500, "Database unavailable", "The data folder is read-only.");

        var cut = Render<HomePage>();

        cut.WaitForAssertion(() => Assert.Contains("The data folder is read-only.", cut.Find(".problem-notice").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void Submit_NewBench_CreatesItAndOpensIt()
    {
        api.Benches = FakePatchproofApi.Ok<IReadOnlyList<BenchSummary>>([]);
        NewBench? sent = null;
        api.CreateBench = bench =>
        {
            sent = bench;
            return FakePatchproofApi.Ok(DemoData.Bench);
        };
        var cut = Render<HomePage>();
        cut.WaitForAssertion(() => cut.Find("details.new-bench input"));

        cut.FindAll("details.new-bench input")[0].Change("  Analog Lab B ");
        cut.Find("details.new-bench form").Submit();

        Assert.Equal(new NewBench("Analog Lab B", null, null), sent);
        Assert.EndsWith($"benches/{DemoData.BenchId}", Services.GetRequiredService<NavigationManager>().Uri, StringComparison.Ordinal);
    }

    [Fact]
    public void Submit_NewBenchWithoutName_ShowsTheRuleAndSendsNothing()
    {
        api.Benches = FakePatchproofApi.Ok<IReadOnlyList<BenchSummary>>([]);
        var calls = 0;
        api.CreateBench = _ =>
        {
            calls++;
            return FakePatchproofApi.Ok(DemoData.Bench);
        };
        var cut = Render<HomePage>();
        cut.WaitForAssertion(() => cut.Find("details.new-bench form"));

        cut.Find("details.new-bench form").Submit();

        Assert.Equal(0, calls);
        Assert.Contains("Give the bench a name.", cut.Markup, StringComparison.Ordinal);
    }
}
