namespace Patchproof.Core.Captures.Reading;

/// <summary>One column of numbers as a file gave it, before units and probe factors are applied.</summary>
/// <param name="Name">The name from the header, or CHn.</param>
/// <param name="Unit">The unit text from the header or units row, or null.</param>
/// <param name="Samples">The values in the file's unit; the array is the reader's own and may be scaled in place.</param>
/// <param name="SourceFile">The file.</param>
/// <param name="SourceColumn">The 1-based column.</param>
/// <param name="UnitLine">The line that gave the unit (header or units row), or 0.</param>
internal sealed record RawChannel(string Name, string? Unit, Memory<float> Samples, string? SourceFile, int SourceColumn, int UnitLine);

/// <summary>What one file held: a time base, its columns and metadata, and the notes made while reading.</summary>
internal sealed record RawCapture(string? File, TimeBase TimeBase, IReadOnlyList<RawChannel> Channels, IReadOnlyList<MetadataEntry> Metadata, IReadOnlyList<SourceDiagnostic> Notes);
