using System.Text.Json;

namespace Patchproof.Contracts.Designs;

/// <summary>One version of a board's design, without its document.</summary>
/// <param name="BoardId">The board the design belongs to.</param>
/// <param name="Version">The version number, counting from 1 per board.</param>
/// <param name="Note">What changed in this version, or null.</param>
/// <param name="DocumentLength">The length of the design document in characters.</param>
/// <param name="CreatedAt">When the version was stored (UTC).</param>
public sealed record DesignVersionSummary(Guid BoardId, int Version, string? Note, int DocumentLength, DateTimeOffset CreatedAt);

/// <summary>One version of a board's design with its document.</summary>
/// <param name="BoardId">The board the design belongs to.</param>
/// <param name="Version">The version number, counting from 1 per board.</param>
/// <param name="Note">What changed in this version, or null.</param>
/// <param name="CreatedAt">When the version was stored (UTC).</param>
/// <param name="Document">The design document as stored: JSON of the project's design schema.</param>
public sealed record DesignVersionResponse(Guid BoardId, int Version, string? Note, DateTimeOffset CreatedAt, JsonElement Document);
