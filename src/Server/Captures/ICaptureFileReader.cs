using Patchproof.Core;

namespace Patchproof.Server.Captures;

/// <summary>Reads a stored capture file, runs the capture checks and writes the parsed samples beside it.</summary>
internal interface ICaptureFileReader
{
    /// <param name="csvPath">The file as received (not yet in the store).</param>
    /// <param name="fileName">The uploader's file name, used only in messages.</param>
    /// <param name="samplesPath">Where to write the parsed samples when the file can be read.</param>
    /// <param name="maxRows">The most sample rows accepted.</param>
    /// <param name="cancellationToken">Stops the reading.</param>
    Task<CaptureReading> ReadAsync(string csvPath, string fileName, string samplesPath, long maxRows, CancellationToken cancellationToken);
}

/// <summary>What reading a capture file found: errors that stop it, or the shape of the capture and the checks' findings.</summary>
/// <param name="Errors">Why the file cannot be used, each at its line and column; empty on success.</param>
/// <param name="Checks">Warnings and notes of the reader and the capture checks.</param>
/// <param name="RowCount">Sample rows read.</param>
/// <param name="ChannelNames">Channels in file order.</param>
/// <param name="SampleIntervalSeconds">The sample interval, or null for a non-uniform time base.</param>
/// <param name="DurationSeconds">From the first to the last sample.</param>
internal sealed record CaptureReading(
    IReadOnlyList<SourceDiagnostic> Errors,
    IReadOnlyList<SourceDiagnostic> Checks,
    long RowCount,
    IReadOnlyList<string> ChannelNames,
    double? SampleIntervalSeconds,
    double DurationSeconds)
{
    public bool Success => Errors.Count == 0;

    public static CaptureReading Failed(IReadOnlyList<SourceDiagnostic> errors, IReadOnlyList<SourceDiagnostic>? checks = null) =>
        new(errors, checks ?? [], 0, [], null, 0);
}
