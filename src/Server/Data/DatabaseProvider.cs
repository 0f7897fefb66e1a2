using Microsoft.EntityFrameworkCore;

namespace Patchproof.Server.Data;

/// <summary>Chooses the database: PostgreSQL when <c>ConnectionStrings:Postgres</c> is set, SQLite in the data folder otherwise.</summary>
internal static class DatabaseProvider
{
    public const string PostgresConnectionName = "Postgres";

    public static void Configure(DbContextOptionsBuilder options, string? postgresConnectionString, string dataFolderPath)
    {
        if (!string.IsNullOrWhiteSpace(postgresConnectionString))
        {
            options.UseNpgsql(postgresConnectionString, npgsql => npgsql.MigrationsAssembly(typeof(DatabaseProvider).Assembly.GetName().Name));
            return;
        }

        Directory.CreateDirectory(dataFolderPath);
        var databasePath = Path.Combine(dataFolderPath, "patchproof.db");
        // Pooling off: the file can then be moved or deleted as soon as the server stops.
        options.UseSqlite($"Data Source={databasePath};Pooling=False", sqlite => sqlite.MigrationsAssembly(typeof(DatabaseProvider).Assembly.GetName().Name));
    }
}
