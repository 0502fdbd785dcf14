using LaunchLogger.Archive.Schema;
using Microsoft.Data.Sqlite;

namespace LaunchLogger.Archive;

/// <summary>One archive file: open it, and everything kept in it — events, venues, cars and
/// their settings, drivers, classes, logs and their runs, results and the board.</summary>
/// <remarks>
/// <para>SQLite in write-ahead-log mode with foreign keys enforced and
/// <c>synchronous=NORMAL</c>: each change is one transaction, so a process killed at any moment
/// leaves the file at the last committed change (a power cut may lose the last few, never
/// consistency). Readers do not block the writer (a board can be printed during a capture).</para>
/// <para>Not thread-safe: one instance per thread.</para>
/// </remarks>
public sealed partial class SessionArchive : IDisposable
{
    private readonly SqliteConnection connection;

    private SessionArchive(string path, SqliteConnection connection)
    {
        Path = path;
        this.connection = connection;
    }

    /// <summary>The archive file.</summary>
    public string Path { get; }

    /// <summary>The schema version of the file (after migration, <see cref="SchemaVersion"/> = latest).</summary>
    public int SchemaVersion => Convert.ToInt32(Scalar("PRAGMA user_version"));

    /// <summary>The schema version this build writes.</summary>
    public static int LatestSchemaVersion => Migrations.Latest;

    /// <summary>Opens <paramref name="path"/>, creating the file (and its folder) when absent, and
    /// brings its schema up to date.</summary>
    /// <exception cref="ArchiveException">The file is not an archive, is from a newer tool, or cannot be opened.</exception>
    public static SessionArchive Open(string path)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        string full = System.IO.Path.GetFullPath(path);
        SqliteConnection? connection = null;
        try
        {
            Directory.CreateDirectory(System.IO.Path.GetDirectoryName(full)!);
            connection = new SqliteConnection(new SqliteConnectionStringBuilder
            {
                DataSource = full,
                Mode = SqliteOpenMode.ReadWriteCreate,
                ForeignKeys = true,
                Pooling = false,
                DefaultTimeout = 30,
            }.ToString());
            connection.Open();
            var archive = new SessionArchive(full, connection);
            archive.Execute("PRAGMA journal_mode=WAL; PRAGMA synchronous=NORMAL; PRAGMA busy_timeout=30000; PRAGMA cache_size=-16384;");
            archive.Migrate();
            return archive;
        }
        catch (SqliteException e)
        {
            connection?.Dispose();
            throw new ArchiveException($"{full}: cannot open the archive: {e.Message}", e);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            connection?.Dispose();
            throw new ArchiveException($"{full}: cannot open the archive: {e.Message}", e);
        }
        catch (ArchiveException)
        {
            connection?.Dispose();
            throw;
        }
    }

    /// <summary>Runs SQLite's own consistency check; "ok" when the file is sound.</summary>
    public string IntegrityCheck() => string.Join("; ", Column("PRAGMA integrity_check").Select(v => v?.ToString() ?? ""));

    /// <summary>Closes the file.</summary>
    public void Dispose() => connection.Dispose();

    private void Migrate()
    {
        int version = SchemaVersion;
        if (version > Migrations.Latest)
        {
            throw new ArchiveException($"{Path}: archive schema version {version} is newer than this tool's ({Migrations.Latest}); upgrade launchlogger");
        }

        if (version == 0 && Convert.ToInt64(Scalar("SELECT count(*) FROM sqlite_master")) > 0)
        {
            throw new ArchiveException($"{Path}: this SQLite file is not a launchlogger archive");
        }

        for (int step = version; step < Migrations.Latest; step++)
        {
            using SqliteTransaction transaction = connection.BeginTransaction();
            Execute(Migrations.Steps[step], transaction);
            Execute($"PRAGMA user_version = {step + 1}", transaction);
            transaction.Commit();
        }
    }

    private SqliteCommand Command(string sql, SqliteTransaction? transaction = null, params (string Name, object? Value)[] parameters)
    {
        SqliteCommand command = connection.CreateCommand();
        command.CommandText = sql;
        command.Transaction = transaction;
        foreach ((string name, object? value) in parameters)
        {
            command.Parameters.AddWithValue(name, value ?? DBNull.Value);
        }

        return command;
    }

    private int Execute(string sql, SqliteTransaction? transaction = null, params (string Name, object? Value)[] parameters)
    {
        using SqliteCommand command = Command(sql, transaction, parameters);
        return command.ExecuteNonQuery();
    }

    private object? Scalar(string sql, SqliteTransaction? transaction = null, params (string Name, object? Value)[] parameters)
    {
        using SqliteCommand command = Command(sql, transaction, parameters);
        object? value = command.ExecuteScalar();
        return value is DBNull ? null : value;
    }

    private List<object?> Column(string sql, params (string Name, object? Value)[] parameters)
    {
        using SqliteCommand command = Command(sql, null, parameters);
        using SqliteDataReader reader = command.ExecuteReader();
        var values = new List<object?>();
        while (reader.Read())
        {
            values.Add(reader.IsDBNull(0) ? null : reader.GetValue(0));
        }

        return values;
    }

    private static string Now() => DateTime.UtcNow.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", System.Globalization.CultureInfo.InvariantCulture);
}
