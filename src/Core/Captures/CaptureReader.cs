using Patchproof.Core.Captures.Reading;

namespace Patchproof.Core.Captures;

/// <summary>One input of a capture: a name for messages and the stream of its CSV text.</summary>
/// <param name="FileName">The file name as the person gave it, used in messages and channel sources.</param>
/// <param name="Content">The CSV text, read once from its current position; the caller disposes it.</param>
public sealed record CaptureInput(string FileName, Stream Content);

/// <summary>Reads scope CSV exports into a <see cref="Capture"/>, working out each file's dialect by itself.</summary>
/// <remarks>
/// Understands delimiters (comma, semicolon, tab, runs of spaces), decimal point or comma, metadata blocks,
/// header spellings with units, separate units rows, time columns in s/ms/µs/ns, no time column with a
/// sample interval or rate in the metadata, sample-index columns, quotes, byte-order marks, CRLF/LF/CR and
/// trailing delimiters; docs/captures.md lists every spelling. Several files (one per channel) merge when
/// their time bases agree. Values come out in SI units (seconds, volts). Never depends on the machine's
/// locale. Bad input gives a failed <see cref="ParseResult{T}"/> whose errors name file, line and column;
/// recoveries and notes come back as warnings (severity Info or Warning). Only a caller's mistake throws.
/// </remarks>
public static class CaptureReader
{
    /// <summary>Reads one file, or several files of one acquisition, from disk.</summary>
    /// <param name="paths">One or more paths.</param>
    /// <param name="options">Probe factors and units the person stated; null for none.</param>
    /// <exception cref="ArgumentException"><paramref name="paths"/> is empty.</exception>
    public static ParseResult<Capture> ReadFiles(IReadOnlyList<string> paths, CaptureReadOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(paths);
        if (paths.Count == 0)
        {
            throw new ArgumentException("At least one file is needed.", nameof(paths));
        }

        var raws = new List<RawCapture>();
        var notes = new List<SourceDiagnostic>();
        foreach (var path in paths)
        {
            ParseResult<RawCapture> result;
            try
            {
                using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1, FileOptions.SequentialScan);
                result = CsvCaptureFileReader.Read(stream, path, stream.Length);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
            {
                return ParseResult<Capture>.ForErrors([SourceDiagnostic.ErrorAt(path, 0, 0, "Cannot open the file: " + e.Message)], notes);
            }

            if (!result.TryGetValue(out var raw))
            {
                return ParseResult<Capture>.ForErrors(result.Errors, [.. notes, .. result.Warnings]);
            }

            notes.AddRange(result.Warnings);
            raws.Add(raw);
        }

        return CaptureAssembler.Assemble(raws, options ?? CaptureReadOptions.Default);
    }

    /// <summary>Reads one file from disk.</summary>
    /// <param name="path">The file's path.</param>
    /// <param name="options">Probe factors and units the person stated; null for none.</param>
    public static ParseResult<Capture> ReadFile(string path, CaptureReadOptions? options = null) => ReadFiles([path], options);

    /// <summary>Reads one or more streams (one per channel file, or one holding every channel), for uploads.</summary>
    /// <param name="inputs">One or more inputs; each stream is read once and not disposed.</param>
    /// <param name="options">Probe factors and units the person stated; null for none.</param>
    /// <exception cref="ArgumentException"><paramref name="inputs"/> is empty.</exception>
    public static ParseResult<Capture> Read(IReadOnlyList<CaptureInput> inputs, CaptureReadOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(inputs);
        if (inputs.Count == 0)
        {
            throw new ArgumentException("At least one input is needed.", nameof(inputs));
        }

        var raws = new List<RawCapture>();
        var notes = new List<SourceDiagnostic>();
        foreach (var input in inputs)
        {
            long length;
            try
            {
                length = input.Content.CanSeek ? input.Content.Length - input.Content.Position : -1;
            }
            catch (NotSupportedException)
            {
                length = -1;
            }

            ParseResult<RawCapture> result;
            try
            {
                result = CsvCaptureFileReader.Read(input.Content, input.FileName, length);
            }
            catch (IOException e)
            {
                return ParseResult<Capture>.ForErrors([SourceDiagnostic.ErrorAt(input.FileName, 0, 0, "Cannot read the input: " + e.Message)], notes);
            }

            if (!result.TryGetValue(out var raw))
            {
                return ParseResult<Capture>.ForErrors(result.Errors, [.. notes, .. result.Warnings]);
            }

            notes.AddRange(result.Warnings);
            raws.Add(raw);
        }

        return CaptureAssembler.Assemble(raws, options ?? CaptureReadOptions.Default);
    }

    /// <summary>Reads one stream.</summary>
    /// <param name="content">The CSV text, read once from its current position.</param>
    /// <param name="fileName">The name used in messages.</param>
    /// <param name="options">Probe factors and units the person stated; null for none.</param>
    public static ParseResult<Capture> Read(Stream content, string fileName, CaptureReadOptions? options = null) =>
        Read([new CaptureInput(fileName, content)], options);
}
