using Patchproof.Contracts.Health;
using Patchproof.Core;

namespace Patchproof.Server.Apis;

/// <summary>The liveness endpoint that scripts and the client poll.</summary>
internal static class HealthApi
{
    public static IEndpointRouteBuilder MapHealthEndpoints(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/api/health", () => TypedResults.Ok(new HealthResponse("ok", CoreAssembly.Version)))
            .WithTags("Health")
            .WithName("GetHealth")
            .WithSummary("Reports that the server is up and which core version it runs.");
        return routes;
    }
}
