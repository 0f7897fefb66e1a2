namespace Patchproof.Contracts.Boards;

/// <summary>One physical board on a bench.</summary>
/// <param name="Id">The board's identifier.</param>
/// <param name="BenchId">The bench it belongs to.</param>
/// <param name="Code">The label on the board, unique on its bench (for example "QH-L3").</param>
/// <param name="Name">Its nickname (for example "Wren").</param>
/// <param name="BuiltBy">Who built or looks after it, or null.</param>
/// <param name="Description">A free-text note, or null.</param>
/// <param name="LatestDesignVersion">The newest design version, or null when it has none yet.</param>
/// <param name="CaptureCount">How many captures were uploaded for it.</param>
/// <param name="FitCount">How many fits were started for it.</param>
/// <param name="CreatedAt">When it was recorded (UTC).</param>
public sealed record BoardResponse(
    Guid Id,
    Guid BenchId,
    string Code,
    string Name,
    string? BuiltBy,
    string? Description,
    int? LatestDesignVersion,
    int CaptureCount,
    int FitCount,
    DateTimeOffset CreatedAt);

/// <summary>The body of <c>POST /api/benches/{benchId}/boards</c>.</summary>
/// <param name="Code">The label on the board, 1 to 40 characters, unique on its bench.</param>
/// <param name="Name">Its nickname, 1 to 200 characters.</param>
/// <param name="BuiltBy">Who built or looks after it, at most 200 characters, or null.</param>
/// <param name="Description">A free-text note, at most 2000 characters, or null.</param>
public sealed record CreateBoardRequest(string Code, string Name, string? BuiltBy = null, string? Description = null);
