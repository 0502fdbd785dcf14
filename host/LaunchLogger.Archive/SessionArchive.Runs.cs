using System.Globalization;
using LaunchLogger.Archive.Board;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Archive.Records;
using LaunchLogger.Decoding.Calibration;
using Microsoft.Data.Sqlite;

namespace LaunchLogger.Archive;

// Runs: listing, showing, assigning, standing (reruns and disqualifications).
public sealed partial class SessionArchive
{
    /// <summary>The main figures listed with each run: (figure, column stem).</summary>
    private static readonly (string Code, string Column)[] ListedFigures =
    [
        ("0-60mph", "0_60mph"), ("60ft", "60ft"), ("quarter", "quarter"), ("trap", "trap"), ("stop", "stop"),
    ];

    /// <summary>Runs matching <paramref name="filter"/>, oldest first, with their main figures.</summary>
    /// <exception cref="ArchiveException">A name in the filter matches nothing.</exception>
    public ArchiveTable ListRuns(RunFilter? filter = null)
    {
        (string where, var parameters) = RunWhere(filter ?? new RunFilter());
        return Query(RunSelect + where + " ORDER BY r.id", parameters);
    }

    /// <summary>One run: its row as listed, and its current report entry as JSON (null when it failed).</summary>
    /// <exception cref="ArchiveException">No such run.</exception>
    public (ArchiveTable Row, string? ReportJson) ShowRun(long runId)
    {
        ArchiveTable row = Query(RunSelect + " WHERE r.id = $id", ("$id", runId));
        if (row.Rows.Count == 0)
        {
            throw new ArchiveException($"no run {runId}");
        }

        return (row, Scalar("SELECT rp.json FROM runs r JOIN reports rp ON rp.result_id = r.result_id WHERE r.id = $id", null, ("$id", runId)) as string);
    }

    /// <summary>Every result a run has had, oldest first (one per analysis and tool version).</summary>
    public ArchiveTable RunHistory(long runId) => Query(
        "SELECT id AS result, tool_version, analysed_at, verdict, reasons, failure FROM results WHERE run_id = $id ORDER BY id", ("$id", runId));

    /// <summary>Sets where a run belongs; names left null are unchanged, empty names clear.</summary>
    /// <returns>True when the car changed (the run should be re-analysed with the new car's settings).</returns>
    /// <exception cref="ArchiveException">No such run, or a name matches nothing.</exception>
    public bool AssignRun(long runId, RunAssignment assignment)
    {
        ArgumentNullException.ThrowIfNull(assignment);
        RequireRun(runId);
        bool carChanged = false;

        // Names are looked up before the transaction opens: a lookup outside it would be refused
        // while it is pending.
        long? Lookup(RecordKind kind, string? name) => name is null || name.Trim().Length == 0 ? null : RequireId(kind, name);
        long? eventId = Lookup(RecordKind.Event, assignment.Event);
        long? driverId = Lookup(RecordKind.Driver, assignment.Driver);
        long? classId = Lookup(RecordKind.Class, assignment.Class);
        long? carId = Lookup(RecordKind.Car, assignment.Car);
        using SqliteTransaction transaction = connection.BeginTransaction();
        void Set(string column, string? name, long? id)
        {
            if (name is not null)
            {
                Execute($"UPDATE runs SET {column} = $v WHERE id = $id", transaction, ("$v", id), ("$id", runId));
            }
        }

        Set("event_id", assignment.Event, eventId);
        Set("driver_id", assignment.Driver, driverId);
        Set("class_id", assignment.Class, classId);
        if (assignment.Car is not null)
        {
            long? settingsId = carId is { } c ? CurrentCarSettings(c, transaction).SettingsId : null;
            carChanged = Execute("UPDATE runs SET car_id = $car, car_settings_id = $s WHERE id = $id AND car_id IS NOT $car", transaction,
                ("$car", carId), ("$s", settingsId), ("$id", runId)) > 0;
            if (assignment.Class is null && carId is { } withClass)
            {
                Execute("UPDATE runs SET class_id = coalesce((SELECT class_id FROM cars WHERE id = $car), class_id) WHERE id = $id", transaction, ("$car", withClass), ("$id", runId));
            }
        }

        transaction.Commit();
        return carChanged;
    }

    /// <summary>Records whether a run counts: a rerun or a disqualification needs a reason.</summary>
    /// <exception cref="ArchiveException">No such run, or no reason given for a rerun or disqualification.</exception>
    public void SetStanding(long runId, RunStanding standing, string? reason)
    {
        RequireRun(runId);
        reason = string.IsNullOrWhiteSpace(reason) ? null : reason.Trim();
        if (standing != RunStanding.Counted && reason is null)
        {
            throw new ArchiveException($"a {StandingName(standing)} needs a --reason");
        }

        Execute("UPDATE runs SET standing = $s, standing_reason = $reason WHERE id = $id", null,
            ("$s", StandingName(standing)), ("$reason", reason), ("$id", runId));
    }

    /// <summary>The archive's name for a standing.</summary>
    public static string StandingName(RunStanding standing) => standing switch
    {
        RunStanding.Rerun => "rerun",
        RunStanding.Disqualified => "disqualified",
        _ => "counted",
    };

    /// <summary>Counts of what the archive holds.</summary>
    public ArchiveTable Summary() => Query(
        """
        SELECT (SELECT count(*) FROM logs) AS logs, (SELECT count(*) FROM runs) AS runs, (SELECT count(*) FROM events) AS events,
               (SELECT count(*) FROM cars) AS cars, (SELECT count(*) FROM drivers) AS drivers, (SELECT count(*) FROM classes) AS classes,
               (SELECT coalesce(sum(byte_count), 0) FROM logs) AS log_bytes
        """);

    private void RequireRun(long runId)
    {
        if (Scalar("SELECT id FROM runs WHERE id = $id", null, ("$id", runId)) is null)
        {
            throw new ArchiveException($"no run {runId}");
        }
    }

    private static string RunSelect
    {
        get
        {
            string figures = string.Concat(ListedFigures.Select(f =>
            {
                string unit = BoardFigures.Find(f.Code)!.Quantity switch { FigureQuantity.Speed => "mps", FigureQuantity.Distance => "m", _ => "s" };
                bool conventions = BoardFigures.Find(f.Code)!.HasConventions;
                string sub = $"(SELECT {{0}} FROM figures WHERE result_id = res.id AND figure = '{f.Code}')";
                return conventions
                    ? $", {string.Format(CultureInfo.InvariantCulture, sub, "standstill")} AS \"{f.Column}_standstill_{unit}\", {string.Format(CultureInfo.InvariantCulture, sub, "rollout")} AS \"{f.Column}_rollout_{unit}\""
                    : $", {string.Format(CultureInfo.InvariantCulture, sub, "standstill")} AS \"{f.Column}_{unit}\"";
            }));
            return
                $"""
                SELECT r.id AS run, e.name AS event, e.date AS date, d.name AS driver, c.name AS car, k.name AS class,
                       r.box_run, r.standing, r.standing_reason, res.verdict, res.reasons, res.tool_version, r.source, r.log_id AS log{figures}
                FROM runs r
                LEFT JOIN results res ON res.id = r.result_id
                LEFT JOIN events e ON e.id = r.event_id
                LEFT JOIN drivers d ON d.id = r.driver_id
                LEFT JOIN cars c ON c.id = r.car_id
                LEFT JOIN classes k ON k.id = r.class_id
                """;
        }
    }

    private (string Where, (string, object?)[] Parameters) RunWhere(RunFilter filter)
    {
        var clauses = new List<string>();
        var parameters = new List<(string, object?)>();
        void By(string column, RecordKind kind, string? name)
        {
            if (name is not null)
            {
                clauses.Add($"r.{column} = ${column}");
                parameters.Add(($"${column}", RequireId(kind, name)));
            }
        }

        By("event_id", RecordKind.Event, filter.Event);
        By("car_id", RecordKind.Car, filter.Car);
        By("driver_id", RecordKind.Driver, filter.Driver);
        By("class_id", RecordKind.Class, filter.Class);
        if (filter.Season is { } year)
        {
            clauses.Add("substr(e.date, 1, 4) = $season");
            parameters.Add(("$season", year.ToString("D4", CultureInfo.InvariantCulture)));
        }

        return (clauses.Count == 0 ? "" : " WHERE " + string.Join(" AND ", clauses), parameters.ToArray());
    }
}
