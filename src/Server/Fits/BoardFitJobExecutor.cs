using Patchproof.Core;
using Patchproof.Core.Captures;
using Patchproof.Core.Circuits.Files;
using Patchproof.Core.Reports;
using Patchproof.Server.Reports;
using Patchproof.Server.Storage;

namespace Patchproof.Server.Fits;

/// <summary>The fit engine: reads the design and the stored capture with the core's readers and runs <see cref="BoardFitter"/>.</summary>
/// <remarks>
/// The core fits one capture at a time; a fit of several captures fits the first and says so in the result's notes.
/// The channels are mapped as the fit was started (<see cref="FitJobInput.Mapping"/>, checked by the API against the design
/// and the captures); a fit started without a mapping, or stored before mappings were kept, takes the channels in file order
/// for the design's variables (sign +1), as the core does when no mapping is given. The result's run lists the mapping fitted.
/// Progress is the core's: its stages, one report per Levenberg-Marquardt iteration and one per finished comparison part,
/// never decreasing; a cancel request stops the fit between iterations or inside the comparison. When the board's bench has a probe calibration (docs/probe-calibration.md), the newest one
/// sets the probe gains, and the result's notes say so; a fit started with <see cref="FitJobInput.IgnoreBenchCalibration"/>
/// leaves it out, so every channel keeps the probe tolerance, and its notes say that instead.
/// </remarks>
internal sealed class BoardFitJobExecutor(TimeProvider clock, ProbeCalibrationStore? calibrations = null) : IFitJobExecutor
{
    private const double ReadingShare = 0.05;
    private const double FittingShare = 0.93;

    public Task<FitJobOutcome> ExecuteAsync(FitJobInput input, IProgress<FitJobProgress> progress, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(input);
        ArgumentNullException.ThrowIfNull(progress);
        return Task.FromResult(Execute(input, progress, cancellationToken));
    }

    private FitJobOutcome Execute(FitJobInput input, IProgress<FitJobProgress> progress, CancellationToken cancellationToken)
    {
        progress.Report(new FitJobProgress(0, "reading the design"));
        var design = DesignFileReader.Read(input.DesignDocument, $"design version {input.DesignVersion}");
        if (!design.TryGetValue(out var board))
        {
            return FitJobOutcome.Failed("The design cannot be read: " + Describe(design.Errors));
        }

        var first = input.Captures[0];
        cancellationToken.ThrowIfCancellationRequested();
        progress.Report(new FitJobProgress(0.01, "reading the capture"));
        ParseResult<Capture> read;
        using (var stream = new FileStream(first.CsvPath, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan))
        {
            read = CaptureReader.Read(stream, first.FileName);
        }

        if (!read.TryGetValue(out var capture))
        {
            return FitJobOutcome.Failed("The capture cannot be read: " + Describe(read.Errors));
        }

        var benchCalibration = input.BenchId is { } benchId ? calibrations?.Newest(benchId) : null;
        var calibration = input.IgnoreBenchCalibration ? null : benchCalibration;
        var options = new BoardFitOptions
        {
            Cancellation = cancellationToken,
            Progress = new StageProgress(progress),
            Calibration = calibration?.Calibration,
            Mapping = (input.Mapping ?? []).Select(m => new ChannelAssignment(m.Channel, m.Variable, m.Sign)).ToList(),
        };
        var fitted = BoardFitter.Fit(board, capture, options, clock);
        if (!fitted.TryGetValue(out var report))
        {
            return FitJobOutcome.Failed("The design and the capture cannot be fitted together: " + Describe(fitted.Errors));
        }

        progress.Report(new FitJobProgress(0.99, "writing the report"));
        var notes = new List<string>();
        if (input.Captures.Count > 1)
        {
            notes.Add($"The fit used {first.FileName}, the first of the {input.Captures.Count} captures chosen; fit the others one at a time to compare them.");
        }

        if (calibration is { } used)
        {
            notes.Add($"Probe gains from the bench's newest probe calibration (uploaded {used.UploadedAt:yyyy-MM-dd HH:mm} UTC, reference {used.Calibration.ReferenceChannel})"
                + (used.Calibration.Absolute is { } absolute
                    ? string.Create(System.Globalization.CultureInfo.InvariantCulture, $"; absolute gains, against a known amplitude of {absolute.KnownAmplitudeVolts:0.####} V.")
                    : "."));
        }
        else if (benchCalibration is { } skipped)
        {
            notes.Add($"The bench's probe calibration (uploaded {skipped.UploadedAt:yyyy-MM-dd HH:mm} UTC) was not used, as asked when the fit was started: every channel kept the stated probe tolerance.");
        }

        return FitJobOutcome.Succeeded(FitResultJson.ToElement(FitResultMapper.Map(report, first.CaptureId, first.FileName, notes)));
    }

    private static string Describe(IReadOnlyList<SourceDiagnostic> errors) =>
        string.Join("; ", errors.Take(5).Select(e => e.Line > 0 ? $"{e.File}:{e.Line}:{e.Column}: {e.Message}" : $"{e.File}: {e.Message}"));

    /// <summary>Passes the core's stages on, scaled into the fitting share of the bar.</summary>
    private sealed class StageProgress(IProgress<FitJobProgress> outer) : IProgress<BoardFitProgress>
    {
        public void Report(BoardFitProgress value) =>
            outer.Report(new FitJobProgress(ReadingShare + (FittingShare * value.Fraction), value.Stage));
    }
}
