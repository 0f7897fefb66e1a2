using System.Net;
using Microsoft.AspNetCore.Hosting.Server;
using Microsoft.AspNetCore.Hosting.Server.Features;
using Microsoft.AspNetCore.Mvc.Testing;
using Microsoft.Extensions.DependencyInjection;

namespace Patchproof.EndToEnd.Tests.Infrastructure;

/// <summary>The real server on a free loopback port, with Kestrel, for a browser to talk to.</summary>
public sealed class LiveServer : IAsyncLifetime
{
    private readonly WebApplicationFactory<Program> factory = new();

    /// <summary>The server's address, for example <c>http://127.0.0.1:41234/</c>.</summary>
    public Uri BaseAddress { get; private set; } = new("http://127.0.0.1/");

    public ValueTask InitializeAsync()
    {
        factory.UseKestrel(options => options.Listen(IPAddress.Loopback, 0));
        factory.StartServer();
        var addresses = factory.Services.GetRequiredService<IServer>().Features.Get<IServerAddressesFeature>()!.Addresses;
        BaseAddress = new Uri(addresses.First().TrimEnd('/') + "/");
        return ValueTask.CompletedTask;
    }

    public async ValueTask DisposeAsync() => await factory.DisposeAsync();
}
