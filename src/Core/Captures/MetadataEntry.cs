namespace Patchproof.Core.Captures;

/// <summary>One <c>key = value</c> item of the block a scope writes before its data.</summary>
/// <remarks>Kept as text: the reader interprets only the keys listed in docs/captures.md (sample interval, rate, start time).</remarks>
/// <param name="Key">The key as written, trimmed.</param>
/// <param name="Value">The value as written, trimmed; may be empty.</param>
/// <param name="Unit">A unit given in a separate field (<c>key;value;unit</c>) or in the key (<c>Interval (us)</c>), or null.</param>
/// <param name="Section">The bracketed section the line sat in (<c>[Acquisition]</c>), or null.</param>
/// <param name="SourceFile">The file the line came from, or null.</param>
/// <param name="Line">The 1-based line in that file.</param>
public sealed record MetadataEntry(string Key, string Value, string? Unit, string? Section, string? SourceFile, int Line);
