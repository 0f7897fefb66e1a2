namespace Patchproof.Server.Extensions;

/// <summary>Builds the request pipeline: errors as problem details, the client's files, the API description.</summary>
internal static class PipelineConfiguration
{
    public static WebApplication UsePatchproofPipeline(this WebApplication app)
    {
        // No stack trace leaves the server: unhandled errors become RFC 9457 problem details.
        app.UseExceptionHandler();
        app.UseStatusCodePages();
        app.MapStaticAssets();
        app.MapOpenApi("/api/openapi/{documentName}.json");
        return app;
    }

    /// <summary>Serves the client's start page for every path outside <c>/api</c>, so an unknown API route stays a 404.</summary>
    public static WebApplication MapClientFallback(this WebApplication app)
    {
        app.MapFallback("api/{**rest}", (string? rest) => TypedResults.Problem(
            statusCode: StatusCodes.Status404NotFound,
            title: "No such API resource",
            detail: $"Nothing answers at /api/{rest}; the API is described at /api/openapi/v1.json."));
        app.MapFallbackToFile("index.html");
        return app;
    }
}
