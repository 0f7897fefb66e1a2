namespace Patchproof.Contracts.Benches;

/// <summary>What <c>POST /api/benches/{benchId}/probe-calibrations</c> stored.</summary>
/// <param name="BenchId">The bench.</param>
/// <param name="ReferenceChannel">The calibration's reference channel.</param>
/// <param name="Channels">The channels it calibrates.</param>
/// <param name="CreatedAt">When the calibration was computed (from the file).</param>
/// <param name="UploadedAt">When the server stored it; fits of the bench's boards use the newest upload.</param>
public sealed record ProbeCalibrationSummary(Guid BenchId, string ReferenceChannel, IReadOnlyList<string> Channels, DateTimeOffset CreatedAt, DateTimeOffset UploadedAt);
