using Microsoft.AspNetCore.Components;
using Microsoft.AspNetCore.Components.WebAssembly.Services;
using Microsoft.AspNetCore.Hosting.StaticWebAssets;
using Microsoft.Extensions.Options;
using Patchproof.Client.Services;
using Patchproof.Server.Captures;
using Patchproof.Server.Data;
using Patchproof.Server.Designs;
using Patchproof.Server.Fits;
using Patchproof.Server.Rendering;
using Patchproof.Server.Seeding;
using Patchproof.Server.Storage;

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

    /// <summary>The database (SQLite in the data folder, or PostgreSQL), created or migrated at start, with the demo scenario.</summary>
    public static WebApplicationBuilder AddPatchproofPersistence(this WebApplicationBuilder builder)
    {
        builder.Services.AddOptions<PatchproofOptions>().Bind(builder.Configuration.GetSection(PatchproofOptions.SectionName));
        // Read when the first context is made, so settings added by a host (tests, for one) count.
        builder.Services.AddDbContextFactory<PatchproofDbContext>((services, options) => DatabaseProvider.Configure(
            options,
            services.GetRequiredService<IConfiguration>().GetConnectionString(DatabaseProvider.PostgresConnectionName),
            services.GetRequiredService<IOptions<PatchproofOptions>>().Value.DataFolderPath));
        builder.Services.AddSingleton<CaptureStore>();
        builder.Services.AddSingleton<ProbeCalibrationStore>();
        builder.Services.AddSingleton<IDesignDocumentValidator, DesignFileValidator>();
        builder.Services.AddScoped<DemoScenarioSeeder>();
        builder.Services.AddHostedService<DatabaseStartup>();
        return builder;
    }

    /// <summary>Capture uploads: the core's reader and checks behind a streaming, content-addressed store.</summary>
    public static WebApplicationBuilder AddPatchproofCaptures(this WebApplicationBuilder builder)
    {
        builder.Services.AddSingleton<ICaptureFileReader, InspectingCaptureFileReader>();
        builder.Services.AddScoped<CaptureIngest>();
        return builder;
    }

    /// <summary>The fit job queue, this process's runner and the fit engine (<see cref="BoardFitJobExecutor"/>) behind the <see cref="IFitJobExecutor"/> seam.</summary>
    public static WebApplicationBuilder AddPatchproofFitJobs(this WebApplicationBuilder builder)
    {
        builder.Services.AddSingleton<IFitJobExecutor, BoardFitJobExecutor>();
        builder.Services.AddSingleton<FitJobQueue>();
        builder.Services.AddSingleton<FitJobSignal>();
        builder.Services.AddHostedService<FitJobRunner>();
        return builder;
    }

    /// <summary>The page document, and what the client's start page needs when the server renders it (see <see cref="StartPagePrerendering"/>).</summary>
    public static WebApplicationBuilder AddPatchproofPageRendering(this WebApplicationBuilder builder)
    {
        builder.Services.AddRazorComponents().AddInteractiveWebAssemblyComponents();
        builder.Services.AddSingleton<LoopbackApiAddress>();
        builder.Services.AddHttpClient<IPatchproofApi, PatchproofApi>((services, client) => client.BaseAddress =
            services.GetRequiredService<LoopbackApiAddress>().BaseAddress ?? new Uri(services.GetRequiredService<NavigationManager>().BaseUri));
        // The client's router asks for it on every navigation; on the server it finds the assemblies already loaded.
        builder.Services.AddScoped<LazyAssemblyLoader>();
        builder.Services.AddHostedService<StartPageWarmUp>();
        return builder;
    }
}
