using System.Text.Json;
using System.Text.Json.Serialization;
using Patchproof.Contracts.Reports;

namespace Patchproof.Server.Reports;

/// <summary>How the result document is written and read back: camel case, non-finite numbers as "NaN" and "Infinity".</summary>
internal static class FitResultJson
{
    public static JsonSerializerOptions Options { get; } = new(JsonSerializerDefaults.Web)
    {
        NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals | JsonNumberHandling.AllowReadingFromString,
    };

    public static JsonElement ToElement(FitResultDocument document) => JsonSerializer.SerializeToElement(document, Options);

    /// <summary>Reads a stored result; null when it is not a document of this kind (an older engine's, say).</summary>
    public static FitResultDocument? TryRead(JsonElement result)
    {
        if (result.ValueKind != JsonValueKind.Object || !result.TryGetProperty("format", out var format) || format.GetString() != FitResultDocument.FormatName)
        {
            return null;
        }

        try
        {
            return result.Deserialize<FitResultDocument>(Options);
        }
        catch (JsonException)
        {
            return null;
        }
    }
}
