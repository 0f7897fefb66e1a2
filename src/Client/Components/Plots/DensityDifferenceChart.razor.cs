using Microsoft.AspNetCore.Components;
using Patchproof.Client.Models;
using Plotly.Blazor;
using Plotly.Blazor.ConfigLib;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;

namespace Patchproof.Client.Components.Plots;

/// <summary>The occupancy density of the capture minus that of the fitted model on one phase plane, on a diverging scale centred on zero.</summary>
public sealed partial class DensityDifferenceChart : IDisposable
{
    private PlotlyChart? chart;
    private PlotViewport viewport = new(new AxisRange(0, 1), new AxisRange(0, 1));
    private Config config = new();
    private Plotly.Blazor.Layout layout = new();
    private IList<ITrace> data = [];
    private DensityDifferencePlot? shown;

    /// <summary>The density difference to draw.</summary>
    [Parameter, EditorRequired]
    public DensityDifferencePlot Plot { get; set; } = default!;

    /// <summary>The chart's element id, unique on the page.</summary>
    [Parameter, EditorRequired]
    public string ChartId { get; set; } = default!;

    /// <inheritdoc />
    public void Dispose() => viewport.Changed -= OnViewportChanged;

    /// <inheritdoc />
    protected override void OnParametersSet()
    {
        if (ReferenceEquals(shown, Plot))
        {
            return;
        }

        shown = Plot;
        viewport.Changed -= OnViewportChanged;
        viewport = new PlotViewport(AxisRange.Enclosing(Plot.XCentres, 0), AxisRange.Enclosing(Plot.YCentres, 0));
        viewport.Changed += OnViewportChanged;
        var largest = Plot.Difference.SelectMany(r => r).Where(double.IsFinite).Select(Math.Abs).DefaultIfEmpty(1).Max();
        config = new Config { Responsive = true, DisplayLogo = false, DisplayModeBar = DisplayModeBarEnum.Hover };
        data =
        [
            new HeatMap
            {
                Name = "capture minus fitted",
                X = Plot.XCentres.Cast<object>().ToList(),
                Y = Plot.YCentres.Cast<object>().ToList(),
                Z = Plot.Difference.Select(row => (object)row.Cast<object>().ToList()).ToList(),
                ZMin = (decimal)-largest,
                ZMax = (decimal)largest,
                ColorScale = new object[]
                {
                    new object[] { 0, OkabeIto.Blue },
                    new object[] { 0.5, "#ffffff" },
                    new object[] { 1, OkabeIto.Vermillion },
                },
            },
        ];
        layout = new Plotly.Blazor.Layout
        {
            PaperBgColor = "#ffffff",
            PlotBgColor = "#ffffff",
            Height = 380,
            Margin = new Margin { L = 64, R = 16, T = 12, B = 52 },
            Font = new Font { Family = "system-ui, sans-serif", Size = 13, Color = "#1a1a1a" },
            XAxis = [new XAxis { Title = new Plotly.Blazor.LayoutLib.XAxisLib.Title { Text = Plot.XLabel }, Range = [viewport.X.Min, viewport.X.Max] }],
            YAxis = [new YAxis { Title = new Plotly.Blazor.LayoutLib.YAxisLib.Title { Text = Plot.YLabel }, Range = [viewport.Y.Min, viewport.Y.Max] }],
        };
    }

    private async void OnViewportChanged()
    {
        layout.XAxis[0].Range = [viewport.X.Min, viewport.X.Max];
        layout.YAxis[0].Range = [viewport.Y.Min, viewport.Y.Max];
        await InvokeAsync(StateHasChanged);
        if (chart is not null)
        {
            await chart.Relayout();
        }
    }
}
