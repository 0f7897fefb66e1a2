using System.Net.Http.Json;
using Patchproof.Contracts.Health;

namespace Patchproof.Client.Services;

/// <summary>Calls the server's REST API.</summary>
public sealed class PatchproofApi(HttpClient http) : IPatchproofApi
{
    /// <inheritdoc />
    public async Task<HealthResponse> GetHealthAsync(CancellationToken cancellationToken = default) =>
        await http.GetFromJsonAsync<HealthResponse>("api/health", cancellationToken)
        ?? throw new InvalidOperationException("The server sent an empty health answer.");
}
