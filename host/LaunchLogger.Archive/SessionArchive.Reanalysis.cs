using LaunchLogger.Archive.Importing;
using LaunchLogger.Decoding.Corrections;
using Microsoft.Data.Sqlite;

namespace LaunchLogger.Archive;

// Re-analysis: the stored raw bytes read again by this tool; earlier results are kept.
public sealed partial class SessionArchive
{
    /// <summary>Analyses stored logs again with this tool and makes the new results current
    /// (earlier ones stay in each run's history). Each log is one transaction.</summary>
    /// <param name="toolVersion">This tool's version.</param>
    /// <param name="everything">True: every log; false: only logs with a run whose current
    /// result was made by another tool version (or has none).</param>
    /// <param name="progress">Told after each log (logs done, logs in all).</param>
    /// <param name="cancel">Stops between logs; what is done stays done.</param>
    public ReanalysisOutcome Reanalyse(string toolVersion, bool everything, Action<int, int>? progress = null, CancellationToken cancel = default)
    {
        List<long> logs = Column(
            """
            SELECT DISTINCT r.log_id FROM runs r LEFT JOIN results res ON res.id = r.result_id
            WHERE $all OR res.id IS NULL OR res.tool_version <> $tool ORDER BY r.log_id
            """,
            ("$all", everything), ("$tool", toolVersion)).Select(Convert.ToInt64).ToList();
        int runs = 0, changed = 0, done = 0;
        foreach (long logId in logs)
        {
            cancel.ThrowIfCancellationRequested();
            (int r, int c) = ReanalyseLog(logId, toolVersion, cancel);
            runs += r;
            changed += c;
            progress?.Invoke(++done, logs.Count);
        }

        return new ReanalysisOutcome(logs.Count, runs, changed);
    }

    private (int Runs, int Changed) ReanalyseLog(long logId, string toolVersion, CancellationToken cancel)
    {
        string source = (string)Scalar("SELECT source FROM logs WHERE id = $id", null, ("$id", logId))!;
        byte[] bytes = LogBytes(logId);

        // The runs of one log come from one box in one car: analyse with the settings version
        // and event weather its first run was filed with, as at import.
        long? settingsId = null;
        Weather? weather = null;
        using (SqliteCommand command = Command(
            "SELECT r.car_settings_id, e.weather FROM runs r LEFT JOIN events e ON e.id = r.event_id WHERE r.log_id = $log ORDER BY r.position LIMIT 1",
            null, ("$log", logId)))
        using (SqliteDataReader reader = command.ExecuteReader())
        {
            if (reader.Read())
            {
                settingsId = reader.IsDBNull(0) ? null : reader.GetInt64(0);
                weather = reader.IsDBNull(1) ? null : Weather.Parse(reader.GetString(1));
            }
        }

        AnalysedLog analysed = LogAnalyzer.Analyze(bytes, source, toolVersion, SettingsCalibration(settingsId), weather, cancel);
        using SqliteTransaction transaction = connection.BeginTransaction();
        var existing = new Dictionary<int, (long Id, string? Verdict)>();
        using (SqliteCommand command = Command(
            "SELECT r.position, r.id, res.verdict FROM runs r LEFT JOIN results res ON res.id = r.result_id WHERE r.log_id = $log", transaction, ("$log", logId)))
        using (SqliteDataReader reader = command.ExecuteReader())
        {
            while (reader.Read())
            {
                existing[reader.GetInt32(0)] = (reader.GetInt64(1), reader.IsDBNull(2) ? null : reader.GetString(2));
            }
        }

        int changed = 0;
        foreach (AnalysedRun run in analysed.Runs)
        {
            long runId;
            if (existing.TryGetValue(run.Position, out var known))
            {
                runId = known.Id;
                changed += known.Verdict == run.Verdict ? 0 : 1;
            }
            else
            {
                // This reader finds a run an earlier one did not: file it beside its log-mates.
                runId = Convert.ToInt64(Scalar(
                    """
                    INSERT INTO runs (log_id, position, box_run, firmware, source, added_at, event_id, car_id, car_settings_id, driver_id, class_id)
                    SELECT $log, $pos, $box, $fw, $source, $at, m.event_id, m.car_id, m.car_settings_id, m.driver_id, m.class_id
                    FROM (SELECT 1) LEFT JOIN (SELECT * FROM runs WHERE log_id = $log ORDER BY position LIMIT 1) m RETURNING id
                    """,
                    transaction, ("$log", logId), ("$pos", run.Position), ("$box", run.BoxRun), ("$fw", run.Firmware), ("$source", run.Source), ("$at", Now())));
                changed++;
            }

            AddResult(runId, run, toolVersion, transaction);
        }

        foreach ((int position, (long id, string? verdict)) in existing.Where(e => e.Key > analysed.Runs.Count))
        {
            AddResult(id, new AnalysedRun(position, 0, "", source, null, "this tool no longer finds the run in its log"), toolVersion, transaction);
            changed += verdict == "failed" ? 0 : 1;
        }

        transaction.Commit();
        return (analysed.Runs.Count + existing.Keys.Count(p => p > analysed.Runs.Count), changed);
    }
}
