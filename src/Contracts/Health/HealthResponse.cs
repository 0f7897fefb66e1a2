namespace Patchproof.Contracts.Health;

/// <summary>The answer of <c>GET /api/health</c>.</summary>
/// <param name="Status">"ok" when the server can serve requests.</param>
/// <param name="Version">The version of the numeric core behind the server.</param>
public sealed record HealthResponse(string Status, string Version);
