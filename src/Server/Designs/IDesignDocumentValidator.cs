using System.Text.Json;
using Patchproof.Core;

namespace Patchproof.Server.Designs;

/// <summary>Checks a design document before it is stored as a new version.</summary>
/// <remarks>
/// The registered validator decides what a storable design is. <see cref="JsonDesignDocumentValidator"/>
/// only checks that the document is one JSON object; the design schema's own checks plug in here
/// by registering a validator that also reads the document as a design.
/// </remarks>
internal interface IDesignDocumentValidator
{
    /// <summary>The errors, each with its line and column in the document; empty when it may be stored.</summary>
    IReadOnlyList<SourceDiagnostic> Validate(string document);
}

/// <summary>Accepts any well-formed JSON object.</summary>
internal sealed class JsonDesignDocumentValidator : IDesignDocumentValidator
{
    public IReadOnlyList<SourceDiagnostic> Validate(string document)
    {
        try
        {
            using var parsed = JsonDocument.Parse(document, new JsonDocumentOptions { MaxDepth = 64 });
            return parsed.RootElement.ValueKind == JsonValueKind.Object
                ? []
                : [SourceDiagnostic.ErrorAt(null, 1, 1, "A design document is a JSON object ({ ... }).")];
        }
        catch (JsonException exception)
        {
            var line = (int)(exception.LineNumber ?? 0) + 1;
            var column = (int)(exception.BytePositionInLine ?? 0) + 1;
            return [SourceDiagnostic.ErrorAt(null, line, column, "The design document is not well-formed JSON.")];
        }
    }
}
