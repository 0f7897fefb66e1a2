using Microsoft.Playwright;
using Patchproof.EndToEnd.Tests.Infrastructure;

namespace Patchproof.EndToEnd.Tests.Pages;

/// <summary>How long the browser takes to draw and re-zoom a phase-portrait overlay of a 1,000,000-sample capture from decimated series.</summary>
/// <remarks>
/// The trajectory is made in the page (RK4 of the Lorenz system, 1,000,000 samples, invented demo data) and cut to
/// 20,000 points per trace, the most the server sends; the figures go to artifacts/e2e/timings.tsv, never asserted.
/// </remarks>
[Collection(EndToEndCollection.Name)]
public sealed class PlotDrawingTests(LiveServer server, Browser browser)
{
    private const string LoadPlotlyScript = """
        async () => {
          const interop = await import('./_content/Plotly.Blazor/plotly-interop-7.2.0.js');
          await interop.importScript('plotly-import', './_content/Plotly.Blazor/plotly-3.7.0.min.js');
        }
        """;

    private const string DrawScript = """
        async () => {
          const n = 1000000, keep = 20000, h = 0.002;
          let x = 1, y = 1, z = 1;
          const f = (x, y, z) => [10 * (y - x), x * (28 - z) - y, x * y - 8 / 3 * z];
          const stride = Math.ceil(n / keep);
          const traces = [[[], []], [[], []], [[], []]];
          for (let i = 0; i < n; i++) {
            const k1 = f(x, y, z), k2 = f(x + h / 2 * k1[0], y + h / 2 * k1[1], z + h / 2 * k1[2]);
            const k3 = f(x + h / 2 * k2[0], y + h / 2 * k2[1], z + h / 2 * k2[2]), k4 = f(x + h * k3[0], y + h * k3[1], z + h * k3[2]);
            x += h / 6 * (k1[0] + 2 * k2[0] + 2 * k3[0] + k4[0]); y += h / 6 * (k1[1] + 2 * k2[1] + 2 * k3[1] + k4[1]); z += h / 6 * (k1[2] + 2 * k2[2] + 2 * k3[2] + k4[2]);
            if (i % stride === 0) {
              traces[0][0].push(x); traces[0][1].push(z);
              traces[1][0].push(x * 1.01); traces[1][1].push(z * 0.99);
              traces[2][0].push(x * 1.005); traces[2][1].push(z * 1.002);
            }
          }
          const div = document.createElement('div'); div.style.width = '900px'; div.style.height = '420px'; div.id = 'perf-plot';
          document.body.prepend(div);
          const styles = [['#000000', 'solid', 'capture (measured on the board)'], ['#E69F00', 'dash', 'nominal design (simulated)'], ['#0072B2', 'solid', 'fitted values (simulated)']];
          const data = traces.map((t, i) => ({ x: t[0], y: t[1], mode: 'lines', type: 'scatter', name: styles[i][2], line: { color: styles[i][0], dash: styles[i][1], width: 1.2 } }));
          const t0 = performance.now();
          await Plotly.newPlot(div, data, { paper_bgcolor: '#fff', plot_bgcolor: '#fff', xaxis: { title: { text: 'x (V)' } }, yaxis: { title: { text: 'z (V)' } }, legend: { orientation: 'h' } });
          const t1 = performance.now();
          await Plotly.relayout(div, { 'xaxis.range': [-5, 5], 'yaxis.range': [15, 35] });
          const t2 = performance.now();
          return [t1 - t0, t2 - t1, data.reduce((s, d) => s + d.x.length, 0)];
        }
        """;

    [Fact]
    public async Task Overlay_MillionSampleCaptureDecimated_DrawsAndZooms()
    {
        var page = await browser.NewPageAsync();
        await page.GotoAsync(server.BaseAddress.ToString());
        await page.GetByText("Server ready").WaitForAsync(new LocatorWaitForOptions { Timeout = 60_000 });
        // The start page leaves plotly.js out; load the copy the app ships as the chart component does, with Plotly.Blazor's loader.
        await page.EvaluateAsync(LoadPlotlyScript);

        var figures = await page.EvaluateAsync<double[]>(DrawScript);

        Assert.True(figures[2] <= 3 * 20_001, $"{figures[2]} points were drawn; the decimated series hold at most 20,000 per trace.");
        Assert.Equal(3, await page.Locator("#perf-plot .scatterlayer .trace").CountAsync());
        await Timings.RecordAsync("overlay-1M-draw-ms", figures[0]);
        await Timings.RecordAsync("overlay-1M-zoom-ms", figures[1]);
        await Browser.SaveScreenshotAsync(page, "overlay-1M-decimated");
    }
}
