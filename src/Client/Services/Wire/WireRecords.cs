using System.Text.Json;
using Patchproof.Contracts.Fits;

namespace Patchproof.Client.Services.Wire;

// Implementation note: these mirror the server's answers field for field, so that the view models the
// pages use can change without touching the wire. They go once the shared records in Contracts cover them.

internal sealed record BenchWire(Guid Id, string Name, string? Institution, string? Description, int BoardCount);

internal sealed record BoardWire(
    Guid Id, Guid BenchId, string Code, string Name, string? BuiltBy, string? Description,
    int? LatestDesignVersion, int CaptureCount, int FitCount, DateTimeOffset CreatedAt);

internal sealed record DesignVersionSummaryWire(Guid BoardId, int Version, string? Note, DateTimeOffset CreatedAt);


internal sealed record CaptureCheckWire(string Severity, int Line, int Column, string Message);

internal sealed record CaptureWire(
    Guid Id, Guid BoardId, string FileName, long SizeBytes, long RowCount, List<string> ChannelNames,
    double? SampleIntervalSeconds, double DurationSeconds, List<CaptureCheckWire> Checks, DateTimeOffset UploadedAt);

internal sealed record FitReportWire(FitResponse Fit, BoardWire Board, DesignVersionSummaryWire Design, List<CaptureWire> Captures, JsonElement Result);

internal sealed record MappingCheckRequestWire(int DesignVersion, IReadOnlyList<ChannelMappingWire> Mapping);

internal sealed record ChannelMappingWire(string Channel, string Variable, int Sign);

internal sealed record MappingCheckWire(bool AgreesWithGiven, List<ChannelMappingWire> Suggested, string Message);

internal sealed record DesignCheckNoteWire(string Severity, string Subject, string Message);

internal sealed record BuiltInModelWire(string Id, string Name, string Summary, List<string> Equations, bool CanGenerateDesign = true);
