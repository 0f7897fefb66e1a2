using Patchproof.Contracts.Health;

namespace Patchproof.Client.Services;

/// <summary>The client's only way to the server: typed calls over HTTP.</summary>
public interface IPatchproofApi
{
    /// <summary>Reads <c>/api/health</c>.</summary>
    Task<HealthResponse> GetHealthAsync(CancellationToken cancellationToken = default);
}
