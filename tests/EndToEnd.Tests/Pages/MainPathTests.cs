using System.Diagnostics;
using System.Text.RegularExpressions;
using Microsoft.Playwright;
using Patchproof.EndToEnd.Tests.Infrastructure;
using Patchproof.EndToEnd.Tests.Support;

namespace Patchproof.EndToEnd.Tests.Pages;

/// <summary>The main path in the browser: a demo board, its capture, a fit with progress, the report naming a part; and a design generated from a model.</summary>
[Collection(EndToEndCollection.Name)]
public sealed class MainPathTests(LiveServer server, Browser browser)
{
    private static readonly LocatorWaitForOptions Slow = new() { Timeout = 60_000 };

    [Fact]
    public async Task MainPath_DemoDesignAndCapture_ReportNamesAPart()
    {
        Browser.RequireBrowser();
        var page = await browser.NewPageAsync();
        await page.GotoAsync(server.BaseAddress.ToString());

        // QH-L4 "Plover" of the demo scenario: the resistor from x into the y integrator reads about 10 % high.
        await page.GetByRole(AriaRole.Link, new() { NameRegex = new Regex("Analog Lab B") }).First.ClickAsync();
        await page.GetByRole(AriaRole.Link, new() { NameRegex = new Regex("^QH-L4\\b") }).ClickAsync();
        await page.GetByRole(AriaRole.Heading, new() { Name = "Run a fit" }).WaitForAsync(Slow);
        await Browser.SaveScreenshotAsync(page, "board");

        await page.GetByRole(AriaRole.Link, new() { Name = "Upload captures" }).ClickAsync();
        await page.Locator("#capture-files").SetInputFilesAsync(DemoCapture.OfBoard("qh-l4-plover.csv"));
        await page.GetByText("stored and checked").WaitForAsync(Slow);
        await Browser.SaveScreenshotAsync(page, "capture-upload");

        await page.GetByRole(AriaRole.Link, new() { Name = "Back to the board to run a fit" }).ClickAsync();
        var start = page.GetByRole(AriaRole.Button, new() { Name = "Start the fit" });
        await start.WaitForAsync(Slow);
        var stopwatch = Stopwatch.StartNew();
        await start.ClickAsync();
        await page.Locator(".fit-progress").First.WaitForAsync(Slow);
        await Browser.SaveScreenshotAsync(page, "fit-progress");
        var report = page.GetByRole(AriaRole.Link, new() { Name = "Read the report" });
        var failed = page.GetByText("The fit failed.");
        await report.Or(failed).First.WaitForAsync(new LocatorWaitForOptions { Timeout = 600_000 });
        stopwatch.Stop();
        if (await failed.IsVisibleAsync())
        {
            Assert.Fail("The fit failed: " + await page.Locator(".problem-notice").First.InnerTextAsync());
        }

        await Timings.RecordAsync("main-path-fit-qh-l4-ms", stopwatch.ElapsedMilliseconds);

        await report.ClickAsync();
        var part = page.Locator(".finding .part").First;
        await part.WaitForAsync(Slow);
        Assert.Matches("^[RCM][0-9]+$", await part.InnerTextAsync());

        // The comparison plots: the chart component loads plotly.js on first use and draws every trace of the legend.
        var chart = page.Locator(".overlay-chart").First;
        await chart.Locator(".scatterlayer .trace").First.WaitForAsync(Slow);
        Assert.Equal(await chart.Locator(".legend-words li").CountAsync(), await chart.Locator(".scatterlayer .trace").CountAsync());
        await Browser.SaveScreenshotAsync(page, "report");
    }

    [Fact]
    public async Task DesignPath_GenerateCheckAndSave_StoresVersionOne()
    {
        Browser.RequireBrowser();
        var page = await browser.NewPageAsync();
        await page.GotoAsync(server.BaseAddress.ToString());
        await page.Locator(".bench-list a, .empty").First.WaitForAsync(Slow);

        // A bench of our own keeps the test independent of the demo data already loaded.
        var suffix = Guid.NewGuid().ToString("N")[..6];
        await page.GetByText("Record a new bench or class").ClickAsync();
        await page.GetByLabel("Name").FillAsync($"Test bench {suffix}");
        await page.GetByRole(AriaRole.Button, new() { Name = "Record bench" }).ClickAsync();
        await page.GetByRole(AriaRole.Heading, new() { Name = "Record a new board" }).WaitForAsync(Slow);
        await Browser.SaveScreenshotAsync(page, "bench");

        await page.GetByLabel("Label on the board").FillAsync($"QH-T{suffix}");
        await page.GetByLabel("Nickname").FillAsync("Petrel");
        await page.GetByRole(AriaRole.Button, new() { Name = "Record board" }).ClickAsync();
        await page.GetByRole(AriaRole.Link, new() { Name = "Set up the design", Exact = true }).ClickAsync();

        await page.GetByRole(AriaRole.Button, new() { NameRegex = new Regex("Generate a design from the Lorenz") }).ClickAsync();
        await page.Locator("table.parts").WaitForAsync(Slow);
        await page.GetByRole(AriaRole.Button, new() { Name = "Check the design" }).ClickAsync();
        await page.GetByRole(AriaRole.Button, new() { Name = "Save as a new version" }).ClickAsync();
        await page.GetByText("Saved as version 1.").WaitForAsync(Slow);
        await Browser.SaveScreenshotAsync(page, "design");
    }
}
