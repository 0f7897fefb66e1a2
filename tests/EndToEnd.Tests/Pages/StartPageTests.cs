using System.Diagnostics;
using System.Text.Json;
using Microsoft.Playwright;
using Patchproof.EndToEnd.Tests.Infrastructure;
using Patchproof.EndToEnd.Tests.Support;

namespace Patchproof.EndToEnd.Tests.Pages;

[Collection(EndToEndCollection.Name)]
public sealed class StartPageTests(LiveServer server, Browser browser)
{
    // The server's rendering has the start page's buttons disabled; the client's has them enabled.
    private const string ClientHasTakenOver = "() => document.querySelector('main .new-bench button:enabled') !== null";

    [Fact]
    public async Task StartPage_ComesRenderedFromTheServer_AndTheClientTakesItOver()
    {
        var page = await browser.NewPageAsync();
        await StartPageTimeline.PrepareAsync(page);
        var stopwatch = Stopwatch.StartNew();

        // Waits only for the answer to begin, not for the load event: the figure is when the page shows what it is for.
        await page.GotoAsync(server.BaseAddress.ToString(), new PageGotoOptions { WaitUntil = WaitUntilState.Commit });
        // Checked on every animation frame: a locator's wait re-checks only every 500 ms after its first second, which
        // would round the figure up to the next check.
        await page.WaitForFunctionAsync("() => document.body !== null && document.body.textContent.includes('Server ready')", null, new PageWaitForFunctionOptions { Timeout = 60_000 });
        var readyMs = stopwatch.ElapsedMilliseconds;
        // The page comes rendered from the server; its buttons work once the client has taken it over.
        await page.WaitForFunctionAsync(ClientHasTakenOver, null, new PageWaitForFunctionOptions { Timeout = 60_000 });
        stopwatch.Stop();
        await page.GetByText("Server ready").WaitForAsync(new LocatorWaitForOptions { Timeout = 5_000 });
        Assert.Equal(1, await page.Locator(".bench-list a", new() { HasTextString = "Analog Lab B" }).CountAsync());

        Assert.Equal("Check a board against its design", await page.Locator("h1").InnerTextAsync());
        await Browser.SaveScreenshotAsync(page, "start-page");
        // Recorded for docs/performance.md, never asserted: timing belongs in measurements, not unit tests.
        await Timings.RecordAsync("start-page-ready-ms", readyMs);
        await Timings.RecordAsync("start-page-interactive-ms", stopwatch.ElapsedMilliseconds);
        // The phases of the same load (artifacts/e2e/start-page-timeline.json), to see where the time goes.
        var timeline = await StartPageTimeline.CollectAsync(page, "start-page-timeline");
        await Timings.RecordAsync("start-page-framework-loaded-ms", timeline.GetProperty("framework").GetProperty("endMs").GetDouble());
        await Timings.RecordAsync("start-page-first-render-ms", timeline.GetProperty("firstRenderMs").GetDouble());
        await Timings.RecordAsync("start-page-first-contentful-paint-ms", timeline.GetProperty("firstContentfulPaintMs").GetDouble());
        await Timings.RecordAsync("start-page-load-event-ms", timeline.GetProperty("loadEventMs").GetDouble());
        // The same moment as start-page-ready-ms seen from inside the page, without the test driver's round trips.
        await Timings.RecordAsync("start-page-server-ready-in-page-ms", timeline.GetProperty("serverReadyMs").GetDouble());
        await Timings.RecordAsync("start-page-interactive-in-page-ms", timeline.GetProperty("interactiveMs").GetDouble());
        // The server rendered the page with its answers and handed them over: the client asked the API nothing.
        Assert.Equal(0, timeline.GetProperty("api").GetArrayLength());

        // plotly.js (4.6 MB) is for the plots only: the start page must neither fetch nor run it.
        Assert.Equal(JsonValueKind.Null, timeline.GetProperty("plotlyScript").ValueKind);
        Assert.Equal(JsonValueKind.Null, timeline.GetProperty("plotlyExecutedMs").ValueKind);
    }

    [Fact]
    public async Task StartPage_SkipLink_IsTheFirstKeyboardStop()
    {
        var page = await browser.NewPageAsync();
        await page.GotoAsync(server.BaseAddress.ToString());
        await page.GetByText("Server ready").WaitForAsync(new LocatorWaitForOptions { Timeout = 60_000 });

        await page.Keyboard.PressAsync("Tab");

        Assert.Equal("Skip to content", await page.EvaluateAsync<string>("() => document.activeElement.textContent"));
    }

    [Fact]
    public async Task StartPage_FocusGivenBeforeTheClientTakesOver_StaysOnTheSameLink()
    {
        var page = await browser.NewPageAsync();
        // The runtime is held back until the link has the focus, so the takeover surely comes after it.
        var focused = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
        await page.RouteAsync("**/_framework/dotnet.native*.wasm", async route =>
        {
            await focused.Task;
            await route.ContinueAsync();
        });
        await page.GotoAsync(server.BaseAddress.ToString(), new PageGotoOptions { WaitUntil = WaitUntilState.Commit });
        var benchLink = page.Locator(".bench-list a").First;
        await benchLink.WaitForAsync(new LocatorWaitForOptions { Timeout = 60_000 });
        Assert.False(await page.EvaluateAsync<bool>(ClientHasTakenOver));

        await benchLink.FocusAsync();
        focused.SetResult();
        await page.WaitForFunctionAsync(ClientHasTakenOver, null, new PageWaitForFunctionOptions { Timeout = 60_000 });

        Assert.Equal("Analog Lab B", await page.EvaluateAsync<string>("() => document.activeElement.textContent"));
        Assert.True(await page.EvaluateAsync<bool>("() => document.activeElement.classList.contains('bench-name')"));
    }

    [Fact]
    public async Task CaptureHowTo_ReachedByKeyboard_CarriesTheBenchSafetyCaution()
    {
        var page = await browser.NewPageAsync();
        await page.GotoAsync(server.BaseAddress.ToString());
        await page.GetByText("Server ready").WaitForAsync(new LocatorWaitForOptions { Timeout = 60_000 });

        // Tab through the masthead to the "How to capture" link and follow it with Enter: no mouse.
        for (var i = 0; i < 10 && await page.EvaluateAsync<string>("() => document.activeElement.textContent") != "How to capture"; i++)
        {
            await page.Keyboard.PressAsync("Tab");
        }

        await page.Keyboard.PressAsync("Enter");
        await page.GetByRole(AriaRole.Heading, new() { Name = "How to capture a board" }).WaitForAsync();

        Assert.Contains("Your lab's own rules", await page.Locator(".bench-safety").InnerTextAsync(), StringComparison.Ordinal);
        await Browser.SaveScreenshotAsync(page, "how-to-capture");
    }
}
