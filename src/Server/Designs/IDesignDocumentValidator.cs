using Patchproof.Core;
using Patchproof.Core.Circuits.Files;

namespace Patchproof.Server.Designs;

/// <summary>Checks a design document before it is stored as a new version.</summary>
internal interface IDesignDocumentValidator
{
    /// <summary>The errors, each with its line and column in the document; empty when it may be stored.</summary>
    IReadOnlyList<SourceDiagnostic> Validate(string document);
}

/// <summary>Accepts a document that the core's design file reader reads (the project's design schema, docs/circuits.md).</summary>
/// <remarks>A design that reads but fails the design check is still stored: the check's findings are for the person to see beside the parts, not a reason to lose the version.</remarks>
internal sealed class DesignFileValidator : IDesignDocumentValidator
{
    public IReadOnlyList<SourceDiagnostic> Validate(string document)
    {
        var result = DesignFileReader.Read(document);
        return result.Success ? [] : result.Errors;
    }
}
