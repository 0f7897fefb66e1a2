namespace Patchproof.Contracts.Models;

/// <summary>A built-in model of the core's library.</summary>
/// <param name="Id">Its name, for example "lorenz".</param>
/// <param name="Name">Its usual name, for example "Lorenz system".</param>
/// <param name="Summary">One sentence on what it is.</param>
/// <param name="Equations">Its right-hand sides, one a line, for example "dx/dt = sigma*(y - x)".</param>
/// <param name="Source">Where its equations and parameter values come from.</param>
/// <param name="CanGenerateDesign">True when <c>POST /api/models/{id}/design</c> can propose a board for it.</param>
public sealed record BuiltInModelResponse(string Id, string Name, string Summary, IReadOnlyList<string> Equations, string Source, bool CanGenerateDesign);
