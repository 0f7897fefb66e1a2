namespace Patchproof.Client.Models;

/// <summary>A bench or a class as the boards list shows it.</summary>
/// <param name="Id">The bench's identifier.</param>
/// <param name="Name">Its name, for example "Analog Lab B".</param>
/// <param name="Institution">Where it is, or null.</param>
/// <param name="Description">A free-text note, or null.</param>
/// <param name="BoardCount">How many boards belong to it.</param>
public sealed record BenchSummary(Guid Id, string Name, string? Institution, string? Description, int BoardCount);

/// <summary>What a person types to record a new bench or class.</summary>
/// <param name="Name">A unique name.</param>
/// <param name="Institution">Where it is, or null.</param>
/// <param name="Description">A free-text note, or null.</param>
public sealed record NewBench(string Name, string? Institution, string? Description);
