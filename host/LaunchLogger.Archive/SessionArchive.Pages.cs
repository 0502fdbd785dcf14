using LaunchLogger.Archive.Records;
using LaunchLogger.Archive.Schema;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Corrections;
using Microsoft.Data.Sqlite;

namespace LaunchLogger.Archive;

// What the run cards, the event's results page and the live board read: a run with everything
// filed about it, an event's facts, and a cheap stamp that changes whenever anything is filed.
public sealed partial class SessionArchive
{
    /// <summary>Opens an existing archive for reading only: nothing is created, migrated or
    /// written, and SQLite refuses any write through this instance.</summary>
    /// <exception cref="ArchiveException">No such file, not an archive, or a schema this tool
    /// does not read (older: open it once with any archive verb to bring it up to date; newer:
    /// upgrade launchlogger).</exception>
    public static SessionArchive OpenReadOnly(string path)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        string full = System.IO.Path.GetFullPath(path);
        if (!System.IO.File.Exists(full))
        {
            throw new ArchiveException($"{full}: no such archive");
        }

        SqliteConnection? connection = null;
        try
        {
            connection = new SqliteConnection(new SqliteConnectionStringBuilder
            {
                DataSource = full,
                Mode = SqliteOpenMode.ReadOnly,
                Pooling = false,
                DefaultTimeout = 30,
            }.ToString());
            connection.Open();
            var archive = new SessionArchive(full, connection);
            archive.Execute("PRAGMA busy_timeout=30000; PRAGMA query_only=1;");
            int version = archive.SchemaVersion;
            if (version != Migrations.Latest)
            {
                connection.Dispose();
                throw new ArchiveException(version > Migrations.Latest
                    ? $"{full}: archive schema version {version} is newer than this tool's ({Migrations.Latest}); upgrade launchlogger"
                    : version == 0
                        ? $"{full}: not a launchlogger archive"
                        : $"{full}: archive schema version {version} is older than this tool's ({Migrations.Latest}); run any archive verb on it once (e.g. launchlogger run list --archive FILE) to bring it up to date");
            }

            return archive;
        }
        catch (SqliteException e)
        {
            connection?.Dispose();
            throw new ArchiveException($"{full}: cannot open the archive: {e.Message}", e);
        }
    }

    /// <summary>A number that changes whenever anything is filed or changed in the archive, by
    /// this or another process: SQLite's data version (moved by other connections' commits)
    /// with the count and newest ids of runs and results beside it. Cheap: no table is scanned.</summary>
    public string ChangeStamp()
    {
        using SqliteCommand command = Command(
            "SELECT (SELECT coalesce(max(id), 0) FROM runs), (SELECT coalesce(max(id), 0) FROM results), (SELECT count(*) FROM runs)");
        using SqliteDataReader reader = command.ExecuteReader();
        reader.Read();
        long dataVersion = Convert.ToInt64(Scalar("PRAGMA data_version"));
        return $"{dataVersion}.{reader.GetInt64(0)}.{reader.GetInt64(1)}.{reader.GetInt64(2)}";
    }

    /// <summary>One run with everything filed about it and its current report entry.</summary>
    /// <exception cref="ArchiveException">No such run.</exception>
    public FiledRun FiledRun(long runId)
    {
        using SqliteCommand command = Command(
            """
            SELECT r.id, d.name, d.club, c.name, k.name, e.name, e.date, v.name, e.weather, r.standing, r.standing_reason,
                   s.version, s.pickup, s.tyre, cal.source, cal.added_at, res.analysed_at, res.failure, res.tool_version, rp.json
            FROM runs r
            LEFT JOIN drivers d ON d.id = r.driver_id
            LEFT JOIN cars c ON c.id = r.car_id
            LEFT JOIN classes k ON k.id = r.class_id
            LEFT JOIN events e ON e.id = r.event_id
            LEFT JOIN venues v ON v.id = e.venue_id
            LEFT JOIN car_settings s ON s.id = r.car_settings_id
            LEFT JOIN calibrations cal ON cal.id = s.calibration_id
            LEFT JOIN results res ON res.id = r.result_id
            LEFT JOIN reports rp ON rp.result_id = r.result_id
            WHERE r.id = $id
            """, null, ("$id", runId));
        using SqliteDataReader reader = command.ExecuteReader();
        if (!reader.Read())
        {
            throw new ArchiveException($"no run {runId}");
        }

        string? Text(int i) => reader.IsDBNull(i) ? null : reader.GetString(i);
        string? calibration = Text(14) is { } source ? $"{source} (filed {Text(15)})" : null;
        return new FiledRun
        {
            RunId = reader.GetInt64(0),
            Driver = Text(1),
            Club = Text(2),
            Car = Text(3),
            Class = Text(4),
            Event = Text(5),
            Date = Text(6),
            Venue = Text(7),
            Weather = Text(8),
            Standing = Text(9) ?? "counted",
            StandingReason = Text(10),
            SettingsVersion = reader.IsDBNull(11) ? null : reader.GetInt32(11),
            Pickup = Text(12),
            Tyre = Text(13),
            CalibrationSource = calibration,
            AnalysedAt = Text(16),
            Failure = Text(17),
            ToolVersion = Text(18),
            ReportJson = Text(19),
        };
    }

    /// <summary>What a run was analysed from: its log's bytes and name, its place in the log, and
    /// the calibration and weather its result was made with (as import and re-analysis use them).</summary>
    /// <exception cref="ArchiveException">No such run.</exception>
    public (long LogId, string Source, int Position, CalibrationSettings? Calibration, Weather? Weather) RunInput(long runId)
    {
        long logId;
        int position;
        long? settingsId;
        string? weather;
        string source;
        using (SqliteCommand command = Command(
            "SELECT r.log_id, r.position, r.car_settings_id, e.weather, l.source FROM runs r JOIN logs l ON l.id = r.log_id LEFT JOIN events e ON e.id = r.event_id WHERE r.id = $id",
            null, ("$id", runId)))
        using (SqliteDataReader reader = command.ExecuteReader())
        {
            if (!reader.Read())
            {
                throw new ArchiveException($"no run {runId}");
            }

            logId = reader.GetInt64(0);
            position = reader.GetInt32(1);
            settingsId = reader.IsDBNull(2) ? null : reader.GetInt64(2);
            weather = reader.IsDBNull(3) ? null : reader.GetString(3);
            source = reader.GetString(4);
        }

        return (logId, source, position, SettingsCalibration(settingsId), weather is null ? null : Weather.Parse(weather));
    }

    /// <summary>An event's name, date, venue, surface and weather as filed.</summary>
    /// <exception cref="ArchiveException">No such event.</exception>
    public (string Name, string Date, string? Venue, string? Surface, string? Weather) EventFacts(string name)
    {
        long id = RequireId(RecordKind.Event, name);
        using SqliteCommand command = Command(
            "SELECT e.name, e.date, v.name, coalesce(e.surface, v.surface), e.weather FROM events e LEFT JOIN venues v ON v.id = e.venue_id WHERE e.id = $id",
            null, ("$id", id));
        using SqliteDataReader reader = command.ExecuteReader();
        reader.Read();
        return (reader.GetString(0), reader.GetString(1), reader.IsDBNull(2) ? null : reader.GetString(2), reader.IsDBNull(3) ? null : reader.GetString(3), reader.IsDBNull(4) ? null : reader.GetString(4));
    }

    /// <summary>The archive ids of the runs matching <paramref name="filter"/>, oldest first.</summary>
    /// <exception cref="ArchiveException">A name in the filter matches nothing.</exception>
    public IReadOnlyList<long> RunIds(RunFilter? filter = null)
    {
        (string where, var parameters) = RunWhere(filter ?? new RunFilter());
        return Column("SELECT r.id FROM runs r LEFT JOIN events e ON e.id = r.event_id" + where + " ORDER BY r.id", parameters).Select(Convert.ToInt64).ToList();
    }
}
