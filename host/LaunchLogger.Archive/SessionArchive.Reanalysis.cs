using LaunchLogger.Archive.Importing;
using LaunchLogger.Decoding.Corrections;
using Microsoft.Data.Sqlite;

namespace LaunchLogger.Archive;

// Re-analysis: the stored raw bytes read again by this tool, run by run from the stored blob;
// earlier results are kept.
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
        string sha256 = (string)Scalar("SELECT sha256 FROM logs WHERE id = $id", null, ("$id", logId))!;

        // Each run is analysed with its own car settings version and its own event's weather:
        // a run moved to another event or car since import is judged as it is filed now. The
        // log is analysed once per distinct pair (nearly always one).
        var existing = new Dictionary<int, ExistingRun>();
        using (SqliteCommand command = Command(
            """
            SELECT r.position, r.id, res.verdict, r.car_settings_id, e.weather
            FROM runs r LEFT JOIN results res ON res.id = r.result_id LEFT JOIN events e ON e.id = r.event_id
            WHERE r.log_id = $log ORDER BY r.position
            """,
            null, ("$log", logId)))
        using (SqliteDataReader reader = command.ExecuteReader())
        {
            while (reader.Read())
            {
                existing[reader.GetInt32(0)] = new ExistingRun(
                    reader.GetInt64(1),
                    reader.IsDBNull(2) ? null : reader.GetString(2),
                    reader.IsDBNull(3) ? null : reader.GetInt64(3),
                    reader.IsDBNull(4) ? null : reader.GetString(4));
            }
        }

        // A run the log holds that an earlier reader did not find is analysed like its
        // log-mates: with the first run's settings and weather.
        ExistingRun? first = existing.Count > 0 ? existing[existing.Keys.Min()] : null;
        var analyses = new Dictionary<(long?, string?), AnalysedLog>();
        AnalysedLog AnalysisFor(ExistingRun? row)
        {
            (long?, string?) key = (row?.SettingsId, row?.Weather);
            if (!analyses.TryGetValue(key, out AnalysedLog? log))
            {
                Weather? weather = row?.Weather is { } w ? Weather.Parse(w) : null;
                // Read from the stored blob a block at a time: the log is never held whole.
                using (Stream bytes = OpenLog(logId))
                {
                    log = LogAnalyzer.AnalyzeStream(bytes, sha256, source, toolVersion, SettingsCalibration(row?.SettingsId), weather, cancel);
                }

                analyses[key] = log;
            }

            return log;
        }

        AnalysedLog plan = AnalysisFor(first);
        using SqliteTransaction transaction = connection.BeginTransaction();
        int changed = 0, runs = 0;
        for (int i = 0; i < plan.Runs.Count; i++)
        {
            int position = plan.Runs[i].Position;
            long runId;
            AnalysedRun run;
            if (existing.TryGetValue(position, out ExistingRun? known))
            {
                run = AnalysisFor(known).Runs[i];
                runId = known.Id;
                changed += known.Verdict == run.Verdict ? 0 : 1;
                Execute(
                    "UPDATE runs SET fingerprint = $print, frames_lost = $lost WHERE id = $id",
                    transaction, ("$print", run.Fingerprint), ("$lost", run.FramesLost), ("$id", runId));
            }
            else if (FindCopy(plan.Runs[i], transaction) is not null)
            {
                // Another copy of the box's bytes carries this run already.
                continue;
            }
            else
            {
                // This reader finds a run an earlier one did not: file it beside its log-mates.
                run = plan.Runs[i];
                runId = Convert.ToInt64(Scalar(
                    """
                    INSERT INTO runs (log_id, position, box_run, firmware, source, added_at, event_id, car_id, car_settings_id, driver_id, class_id, fingerprint, frames_lost)
                    SELECT $log, $pos, $box, $fw, $source, $at, m.event_id, m.car_id, m.car_settings_id, m.driver_id, m.class_id, $print, $lost
                    FROM (SELECT 1) LEFT JOIN (SELECT * FROM runs WHERE log_id = $log ORDER BY position LIMIT 1) m RETURNING id
                    """,
                    transaction, ("$log", logId), ("$pos", run.Position), ("$box", run.BoxRun), ("$fw", run.Firmware), ("$source", run.Source), ("$at", Now()),
                    ("$print", run.Fingerprint), ("$lost", run.FramesLost)));
                changed++;
            }

            AddResult(runId, run, toolVersion, transaction);
            runs++;
        }

        foreach ((int position, ExistingRun gone) in existing.Where(e => e.Key > plan.Runs.Count))
        {
            AddResult(gone.Id, new AnalysedRun(position, 0, "", source, null, "this tool no longer finds the run in its log"), toolVersion, transaction);
            changed += gone.Verdict == "failed" ? 0 : 1;
            runs++;
        }

        transaction.Commit();
        return (runs, changed);
    }

    /// <summary>A run of the log being analysed again, as filed.</summary>
    private sealed record ExistingRun(long Id, string? Verdict, long? SettingsId, string? Weather);
}
