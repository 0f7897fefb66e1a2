using Microsoft.EntityFrameworkCore;
using Patchproof.Server.Data;
using Patchproof.Server.Tests.Hosting;

namespace Patchproof.Server.Tests.Data;

public abstract class MigrationsTests(ServerDatabase database)
{
    [Fact]
    public async Task Migrations_OnAFreshDatabase_ApplyAndMatchTheModel()
    {
        await using var data = database.CreateData();
        var options = new DbContextOptionsBuilder<PatchproofDbContext>();
        DatabaseProvider.Configure(options, data.PostgresConnectionString, data.DataFolder);
        await using var db = new PatchproofDbContext(options.Options);

        await db.Database.MigrateAsync(ApiTest.Token);

        Assert.Empty(await db.Database.GetPendingMigrationsAsync(ApiTest.Token));
        Assert.False(db.Database.HasPendingModelChanges(), "The model differs from the migrations' snapshot on this provider.");
        Assert.Equal(0, await db.FitJobs.CountAsync(ApiTest.Token));
    }

    public sealed class OnSqlite() : MigrationsTests(ServerDatabase.Sqlite);

    public sealed class OnPostgres() : MigrationsTests(ServerDatabase.Postgres);
}
