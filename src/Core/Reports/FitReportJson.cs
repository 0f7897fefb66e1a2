using System.Globalization;
using System.Text;
using System.Text.Json;
using System.Text.Json.Serialization;

namespace Patchproof.Core.Reports;

/// <summary>Writes a <see cref="FitReport"/> as the versioned <c>patchproof-fit-report</c> JSON document, and reads its comparison back.</summary>
/// <remarks>
/// The document is an object with <c>format</c> ("patchproof-fit-report") and <c>version</c> (1) first, then the
/// report's properties in camelCase; enums as strings; non-finite numbers as the strings "NaN", "Infinity",
/// "-Infinity". Arrays of numbers (plot data) are written on one line each so that a report with its overlays stays
/// readable and small. The fields are listed in docs/fit-report.md.
/// </remarks>
public static class FitReportJson
{
    private static readonly JsonSerializerOptions Options = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        WriteIndented = true,
        NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
        Converters = { new JsonStringEnumConverter(JsonNamingPolicy.CamelCase), new NumberArrayConverter() },
    };

    /// <summary>The report as indented JSON.</summary>
    public static string Write(FitReport report)
    {
        ArgumentNullException.ThrowIfNull(report);
        // Serialized in one pass so the number-array converter shapes the plot data; the header goes in front.
        var body = JsonSerializer.Serialize(report, Options);
        var newLine = Options.NewLine;
        var header = string.Create(CultureInfo.InvariantCulture, $"{{{newLine}  \"format\": \"{FitReport.FormatName}\",{newLine}  \"version\": {FitReport.FormatVersion},");
        return header + body[1..];
    }

    /// <summary>Reads the <c>comparison</c> member of a report written by <see cref="Write"/>.</summary>
    /// <param name="json">The report document.</param>
    /// <returns>The comparison, or an error naming what is wrong (not JSON, another format, no comparison).</returns>
    public static ParseResult<FitComparison> ReadComparison(string json)
    {
        ArgumentNullException.ThrowIfNull(json);
        try
        {
            using var document = JsonDocument.Parse(json);
            var root = document.RootElement;
            if (root.ValueKind != JsonValueKind.Object || !root.TryGetProperty("format", out var format) || format.ValueKind != JsonValueKind.String || format.GetString() != FitReport.FormatName)
            {
                return Error("format", $"not a {FitReport.FormatName} document");
            }

            if (!root.TryGetProperty("comparison", out var comparison) || comparison.ValueKind != JsonValueKind.Object)
            {
                return Error("comparison", "the report carries no comparison");
            }

            var value = comparison.Deserialize<FitComparison>(Options);
            return value is null ? Error("comparison", "the comparison is empty") : ParseResult<FitComparison>.ForValue(value);
        }
        catch (JsonException exception)
        {
            return Error(exception.Path ?? "comparison", exception.Message);
        }
    }

    private static ParseResult<FitComparison> Error(string field, string message) =>
        ParseResult<FitComparison>.ForError(SourceDiagnostic.ErrorAt(field, 0, 0, message));

    /// <summary>Writes a number array on one line; non-finite entries as the strings JSON allows for them here.</summary>
    private sealed class NumberArrayConverter : JsonConverter<double[]>
    {
        public override double[] Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options)
        {
            if (reader.TokenType != JsonTokenType.StartArray)
            {
                throw new JsonException("expected an array of numbers");
            }

            var values = new List<double>();
            while (reader.Read() && reader.TokenType != JsonTokenType.EndArray)
            {
                values.Add(reader.TokenType switch
                {
                    JsonTokenType.Number => reader.GetDouble(),
                    JsonTokenType.String => reader.GetString() switch
                    {
                        "NaN" => double.NaN,
                        "Infinity" => double.PositiveInfinity,
                        "-Infinity" => double.NegativeInfinity,
                        var text => throw new JsonException($"expected a number, found \"{text}\""),
                    },
                    _ => throw new JsonException("expected a number"),
                });
            }

            return [.. values];
        }

        public override void Write(Utf8JsonWriter writer, double[] value, JsonSerializerOptions options)
        {
            var text = new StringBuilder(value.Length * 12 + 2).Append('[');
            for (var i = 0; i < value.Length; i++)
            {
                if (i > 0)
                {
                    text.Append(',');
                }

                var v = value[i];
                text.Append(double.IsNaN(v) ? "\"NaN\"" : double.IsPositiveInfinity(v) ? "\"Infinity\"" : double.IsNegativeInfinity(v) ? "\"-Infinity\"" : v.ToString("R", CultureInfo.InvariantCulture));
            }

            writer.WriteRawValue(text.Append(']').ToString(), skipInputValidation: true);
        }
    }
}
