using Patchproof.Client.Models;
using Patchproof.Contracts.Benches;
using Patchproof.Contracts.Fits;

namespace Patchproof.Client.Services.Wire;

/// <summary>From the server's answers to the view models the pages use.</summary>
internal static class WireMapping
{
    public static BenchSummary ToView(this BenchWire w) => new(w.Id, w.Name, w.Institution, w.Description, w.BoardCount);

    public static BoardSummary ToView(this BoardWire w) =>
        new(w.Id, w.BenchId, w.Code, w.Name, w.BuiltBy, w.Description, w.LatestDesignVersion, w.CaptureCount, w.FitCount, w.CreatedAt);

    public static DesignVersionEntry ToView(this DesignVersionSummaryWire w) => new(w.Version, w.Note, w.CreatedAt);

    public static CaptureEntry ToView(this CaptureWire w) => new(
        w.Id, w.BoardId, w.FileName, w.SizeBytes, w.RowCount, w.ChannelNames ?? [], w.SampleIntervalSeconds, w.DurationSeconds,
        (w.Checks ?? []).Select(c => new CaptureCheckEntry(ToSeverity(c.Severity), c.Line, c.Column, c.Message)).ToList(), w.UploadedAt);

    public static FitJob ToView(this FitResponse w) => new(
        w.Id, w.BoardId, w.DesignVersion, w.CaptureIds ?? [], ToState(w.State), w.Progress, w.Stage, w.CancelRequested, w.Error,
        w.HasResult, w.CreatedAt, w.FinishedAt)
    {
        IgnoresBenchCalibration = w.IgnoreBenchCalibration,
        Mapping = w.Mapping?.Select(m => new ChannelMapping(m.Channel, m.Variable, m.Sign < 0 ? -1 : 1)).ToList(),
    };

    public static ProbeCalibrationView ToView(this ProbeCalibrationSummary w)
    {
        // A summary from a server that lists only channel names still shows them, without gains.
        var details = w.ChannelDetails is { Count: > 0 } given
            ? given.Select(c => new ProbeChannelView(c.Channel, c.IsReference, c.Gain, c.GainSd, c.OffsetVolts, c.OffsetSdVolts, c.Correlation, c.ResidualRmsVolts, c.ExpectedResidualRmsVolts, c.FollowsReference)).ToList()
            : (w.Channels ?? []).Select(name => new ProbeChannelView(name, name == w.ReferenceChannel, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, null)).ToList();
        return new ProbeCalibrationView(w.BenchId, w.ReferenceChannel, w.CreatedAt, w.UploadedAt, w.Note ?? "", w.SampleCount, w.DurationSeconds, w.SourceFiles ?? [], details, w.Findings ?? [])
        {
            KnownAmplitude = w.KnownAmplitude is { } known ? new KnownAmplitudeView(known.AmplitudeVolts, known.AmplitudeRelativeSd, known.ReferenceGain, known.ReferenceGainSd) : null,
        };
    }

    public static ChannelMapping ToView(this ChannelMappingWire w) => new(w.Channel, w.Variable, w.Sign < 0 ? -1 : 1);

    public static DesignCheckNote ToView(this DesignCheckNoteWire w) => new(ToSeverity(w.Severity), w.Subject ?? "", w.Message);

    public static BuiltInModelEntry ToView(this BuiltInModelWire w) => new(w.Id, w.Name, w.Summary, w.Equations ?? []) { CanGenerateDesign = w.CanGenerateDesign };

    public static CheckSeverity ToSeverity(string? severity) => severity?.ToLowerInvariant() switch
    {
        "error" => CheckSeverity.Error,
        "warning" => CheckSeverity.Warning,
        _ => CheckSeverity.Note,
    };

    public static FitJobState ToState(FitState state) => state switch
    {
        FitState.Queued => FitJobState.Queued,
        FitState.Running => FitJobState.Running,
        FitState.Succeeded => FitJobState.Succeeded,
        FitState.Cancelled => FitJobState.Cancelled,
        _ => FitJobState.Failed,
    };
}
