using System.Globalization;
using System.Net;
using System.Text;
using Patchproof.Contracts.Reports;

namespace Patchproof.Server.Reports;

/// <summary>A report as one self-contained, printable HTML page: inline styles, plots as inline SVG, nothing fetched from elsewhere.</summary>
internal static class ReportHtmlWriter
{
    private const int MaxSvgPoints = 2000;

    private static readonly Dictionary<TraceRoleCode, (string Colour, string Dash, string Name)> Styles = new()
    {
        // Okabe-Ito: black for the capture, orange dashed for the nominal design, blue for the fitted values.
        [TraceRoleCode.Capture] = ("#000000", string.Empty, "capture (black, solid)"),
        [TraceRoleCode.Nominal] = ("#E69F00", "6 4", "nominal design (orange, dashed)"),
        [TraceRoleCode.Fitted] = ("#0072B2", string.Empty, "fitted values (blue, solid)"),
    };

    public static string Write(string boardCode, string boardName, int designVersion, IReadOnlyList<string> captureFiles, DateTimeOffset finishedAt, FitResultDocument document)
    {
        var html = new StringBuilder();
        html.Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
        html.Append(CultureInfo.InvariantCulture, $"<title>Patchproof report · {E(boardCode)}</title>\n");
        html.Append("""
            <style>
            body { font-family: system-ui, sans-serif; color: #111; background: #fff; max-width: 60rem; margin: 1.5rem auto; padding: 0 1rem; line-height: 1.4; }
            h1 { font-size: 1.5rem; margin-bottom: 0.2rem; } h2 { font-size: 1.15rem; border-bottom: 1px solid #ccc; padding-bottom: 0.2rem; margin-top: 1.6rem; }
            .context { color: #444; margin-top: 0; } .summary { font-weight: 600; font-size: 1.05rem; }
            .warnings { border-left: 4px solid #E69F00; background: #FFF8EC; padding: 0.4rem 0.8rem; }
            .finding { border-left: 4px solid #999; padding: 0.3rem 0.8rem; margin: 0.6rem 0; break-inside: avoid; }
            .finding.drifted { border-left-color: #D55E00; } .finding.withinTolerance { border-left-color: #009E73; } .finding.cannotDecide { border-left-color: #E69F00; }
            .part { font-weight: 700; font-size: 1.1rem; }
            table { border-collapse: collapse; width: 100%; font-size: 0.92rem; } th, td { border-bottom: 1px solid #ddd; padding: 0.25rem 0.4rem; text-align: left; }
            td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; }
            figure { margin: 0.8rem 0; break-inside: avoid; } figcaption { font-size: 0.9rem; color: #333; }
            footer { margin-top: 2rem; color: #555; font-size: 0.85rem; }
            @media print { body { margin: 0; max-width: none; } a { color: inherit; } }
            </style>
            </head>
            <body>

            """);
        html.Append(CultureInfo.InvariantCulture, $"<h1>Report · {E(boardCode)} {E(boardName)}</h1>\n");
        html.Append(CultureInfo.InvariantCulture, $"<p class=\"context\">Design version {designVersion} against {E(string.Join(", ", captureFiles))}; finished {finishedAt.UtcDateTime:yyyy-MM-dd HH:mm} UTC.</p>\n");

        html.Append("<h2>Findings</h2>\n");
        html.Append(CultureInfo.InvariantCulture, $"<p class=\"summary\">{E(document.Summary)}</p>\n");
        if (document.Warnings.Count > 0)
        {
            html.Append("<div class=\"warnings\"><p><strong>Take care: these findings may be unsafe.</strong></p><ul>\n");
            foreach (var w in document.Warnings)
            {
                html.Append(CultureInfo.InvariantCulture, $"<li>{E(w)}</li>\n");
            }

            html.Append("</ul></div>\n");
        }

        if (document.Findings.Count == 0)
        {
            html.Append("<p>The diagnosis names no part.</p>\n");
        }

        foreach (var f in document.Findings)
        {
            html.Append(CultureInfo.InvariantCulture, $"<div class=\"finding {VerdictClass(f.Verdict)}\"><p><span class=\"part\">{E(f.Part)}</span> · {E(ReportCsvWriter.VerdictText(f.Verdict))} · {E(f.Role)}</p>\n");
            html.Append(CultureInfo.InvariantCulture, $"<p>{E(f.Sentence)}</p>\n<p>How sure: probability {N(f.Probability, "0.00")}{(f.RunnerUp is { Length: > 0 } r ? "; next best: " + E(r) : string.Empty)}.</p>\n<p>What to do: {E(f.Advice)}</p></div>\n");
        }

        html.Append("<h2>Comparison</h2>\n");
        var overlays = document.Plots.PhasePlanes.Concat(document.Plots.TimeSeries).Concat(document.Plots.ReturnMap is { } map ? [map] : []).ToList();
        if (overlays.Count == 0)
        {
            html.Append("<p>No comparison plots in this report: the fit engine made none.</p>\n");
        }

        foreach (var plot in overlays)
        {
            Svg(html, plot);
        }

        if (document.Plots.DensityDifferences.Count > 0 || document.Plots.Spectra.Count > 0)
        {
            html.Append("<p>Density differences and spectra are shown on the report page in the app; they are left out of this printable page.</p>\n");
        }

        html.Append("<h2>Coefficients</h2>\n<table><thead><tr><th>Equation</th><th>Term</th><th>Unit</th><th class=\"num\">Nominal</th><th class=\"num\">Estimate</th><th class=\"num\">± s.e.</th><th class=\"num\">Off by</th></tr></thead><tbody>\n");
        foreach (var c in document.Coefficients)
        {
            var off = c.Nominal == 0 ? double.NaN : 100 * ((c.Estimate / c.Nominal) - 1);
            html.Append(CultureInfo.InvariantCulture, $"<tr><td>{E(c.Equation)}</td><td>{E(c.Term)}{(c.RestsOnPriors ? " (rests on priors)" : string.Empty)}</td><td>{E(c.Unit)}</td><td class=\"num\">{N(c.Nominal, "G6")}</td><td class=\"num\">{N(c.Estimate, "G6")}</td><td class=\"num\">{N(c.StandardError, "G3")}</td><td class=\"num\">{N(off, "+0.00;-0.00")} %</td></tr>\n");
        }

        html.Append("</tbody></table>\n<h2>Offsets</h2>\n<table><thead><tr><th>Integrator</th><th class=\"num\">Equivalent input offset (mV)</th><th class=\"num\">± s.e. (mV)</th></tr></thead><tbody>\n");
        foreach (var o in document.Offsets)
        {
            html.Append(CultureInfo.InvariantCulture, $"<tr><td>d{E(o.Variable)}/dt</td><td class=\"num\">{N(o.EquivalentInputMillivolts, "0.00")}</td><td class=\"num\">{N(o.StandardErrorMillivolts, "0.00")}</td></tr>\n");
        }

        html.Append("</tbody></table>\n");
        if (document.Channels is { Count: > 0 } channels)
        {
            html.Append("<h2>Channel gains assumed</h2>\n<table><thead><tr><th>Channel</th><th>Records</th><th class=\"num\">Gain</th><th class=\"num\">± prior sd</th><th>Where it came from</th></tr></thead><tbody>\n");
            foreach (var g in channels)
            {
                html.Append(CultureInfo.InvariantCulture, $"<tr><td>{E(g.Channel)}</td><td>{(g.Sign < 0 ? "-" : string.Empty)}{E(g.Variable)}</td><td class=\"num\">{N(g.Gain, "0.0000")}</td><td class=\"num\">{N(g.GainSdPercent, "0.00")} %</td><td>{E(g.GainSource)}</td></tr>\n");
            }

            html.Append("</tbody></table>\n");
        }

        html.Append("<h2>Time scale</h2>\n");
        html.Append(document.TimeScale is { } t
            ? string.Create(CultureInfo.InvariantCulture, $"<p>Design {N(t.NominalSeconds * 1e3, "0.####")} ms per problem time unit; the fit's common factor gives {N(t.EstimateSeconds * 1e3, "0.####")} ms ± {N(t.StandardErrorSeconds * 1e3, "0.####")} ms.</p>\n")
            : "<p>None in this report.</p>\n");
        html.Append("<h2>Invariants</h2>\n");
        html.Append(document.Invariants.Count == 0 ? "<p>None in this report.</p>\n" : string.Concat(document.Invariants.Select(i =>
            string.Create(CultureInfo.InvariantCulture, $"<p>{E(i.Name)}: capture {(i.FromCapture is { } a ? N(a, "G4") : "–")}, fitted model {(i.FromModel is { } b ? N(b, "G4") : "–")} {E(i.Unit)}</p>\n"))));
        html.Append("<h2>Structure check</h2>\n");
        html.Append(document.StructureCheck is { } s ? $"<p>{(s.Passed ? "Passed" : "Not passed")}: {E(s.Message)}</p>\n" : "<p>None in this report.</p>\n");
        if (document.Notes.Count > 0)
        {
            html.Append("<h2>Notes</h2>\n<ul>\n");
            foreach (var n in document.Notes)
            {
                html.Append(CultureInfo.InvariantCulture, $"<li>{E(n)}</li>\n");
            }

            html.Append("</ul>\n");
        }

        var run = document.Fitted;
        html.Append(CultureInfo.InvariantCulture, $"<footer>Fitted {E(run.CaptureFileName)} ({E(string.Join(", ", run.Mapping))}) by {E(run.Method)}: {run.Iterations} iterations, {E(run.ExitReason)}{(run.Converged ? string.Empty : " (not converged)")}, {N(run.ElapsedSeconds, "0.0")} s; Patchproof core {E(run.CoreVersion)}. Before probing or reworking a powered board, follow your lab's own safety rules.</footer>\n");
        html.Append("</body>\n</html>\n");
        return html.ToString();
    }

    private static void Svg(StringBuilder html, OverlayPlotDocument plot)
    {
        const double width = 640, height = 400, margin = 40;
        var points = plot.Traces.SelectMany(t => t.X.Zip(t.Y)).Where(p => double.IsFinite(p.First) && double.IsFinite(p.Second)).ToList();
        if (points.Count == 0)
        {
            return;
        }

        double xMin = points.Min(p => p.First), xMax = points.Max(p => p.First), yMin = points.Min(p => p.Second), yMax = points.Max(p => p.Second);
        var xSpan = xMax > xMin ? xMax - xMin : 1;
        var ySpan = yMax > yMin ? yMax - yMin : 1;
        html.Append(CultureInfo.InvariantCulture, $"<figure><svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 {width} {height}\" width=\"{width}\" height=\"{height}\" role=\"img\" aria-label=\"{E(plot.Title)}\">\n");
        html.Append(CultureInfo.InvariantCulture, $"<rect x=\"{margin}\" y=\"{margin / 2}\" width=\"{width - (1.5 * margin)}\" height=\"{height - (1.5 * margin)}\" fill=\"none\" stroke=\"#999\"/>\n");
        foreach (var trace in plot.Traces)
        {
            var (colour, dash, _) = Styles[trace.Role];
            var count = Math.Min(trace.X.Count, trace.Y.Count);
            var stride = Math.Max(1, count / MaxSvgPoints);
            var path = new StringBuilder();
            for (var i = 0; i < count; i += stride)
            {
                if (!double.IsFinite(trace.X[i]) || !double.IsFinite(trace.Y[i]))
                {
                    continue;
                }

                var x = margin + ((trace.X[i] - xMin) / xSpan * (width - (1.5 * margin)));
                var y = (height - margin) - ((trace.Y[i] - yMin) / ySpan * (height - (1.5 * margin)));
                path.Append(CultureInfo.InvariantCulture, $"{x:0.#},{y:0.#} ");
            }

            html.Append(CultureInfo.InvariantCulture, $"<polyline fill=\"none\" stroke=\"{colour}\" stroke-width=\"1\"{(dash.Length > 0 ? $" stroke-dasharray=\"{dash}\"" : string.Empty)} points=\"{path.ToString().TrimEnd()}\"/>\n");
        }

        html.Append(CultureInfo.InvariantCulture, $"<text x=\"{width / 2}\" y=\"{height - 8}\" text-anchor=\"middle\" font-size=\"12\">{E(plot.XLabel)}</text>\n");
        html.Append(CultureInfo.InvariantCulture, $"<text x=\"12\" y=\"{height / 2}\" text-anchor=\"middle\" font-size=\"12\" transform=\"rotate(-90 12 {height / 2})\">{E(plot.YLabel)}</text>\n");
        html.Append(CultureInfo.InvariantCulture, $"</svg><figcaption>{E(plot.Title)}: {E(string.Join("; ", plot.Traces.Select(t => Styles[t.Role].Name)))}.</figcaption></figure>\n");
    }

    private static string VerdictClass(FindingVerdictCode verdict) => verdict switch
    {
        FindingVerdictCode.Drifted => "drifted",
        FindingVerdictCode.WithinTolerance => "withinTolerance",
        _ => "cannotDecide",
    };

    private static string E(string? text) => WebUtility.HtmlEncode(text ?? string.Empty);

    private static string N(double value, string format) => double.IsFinite(value) ? value.ToString(format, CultureInfo.InvariantCulture) : "–";
}
