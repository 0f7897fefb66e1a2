using Bunit;
using Microsoft.Extensions.DependencyInjection;
using Patchproof.Client.Components.Pages.Fits;
using Patchproof.Client.Models;
using Patchproof.Client.Services;
using Patchproof.Client.Tests.Fakes;

namespace Patchproof.Client.Tests.Components.Pages.Fits;

public sealed class FitPageTests : BunitContext
{
    private readonly FakePatchproofApi api = new();

    public FitPageTests() => Services.AddSingleton<IPatchproofApi>(api);

    private IRenderedComponent<FitPage> RenderPage() =>
        Render<FitPage>(ps => ps.Add(p => p.FitId, DemoData.FitId).Add(p => p.PollInterval, TimeSpan.FromMilliseconds(20)));

    [Fact]
    public void Render_WhileLoading_ShowsPending()
    {
        api.Fit = FakePatchproofApi.Never<FitJob>;

        var cut = RenderPage();

        Assert.Contains("Loading the fit", cut.Find("[role=status]").TextContent, StringComparison.Ordinal);
    }

    [Fact]
    public void Render_FitMissing_ShowsTheProblem()
    {
        api.Fit = () => FakePatchproofApi.Problem<FitJob>(404, "No such fit");

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Contains("No such fit", cut.Find("[role=alert]").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void Render_Running_PollsUntilItSucceedsThenLinksTheReport()
    {
        // The server's answer moves on only when the test says so: the page must show each state it polls.
        var answer = DemoData.FitJob(FitJobState.Running, 0.3);
        api.Fit = () => FakePatchproofApi.Ok(Volatile.Read(ref answer));

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Contains("running, 30 % · multiple shooting", cut.Find(".state").TextContent, StringComparison.Ordinal));
        Volatile.Write(ref answer, DemoData.FitJob(FitJobState.Running, 0.7));
        cut.WaitForAssertion(() => Assert.Contains("running, 70 %", cut.Find(".state").TextContent, StringComparison.Ordinal), TimeSpan.FromSeconds(10));
        Volatile.Write(ref answer, DemoData.FitJob(FitJobState.Succeeded, 1));
        cut.WaitForAssertion(() => Assert.Equal($"fits/{DemoData.FitId}/report", cut.Find("a.button").GetAttribute("href")), TimeSpan.FromSeconds(10));
        Assert.Equal("finished", cut.Find(".state").TextContent);
        Assert.Empty(cut.FindAll("button"));
    }

    [Fact]
    public void Cancel_WhileRunning_AsksTheServerAndShowsCancelling()
    {
        // Like the server, the fake remembers the cancel request in every later answer.
        api.Fit = () => FakePatchproofApi.Ok(DemoData.FitJob(FitJobState.Running, 0.5, cancelRequested: api.CancelCalls > 0));
        api.CancelFit = () => FakePatchproofApi.Ok(DemoData.FitJob(FitJobState.Running, 0.5, cancelRequested: true));
        var cut = RenderPage();
        cut.WaitForAssertion(() => cut.Find("button"));

        cut.Find("button").Click();

        Assert.Equal(1, api.CancelCalls);
        cut.WaitForAssertion(() => Assert.StartsWith("cancelling", cut.Find(".state").TextContent, StringComparison.Ordinal));
        Assert.True(cut.Find("button").HasAttribute("disabled"));
    }

    [Fact]
    public void Render_Failed_ShowsWhy()
    {
        api.Fit = () => FakePatchproofApi.Ok(DemoData.FitJob(FitJobState.Failed));

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Contains("shorter than one Lyapunov time", cut.Find("[role=alert]").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void Render_Comparing_ShowsThePartThatJustFinishedInWords()
    {
        const string stage = "comparing the capture with the designs: correlation dimension of the capture done (5 of 12 parts)";
        api.Fit = () => FakePatchproofApi.Ok(DemoData.FitJob(FitJobState.Running, 0.93) with { Stage = stage });

        var cut = RenderPage();

        cut.WaitForAssertion(() => Assert.Equal($"running, 93 % · {stage}", cut.Find(".state").TextContent));
    }

    [Fact]
    public void Render_ServerAnswersLowerProgressLater_BarNeverGoesBack()
    {
        var answer = DemoData.FitJob(FitJobState.Running, 0.6);
        api.Fit = () => FakePatchproofApi.Ok(Volatile.Read(ref answer));
        var cut = RenderPage();
        cut.WaitForAssertion(() => Assert.Contains("running, 60 %", cut.Find(".state").TextContent, StringComparison.Ordinal));

        Volatile.Write(ref answer, DemoData.FitJob(FitJobState.Running, 0.4));
        var reads = api.FitReads;
        // Two more reads: the first of them has been shown by the time the second is made.
        cut.WaitForAssertion(() => Assert.True(api.FitReads >= reads + 2), TimeSpan.FromSeconds(10));

        Assert.Contains("running, 60 %", cut.Find(".state").TextContent, StringComparison.Ordinal);
        Assert.Equal(0.6, ProgressValue(cut));
        Volatile.Write(ref answer, DemoData.FitJob(FitJobState.Running, 0.8));
        cut.WaitForAssertion(() => Assert.Equal(0.8, ProgressValue(cut)), TimeSpan.FromSeconds(10));
    }

    private static double ProgressValue(IRenderedComponent<FitPage> cut) =>
        double.Parse(cut.Find("progress").GetAttribute("value")!, System.Globalization.CultureInfo.InvariantCulture);
}
