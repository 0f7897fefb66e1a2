using Npgsql;

namespace Patchproof.Server.Tests.Hosting;

/// <summary>Where a test server keeps its data: a fresh SQLite file, or a fresh database on the PostgreSQL named by PATCHPROOF_TEST_POSTGRES.</summary>
public abstract class ServerDatabase
{
    public const string PostgresVariable = "PATCHPROOF_TEST_POSTGRES";

    public abstract string Name { get; }

    /// <summary>A new, empty place for one test's data; several servers may share it.</summary>
    public abstract ServerData CreateData();

    public static ServerDatabase Sqlite { get; } = new SqliteDatabase();

    public static ServerDatabase Postgres { get; } = new PostgresDatabase();

    private sealed class SqliteDatabase : ServerDatabase
    {
        public override string Name => "SQLite";

        public override ServerData CreateData() => new(NewDataFolder(), null);
    }

    private sealed class PostgresDatabase : ServerDatabase
    {
        public override string Name => "PostgreSQL";

        public override ServerData CreateData()
        {
            var connectionString = Environment.GetEnvironmentVariable(PostgresVariable);
            if (string.IsNullOrWhiteSpace(connectionString))
            {
                Assert.Skip($"{PostgresVariable} is not set: these tests need a PostgreSQL connection string with a role that may create databases (docs/server.md says how).");
            }

            var builder = new NpgsqlConnectionStringBuilder(connectionString) { Database = $"patchproof_test_{Guid.NewGuid():N}" };
            return new ServerData(NewDataFolder(), builder.ConnectionString);
        }
    }

    private static string NewDataFolder()
    {
        var folder = Path.Combine(Path.GetTempPath(), "patchproof-server-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(folder);
        return folder;
    }
}

/// <summary>One test's data folder and, on PostgreSQL, its own database; removed on dispose.</summary>
public sealed class ServerData(string dataFolder, string? postgresConnectionString) : IAsyncDisposable
{
    public string DataFolder { get; } = dataFolder;

    public string? PostgresConnectionString { get; } = postgresConnectionString;

    public async ValueTask DisposeAsync()
    {
        if (PostgresConnectionString is not null)
        {
            var builder = new NpgsqlConnectionStringBuilder(PostgresConnectionString);
            var database = builder.Database;
            builder.Database = "postgres";
            builder.Pooling = false;
            NpgsqlConnection.ClearAllPools();
            await using var connection = new NpgsqlConnection(builder.ConnectionString);
            await connection.OpenAsync();
            await using var drop = new NpgsqlCommand($"DROP DATABASE IF EXISTS \"{database}\" WITH (FORCE)", connection);
            await drop.ExecuteNonQueryAsync();
        }

        try
        {
            Directory.Delete(DataFolder, recursive: true);
        }
        catch (IOException)
        {
        }
    }
}
