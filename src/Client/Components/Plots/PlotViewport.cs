namespace Patchproof.Client.Components.Plots;

/// <summary>The visible part of a plot: zoom and pan state kept apart from the chart, so it is tested without rendering.</summary>
/// <remarks>
/// The home view encloses all the data. Zooming scales both axes about the view's centre by <see cref="ZoomStep"/>;
/// panning moves the view by <see cref="PanStep"/> of its width or height. Zooming out never goes past four times the
/// home view, and zooming in never below a millionth of it, so a held key cannot lose the data. A drag-zoom in the chart
/// reports its new view through <see cref="Show"/>.
/// </remarks>
public sealed class PlotViewport
{
    /// <summary>The factor one zoom step scales the view by.</summary>
    public const double ZoomStep = 0.5;

    /// <summary>The fraction of the view one pan step moves it by.</summary>
    public const double PanStep = 0.25;

    private const double MaxZoomOut = 4;
    private const double MinZoomIn = 1e-6;

    /// <summary>Starts at the home view.</summary>
    public PlotViewport(AxisRange homeX, AxisRange homeY)
    {
        HomeX = homeX;
        HomeY = homeY;
        X = homeX;
        Y = homeY;
    }

    /// <summary>Raised after the view changed.</summary>
    public event Action? Changed;

    /// <summary>The view that encloses all the data.</summary>
    public AxisRange HomeX { get; private set; }

    /// <summary>The view that encloses all the data.</summary>
    public AxisRange HomeY { get; private set; }

    /// <summary>The visible horizontal range.</summary>
    public AxisRange X { get; private set; }

    /// <summary>The visible vertical range.</summary>
    public AxisRange Y { get; private set; }

    /// <summary>True when the view is the home view.</summary>
    public bool IsHome => X == HomeX && Y == HomeY;

    /// <summary>How far the view is zoomed in, relative to the home view's width (1 at home, 2 after one step in).</summary>
    public double Magnification => HomeX.Width / X.Width;

    /// <summary>Zooms in one step about the view's centre.</summary>
    public void ZoomIn() => Scale(ZoomStep);

    /// <summary>Zooms out one step about the view's centre.</summary>
    public void ZoomOut() => Scale(1 / ZoomStep);

    /// <summary>Moves the view one step.</summary>
    public void Pan(PanDirection direction)
    {
        (X, Y) = direction switch
        {
            PanDirection.Left => (X.ShiftedBy(-PanStep), Y),
            PanDirection.Right => (X.ShiftedBy(PanStep), Y),
            PanDirection.Up => (X, Y.ShiftedBy(PanStep)),
            PanDirection.Down => (X, Y.ShiftedBy(-PanStep)),
            _ => throw new ArgumentOutOfRangeException(nameof(direction), direction, "Unknown pan direction."),
        };
        Changed?.Invoke();
    }

    /// <summary>Goes back to the home view.</summary>
    public void Reset()
    {
        X = HomeX;
        Y = HomeY;
        Changed?.Invoke();
    }

    /// <summary>Shows the given ranges (from a drag-zoom in the chart); an empty or inverted range is ignored.</summary>
    public void Show(AxisRange x, AxisRange y)
    {
        if (!(x.Width > 0) || !(y.Width > 0) || !double.IsFinite(x.Width) || !double.IsFinite(y.Width))
        {
            return;
        }

        X = x;
        Y = y;
        Changed?.Invoke();
    }

    /// <summary>Takes new data: a new home view, shown at once.</summary>
    public void Rehome(AxisRange homeX, AxisRange homeY)
    {
        HomeX = homeX;
        HomeY = homeY;
        Reset();
    }

    private void Scale(double factor)
    {
        var width = X.Width * factor;
        if (width > HomeX.Width * MaxZoomOut || width < HomeX.Width * MinZoomIn)
        {
            return;
        }

        X = X.ScaledBy(factor);
        Y = Y.ScaledBy(factor);
        Changed?.Invoke();
    }
}
