using Microsoft.AspNetCore.Hosting.StaticWebAssets;

namespace Patchproof.Server.Extensions;

/// <summary>Registers the server's services in one place so Program.cs stays short.</summary>
internal static class ServiceRegistration
{
    public static WebApplicationBuilder AddPatchproofServices(this WebApplicationBuilder builder)
    {
        // Serves the client's files from the build tree when run with `dotnet run`; a no-op once published.
        StaticWebAssetsLoader.UseStaticWebAssets(builder.Environment, builder.Configuration);
        builder.Services.AddProblemDetails();
        builder.Services.AddOpenApi();
        builder.Services.AddSingleton(TimeProvider.System);
        return builder;
    }
}
