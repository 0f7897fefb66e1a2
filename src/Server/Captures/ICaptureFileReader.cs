using Patchproof.Contracts.Captures;
using Patchproof.Core;

namespace Patchproof.Server.Captures;

/// <summary>Reads a capture file, runs the capture checks and writes the parsed samples beside it.</summary>
internal interface ICaptureFileReader
{
    /// <param name="csvPath">The file as received (not yet in the store).</param>
    /// <param name="fileName">The uploader's file name, used only in messages.</param>
    /// <param name="samplesPath">Where to write the parsed samples when the file can be read.</param>
    /// <param name="cancellationToken">Stops the reading.</param>
    Task<CaptureReading> ReadAsync(string csvPath, string fileName, string samplesPath, CancellationToken cancellationToken);
}

/// <summary>What reading a capture file found: errors that stop it, or the shape of the capture and the findings.</summary>
/// <param name="Errors">Why the file cannot be used, each at its line and column; empty on success.</param>
/// <param name="Checks">The reader's notes and the capture checks' findings.</param>
/// <param name="RowCount">Samples per channel.</param>
/// <param name="Channels">Channels in file order.</param>
/// <param name="SampleIntervalSeconds">The sample interval, or null for a non-uniform time base.</param>
/// <param name="DurationSeconds">From the first to the last sample.</param>
internal sealed record CaptureReading(
    IReadOnlyList<SourceDiagnostic> Errors,
    IReadOnlyList<CaptureCheck> Checks,
    long RowCount,
    IReadOnlyList<CaptureChannelInfo> Channels,
    double? SampleIntervalSeconds,
    double DurationSeconds)
{
    public bool Success => Errors.Count == 0;

    public static CaptureReading Failed(IReadOnlyList<SourceDiagnostic> errors) => new(errors, [], 0, [], null, 0);
}
