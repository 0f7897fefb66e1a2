namespace Patchproof.Core.Circuits;

/// <summary>One thing wrong with a design, located by a path into the design file.</summary>
/// <param name="Path">A JSON path such as <c>$.blocks[2].inputs[0].from</c>.</param>
/// <param name="Message">One sentence a person can act on.</param>
public sealed record DesignProblem(string Path, string Message)
{
    /// <inheritdoc/>
    public override string ToString() => $"{Path}: {Message}";
}
