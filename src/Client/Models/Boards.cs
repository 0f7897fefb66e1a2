namespace Patchproof.Client.Models;

/// <summary>One physical board as the lists and the board page show it.</summary>
/// <param name="Id">The board's identifier.</param>
/// <param name="BenchId">The bench it belongs to.</param>
/// <param name="Code">The label on the board, for example "QH-L3".</param>
/// <param name="Name">Its nickname, for example "Wren".</param>
/// <param name="BuiltBy">Who built or looks after it, or null.</param>
/// <param name="Description">A free-text note, or null.</param>
/// <param name="LatestDesignVersion">The newest design version, or null when it has none.</param>
/// <param name="CaptureCount">How many captures it has.</param>
/// <param name="FitCount">How many fits were started for it.</param>
/// <param name="CreatedAt">When it was recorded.</param>
public sealed record BoardSummary(
    Guid Id,
    Guid BenchId,
    string Code,
    string Name,
    string? BuiltBy,
    string? Description,
    int? LatestDesignVersion,
    int CaptureCount,
    int FitCount,
    DateTimeOffset CreatedAt)
{
    /// <summary>"QH-L3 Wren": how a board is named in headings and links.</summary>
    public string Label => $"{Code} {Name}";
}

/// <summary>What a person types to record a new board.</summary>
/// <param name="Code">The label on the board.</param>
/// <param name="Name">Its nickname.</param>
/// <param name="BuiltBy">Who built or looks after it, or null.</param>
/// <param name="Description">A free-text note, or null.</param>
public sealed record NewBoard(string Code, string Name, string? BuiltBy, string? Description);

/// <summary>One version of a board's design in the board's history.</summary>
/// <param name="Version">The version number, from 1.</param>
/// <param name="Note">What changed, or null.</param>
/// <param name="CreatedAt">When it was stored.</param>
public sealed record DesignVersionEntry(int Version, string? Note, DateTimeOffset CreatedAt);
