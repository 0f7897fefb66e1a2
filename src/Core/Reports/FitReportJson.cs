using System.Text.Json;
using System.Text.Json.Serialization;

namespace Patchproof.Core.Reports;

/// <summary>Writes a <see cref="FitReport"/> as the versioned <c>patchproof-fit-report</c> JSON document.</summary>
/// <remarks>
/// The document is an object with <c>format</c> ("patchproof-fit-report") and <c>version</c> (1) first, then the
/// report's properties in camelCase; enums as strings; non-finite numbers as the strings "NaN", "Infinity". The
/// fields are listed in docs/fit-report.md.
/// </remarks>
public static class FitReportJson
{
    private static readonly JsonSerializerOptions Options = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        WriteIndented = true,
        NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
        Converters = { new JsonStringEnumConverter(JsonNamingPolicy.CamelCase) },
    };

    /// <summary>The report as indented JSON.</summary>
    public static string Write(FitReport report)
    {
        var body = JsonSerializer.SerializeToNode(report, Options)!.AsObject();
        var document = new System.Text.Json.Nodes.JsonObject
        {
            ["format"] = FitReport.FormatName,
            ["version"] = FitReport.FormatVersion,
        };
        foreach (var (name, value) in body.ToList())
        {
            body.Remove(name);
            document[name] = value;
        }

        return document.ToJsonString(Options);
    }
}
