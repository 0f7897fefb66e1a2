using Patchproof.Contracts.Fits;

namespace Patchproof.Server.Data;

// Times are stored as Unix milliseconds (UTC) so that both SQLite and PostgreSQL compare and order
// them in SQL with the same migrations; TimeStamps converts at the edges.

/// <summary>A bench or class row.</summary>
internal sealed class BenchRecord
{
    public Guid Id { get; set; }
    public required string Name { get; set; }
    public string? Institution { get; set; }
    public string? Description { get; set; }
    public long CreatedAtUnixMs { get; set; }
    public List<BoardRecord> Boards { get; set; } = [];
}

/// <summary>A board row; a board belongs to one bench.</summary>
internal sealed class BoardRecord
{
    public Guid Id { get; set; }
    public Guid BenchId { get; set; }
    public BenchRecord? Bench { get; set; }
    public required string Code { get; set; }
    public required string Name { get; set; }
    public string? BuiltBy { get; set; }
    public string? Description { get; set; }
    public long CreatedAtUnixMs { get; set; }
    public List<DesignVersionRecord> Designs { get; set; } = [];
    public List<CaptureRecord> Captures { get; set; } = [];
    public List<FitJobRecord> Fits { get; set; } = [];
}

/// <summary>One version of a board's design document, stored as JSON text.</summary>
internal sealed class DesignVersionRecord
{
    public Guid Id { get; set; }
    public Guid BoardId { get; set; }
    public BoardRecord? Board { get; set; }
    public int Version { get; set; }
    public string? Note { get; set; }
    public required string Document { get; set; }
    public long CreatedAtUnixMs { get; set; }
}

/// <summary>A capture row: the file lives in the capture store under its SHA-256.</summary>
internal sealed class CaptureRecord
{
    public Guid Id { get; set; }
    public Guid BoardId { get; set; }
    public BoardRecord? Board { get; set; }
    public required string FileName { get; set; }
    public required string Sha256 { get; set; }
    public long SizeBytes { get; set; }
    public long RowCount { get; set; }
    public required string ChannelsJson { get; set; }
    public double? SampleIntervalSeconds { get; set; }
    public double DurationSeconds { get; set; }
    public required string ChecksJson { get; set; }
    public long UploadedAtUnixMs { get; set; }
}

/// <summary>A fit job: the queue entry, its lease and, once done, its result.</summary>
internal sealed class FitJobRecord
{
    public Guid Id { get; set; }
    public Guid BoardId { get; set; }
    public BoardRecord? Board { get; set; }
    public Guid DesignVersionId { get; set; }
    public DesignVersionRecord? DesignVersion { get; set; }
    public FitState State { get; set; }
    public bool CancelRequested { get; set; }
    public double Progress { get; set; }
    public string? Stage { get; set; }
    public int Attempts { get; set; }
    public string? LeaseOwner { get; set; }
    public Guid? LeaseToken { get; set; }
    public long? LeaseExpiresAtUnixMs { get; set; }
    public long CreatedAtUnixMs { get; set; }
    public long? StartedAtUnixMs { get; set; }
    public long? FinishedAtUnixMs { get; set; }
    public string? ResultJson { get; set; }
    public string? Error { get; set; }
    public bool IgnoreBenchCalibration { get; set; }

    // The channel mapping the fit was started with (JSON, FitMappingJson); null for file order, as in fits stored before it existed.
    public string? MappingJson { get; set; }
    public List<FitJobCaptureRecord> Captures { get; set; } = [];
}

/// <summary>Which captures a fit job uses, in order.</summary>
internal sealed class FitJobCaptureRecord
{
    public Guid FitJobId { get; set; }
    public Guid CaptureId { get; set; }
    public CaptureRecord? Capture { get; set; }
    public int Position { get; set; }
}
