using System.Text.Json;
using LaunchLogger.Archive.Board;
using LaunchLogger.Archive.Importing;
using LaunchLogger.Archive.Records;
using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Reporting;
using Microsoft.Data.Sqlite;

namespace LaunchLogger.Archive;

// Filing logs: content hash, raw bytes, runs, results and their figures.
public sealed partial class SessionArchive
{
    /// <summary>The id of the log with this content hash, or null when it is not in the archive.</summary>
    public long? FindLog(string sha256) =>
        Scalar("SELECT id FROM logs WHERE sha256 = $h", null, ("$h", sha256)) is { } v ? Convert.ToInt64(v) : null;

    /// <summary>Looks up an assignment by name.</summary>
    /// <exception cref="ArchiveException">A name matches nothing.</exception>
    public ResolvedAssignment Resolve(RunAssignment assignment)
    {
        ArgumentNullException.ThrowIfNull(assignment);
        long? eventId = assignment.Event is { } e ? RequireId(RecordKind.Event, e) : null;
        long? carId = assignment.Car is { } c ? RequireId(RecordKind.Car, c) : null;
        long? driverId = assignment.Driver is { } d ? RequireId(RecordKind.Driver, d) : null;
        long? classId = assignment.Class is { } k ? RequireId(RecordKind.Class, k)
            : carId is { } car && Scalar("SELECT class_id FROM cars WHERE id = $id", null, ("$id", car)) is { } carClass ? Convert.ToInt64(carClass) : null;
        (long? settingsId, var calibration) = carId is { } id ? CurrentCarSettings(id) : (null, null);
        Weather? weather = eventId is { } ev && Scalar("SELECT weather FROM events WHERE id = $id", null, ("$id", ev)) is string w ? Weather.Parse(w) : null;
        return new ResolvedAssignment
        {
            EventId = eventId,
            CarId = carId,
            CarSettingsId = settingsId,
            DriverId = driverId,
            ClassId = classId,
            Calibration = calibration,
            Weather = weather,
        };
    }

    /// <summary>Files an analysed log: its bytes, its runs and their results, all in one
    /// transaction. A log whose bytes are in the archive already adds nothing.</summary>
    /// <param name="log">The log, from <see cref="LogAnalyzer.Analyze"/>.</param>
    /// <param name="assignment">Where its runs belong.</param>
    /// <param name="gaps">Times the link was down while it was captured.</param>
    public ImportOutcome File(AnalysedLog log, ResolvedAssignment? assignment = null, IReadOnlyList<LinkGap>? gaps = null)
    {
        ArgumentNullException.ThrowIfNull(log);
        assignment ??= new ResolvedAssignment();
        using SqliteTransaction transaction = connection.BeginTransaction();
        if (Scalar("SELECT id FROM logs WHERE sha256 = $h", transaction, ("$h", log.Sha256)) is { } existing)
        {
            return new ImportOutcome(log.Source, Convert.ToInt64(existing), false, []);
        }

        string now = Now();
        string? linkGaps = gaps is { Count: > 0 } ? JsonSerializer.Serialize(gaps, ReportJson.Options) : null;
        long logId = log.BytesFile is { } bytesFile
            ? Convert.ToInt64(Scalar(
                "INSERT INTO logs (sha256, source, added_at, byte_count, bytes, link_gaps) VALUES ($h, $source, $at, $n, zeroblob($n), $gaps) RETURNING id",
                transaction,
                ("$h", log.Sha256), ("$source", log.Source), ("$at", now), ("$n", log.ByteCount), ("$gaps", linkGaps)))
            : Convert.ToInt64(Scalar(
                "INSERT INTO logs (sha256, source, added_at, byte_count, bytes, link_gaps) VALUES ($h, $source, $at, $n, $bytes, $gaps) RETURNING id",
                transaction,
                ("$h", log.Sha256), ("$source", log.Source), ("$at", now), ("$n", log.ByteCount), ("$bytes", log.Bytes), ("$gaps", linkGaps)));
        if (log.BytesFile is { } file)
        {
            CopyBytes(file, logId, log.Sha256, log.ByteCount);
        }

        var filed = new List<(long, AnalysedRun)>(log.Runs.Count);
        var known = new List<KnownRun>();
        foreach (AnalysedRun run in log.Runs)
        {
            if (FindCopy(run, transaction) is { } copy)
            {
                // The same run is filed already from another copy of the box's bytes (a live
                // capture, then the card). The copy that lost fewer frames carries the run.
                bool fuller = run.FramesLost < copy.FramesLost;
                if (fuller)
                {
                    Execute(
                        "UPDATE runs SET log_id = $log, position = $pos, source = $source, frames_lost = $lost WHERE id = $id",
                        transaction, ("$log", logId), ("$pos", run.Position), ("$source", run.Source), ("$lost", run.FramesLost), ("$id", copy.RunId));
                    AddResult(copy.RunId, run, log.ToolVersion, transaction);
                }

                known.Add(new KnownRun(copy.RunId, run, fuller));
                continue;
            }

            long runId = Convert.ToInt64(Scalar(
                """
                INSERT INTO runs (log_id, position, box_run, firmware, source, added_at, event_id, car_id, car_settings_id, driver_id, class_id, fingerprint, frames_lost)
                VALUES ($log, $pos, $box, $fw, $source, $at, $event, $car, $settings, $driver, $class, $print, $lost) RETURNING id
                """,
                transaction,
                ("$log", logId), ("$pos", run.Position), ("$box", run.BoxRun), ("$fw", run.Firmware), ("$source", run.Source), ("$at", now),
                ("$event", assignment.EventId), ("$car", assignment.CarId), ("$settings", assignment.CarSettingsId),
                ("$driver", assignment.DriverId), ("$class", assignment.ClassId), ("$print", run.Fingerprint), ("$lost", run.FramesLost)));
            AddResult(runId, run, log.ToolVersion, transaction);
            filed.Add((runId, run));
        }

        transaction.Commit();
        return new ImportOutcome(log.Source, logId, true, filed) { Known = known };
    }

    /// <summary>The archived run that is <paramref name="run"/> read from another copy of the
    /// box's bytes, with the frames that copy lost; null when there is none.</summary>
    private (long RunId, long FramesLost)? FindCopy(AnalysedRun run, SqliteTransaction? transaction)
    {
        if (run.Fingerprint is null)
        {
            return null;
        }

        using SqliteCommand command = Command(
            "SELECT id, COALESCE(frames_lost, 0) FROM runs WHERE fingerprint = $print ORDER BY id LIMIT 1", transaction, ("$print", run.Fingerprint));
        using SqliteDataReader reader = command.ExecuteReader();
        return reader.Read() ? (reader.GetInt64(0), reader.GetInt64(1)) : null;
    }

    /// <summary>Copies a log's bytes from its file into its row's blob in blocks (the open
    /// transaction covers it), checking that the file still holds the bytes that were analysed.</summary>
    /// <exception cref="ArchiveException">The file changed since it was analysed (nothing is filed).</exception>
    private void CopyBytes(string file, long logId, string sha256, long length)
    {
        using var blob = new SqliteBlob(connection, "logs", "bytes", logId);
        using FileStream source = System.IO.File.OpenRead(file);
        using var hash = System.Security.Cryptography.IncrementalHash.CreateHash(System.Security.Cryptography.HashAlgorithmName.SHA256);
        byte[] block = new byte[1 << 16];
        long copied = 0;
        int got;
        while ((got = source.Read(block, 0, block.Length)) > 0 && copied + got <= length)
        {
            blob.Write(block, 0, got);
            hash.AppendData(block, 0, got);
            copied += got;
        }

        if (copied != length || got > 0 || Convert.ToHexStringLower(hash.GetHashAndReset()) != sha256)
        {
            throw new ArchiveException($"{file} changed while it was being filed: import it again");
        }
    }

    /// <summary>The raw bytes of a log, exactly as filed, as a read-only stream over the stored
    /// blob: a long log is read a block at a time, never held whole. Dispose it before the
    /// archive is closed.</summary>
    /// <exception cref="ArchiveException">No such log.</exception>
    /// <remarks>Opened without a command, so it may be read inside a transaction of the archive.</remarks>
    public Stream OpenLog(long logId)
    {
        try
        {
            return new SqliteBlob(connection, "logs", "bytes", logId, readOnly: true);
        }
        catch (SqliteException e)
        {
            throw new ArchiveException($"no log {logId}: {e.Message}");
        }
    }

    /// <summary>The raw bytes of a log, exactly as filed.</summary>
    /// <exception cref="ArchiveException">No such log.</exception>
    public byte[] LogBytes(long logId) =>
        Scalar("SELECT bytes FROM logs WHERE id = $id", null, ("$id", logId)) as byte[] ?? throw new ArchiveException($"no log {logId}");

    private void AddResult(long runId, AnalysedRun run, string toolVersion, SqliteTransaction transaction)
    {
        string reasons = run.Report?.Verdict is { } v ? string.Join(",", v.Reasons.Select(r => r.Code)) : "";
        long resultId = Convert.ToInt64(Scalar(
            """
            INSERT INTO results (run_id, tool_version, analysed_at, verdict, reasons, failure)
            VALUES ($run, $tool, $at, $verdict, $reasons, $failure) RETURNING id
            """,
            transaction,
            ("$run", runId), ("$tool", toolVersion), ("$at", Now()), ("$verdict", run.Verdict), ("$reasons", reasons), ("$failure", run.Failure)));
        if (run.Report is { } report)
        {
            Execute("INSERT INTO reports (result_id, json) VALUES ($r, $json)", transaction, ("$r", resultId), ("$json", JsonSerializer.Serialize(report, ReportJson.Options)));
            using SqliteCommand insert = Command(
                "INSERT INTO figures (result_id, figure, standstill, standstill_sigma, rollout, rollout_sigma) VALUES ($r, $f, $s, $ss, $o, $os)",
                transaction);
            SqliteParameter figure = insert.Parameters.Add("$f", SqliteType.Text);
            SqliteParameter standstill = insert.Parameters.Add("$s", SqliteType.Real);
            SqliteParameter standstillSigma = insert.Parameters.Add("$ss", SqliteType.Real);
            SqliteParameter rollout = insert.Parameters.Add("$o", SqliteType.Real);
            SqliteParameter rolloutSigma = insert.Parameters.Add("$os", SqliteType.Real);
            insert.Parameters.AddWithValue("$r", resultId);
            foreach (BoardFigure f in BoardFigures.All)
            {
                if (f.Read(report) is not { } value)
                {
                    continue;
                }

                figure.Value = f.Code;
                standstill.Value = (object?)value.Standstill ?? DBNull.Value;
                standstillSigma.Value = (object?)value.StandstillSigma ?? DBNull.Value;
                rollout.Value = (object?)value.Rollout ?? DBNull.Value;
                rolloutSigma.Value = (object?)value.RolloutSigma ?? DBNull.Value;
                insert.ExecuteNonQuery();
            }
        }

        Execute("UPDATE runs SET result_id = $r WHERE id = $run", transaction, ("$r", resultId), ("$run", runId));
    }
}
