using Microsoft.AspNetCore.Hosting.Server;
using Microsoft.AspNetCore.Hosting.Server.Features;

namespace Patchproof.Server.Rendering;

/// <summary>Where this server's own API answers it, for the client code the server runs while prerendering.</summary>
/// <remarks>
/// The client talks to the server over HTTP only, also when its start page is rendered on the server. The address is
/// the one Kestrel listens on, not the one in the browser's address bar, which behind a proxy or a port mapping the
/// server itself may not reach. A wildcard host is reached on the loopback interface. A server without a socket (the
/// tests' in-memory one) has no address; the request's own address is used then.
/// </remarks>
internal sealed class LoopbackApiAddress(IServer server)
{
    public Uri? BaseAddress => FromListeningAddresses(server.Features.Get<IServerAddressesFeature>()?.Addresses ?? []);

    public static Uri? FromListeningAddresses(IEnumerable<string> addresses)
    {
        var listed = addresses.ToList();
        var chosen = listed.FirstOrDefault(a => a.StartsWith("http://", StringComparison.OrdinalIgnoreCase)) ?? listed.FirstOrDefault();
        if (chosen is null)
        {
            return null;
        }

        var builder = new UriBuilder(chosen.Replace("://+", "://localhost", StringComparison.Ordinal).Replace("://*", "://localhost", StringComparison.Ordinal));
        builder.Host = builder.Host switch
        {
            "0.0.0.0" => "127.0.0.1",
            "[::]" => "[::1]",
            _ => builder.Host,
        };
        builder.Path = "/";
        return builder.Uri;
    }
}
