namespace Patchproof.Client.Components.Plots;

/// <summary>The assemblies the plots need, loaded on the way to a page that draws plots rather than at start.</summary>
/// <remarks>
/// Plotly.Blazor is the client's largest assembly (about 5 MB, a third of the download) and only the fit report
/// draws plots, so the project file marks it for lazy loading and the router loads it before showing the report.
/// </remarks>
public static class PlotAssemblies
{
    /// <summary>The files to load, as the project file names them for lazy loading.</summary>
    public static IReadOnlyList<string> Files { get; } = ["Plotly.Blazor.wasm"];

    /// <summary>Whether the page at a path relative to the app's base (as the router gives it) draws plots.</summary>
    public static bool AreNeededFor(string path)
    {
        var end = path.IndexOfAny(['?', '#']);
        var segments = (end < 0 ? path : path[..end]).Trim('/').Split('/');
        // The fit report: fits/{id}/report.
        return segments is ["fits", _, "report"];
    }
}
