using System.Globalization;
using Patchproof.Contracts.Reports;

namespace Patchproof.Server.Reports;

/// <summary>The coefficients and findings of a report as one CSV file: a <c>section</c> column says which table a row belongs to.</summary>
/// <remarks>RFC 4180 quoting (CsvHelper), invariant culture, one header row; numbers in SI units (ohms, farads, 1/s, mV).</remarks>
internal static class ReportCsvWriter
{
    private static readonly string[] Header =
        ["section", "board", "part_or_equation", "role_or_term", "unit", "nominal", "estimate_or_effective", "standard_error_or_half_interval", "drift_percent", "verdict", "probability", "text"];

    public static string Write(string boardCode, FitResultDocument document)
    {
        using var text = new StringWriter(CultureInfo.InvariantCulture);
        using (var csv = CsvHelper.CsvWriter.Create(text, new CsvHelper.CsvWriterOptions { FormatProvider = CultureInfo.InvariantCulture }, true))
        {
            csv.WriteRecord(Header);
            foreach (var f in document.Findings)
            {
                Row(csv, "finding", boardCode, f.Part, f.Role, f.Unit, f.Nominal, f.Effective, f.IntervalHalfWidth, f.DriftPercent, VerdictText(f.Verdict), f.Probability, f.Sentence);
            }

            foreach (var c in document.Coefficients)
            {
                var drift = c.Nominal == 0 ? double.NaN : 100 * ((c.Estimate / c.Nominal) - 1);
                Row(csv, "coefficient", boardCode, c.Equation, c.Term, c.Unit, c.Nominal, c.Estimate, c.StandardError, drift, string.Empty, null, c.RestsOnPriors ? "rests on priors: the term touches an unrecorded variable" : string.Empty);
            }

            foreach (var o in document.Offsets)
            {
                Row(csv, "offset", boardCode, $"d{o.Variable}/dt", "1", "mV", 0, o.EquivalentInputMillivolts, o.StandardErrorMillivolts, double.NaN, string.Empty, null, "equivalent input offset voltage");
            }

            foreach (var w in document.Warnings)
            {
                Row(csv, "warning", boardCode, string.Empty, string.Empty, string.Empty, double.NaN, double.NaN, double.NaN, double.NaN, string.Empty, null, w);
            }
        }

        return text.ToString();
    }

    private static void Row(CsvHelper.CsvWriter csv, string section, string board, string first, string second, string unit, double nominal, double estimate, double error, double drift, string verdict, double? probability, string text) =>
        csv.WriteRecord([section, board, first, second, unit, Number(nominal), Number(estimate), Number(error), Number(drift), verdict, probability is { } p ? Number(p) : string.Empty, text]);

    // An empty field for a number the fit could not give, so spreadsheets read the column as numbers.
    private static string Number(double value) => double.IsFinite(value) ? value.ToString("R", CultureInfo.InvariantCulture) : string.Empty;

    public static string VerdictText(FindingVerdictCode verdict) => verdict switch
    {
        FindingVerdictCode.Drifted => "drifted",
        FindingVerdictCode.WithinTolerance => "within tolerance",
        _ => "cannot decide",
    };
}
