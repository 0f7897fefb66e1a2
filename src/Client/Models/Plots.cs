namespace Patchproof.Client.Models;

/// <summary>Which signal a trace shows; each role has its own colour and line style on every plot.</summary>
public enum TraceRole
{
    /// <summary>The measured capture.</summary>
    Capture,

    /// <summary>The simulation with the design's nominal values.</summary>
    Nominal,

    /// <summary>The simulation with the fitted values.</summary>
    Fitted,
}

/// <summary>One decimated trace: x and y of equal length, at most a few tens of thousands of points.</summary>
/// <param name="Role">What the trace shows.</param>
/// <param name="X">Horizontal values.</param>
/// <param name="Y">Vertical values.</param>
public sealed record PlotTrace(TraceRole Role, IReadOnlyList<double> X, IReadOnlyList<double> Y);

/// <summary>The overlay of one phase plane (or one time series): one trace per role.</summary>
/// <param name="Title">The plot's title, for example "x against z".</param>
/// <param name="XLabel">The horizontal axis label with its unit.</param>
/// <param name="YLabel">The vertical axis label with its unit.</param>
/// <param name="Traces">The traces, at most one per role.</param>
public sealed record OverlayPlot(string Title, string XLabel, string YLabel, IReadOnlyList<PlotTrace> Traces);

/// <summary>The difference of two occupancy densities on a grid: capture minus fitted model.</summary>
/// <param name="Title">The plot's title.</param>
/// <param name="XLabel">The horizontal axis label.</param>
/// <param name="YLabel">The vertical axis label.</param>
/// <param name="XCentres">The grid's column centres.</param>
/// <param name="YCentres">The grid's row centres.</param>
/// <param name="Difference">Rows of the difference, one per y centre, each of x-centre length.</param>
public sealed record DensityDifferencePlot(
    string Title,
    string XLabel,
    string YLabel,
    IReadOnlyList<double> XCentres,
    IReadOnlyList<double> YCentres,
    IReadOnlyList<IReadOnlyList<double>> Difference);

/// <summary>All the comparison plots of a report.</summary>
/// <param name="PhasePlanes">One overlay per phase plane.</param>
/// <param name="TimeSeries">One overlay per channel against time.</param>
/// <param name="ReturnMap">Successive maxima against each other, or null.</param>
/// <param name="DensityDifferences">Density differences per plane.</param>
/// <param name="Spectra">Welch spectra per channel.</param>
public sealed record ComparisonPlots(
    IReadOnlyList<OverlayPlot> PhasePlanes,
    IReadOnlyList<OverlayPlot> TimeSeries,
    OverlayPlot? ReturnMap,
    IReadOnlyList<DensityDifferencePlot> DensityDifferences,
    IReadOnlyList<OverlayPlot> Spectra)
{
    /// <summary>No plots at all.</summary>
    public static ComparisonPlots Empty { get; } = new([], [], null, [], []);

    /// <summary>True when there is nothing to draw.</summary>
    public bool IsEmpty => PhasePlanes.Count == 0 && TimeSeries.Count == 0 && ReturnMap is null && DensityDifferences.Count == 0 && Spectra.Count == 0;
}
