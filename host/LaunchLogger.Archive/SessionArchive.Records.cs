using System.Globalization;
using LaunchLogger.Archive.Records;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Corrections;
using Microsoft.Data.Sqlite;

namespace LaunchLogger.Archive;

// Named records: venues, events, classes, drivers, cars, and the cars' versioned settings.
public sealed partial class SessionArchive
{
    /// <summary>Adds a record.</summary>
    /// <param name="kind">What kind.</param>
    /// <param name="name">Its name, unique within the kind (case-insensitive).</param>
    /// <param name="fields">Field values by field name; absent or null fields stay empty.</param>
    /// <returns>The new record's id.</returns>
    /// <exception cref="ArchiveException">The name is taken, a required field is missing, a value is malformed or names nothing.</exception>
    public long AddRecord(RecordKind kind, string name, IReadOnlyDictionary<string, string?> fields)
    {
        ArgumentNullException.ThrowIfNull(kind);
        name = CheckName(kind, name);
        if (FindId(kind, name) is not null)
        {
            throw new ArchiveException($"{kind.WithArticle} named '{name}' exists already; change it with `{kind.Noun} edit`");
        }

        foreach (RecordField required in kind.Fields.Where(f => f.Required))
        {
            if (!fields.TryGetValue(required.Name, out string? v) || string.IsNullOrWhiteSpace(v))
            {
                throw new ArchiveException($"{kind.WithArticle} needs --{required.Name}");
            }
        }

        var values = Resolve(kind, fields);
        string columns = string.Join(", ", values.Select(v => v.Column).Prepend("name"));
        string parameters = string.Join(", ", values.Select((_, i) => $"$p{i}").Prepend("$name"));
        return Convert.ToInt64(Scalar(
            $"INSERT INTO {kind.Table} ({columns}) VALUES ({parameters}) RETURNING id",
            null,
            [("$name", name), .. values.Select((v, i) => ($"$p{i}", v.Value))]));
    }

    /// <summary>Changes fields of a record (and its name, with a "name" entry); fields given as
    /// empty text are cleared.</summary>
    /// <exception cref="ArchiveException">No such record, or a value is malformed or names nothing.</exception>
    public void EditRecord(RecordKind kind, string name, IReadOnlyDictionary<string, string?> fields)
    {
        ArgumentNullException.ThrowIfNull(kind);
        long id = RequireId(kind, name);
        var values = Resolve(kind, fields);
        if (fields.TryGetValue("name", out string? rename) && rename is not null)
        {
            rename = CheckName(kind, rename);
            if (FindId(kind, rename) is { } other && other != id)
            {
                throw new ArchiveException($"{kind.WithArticle} named '{rename}' exists already");
            }

            values.Insert(0, ("name", rename));
        }

        if (values.Count == 0)
        {
            return;
        }

        foreach (RecordField required in kind.Fields.Where(f => f.Required))
        {
            if (values.Any(v => v.Column == required.Column && v.Value is null))
            {
                throw new ArchiveException($"--{required.Name} cannot be cleared");
            }
        }

        string sets = string.Join(", ", values.Select((v, i) => $"{v.Column} = $p{i}"));
        Execute($"UPDATE {kind.Table} SET {sets} WHERE id = $id", null,
            [("$id", id), .. values.Select((v, i) => ($"$p{i}", v.Value))]);
    }

    /// <summary>Every record of a kind, by name, references shown as names.</summary>
    public ArchiveTable ListRecords(RecordKind kind) => QueryRecords(kind, null);

    /// <summary>One record by name.</summary>
    /// <exception cref="ArchiveException">No such record.</exception>
    public ArchiveTable ShowRecord(RecordKind kind, string name) => QueryRecords(kind, RequireId(kind, name));

    /// <summary>The id of the record named <paramref name="name"/>, or null.</summary>
    public long? FindId(RecordKind kind, string name)
    {
        ArgumentNullException.ThrowIfNull(kind);
        return Scalar($"SELECT id FROM {kind.Table} WHERE name = $name", null, ("$name", name.Trim())) is { } v ? Convert.ToInt64(v) : null;
    }

    /// <summary>The id of the record named <paramref name="name"/>.</summary>
    /// <exception cref="ArchiveException">No such record.</exception>
    public long RequireId(RecordKind kind, string name) =>
        FindId(kind, name) ?? throw new ArchiveException($"no {kind.Noun} named '{name}' (add it with `{kind.Noun} add`)");

    /// <summary>Records a new version of a car's pickup, tyre and calibration settings: what is
    /// not given is carried over from the previous version.</summary>
    /// <param name="car">The car's name.</param>
    /// <param name="change">What changes.</param>
    /// <returns>The new version number.</returns>
    /// <exception cref="ArchiveException">No such car, or a value is out of range.</exception>
    public int AddCarSettings(string car, CarSettingsChange change)
    {
        ArgumentNullException.ThrowIfNull(change);
        long carId = RequireId(RecordKind.Car, car);
        if (change.PulsesPerRevolution is < 1 or > 100_000)
        {
            throw new ArchiveException("--pulses-per-rev must be from 1 to 100000");
        }

        if (change.CircumferenceM is { } c && !(c > 0.3 && c < 10))
        {
            throw new ArchiveException("--circumference-m must be more than 0.3 and less than 10 m");
        }

        using SqliteTransaction transaction = connection.BeginTransaction();
        long? calibrationId = null;
        if (change.Calibration is { } calibration)
        {
            calibrationId = Convert.ToInt64(Scalar(
                "INSERT INTO calibrations (car_id, added_at, source, settings_json) VALUES ($car, $at, $source, $json) RETURNING id",
                transaction, ("$car", carId), ("$at", Now()), ("$source", change.CalibrationSource), ("$json", CalibrationFile.ToJson(calibration))));
        }

        int version = Convert.ToInt32(Scalar("SELECT coalesce(max(version), 0) + 1 FROM car_settings WHERE car_id = $car", transaction, ("$car", carId)));
        Execute(
            """
            INSERT INTO car_settings (car_id, version, added_at, pickup, pulses_per_rev, tyre, circumference_m, calibration_id)
            SELECT $car, $version, $at,
                   coalesce($pickup, p.pickup), coalesce($ppr, p.pulses_per_rev), coalesce($tyre, p.tyre),
                   coalesce($circ, p.circumference_m), coalesce($cal, p.calibration_id)
            FROM (SELECT 1) LEFT JOIN car_settings p ON p.car_id = $car AND p.version = $version - 1
            """,
            transaction,
            ("$car", carId), ("$version", version), ("$at", Now()), ("$pickup", change.Pickup), ("$ppr", change.PulsesPerRevolution),
            ("$tyre", change.Tyre), ("$circ", change.CircumferenceM), ("$cal", calibrationId));
        transaction.Commit();
        return version;
    }

    /// <summary>Every settings version of a car, oldest first.</summary>
    /// <exception cref="ArchiveException">No such car.</exception>
    public ArchiveTable CarSettingsHistory(string car)
    {
        long carId = RequireId(RecordKind.Car, car);
        return Query(
            """
            SELECT s.version, s.added_at, s.pickup, s.pulses_per_rev, s.tyre, s.circumference_m,
                   s.calibration_id, c.source AS calibration_source
            FROM car_settings s LEFT JOIN calibrations c ON c.id = s.calibration_id
            WHERE s.car_id = $car ORDER BY s.version
            """,
            ("$car", carId));
    }

    /// <summary>The current settings version of a car: its id and the calibration it carries.</summary>
    internal (long? SettingsId, CalibrationSettings? Calibration) CurrentCarSettings(long carId, SqliteTransaction? transaction = null)
    {
        long? settingsId = Scalar("SELECT id FROM car_settings WHERE car_id = $car ORDER BY version DESC LIMIT 1", transaction, ("$car", carId)) is { } v
            ? Convert.ToInt64(v)
            : null;
        return (settingsId, SettingsCalibration(settingsId, transaction));
    }

    /// <summary>The calibration of a car settings version; the owner's measured circumference
    /// stands in when the calibration gives none.</summary>
    internal CalibrationSettings? SettingsCalibration(long? settingsId, SqliteTransaction? transaction = null)
    {
        if (settingsId is null)
        {
            return null;
        }

        using SqliteCommand command = Command(
            "SELECT c.settings_json, s.circumference_m FROM car_settings s LEFT JOIN calibrations c ON c.id = s.calibration_id WHERE s.id = $id",
            transaction, ("$id", settingsId));
        using SqliteDataReader reader = command.ExecuteReader();
        if (!reader.Read())
        {
            return null;
        }

        CalibrationSettings? calibration = reader.IsDBNull(0) ? null : System.Text.Json.JsonSerializer.Deserialize<CalibrationSettings>(reader.GetString(0), CalibrationFile.Options);
        if (!reader.IsDBNull(1) && calibration?.CircumferenceM is null)
        {
            calibration = (calibration ?? new CalibrationSettings()) with { CircumferenceM = reader.GetDouble(1) };
        }

        return calibration;
    }

    /// <summary>Runs any query into a table (columns named as the query names them).</summary>
    internal ArchiveTable Query(string sql, params (string Name, object? Value)[] parameters)
    {
        using SqliteCommand command = Command(sql, null, parameters);
        using SqliteDataReader reader = command.ExecuteReader();
        var table = new ArchiveTable(Enumerable.Range(0, reader.FieldCount).Select(reader.GetName).ToList());
        while (reader.Read())
        {
            object?[] row = new object?[reader.FieldCount];
            for (int i = 0; i < row.Length; i++)
            {
                row[i] = reader.IsDBNull(i) ? null : reader.GetValue(i);
            }

            table.Rows.Add(row);
        }

        return table;
    }

    private ArchiveTable QueryRecords(RecordKind kind, long? id)
    {
        var select = new List<string> { "t.id", "t.name" };
        var joins = new List<string>();
        foreach (RecordField f in kind.Fields)
        {
            if (f.Kind == FieldKind.Reference)
            {
                string alias = "r_" + f.Name;
                joins.Add($"LEFT JOIN {f.Referenced!.Table} {alias} ON {alias}.id = t.{f.Column}");
                select.Add($"{alias}.name AS {f.Name}");
            }
            else
            {
                select.Add($"t.{f.Column} AS {f.Name}");
            }
        }

        if (kind == RecordKind.Event)
        {
            select.Add("(SELECT count(*) FROM runs WHERE event_id = t.id) AS runs");
        }
        else if (kind == RecordKind.Car)
        {
            select.Add("(SELECT max(version) FROM car_settings WHERE car_id = t.id) AS settings_version");
            select.Add("(SELECT count(*) FROM runs WHERE car_id = t.id) AS runs");
        }
        else if (kind == RecordKind.Driver)
        {
            select.Add("(SELECT count(*) FROM runs WHERE driver_id = t.id) AS runs");
        }

        string where = id is null ? "" : "WHERE t.id = $id";
        string order = kind == RecordKind.Event ? "t.date, t.name" : "t.name";
        return Query($"SELECT {string.Join(", ", select)} FROM {kind.Table} t {string.Join(" ", joins)} {where} ORDER BY {order}", ("$id", id));
    }

    private List<(string Column, object? Value)> Resolve(RecordKind kind, IReadOnlyDictionary<string, string?> fields)
    {
        var values = new List<(string Column, object? Value)>();
        foreach ((string key, string? raw) in fields)
        {
            if (key == "name" || raw is null)
            {
                continue;
            }

            RecordField field = kind.Fields.FirstOrDefault(f => f.Name == key)
                ?? throw new ArchiveException($"{kind.WithArticle} has no field '{key}'");
            string text = raw.Trim();
            values.Add((field.Column, text.Length == 0 ? null : field.Kind switch
            {
                FieldKind.Date => CheckDate(text),
                FieldKind.Weather => CheckWeather(text),
                FieldKind.Reference => RequireId(field.Referenced!, text),
                _ => text,
            }));
        }

        return values;
    }

    private static string CheckName(RecordKind kind, string name)
    {
        string trimmed = (name ?? "").Trim();
        if (trimmed.Length == 0 || trimmed.Length > 200)
        {
            throw new ArchiveException($"{kind.WithArticle} needs a name of 1 to 200 characters");
        }

        return trimmed;
    }

    private static string CheckDate(string text) =>
        DateOnly.TryParseExact(text, "yyyy-MM-dd", CultureInfo.InvariantCulture, DateTimeStyles.None, out DateOnly date)
            ? date.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture)
            : throw new ArchiveException($"'{text}' is not a date as yyyy-MM-dd");

    private static string CheckWeather(string text)
    {
        try
        {
            Weather.Parse(text);
            return text;
        }
        catch (FormatException e)
        {
            throw new ArchiveException(e.Message);
        }
    }
}
