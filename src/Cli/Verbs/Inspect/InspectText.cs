using System.Globalization;
using Patchproof.Core;
using Patchproof.Core.Captures;
using Patchproof.Core.Captures.Checks;

namespace Patchproof.Cli.Verbs;

/// <summary>The readable summary of <c>patchproof inspect</c>.</summary>
internal static class InspectText
{
    public static void Write(TextWriter output, IReadOnlyList<string> files, Capture capture, IReadOnlyList<SourceDiagnostic> notes, IReadOnlyList<CaptureCheckResult> checks)
    {
        var tb = capture.TimeBase;
        output.WriteLine($"Capture from {string.Join(", ", files)}");
        var shape = tb is UniformTimeBase u
            ? $"even, every {Format.Seconds(u.IntervalSeconds)} ({Format.Hertz(u.SampleRateHertz)}) from {Format.Seconds(u.StartSeconds)}"
            : $"explicit times, typically {Format.Seconds(tb.TypicalIntervalSeconds)} apart";
        output.WriteLine($"  {capture.SampleCount.ToString("N0", CultureInfo.InvariantCulture)} samples over {Format.Seconds(tb.DurationSeconds)}; time base {shape}");
        output.WriteLine($"  {capture.Channels.Count} channel{(capture.Channels.Count == 1 ? string.Empty : "s")}:");
        foreach (var c in capture.Channels)
        {
            var probe = c.ProbeFactor != 1 ? $", probe x{c.ProbeFactor.ToString("G6", CultureInfo.InvariantCulture)}" : string.Empty;
            output.WriteLine($"    {c.Name} [{c.Unit}] from {c.SourceFile ?? "input"} column {c.SourceColumn}{probe}");
        }

        if (capture.Metadata.Count > 0)
        {
            output.WriteLine("  Metadata:");
            foreach (var m in capture.Metadata)
            {
                var unit = m.Unit is null ? string.Empty : $" [{m.Unit}]";
                var section = m.Section is null ? string.Empty : $"[{m.Section}] ";
                output.WriteLine($"    {section}{m.Key}: {m.Value}{unit}");
            }
        }

        if (notes.Count > 0)
        {
            output.WriteLine("Reading notes:");
            foreach (var n in notes)
            {
                output.WriteLine($"  {Format.Severity(n.Severity),-7} {n}");
            }
        }

        output.WriteLine("Checks:");
        foreach (var check in checks)
        {
            output.WriteLine($"  {Format.Severity(check.Severity),-7} {check.Id,-20} {check.Message}");
        }

        var warnings = checks.Count(c => c.Severity == DiagnosticSeverity.Warning);
        var errors = checks.Count(c => c.Severity == DiagnosticSeverity.Error);
        output.WriteLine($"{errors} error{(errors == 1 ? string.Empty : "s")}, {warnings} warning{(warnings == 1 ? string.Empty : "s")} in the checks.");
    }
}

/// <summary>Number formatting shared by the inspect writers.</summary>
internal static class Format
{
    public static string Seconds(double seconds)
    {
        var a = Math.Abs(seconds);
        var (value, unit) = a == 0 ? (0.0, "s") : a < 1e-6 ? (seconds * 1e9, "ns") : a < 1e-3 ? (seconds * 1e6, "µs") : a < 1 ? (seconds * 1e3, "ms") : (seconds, "s");
        return value.ToString("G6", CultureInfo.InvariantCulture) + " " + unit;
    }

    public static string Hertz(double hertz) =>
        hertz >= 1e6 ? (hertz / 1e6).ToString("G6", CultureInfo.InvariantCulture) + " MSa/s"
        : hertz >= 1e3 ? (hertz / 1e3).ToString("G6", CultureInfo.InvariantCulture) + " kSa/s"
        : hertz.ToString("G6", CultureInfo.InvariantCulture) + " Sa/s";

    public static string Severity(DiagnosticSeverity severity) => severity switch
    {
        DiagnosticSeverity.Error => "error",
        DiagnosticSeverity.Warning => "warning",
        _ => "info",
    };
}
