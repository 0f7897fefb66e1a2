using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Mvc.Testing;
using Microsoft.AspNetCore.TestHost;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.DependencyInjection.Extensions;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Time.Testing;
using Patchproof.Client.Services;
using Patchproof.Server.Fits;

namespace Patchproof.Server.Tests.Hosting;

/// <summary>Settings of one in-memory server for a test.</summary>
internal sealed record TestServerSettings
{
    public ScriptedFitExecutor? Executor { get; init; }

    /// <summary>Removes the fit engine, as on a server built without one.</summary>
    public bool WithoutEngine { get; init; }

    public FakeTimeProvider? Time { get; init; }

    public int Workers { get; init; } = 1;

    public bool SeedDemo { get; init; } = true;

    public string? DemoDesignsFolder { get; init; }

    public string? DemoCapturesFolder { get; init; }

    public long? MaxUploadBytes { get; init; }

    public long? MaxRows { get; init; }

    public TimeSpan ShutdownTimeout { get; init; } = TimeSpan.FromSeconds(5);

    public IReadOnlyDictionary<string, string?> Extra { get; init; } = new Dictionary<string, string?>();
}

/// <summary>The real server hosted in memory on a test's data, with a fake clock for leases and, optionally, a scripted fit engine.</summary>
internal sealed class TestServerHost : WebApplicationFactory<Program>
{
    private readonly ServerData data;
    private readonly TestServerSettings settings;

    public TestServerHost(ServerData data, TestServerSettings? settings = null)
    {
        this.data = data;
        this.settings = settings ?? new TestServerSettings();
        Time = this.settings.Time ?? new FakeTimeProvider(new DateTimeOffset(2026, 12, 1, 9, 0, 0, TimeSpan.Zero));
    }

    public FakeTimeProvider Time { get; }

    public ScriptedFitExecutor? Executor => settings.Executor;

    protected override void ConfigureWebHost(IWebHostBuilder builder)
    {
        builder.UseEnvironment("Production");
        builder.UseSetting("Patchproof:DataFolder", data.DataFolder);
        builder.UseSetting("ConnectionStrings:Postgres", data.PostgresConnectionString ?? string.Empty);
        builder.UseSetting("Patchproof:Demo:Seed", settings.SeedDemo ? "true" : "false");
        builder.UseSetting("Patchproof:Demo:DesignsFolder", settings.DemoDesignsFolder ?? Path.Combine(data.DataFolder, "no-demo-files"));
        builder.UseSetting("Patchproof:Demo:CapturesFolder", settings.DemoCapturesFolder ?? Path.Combine(data.DataFolder, "no-demo-files"));
        builder.UseSetting("Patchproof:Fits:Workers", settings.Workers.ToString(System.Globalization.CultureInfo.InvariantCulture));
        builder.UseSetting("Patchproof:Fits:HeartbeatInterval", "00:00:00.050");
        builder.UseSetting("Patchproof:Fits:PollInterval", "00:00:00.100");
        builder.UseSetting("Patchproof:Fits:LeaseDuration", "00:00:30");
        if (settings.MaxUploadBytes is { } maxBytes)
        {
            builder.UseSetting("Patchproof:Captures:MaxUploadBytes", maxBytes.ToString(System.Globalization.CultureInfo.InvariantCulture));
        }

        if (settings.MaxRows is { } maxRows)
        {
            builder.UseSetting("Patchproof:Captures:MaxRows", maxRows.ToString(System.Globalization.CultureInfo.InvariantCulture));
        }

        foreach (var (key, value) in settings.Extra)
        {
            builder.UseSetting(key, value);
        }

        builder.ConfigureTestServices(services =>
        {
            services.RemoveAll<TimeProvider>();
            services.AddSingleton<TimeProvider>(Time);
            services.Configure<HostOptions>(host => host.ShutdownTimeout = settings.ShutdownTimeout);
            // The start page's server rendering calls the API over HTTP; in memory there is no socket to call.
            services.AddHttpClient<IPatchproofApi, PatchproofApi>().ConfigurePrimaryHttpMessageHandler(() => Server.CreateHandler());
            if (settings.WithoutEngine)
            {
                services.RemoveAll<IFitJobExecutor>();
            }

            if (settings.Executor is { } executor)
            {
                services.AddSingleton<IFitJobExecutor>(executor);
            }
        });
    }
}
