namespace Patchproof.Server.Rendering;

/// <summary>Keeps the list of every static file, with its fingerprinted address, out of the client's start.</summary>
/// <remarks>
/// With static assets mapped, each page tells the WebAssembly client where to fetch that list (369 entries, 72 KB of
/// JSON here), and the client reads it into a collection while it starts, in the interpreter, before it can take the
/// page over. The list serves components that name files through <c>Assets[...]</c>; the client's components name
/// none (only the server's page document does, and it keeps its own copy), so the page leaves the address out.
/// The metadata type is internal to ASP.NET Core and found by name; <c>PageDocumentTests</c> checks that the page
/// carries no such address, so a framework version that renames it is noticed.
/// </remarks>
internal static class ClientAssetList
{
    private const string AddressMetadataTypeName = "ResourceCollectionUrlMetadata";

    public static void LeaveOut(EndpointBuilder endpoint)
    {
        for (var i = endpoint.Metadata.Count - 1; i >= 0; i--)
        {
            if (endpoint.Metadata[i].GetType().Name == AddressMetadataTypeName)
            {
                endpoint.Metadata.RemoveAt(i);
            }
        }
    }
}
