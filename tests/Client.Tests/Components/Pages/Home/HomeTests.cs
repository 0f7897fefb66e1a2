using Bunit;
using Bunit.TestDoubles;
using Microsoft.AspNetCore.Components;
using Microsoft.Extensions.DependencyInjection;
using Patchproof.Client.Components.Pages.Home;
using Patchproof.Client.Models;
using Patchproof.Client.Services;
using Patchproof.Client.Tests.Fakes;
using Patchproof.Contracts.Health;
using HomePage = Patchproof.Client.Components.Pages.Home.Home;

namespace Patchproof.Client.Tests.Components.Pages.Home;

public sealed class HomeTests : BunitContext
{
    private readonly FakePatchproofApi api = new();
    private readonly BunitPersistentComponentState pageState;

    public HomeTests()
    {
        Services.AddSingleton<IPatchproofApi>(api);
        pageState = AddBunitPersistentComponentState();
        SetRendererInfo(new RendererInfo("WebAssembly", isInteractive: true));
    }

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
        Assert.Equal(3, cut.FindAll(".new-bench input").Count);
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
    public void Render_BenchesListed_BuildsTheNewBenchFormOnlyOnceAskedFor()
    {
        api.Benches = FakePatchproofApi.Ok<IReadOnlyList<BenchSummary>>([DemoData.Bench]);
        var cut = Render<HomePage>();
        cut.WaitForAssertion(() => cut.Find(".bench-list a"));
        Assert.Empty(cut.FindAll(".new-bench form"));

        cut.Find("button.open-form").Click();

        Assert.Equal(3, cut.FindAll(".new-bench input").Count);
        Assert.False(cut.Find(".new-bench fieldset").HasAttribute("disabled"));
    }

    [Fact]
    public void Render_OnTheServer_ShowsTheAnswersWithTheControlsDisabled()
    {
        SetRendererInfo(new RendererInfo("Static", isInteractive: false));
        api.Benches = FakePatchproofApi.Ok<IReadOnlyList<BenchSummary>>([DemoData.Bench]);

        var cut = Render<HomePage>();

        cut.WaitForAssertion(() => Assert.Equal("Analog Lab B", cut.Find(".bench-list a").TextContent));
        Assert.Contains("Server ready", cut.Find(".server-state").TextContent, StringComparison.Ordinal);
        Assert.True(cut.Find("button.open-form").HasAttribute("disabled"));
    }

    [Fact]
    public void Render_OnTheServerWithNoBench_ShowsTheFormDisabled()
    {
        SetRendererInfo(new RendererInfo("Static", isInteractive: false));
        api.Benches = FakePatchproofApi.Ok<IReadOnlyList<BenchSummary>>([]);

        var cut = Render<HomePage>();

        cut.WaitForAssertion(() => Assert.True(cut.Find(".new-bench fieldset").HasAttribute("disabled")));
    }

    [Fact]
    public void Persisting_AfterBothAnswers_HandsTheServerRenderingsAnswersToTheClient()
    {
        api.Health = Task.FromResult(new HealthResponse("ok", "9.8.7"));
        api.Benches = FakePatchproofApi.Ok<IReadOnlyList<BenchSummary>>([DemoData.Bench]);
        var cut = Render<HomePage>();
        cut.WaitForAssertion(() => cut.Find(".bench-list a"));

        pageState.TriggerOnPersisting();

        // The client's turn: the same page, from what the server handed over, without asking the API again.
        api.Health = new TaskCompletionSource<HealthResponse>().Task;
        api.Benches = FakePatchproofApi.Never<IReadOnlyList<BenchSummary>>();
        var client = Render<HomePage>();
        Assert.Contains("Server ready · core 9.8.7", client.Find(".server-state").TextContent, StringComparison.Ordinal);
        Assert.Equal("Analog Lab B", client.Find(".bench-list a").TextContent);
    }

    [Fact]
    public void Persisting_AfterAFailedAnswer_HandsNothingOver()
    {
        api.Health = Task.FromException<HealthResponse>(new HttpRequestException("connection refused"));
        api.Benches = FakePatchproofApi.Ok<IReadOnlyList<BenchSummary>>([DemoData.Bench]);
        var cut = Render<HomePage>();
        cut.WaitForAssertion(() => cut.Find(".server-state [role=alert]"));

        pageState.TriggerOnPersisting();

        Assert.False(pageState.TryTake<string>(StartPageSnapshot.StateKey, out _));
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
        cut.WaitForAssertion(() => cut.Find(".new-bench input"));

        cut.FindAll(".new-bench input")[0].Change("  Analog Lab B ");
        cut.Find(".new-bench form").Submit();

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
        cut.WaitForAssertion(() => cut.Find(".new-bench form"));

        cut.Find(".new-bench form").Submit();

        Assert.Equal(0, calls);
        Assert.Contains("Give the bench a name.", cut.Markup, StringComparison.Ordinal);
    }
}
