using Patchproof.Client.Models;
using Patchproof.Contracts.Health;

namespace Patchproof.Client.Components.Pages.Home;

/// <summary>What the server's rendering of the start page read from the API, handed to the client in the page.</summary>
/// <remarks>Only complete answers are handed over: after a failure the client asks again itself.</remarks>
public sealed record StartPageSnapshot(HealthResponse Health, IReadOnlyList<BenchSummary> Benches)
{
    /// <summary>The key under which the page carries the snapshot.</summary>
    public const string StateKey = "patchproof-start-page";
}
