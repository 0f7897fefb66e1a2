using Patchproof.Contracts.Reports;
using Patchproof.Core.Dynamics;
using Patchproof.Core.Reports;

namespace Patchproof.Server.Reports;

/// <summary>Turns the core's <see cref="FitComparison"/> into the report's plots and invariants.</summary>
internal static class ComparisonMapper
{
    /// <summary>The most points a trace carries on the wire. The core's traces carry up to 20,000; a browser reading a dozen
    /// such traces spends tens of seconds on the document alone, so they are decimated again (curves along their arc length,
    /// time series min/max per column) and their values rounded to 6 significant digits, finer than a scope's 8-10 bits.</summary>
    public const int MaxPointsPerTrace = 2_500;

    public static PlotsDocument Plots(FitComparison? comparison)
    {
        if (comparison is not { Computed: true })
        {
            return PlotsDocument.Empty;
        }

        var overlays = comparison.Overlays is { Computed: true } o ? o : null;
        return new PlotsDocument(
            overlays?.PhasePlanes.Select(p => Panel(p, againstTime: false)).ToList() ?? [],
            overlays?.TimeSeries.Select(p => Panel(p, againstTime: true)).ToList() ?? [],
            ReturnMap(comparison.ReturnMap),
            comparison.Occupancy is { Computed: true } occupancy ? occupancy.Planes.Select(Density).ToList() : [],
            comparison.Spectra.Where(s => s.Computed).Select(Spectrum).ToList());
    }

    public static IReadOnlyList<InvariantDocument> Invariants(FitComparison? comparison) =>
        comparison is { Computed: true }
            ? comparison.Invariants.Select(i => new InvariantDocument(i.Name, Finite(i.FromCapture), Finite(i.FromModel), i.Unit)).ToList()
            : [];

    private static OverlayPlotDocument Panel(PlotPanel panel, bool againstTime) =>
        new(panel.Title, panel.XLabel, panel.YLabel, panel.Traces.Select(t => Role(t.Role) is { } role ? Decimated(role, t.X, t.Y, againstTime) : null).OfType<TraceDocument>().ToList());

    private static TraceDocument Decimated(TraceRoleCode role, double[] x, double[] y, bool againstTime)
    {
        var count = Math.Min(x.Length, y.Length);
        if (count <= MaxPointsPerTrace)
        {
            return Trace(role, x, y);
        }

        var series = againstTime
            ? TraceDecimation.MinMaxPerColumn(x.AsSpan(0, count), y.AsSpan(0, count), MaxPointsPerTrace / 2)
            : TraceDecimation.AlongCurve(x.AsSpan(0, count), y.AsSpan(0, count), MaxPointsPerTrace);
        return Trace(role, series.X, series.Y);
    }

    private static OverlayPlotDocument? ReturnMap(ReturnMapComparison? map)
    {
        if (map is not { Computed: true })
        {
            return null;
        }

        var traces = new[] { map.Capture, map.Fitted }.OfType<ReturnMapSeries>()
            .Select(s => Role(s.Role) is { } role ? Trace(role, s.Current, s.Next) : null).OfType<TraceDocument>().ToList();
        return new OverlayPlotDocument($"Successive maxima of {map.Variable}", $"maximum n of {map.Variable} (V)", $"maximum n + 1 of {map.Variable} (V)", traces);
    }

    private static DensityDifferenceDocument Density(OccupancyPlane plane) =>
        new($"{plane.YVariable} against {plane.XVariable}: capture minus fitted", $"{plane.XVariable} (V)", $"{plane.YVariable} (V)",
            Rounded(plane.XCentres), Rounded(plane.YCentres), plane.Difference.Select(row => (IReadOnlyList<double>)Rounded(row)).ToList());

    private static OverlayPlotDocument Spectrum(ChannelSpectrum spectrum) =>
        new($"Welch spectrum of {spectrum.Channel} ({spectrum.Variable})", "frequency (Hz)", "power spectral density (V²/Hz)",
            new[] { (TraceRoleCode.Capture, spectrum.Capture), (TraceRoleCode.Nominal, spectrum.Nominal), (TraceRoleCode.Fitted, spectrum.Fitted) }
                .Where(pair => pair.Item2.Length == spectrum.FrequenciesHertz.Length && pair.Item2.Length > 0)
                .Select(pair => Trace(pair.Item1, spectrum.FrequenciesHertz, pair.Item2)).ToList());

    private static TraceDocument Trace(TraceRoleCode role, double[] x, double[] y)
    {
        var count = Math.Min(x.Length, y.Length);
        if (count <= MaxPointsPerTrace)
        {
            return new TraceDocument(role, Rounded(x[..count]), Rounded(y[..count]));
        }

        var stride = (int)Math.Ceiling(count / (double)MaxPointsPerTrace);
        var indices = Enumerable.Range(0, (count + stride - 1) / stride).Select(i => i * stride).ToArray();
        return new TraceDocument(role, Rounded(indices.Select(i => x[i]).ToArray()), Rounded(indices.Select(i => y[i]).ToArray()));
    }

    private static double[] Rounded(double[] values) => values.Select(SixDigits).ToArray();

    private static double SixDigits(double value)
    {
        if (value == 0 || !double.IsFinite(value))
        {
            return value;
        }

        var digits = 5 - (int)Math.Floor(Math.Log10(Math.Abs(value)));
        return digits is >= 0 and <= 15 ? Math.Round(value, digits) : value;
    }

    private static TraceRoleCode? Role(string role) => role switch
    {
        "capture" => TraceRoleCode.Capture,
        "nominal" => TraceRoleCode.Nominal,
        "fitted" => TraceRoleCode.Fitted,
        _ => null,
    };

    private static double? Finite(double value) => double.IsFinite(value) ? value : null;
}
