using Microsoft.AspNetCore.Components;
using Microsoft.AspNetCore.Components.Web;

namespace Patchproof.Server.Rendering;

/// <summary>Which pages the server renders before the WebAssembly client takes them over.</summary>
/// <remarks>
/// Only the start page: it is the first page most people load, and it needs the client's runtime (about 2 s to start
/// on a slow machine) for nothing but its buttons. Every other page renders in the browser only, as a page reached by a
/// link from the start page is, so no page has to be written for two renderers.
/// </remarks>
internal static class StartPagePrerendering
{
    private static readonly IComponentRenderMode Prerendered = new InteractiveWebAssemblyRenderMode(prerender: true);
    private static readonly IComponentRenderMode InBrowserOnly = new InteractiveWebAssemblyRenderMode(prerender: false);

    public static bool IsPrerendered(PathString path) => path == "/" || path == "";

    public static IComponentRenderMode RenderModeFor(PathString path) => IsPrerendered(path) ? Prerendered : InBrowserOnly;
}
