using System.Globalization;
using Microsoft.AspNetCore.Components;
using Patchproof.Client.Models;
using Plotly.Blazor;
using Plotly.Blazor.ConfigLib;
using Plotly.Blazor.LayoutLib;
using Plotly.Blazor.Traces;
using Plotly.Blazor.Traces.ScatterLib;

namespace Patchproof.Client.Components.Plots;

/// <summary>One overlay (a phase plane, a time series, a return map or a spectrum): capture, nominal and fitted traces on white, with zoom and pan.</summary>
public sealed partial class OverlayChart : IDisposable
{
    private PlotlyChart? chart;
    private PlotViewport viewport = new(new AxisRange(0, 1), new AxisRange(0, 1));
    private Config config = new();
    private Plotly.Blazor.Layout layout = new();
    private IList<ITrace> data = [];
    private OverlayPlot? shown;
    private string viewportText = "";

    /// <summary>The overlay to draw.</summary>
    [Parameter, EditorRequired]
    public OverlayPlot Plot { get; set; } = default!;

    /// <summary>The chart's element id, unique on the page.</summary>
    [Parameter, EditorRequired]
    public string ChartId { get; set; } = default!;

    /// <summary>Draws the vertical axis on a log scale (spectra).</summary>
    [Parameter]
    public bool LogY { get; set; }

    /// <summary>Keeps one unit equal on both axes (phase planes).</summary>
    [Parameter]
    public bool EqualAspect { get; set; }

    /// <summary>The zoom and pan state, for tests and for the page that hosts the chart.</summary>
    public PlotViewport Viewport => viewport;

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
        viewport = new PlotViewport(
            AxisRange.Enclosing(Plot.Traces.SelectMany(t => t.X)),
            AxisRange.Enclosing(LogY ? Plot.Traces.SelectMany(t => t.Y).Where(v => v > 0).Select(Math.Log10) : Plot.Traces.SelectMany(t => t.Y)));
        viewport.Changed += OnViewportChanged;
        config = new Config { Responsive = true, DisplayLogo = false, DisplayModeBar = DisplayModeBarEnum.Hover, ScrollZoom = ScrollZoomFlag.False };
        data = Plot.Traces.Select(ToScatter).Cast<ITrace>().ToList();
        layout = BuildLayout();
        viewportText = "";
    }

    private static Scatter ToScatter(PlotTrace trace)
    {
        var style = TraceStyle.For(trace.Role);
        var (x, y) = PlotThinning.ToChartPoints(trace.X, trace.Y);
        return new Scatter
        {
            Name = style.Legend,
            X = x,
            Y = y,
            Mode = ModeFlag.Lines,
            Line = new Line { Color = style.Colour, Width = (decimal)style.WidthPixels, Dash = style.Dash },
            Opacity = trace.Role == TraceRole.Capture ? 0.75m : 0.9m,
            HoverInfo = HoverInfoFlag.X | HoverInfoFlag.Y | HoverInfoFlag.Name,
        };
    }

    private Plotly.Blazor.Layout BuildLayout() => new()
    {
        PaperBgColor = "#ffffff",
        PlotBgColor = "#ffffff",
        Height = 380,
        Margin = new Margin { L = 64, R = 16, T = 12, B = 52 },
        Font = new Font { Family = "system-ui, sans-serif", Size = 13, Color = "#1a1a1a" },
        ShowLegend = true,
        Legend = [new Legend { Orientation = Plotly.Blazor.LayoutLib.LegendLib.OrientationEnum.H, Y = 1.02m, X = 0m, YAnchor = Plotly.Blazor.LayoutLib.LegendLib.YAnchorEnum.Bottom }],
        XAxis = [Axis(Plot.XLabel, viewport.X, log: false)],
        YAxis = [YAxisOf(Plot.YLabel, viewport.Y)],
        DragMode = DragModeEnum.Zoom,
    };

    private static XAxis Axis(string label, AxisRange range, bool log) => new()
    {
        Title = new Plotly.Blazor.LayoutLib.XAxisLib.Title { Text = label },
        Range = [range.Min, range.Max],
        AutoRange = Plotly.Blazor.LayoutLib.XAxisLib.AutoRangeEnum.False,
        GridColor = "#e4e4e4",
        ZeroLineColor = "#bdbdbd",
        LineColor = "#555555",
        ShowLine = true,
        Type = log ? Plotly.Blazor.LayoutLib.XAxisLib.TypeEnum.Log : Plotly.Blazor.LayoutLib.XAxisLib.TypeEnum.Linear,
    };

    private YAxis YAxisOf(string label, AxisRange range) => new()
    {
        Title = new Plotly.Blazor.LayoutLib.YAxisLib.Title { Text = label },
        Range = [range.Min, range.Max],
        AutoRange = Plotly.Blazor.LayoutLib.YAxisLib.AutoRangeEnum.False,
        GridColor = "#e4e4e4",
        ZeroLineColor = "#bdbdbd",
        LineColor = "#555555",
        ShowLine = true,
        Type = LogY ? Plotly.Blazor.LayoutLib.YAxisLib.TypeEnum.Log : Plotly.Blazor.LayoutLib.YAxisLib.TypeEnum.Linear,
        ScaleAnchor = EqualAspect ? "x" : null,
    };

    private async void OnViewportChanged()
    {
        layout.XAxis[0].Range = [viewport.X.Min, viewport.X.Max];
        layout.YAxis[0].Range = [viewport.Y.Min, viewport.Y.Max];
        viewportText = string.Create(CultureInfo.InvariantCulture,
            $"{Plot.Title}: x from {viewport.X.Min:G4} to {viewport.X.Max:G4}, y from {viewport.Y.Min:G4} to {viewport.Y.Max:G4}");
        await InvokeAsync(StateHasChanged);
        if (chart is not null)
        {
            await chart.Relayout();
        }
    }
}
