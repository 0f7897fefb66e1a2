namespace Patchproof.Contracts.Benches;

/// <summary>A bench or a class: the group a set of boards belongs to.</summary>
/// <param name="Id">The bench's identifier.</param>
/// <param name="Name">The name people use for it, unique on a server (for example "Analog Lab B").</param>
/// <param name="Institution">Where the bench is, or null.</param>
/// <param name="Description">A free-text note, or null.</param>
/// <param name="BoardCount">How many boards belong to it.</param>
/// <param name="CreatedAt">When it was recorded (UTC).</param>
public sealed record BenchResponse(Guid Id, string Name, string? Institution, string? Description, int BoardCount, DateTimeOffset CreatedAt);

/// <summary>The body of <c>POST /api/benches</c>.</summary>
/// <param name="Name">A unique name, 1 to 200 characters.</param>
/// <param name="Institution">Where the bench is, at most 200 characters, or null.</param>
/// <param name="Description">A free-text note, at most 2000 characters, or null.</param>
public sealed record CreateBenchRequest(string Name, string? Institution = null, string? Description = null);
