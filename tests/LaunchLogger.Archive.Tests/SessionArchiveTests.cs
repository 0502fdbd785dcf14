using LaunchLogger.Archive.Records;
using LaunchLogger.Archive.Tests.Support;
using Microsoft.Data.Sqlite;

namespace LaunchLogger.Archive.Tests;

public class SessionArchiveTests
{
    [Fact]
    public void A_new_archive_is_at_the_latest_schema_in_wal_mode_with_foreign_keys_on()
    {
        using var temp = new TempFolder();
        string path = temp.File("sub/folder/a.db");
        using (SessionArchive archive = SessionArchive.Open(path))
        {
            Assert.Equal(SessionArchive.LatestSchemaVersion, archive.SchemaVersion);
            Assert.Equal("ok", archive.IntegrityCheck());
        }

        using var check = new SqliteConnection($"Data Source={path};Foreign Keys=True;Pooling=False");
        check.Open();
        using SqliteCommand mode = check.CreateCommand();
        mode.CommandText = "PRAGMA journal_mode";
        Assert.Equal("wal", mode.ExecuteScalar());

        // Foreign keys hold: a run cannot point at a log that does not exist.
        using SqliteCommand orphan = check.CreateCommand();
        orphan.CommandText = "INSERT INTO runs (log_id, position, box_run, source, added_at) VALUES (999, 1, 1, 'x', 'now')";
        Assert.Throws<SqliteException>(() => orphan.ExecuteNonQuery());
    }

    [Fact]
    public void Reopening_keeps_what_was_added_and_does_not_migrate_again()
    {
        using var temp = new TempFolder();
        string path = temp.File("a.db");
        using (SessionArchive archive = SessionArchive.Open(path))
        {
            archive.AddRecord(RecordKind.Class, "Street", new Dictionary<string, string?>());
        }

        using SessionArchive again = SessionArchive.Open(path);
        Assert.NotNull(again.FindId(RecordKind.Class, "street"));
        Assert.Equal(SessionArchive.LatestSchemaVersion, again.SchemaVersion);
    }

    [Fact]
    public void A_file_from_a_newer_tool_is_refused_not_guessed_at()
    {
        using var temp = new TempFolder();
        string path = temp.File("a.db");
        SessionArchive.Open(path).Dispose();
        using (var raw = new SqliteConnection($"Data Source={path};Pooling=False"))
        {
            raw.Open();
            using SqliteCommand bump = raw.CreateCommand();
            bump.CommandText = $"PRAGMA user_version = {SessionArchive.LatestSchemaVersion + 1}";
            bump.ExecuteNonQuery();
        }

        var e = Assert.Throws<ArchiveException>(() => SessionArchive.Open(path));
        Assert.Contains("newer", e.Message);
    }

    [Fact]
    public void Another_sqlite_file_is_not_taken_for_an_archive()
    {
        using var temp = new TempFolder();
        string path = temp.File("other.db");
        using (var raw = new SqliteConnection($"Data Source={path};Pooling=False"))
        {
            raw.Open();
            using SqliteCommand create = raw.CreateCommand();
            create.CommandText = "CREATE TABLE t (x)";
            create.ExecuteNonQuery();
        }

        var e = Assert.Throws<ArchiveException>(() => SessionArchive.Open(path));
        Assert.Contains("not a launchlogger archive", e.Message);
    }

    [Fact]
    public void Records_need_unique_names_required_fields_and_known_references()
    {
        using var temp = new TempFolder();
        using SessionArchive archive = SessionArchive.Open(temp.File("a.db"));
        archive.AddRecord(RecordKind.Venue, "Marsh Lane strip", new Dictionary<string, string?> { ["surface"] = "concrete" });
        Assert.Contains("exists already", Assert.Throws<ArchiveException>(() => archive.AddRecord(RecordKind.Venue, "marsh lane STRIP", new Dictionary<string, string?>())).Message);
        Assert.Contains("--date", Assert.Throws<ArchiveException>(() => archive.AddRecord(RecordKind.Event, "Spring sprint", new Dictionary<string, string?>())).Message);
        Assert.Contains("yyyy-MM-dd", Assert.Throws<ArchiveException>(() => archive.AddRecord(RecordKind.Event, "Spring sprint", new Dictionary<string, string?> { ["date"] = "12/04/2026" })).Message);
        Assert.Contains("no venue named", Assert.Throws<ArchiveException>(() => archive.AddRecord(RecordKind.Event, "Spring sprint", new Dictionary<string, string?> { ["date"] = "2026-04-12", ["venue"] = "Nowhere" })).Message);
        Assert.Throws<ArchiveException>(() => archive.AddRecord(RecordKind.Event, "Spring sprint", new Dictionary<string, string?> { ["date"] = "2026-04-12", ["weather"] = "hot" }));

        archive.AddRecord(RecordKind.Event, "Spring sprint", new Dictionary<string, string?> { ["date"] = "2026-04-12", ["venue"] = "Marsh Lane strip", ["weather"] = "18.5,1008,62" });
        archive.EditRecord(RecordKind.Event, "Spring sprint", new Dictionary<string, string?> { ["surface"] = "damp", ["name"] = "Spring sprint day" });
        ArchiveTable shown = archive.ShowRecord(RecordKind.Event, "spring sprint day");
        var row = shown.AsObjects().Single();
        Assert.Equal("Spring sprint day", row["name"]);
        Assert.Equal("Marsh Lane strip", row["venue"]);
        Assert.Equal("damp", row["surface"]);
        Assert.Equal("2026-04-12", row["date"]);
    }

    [Fact]
    public void Car_settings_are_versioned_and_carry_over_what_does_not_change()
    {
        using var temp = new TempFolder();
        using SessionArchive archive = SessionArchive.Open(temp.File("a.db"));
        archive.AddRecord(RecordKind.Car, "Blue hatch", new Dictionary<string, string?>());
        Assert.Equal(1, archive.AddCarSettings("Blue hatch", new CarSettingsChange { PulsesPerRevolution = 48, Tyre = "195/55 R16" }));
        Assert.Equal(2, archive.AddCarSettings("Blue hatch", new CarSettingsChange { Tyre = "205/50 R16", CircumferenceM = 1.92 }));
        Assert.Throws<ArchiveException>(() => archive.AddCarSettings("Blue hatch", new CarSettingsChange { CircumferenceM = 40 }));

        var versions = archive.CarSettingsHistory("Blue hatch").AsObjects().ToList();
        Assert.Equal(2, versions.Count);
        Assert.Equal("195/55 R16", versions[0]["tyre"]);
        Assert.Equal("205/50 R16", versions[1]["tyre"]);
        Assert.Equal(48L, versions[1]["pulses_per_rev"]);
        Assert.Equal(1.92, versions[1]["circumference_m"]);
    }
}
