using System.Text.Encodings.Web;
using System.Text.Json;
using Patchproof.Core;
using Patchproof.Core.Captures;
using Patchproof.Core.Captures.Checks;

namespace Patchproof.Cli.Verbs;

/// <summary>The JSON form of <c>patchproof inspect --json</c>, format <c>patchproof.inspect</c> version 1 (docs/captures.md).</summary>
internal static class InspectJson
{
    public const string FormatName = "patchproof.inspect";

    public const int FormatVersion = 1;

    private static readonly JsonWriterOptions WriterOptions = new() { Indented = true, Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping };

    public static void Write(TextWriter output, IReadOnlyList<string> files, Capture capture, IReadOnlyList<SourceDiagnostic> notes, IReadOnlyList<CaptureCheckResult> checks)
    {
        using var buffer = new MemoryStream();
        using (var w = new Utf8JsonWriter(buffer, WriterOptions))
        {
            w.WriteStartObject();
            Header(w, files, true);
            w.WriteNumber("sampleCount", capture.SampleCount);
            w.WriteStartObject("timeBase");
            var tb = capture.TimeBase;
            w.WriteString("kind", tb is UniformTimeBase ? "uniform" : "explicit");
            w.WriteNumber("sampleCount", tb.SampleCount);
            if (tb is UniformTimeBase u)
            {
                w.WriteNumber("startSeconds", u.StartSeconds);
                w.WriteNumber("intervalSeconds", u.IntervalSeconds);
            }
            else if (tb.SampleCount > 0)
            {
                w.WriteNumber("firstSeconds", tb.TimeAtSeconds(0));
                w.WriteNumber("lastSeconds", tb.TimeAtSeconds(tb.SampleCount - 1));
                w.WriteNumber("typicalIntervalSeconds", tb.TypicalIntervalSeconds);
            }

            w.WriteNumber("durationSeconds", tb.DurationSeconds);
            w.WriteEndObject();
            w.WriteStartArray("channels");
            foreach (var c in capture.Channels)
            {
                w.WriteStartObject();
                w.WriteString("name", c.Name);
                w.WriteString("unit", c.Unit);
                w.WriteNumber("sampleCount", c.SampleCount);
                w.WriteString("sourceFile", c.SourceFile);
                w.WriteNumber("sourceColumn", c.SourceColumn);
                w.WriteNumber("probeFactor", c.ProbeFactor);
                w.WriteEndObject();
            }

            w.WriteEndArray();
            w.WriteStartArray("metadata");
            foreach (var m in capture.Metadata)
            {
                w.WriteStartObject();
                w.WriteString("key", m.Key);
                w.WriteString("value", m.Value);
                w.WriteString("unit", m.Unit);
                w.WriteString("section", m.Section);
                w.WriteString("file", m.SourceFile);
                w.WriteNumber("line", m.Line);
                w.WriteEndObject();
            }

            w.WriteEndArray();
            Diagnostics(w, "notes", notes);
            w.WriteStartArray("checks");
            foreach (var check in checks)
            {
                w.WriteStartObject();
                w.WriteString("id", check.Id);
                w.WriteString("severity", Format.Severity(check.Severity));
                w.WriteString("channel", check.Channel);
                w.WriteString("message", check.Message);
                w.WriteStartObject("values");
                foreach (var (key, value) in check.Values)
                {
                    if (double.IsFinite(value))
                    {
                        w.WriteNumber(key, value);
                    }
                    else
                    {
                        w.WriteNull(key);
                    }
                }

                w.WriteEndObject();
                w.WriteEndObject();
            }

            w.WriteEndArray();
            w.WriteEndObject();
        }

        output.WriteLine(System.Text.Encoding.UTF8.GetString(buffer.ToArray()));
    }

    public static void WriteFailure(TextWriter output, IReadOnlyList<string> files, IReadOnlyList<SourceDiagnostic> errors, IReadOnlyList<SourceDiagnostic> notes)
    {
        using var buffer = new MemoryStream();
        using (var w = new Utf8JsonWriter(buffer, WriterOptions))
        {
            w.WriteStartObject();
            Header(w, files, false);
            Diagnostics(w, "errors", errors);
            Diagnostics(w, "notes", notes);
            w.WriteEndObject();
        }

        output.WriteLine(System.Text.Encoding.UTF8.GetString(buffer.ToArray()));
    }

    private static void Header(Utf8JsonWriter w, IReadOnlyList<string> files, bool read)
    {
        w.WriteString("format", FormatName);
        w.WriteNumber("version", FormatVersion);
        w.WriteBoolean("read", read);
        w.WriteStartArray("files");
        foreach (var f in files)
        {
            w.WriteStringValue(f);
        }

        w.WriteEndArray();
    }

    private static void Diagnostics(Utf8JsonWriter w, string name, IReadOnlyList<SourceDiagnostic> items)
    {
        w.WriteStartArray(name);
        foreach (var d in items)
        {
            w.WriteStartObject();
            w.WriteString("severity", Format.Severity(d.Severity));
            w.WriteString("file", d.File);
            w.WriteNumber("line", d.Line);
            w.WriteNumber("column", d.Column);
            w.WriteString("message", d.Message);
            w.WriteEndObject();
        }

        w.WriteEndArray();
    }
}
