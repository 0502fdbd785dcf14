namespace LaunchLogger.Archive.Records;

/// <summary>A kind of record the organiser keeps by name: venues, events, classes, drivers,
/// cars. One description serves adding, editing, listing, showing and exporting them all.</summary>
public sealed class RecordKind
{
    private RecordKind(string noun, string table, string description, params RecordField[] fields)
    {
        Noun = noun;
        Table = table;
        Description = description;
        Fields = fields;
    }

    /// <summary>The venues: where events are held.</summary>
    public static RecordKind Venue { get; } = new("venue", "venues", "Venues where events are held.",
        new RecordField("surface", "surface", FieldKind.Text, "Usual surface, e.g. prepared concrete."),
        new RecordField("notes", "notes", FieldKind.Text, "Anything else."));

    /// <summary>The classes cars compete in.</summary>
    public static RecordKind Class { get; } = new("class", "classes", "Classes cars are ranked in.",
        new RecordField("description", "description", FieldKind.Text, "What belongs in the class."));

    /// <summary>The drivers.</summary>
    public static RecordKind Driver { get; } = new("driver", "drivers", "Drivers.",
        new RecordField("club", "club", FieldKind.Text, "Club or team."),
        new RecordField("notes", "notes", FieldKind.Text, "Anything else."));

    /// <summary>The events (a day at a venue).</summary>
    public static RecordKind Event { get; } = new("event", "events", "Events: a day of runs at a venue.",
        new RecordField("date", "date", FieldKind.Date, "Date of the event, yyyy-MM-dd.", Required: true),
        new RecordField("venue", "venue_id", FieldKind.Reference, "Venue (add it first with `venue add`).", Venue),
        new RecordField("surface", "surface", FieldKind.Text, "Surface on the day, e.g. dry concrete."),
        new RecordField("weather", "weather", FieldKind.Weather, "Weather as T_C,P_hPa,RH_pct (station pressure), e.g. 18.5,1008,62; runs of the event get figures corrected to standard air."),
        new RecordField("notes", "notes", FieldKind.Text, "Anything else."));

    /// <summary>The cars; their pickup, tyre and calibration settings are versioned apart.</summary>
    public static RecordKind Car { get; } = new("car", "cars", "Cars, with their pickup, tyre and calibration settings (versioned).",
        new RecordField("model", "model", FieldKind.Text, "Make and model, as the owner describes it."),
        new RecordField("class", "class_id", FieldKind.Reference, "Class the car runs in (add it first with `class add`).", Class),
        new RecordField("notes", "notes", FieldKind.Text, "Anything else."));

    /// <summary>Every kind, in the order their verbs are listed.</summary>
    public static IReadOnlyList<RecordKind> All { get; } = [Event, Venue, Car, Driver, Class];

    /// <summary>The verb, e.g. "event".</summary>
    public string Noun { get; }

    /// <summary>The noun with its indefinite article, for messages: "an event", "a car".</summary>
    public string WithArticle => ("aeiou".Contains(Noun[0], StringComparison.Ordinal) ? "an " : "a ") + Noun;

    /// <summary>The archive table.</summary>
    public string Table { get; }

    /// <summary>For --help.</summary>
    public string Description { get; }

    /// <summary>Fields besides the name.</summary>
    public IReadOnlyList<RecordField> Fields { get; }
}
