using System.Text.Json;
using Microsoft.Playwright;
using Patchproof.EndToEnd.Tests.Infrastructure;

namespace Patchproof.EndToEnd.Tests.Support;

/// <summary>Splits a first page load into its phases from the browser's own navigation and resource timing.</summary>
/// <remarks>
/// Times are milliseconds from the start of the navigation. The script added before the page's own scripts notes
/// when Plotly (if the page loads it) finished executing, when the start page's heading and "Server ready" appeared
/// (in the server's rendering, as the document arrives) and when its first button was enabled (the client has taken the
/// page over); the rest comes from the Resource Timing entries. The figures are for docs/performance.md and are
/// never asserted.
/// </remarks>
public static class StartPageTimeline
{
    private const string MarkScript = """
        (() => {
          const marks = {};
          window.__startPageMarks = marks;
          let plotly;
          Object.defineProperty(window, 'Plotly', {
            configurable: true,
            get() { return plotly; },
            set(value) { if (marks.plotlyExecuted === undefined) marks.plotlyExecuted = performance.now(); plotly = value; },
          });
          new MutationObserver((_, observer) => {
            if (marks.firstRender === undefined && document.querySelector('main h1')) marks.firstRender = performance.now();
            if (marks.serverReady === undefined && document.querySelector('main .server-state .ok')) marks.serverReady = performance.now();
            if (document.querySelector('main .new-bench button:enabled')) { marks.interactive = performance.now(); observer.disconnect(); }
          }).observe(document, { childList: true, subtree: true, attributes: true });
        })();
        """;

    private const string CollectScript = """
        () => {
          const marks = window.__startPageMarks || {};
          const nav = performance.getEntriesByType('navigation')[0];
          const all = performance.getEntriesByType('resource');
          const pick = test => all.filter(r => test(new URL(r.name).pathname));
          const span = list => list.length === 0 ? null : {
            count: list.length,
            startMs: Math.min(...list.map(r => r.startTime)),
            endMs: Math.max(...list.map(r => r.responseEnd)),
            transferKb: list.reduce((s, r) => s + r.transferSize, 0) / 1024,
            decodedKb: list.reduce((s, r) => s + r.decodedBodySize, 0) / 1024,
          };
          const framework = pick(p => p.startsWith('/_framework/'));
          return {
            htmlMs: nav.responseEnd,
            domContentLoadedMs: nav.domContentLoadedEventEnd,
            loadEventMs: nav.loadEventEnd,
            firstContentfulPaintMs: performance.getEntriesByName('first-contentful-paint')[0]?.startTime ?? null,
            plotlyScript: span(pick(p => /\/plotly-[0-9.]+(\.min)?\.js$/.test(p))),
            plotlyExecutedMs: marks.plotlyExecuted ?? null,
            blazorScript: span(pick(p => /\/blazor\.web(assembly)?[^/]*\.js$/.test(p))),
            dotnetScript: span(pick(p => /\/_framework\/dotnet\.[^/]*js$/.test(p) && !/runtime|native/.test(p))),
            runtime: span(pick(p => /\/_framework\/dotnet\.(runtime|native)[^/]*$/.test(p))),
            assemblies: span(framework.filter(r => /\.wasm$/.test(new URL(r.name).pathname) && !/dotnet\.native/.test(r.name))),
            framework: span(framework),
            firstRenderMs: marks.firstRender ?? null,
            serverReadyMs: marks.serverReady ?? null,
            interactiveMs: marks.interactive ?? null,
            health: span(pick(p => p === '/api/health')),
            api: pick(p => p.startsWith('/api/')).map(r => ({ path: new URL(r.name).pathname, startMs: r.startTime, endMs: r.responseEnd })),
            collectedMs: performance.now(),
            everything: span(all),
            resources: all.map(r => ({ path: new URL(r.name).pathname, startMs: r.startTime, responseStartMs: r.responseStart, endMs: r.responseEnd, transferKb: r.transferSize / 1024 })),
          };
        }
        """;

    /// <summary>Adds the marking script to the page; call before the page navigates.</summary>
    public static Task PrepareAsync(IPage page) => page.AddInitScriptAsync(MarkScript);

    /// <summary>Collects the phases after the page is ready, saves them as <c>artifacts/e2e/NAME.json</c> and returns them.</summary>
    public static async Task<JsonElement> CollectAsync(IPage page, string name)
    {
        var timeline = await page.EvaluateAsync<JsonElement>(CollectScript);
        await File.WriteAllTextAsync(Path.Combine(Browser.ArtifactsFolder, name + ".json"),
            JsonSerializer.Serialize(timeline, new JsonSerializerOptions { WriteIndented = true }), TestContext.Current.CancellationToken);
        return timeline;
    }
}
