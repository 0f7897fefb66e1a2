using Patchproof.Server.Rendering;

namespace Patchproof.Server.Extensions;

/// <summary>Builds the request pipeline: errors as problem details, the client's files, the API description.</summary>
internal static class PipelineConfiguration
{
    public static WebApplication UsePatchproofPipeline(this WebApplication app)
    {
        // No stack trace leaves the server: unhandled errors become RFC 9457 problem details.
        app.UseExceptionHandler();
        app.UseStatusCodePages();
        // Outside the API an address no page answers gets the page document with status 404; the client says so. A
        // missing file (a browser's favicon.ico, say) gets a plain 404: rendering the document for it costs the server.
        app.UseWhen(
            context => !context.Request.Path.StartsWithSegments("/api") && !Path.HasExtension(context.Request.Path.Value),
            pages => pages.UseStatusCodePagesWithReExecute("/not-found", createScopeForStatusCodePages: true));
        // After the re-execution above, so the request it repeats is routed to its new path.
        app.UseRouting();
        app.UseAntiforgery();
        app.MapStaticAssets();
        app.MapOpenApi("/api/openapi/{documentName}.json");
        return app;
    }

    /// <summary>Serves the client's pages, and a problem for an unknown API route.</summary>
    public static WebApplication MapClientPages(this WebApplication app)
    {
        app.MapRazorComponents<PageDocument>()
            .AddInteractiveWebAssemblyRenderMode()
            .AddAdditionalAssemblies(typeof(Patchproof.Client.App).Assembly)
            .Add(ClientAssetList.LeaveOut);
        app.MapFallback("api/{**rest}", (string? rest) => TypedResults.Problem(
            statusCode: StatusCodes.Status404NotFound,
            title: "No such API resource",
            detail: $"Nothing answers at /api/{rest}; the API is described at /api/openapi/v1.json."));
        return app;
    }
}
