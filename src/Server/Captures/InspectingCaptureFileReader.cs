using Patchproof.Contracts.Captures;
using Patchproof.Core;
using Patchproof.Core.Captures;
using Patchproof.Core.Captures.Checks;
using Patchproof.Server.Storage;

namespace Patchproof.Server.Captures;

/// <summary>Reads with the core's <see cref="CaptureReader"/>, runs the standard capture checks and writes the samples file.</summary>
internal sealed class InspectingCaptureFileReader : ICaptureFileReader
{
    public async Task<CaptureReading> ReadAsync(string csvPath, string fileName, string samplesPath, CancellationToken cancellationToken)
    {
        // The reader and the checks are synchronous and CPU-bound; keep them off the request thread.
        return await Task.Run(() => Read(csvPath, fileName, samplesPath), cancellationToken);
    }

    private static CaptureReading Read(string csvPath, string fileName, string samplesPath)
    {
        ParseResult<Capture> parsed;
        using (var stream = new FileStream(csvPath, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan))
        {
            parsed = CaptureReader.Read(stream, fileName);
        }

        if (!parsed.TryGetValue(out var capture))
        {
            return CaptureReading.Failed(parsed.Errors);
        }

        var checks = parsed.Warnings.Select(ToCheck)
            .Concat(CaptureInspection.Run(capture).Select(ToCheck))
            .ToList();
        CaptureSamplesFile.Write(samplesPath, capture);
        return new CaptureReading(
            [],
            checks,
            capture.SampleCount,
            capture.Channels.Select(c => new CaptureChannelInfo(c.Name, c.Unit, c.SourceColumn)).ToList(),
            capture.TimeBase is UniformTimeBase uniform ? uniform.IntervalSeconds : null,
            capture.TimeBase.DurationSeconds);
    }

    private static CaptureCheck ToCheck(SourceDiagnostic note) =>
        new("reader", SeverityText(note.Severity), null, note.Line, note.Column, note.Message, new Dictionary<string, double>());

    private static CaptureCheck ToCheck(CaptureCheckResult result) =>
        new(result.Id, SeverityText(result.Severity), result.Channel, 0, 0, result.Message, result.Values);

    private static string SeverityText(DiagnosticSeverity severity) => severity.ToString().ToLowerInvariant();
}
