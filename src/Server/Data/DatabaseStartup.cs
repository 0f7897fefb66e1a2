using Microsoft.EntityFrameworkCore;
using Microsoft.Extensions.Options;
using Patchproof.Server.Seeding;
using Patchproof.Server.Storage;

namespace Patchproof.Server.Data;

/// <summary>Creates or migrates the database before the server takes requests, then loads the demo scenario.</summary>
/// <remarks>Registered before the fit job runner, so hosted services start in this order and the runner finds the tables.</remarks>
internal sealed class DatabaseStartup(IServiceScopeFactory scopes, CaptureStore store, IOptions<PatchproofOptions> options) : IHostedService
{
    public async Task StartAsync(CancellationToken cancellationToken)
    {
        store.ClearStaleTemporaryFiles(TimeSpan.FromDays(1));
        await using var scope = scopes.CreateAsyncScope();
        var db = scope.ServiceProvider.GetRequiredService<PatchproofDbContext>();
        await db.Database.MigrateAsync(cancellationToken);
        if (options.Value.Demo.Seed)
        {
            await scope.ServiceProvider.GetRequiredService<DemoScenarioSeeder>().SeedAsync(cancellationToken);
        }
    }

    public Task StopAsync(CancellationToken cancellationToken) => Task.CompletedTask;
}
