namespace LaunchLogger.Archive.Schema;

/// <summary>The archive's schema, as the ordered list of steps that build it. The file's
/// <c>PRAGMA user_version</c> is the number of steps applied; opening an older file applies the
/// rest, each in its own transaction, so a file is always at one whole version.</summary>
/// <remarks>Never edit a step that has shipped: add a new one. A file whose version is higher
/// than <see cref="Latest"/> was written by a newer tool and is refused rather than guessed at.</remarks>
internal static class Migrations
{
    /// <summary>The steps, in order; step n brings a file from version n-1 to n.</summary>
    public static IReadOnlyList<string> Steps { get; } =
    [
        // 1: the first schema.
        """
        CREATE TABLE venues (
            id          INTEGER PRIMARY KEY,
            name        TEXT NOT NULL UNIQUE COLLATE NOCASE,
            surface     TEXT,
            notes       TEXT
        );
        CREATE TABLE events (
            id          INTEGER PRIMARY KEY,
            name        TEXT NOT NULL UNIQUE COLLATE NOCASE,
            date        TEXT NOT NULL,
            venue_id    INTEGER REFERENCES venues(id),
            surface     TEXT,
            weather     TEXT,
            notes       TEXT
        );
        CREATE TABLE classes (
            id          INTEGER PRIMARY KEY,
            name        TEXT NOT NULL UNIQUE COLLATE NOCASE,
            description TEXT
        );
        CREATE TABLE drivers (
            id          INTEGER PRIMARY KEY,
            name        TEXT NOT NULL UNIQUE COLLATE NOCASE,
            club        TEXT,
            notes       TEXT
        );
        CREATE TABLE cars (
            id          INTEGER PRIMARY KEY,
            name        TEXT NOT NULL UNIQUE COLLATE NOCASE,
            model       TEXT,
            class_id    INTEGER REFERENCES classes(id),
            notes       TEXT
        );
        CREATE TABLE calibrations (
            id            INTEGER PRIMARY KEY,
            car_id        INTEGER NOT NULL REFERENCES cars(id),
            added_at      TEXT NOT NULL,
            source        TEXT,
            settings_json TEXT NOT NULL
        );
        CREATE TABLE car_settings (
            id              INTEGER PRIMARY KEY,
            car_id          INTEGER NOT NULL REFERENCES cars(id),
            version         INTEGER NOT NULL,
            added_at        TEXT NOT NULL,
            pickup          TEXT,
            pulses_per_rev  INTEGER,
            tyre            TEXT,
            circumference_m REAL,
            calibration_id  INTEGER REFERENCES calibrations(id),
            UNIQUE (car_id, version)
        );
        CREATE TABLE logs (
            id          INTEGER PRIMARY KEY,
            sha256      TEXT NOT NULL UNIQUE,
            source      TEXT NOT NULL,
            added_at    TEXT NOT NULL,
            byte_count  INTEGER NOT NULL,
            bytes       BLOB NOT NULL,
            link_gaps   TEXT
        );
        CREATE TABLE runs (
            id              INTEGER PRIMARY KEY,
            log_id          INTEGER NOT NULL REFERENCES logs(id),
            position        INTEGER NOT NULL,
            box_run         INTEGER NOT NULL,
            firmware        TEXT,
            source          TEXT NOT NULL,
            added_at        TEXT NOT NULL,
            event_id        INTEGER REFERENCES events(id),
            car_id          INTEGER REFERENCES cars(id),
            car_settings_id INTEGER REFERENCES car_settings(id),
            driver_id       INTEGER REFERENCES drivers(id),
            class_id        INTEGER REFERENCES classes(id),
            standing        TEXT NOT NULL DEFAULT 'counted' CHECK (standing IN ('counted', 'rerun', 'disqualified')),
            standing_reason TEXT,
            result_id       INTEGER,
            UNIQUE (log_id, position)
        );
        CREATE INDEX runs_event_class ON runs (event_id, class_id);
        CREATE INDEX runs_driver ON runs (driver_id);
        CREATE INDEX runs_car ON runs (car_id);
        CREATE TABLE results (
            id            INTEGER PRIMARY KEY,
            run_id        INTEGER NOT NULL REFERENCES runs(id),
            tool_version  TEXT NOT NULL,
            analysed_at   TEXT NOT NULL,
            verdict       TEXT NOT NULL CHECK (verdict IN ('valid', 'doubtful', 'invalid', 'failed')),
            reasons       TEXT NOT NULL,
            failure       TEXT
        );
        CREATE INDEX results_run ON results (run_id);
        -- The report entries apart from the results, so that the board's scan of results and
        -- figures never pages through kilobytes of JSON per run.
        CREATE TABLE reports (
            result_id     INTEGER PRIMARY KEY REFERENCES results(id),
            json          TEXT NOT NULL
        );
        CREATE TABLE figures (
            result_id        INTEGER NOT NULL REFERENCES results(id),
            figure           TEXT NOT NULL,
            standstill       REAL,
            standstill_sigma REAL,
            rollout          REAL,
            rollout_sigma    REAL,
            PRIMARY KEY (result_id, figure)
        ) WITHOUT ROWID;
        """,

        // 2: a run's fingerprint (the box's run number and opening time, hashed), so that a run
        // captured live and the same run read later from the card are one run; and how many
        // frames each copy lost, so the fuller copy can take over.
        """
        ALTER TABLE runs ADD COLUMN fingerprint TEXT;
        ALTER TABLE runs ADD COLUMN frames_lost INTEGER;
        CREATE INDEX runs_fingerprint ON runs (fingerprint);
        """,
    ];

    /// <summary>The schema version this tool writes.</summary>
    public static int Latest => Steps.Count;
}
