using System.CommandLine;
using LaunchLogger.Archive;
using LaunchLogger.Archive.Records;
using LaunchLogger.Decoding.Calibration;

namespace LaunchLogger.Cli.Verbs;

/// <summary>The add, list, show, edit and export sub-verbs every named record kind has (events,
/// venues, cars, drivers, classes), built from the kind's field list.</summary>
internal static class RecordVerbs
{
    /// <summary>Builds <c>launchlogger NOUN add|list|show|edit|export</c>.</summary>
    public static Command Create(RecordKind kind)
    {
        return new Command(kind.Noun, kind.Description)
        {
            AddVerb(kind),
            ListVerb(kind),
            ShowVerb(kind),
            EditVerb(kind),
            ExportVerb(kind),
        };
    }

    /// <summary>Adds a record (and, for a car, its first settings version).</summary>
    public static ExitCode Add(string? archivePath, RecordKind kind, string name, IReadOnlyDictionary<string, string?> fields, CarSettingsChange? settings, bool json, TextWriter output, TextWriter error) =>
        ArchiveSupport.With(archivePath, $"{kind.Noun} add", error, archive =>
        {
            long id = archive.AddRecord(kind, name, fields);
            if (settings is { IsEmpty: false })
            {
                archive.AddCarSettings(name, settings);
            }

            if (json)
            {
                ArchiveSupport.Write(archive.ShowRecord(kind, name), true, output);
            }
            else
            {
                output.WriteLine($"added {kind.Noun} '{name.Trim()}' (id {id})");
            }

            return ExitCode.Ok;
        });

    /// <summary>Changes a record (and, for a car, records a new settings version when settings change).</summary>
    public static ExitCode Edit(string? archivePath, RecordKind kind, string name, IReadOnlyDictionary<string, string?> fields, CarSettingsChange? settings, TextWriter output, TextWriter error) =>
        ArchiveSupport.With(archivePath, $"{kind.Noun} edit", error, archive =>
        {
            if (fields.Count == 0 && settings is null or { IsEmpty: true })
            {
                throw new UsageException("nothing to change: give at least one field");
            }

            archive.EditRecord(kind, name, fields);
            string current = fields.TryGetValue("name", out string? renamed) && renamed is not null ? renamed : name;
            if (settings is { IsEmpty: false })
            {
                int version = archive.AddCarSettings(current, settings);
                output.WriteLine($"{kind.Noun} '{current.Trim()}': settings version {version} recorded; runs filed from now on use it (older runs keep theirs)");
            }

            output.WriteLine($"changed {kind.Noun} '{current.Trim()}'");
            return ExitCode.Ok;
        });

    /// <summary>Lists every record of a kind.</summary>
    public static ExitCode List(string? archivePath, RecordKind kind, bool json, TextWriter output, TextWriter error) =>
        ArchiveSupport.With(archivePath, $"{kind.Noun} list", error, archive =>
        {
            ArchiveSupport.Write(archive.ListRecords(kind), json, output);
            return ExitCode.Ok;
        });

    /// <summary>Shows one record (a car with its settings versions).</summary>
    public static ExitCode Show(string? archivePath, RecordKind kind, string name, bool json, TextWriter output, TextWriter error) =>
        ArchiveSupport.With(archivePath, $"{kind.Noun} show", error, archive =>
        {
            ArchiveTable record = archive.ShowRecord(kind, name);
            ArchiveTable? history = kind == RecordKind.Car ? archive.CarSettingsHistory(name) : null;
            if (json)
            {
                var body = record.AsObjects().First();
                if (history is not null)
                {
                    body["settings"] = history.AsObjects().ToList();
                }

                output.WriteLine(System.Text.Json.JsonSerializer.Serialize(body, Output.ArchiveTableWriter.JsonOptions));
                return ExitCode.Ok;
            }

            Output.ArchiveTableWriter.WriteRecord(record, output);
            if (history is not null)
            {
                output.WriteLine();
                output.WriteLine("settings versions:");
                Output.ArchiveTableWriter.WriteText(history, output);
            }

            return ExitCode.Ok;
        });

    /// <summary>Exports every record of a kind as CSV or JSON.</summary>
    public static ExitCode Export(string? archivePath, RecordKind kind, string format, FileInfo? file, TextWriter output, TextWriter error) =>
        ArchiveSupport.With(archivePath, $"{kind.Noun} export", error, archive =>
        {
            ArchiveSupport.Export(archive.ListRecords(kind), format, file, output);
            return ExitCode.Ok;
        });

    private static Command AddVerb(RecordKind kind)
    {
        var name = new Argument<string>("name") { Description = $"The {kind.Noun}'s name (unique)." };
        var archive = ArchiveSupport.ArchiveOption();
        var json = ArchiveSupport.JsonOption();
        var fields = FieldOptions(kind);
        var settings = kind == RecordKind.Car ? new SettingsOptions() : null;
        var command = new Command("add", $"Add {kind.WithArticle}.") { name, archive, json };
        AddAll(command, fields.Values, settings);
        command.SetAction((parse, _) => Task.FromResult((int)Run(parse, settings, error =>
            Add(parse.GetValue(archive)?.FullName, kind, parse.GetValue(name)!, Values(parse, fields), settings?.Read(parse), parse.GetValue(json), parse.InvocationConfiguration.Output, error))));
        return command;
    }

    private static Command EditVerb(RecordKind kind)
    {
        var name = new Argument<string>("name") { Description = $"The {kind.Noun} to change." };
        var rename = new Option<string?>("--name") { Description = "A new name." };
        var archive = ArchiveSupport.ArchiveOption();
        var fields = FieldOptions(kind);
        var settings = kind == RecordKind.Car ? new SettingsOptions() : null;
        var command = new Command("edit", $"Change {kind.WithArticle}'s fields (an empty value clears one).") { name, rename, archive };
        AddAll(command, fields.Values, settings);
        command.SetAction((parse, _) => Task.FromResult((int)Run(parse, settings, error =>
        {
            var values = Values(parse, fields);
            if (parse.GetValue(rename) is { } newName)
            {
                values["name"] = newName;
            }

            return Edit(parse.GetValue(archive)?.FullName, kind, parse.GetValue(name)!, values, settings?.Read(parse), parse.InvocationConfiguration.Output, error);
        })));
        return command;
    }

    private static Command ListVerb(RecordKind kind)
    {
        var archive = ArchiveSupport.ArchiveOption();
        var json = ArchiveSupport.JsonOption();
        var command = new Command("list", $"List every {kind.Noun}.") { archive, json };
        command.SetAction((parse, _) => Task.FromResult((int)List(parse.GetValue(archive)?.FullName, kind, parse.GetValue(json), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error)));
        return command;
    }

    private static Command ShowVerb(RecordKind kind)
    {
        var name = new Argument<string>("name") { Description = $"The {kind.Noun}'s name." };
        var archive = ArchiveSupport.ArchiveOption();
        var json = ArchiveSupport.JsonOption();
        var command = new Command("show", $"Show one {kind.Noun}.") { name, archive, json };
        command.SetAction((parse, _) => Task.FromResult((int)Show(parse.GetValue(archive)?.FullName, kind, parse.GetValue(name)!, parse.GetValue(json), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error)));
        return command;
    }

    private static Command ExportVerb(RecordKind kind)
    {
        var archive = ArchiveSupport.ArchiveOption();
        var format = ArchiveSupport.FormatOption();
        var file = ArchiveSupport.ExportFileOption();
        var command = new Command("export", $"Export every {kind.Noun} as CSV or JSON.") { archive, format, file };
        command.SetAction((parse, _) => Task.FromResult((int)Export(parse.GetValue(archive)?.FullName, kind, parse.GetValue(format)!, parse.GetValue(file), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error)));
        return command;
    }

    private static Dictionary<RecordField, Option<string?>> FieldOptions(RecordKind kind) =>
        kind.Fields.ToDictionary(f => f, f => new Option<string?>("--" + f.Name) { Description = f.Description });

    private static Dictionary<string, string?> Values(ParseResult parse, Dictionary<RecordField, Option<string?>> fields) =>
        fields.Where(f => parse.GetResult(f.Value) is not null).ToDictionary(f => f.Key.Name, f => parse.GetValue(f.Value));

    private static void AddAll(Command command, IEnumerable<Option> options, SettingsOptions? settings)
    {
        foreach (Option option in options.Concat(settings?.All ?? []))
        {
            command.Options.Add(option);
        }
    }

    private static ExitCode Run(ParseResult parse, SettingsOptions? settings, Func<TextWriter, ExitCode> handler)
    {
        TextWriter error = parse.InvocationConfiguration.Error;
        try
        {
            return handler(error);
        }
        catch (LaunchLogger.Decoding.Import.InputException e)
        {
            error.WriteLine($"launchlogger: {e.Message}");
            return ExitCode.BadInput;
        }
    }

    /// <summary>A car's settings options.</summary>
    private sealed class SettingsOptions
    {
        public Option<string?> Pickup { get; } = new("--pickup") { Description = "The wheel-speed pickup, in words (which wheel, what target)." };

        public Option<int?> PulsesPerRev { get; } = new("--pulses-per-rev") { Description = "Pulses per wheel revolution." };

        public Option<string?> Tyre { get; } = new("--tyre") { Description = "The tyre, in words (size, pressure)." };

        public Option<double?> Circumference { get; } = new("--circumference-m") { Description = "Rolling circumference you measured, m (a calibration's value wins)." };

        public Option<FileInfo?> Settings { get; } = new("--settings") { Description = "Calibration settings file from `launchlogger calibrate`, applied to the car's runs." };

        public IEnumerable<Option> All => [Pickup, PulsesPerRev, Tyre, Circumference, Settings];

        /// <exception cref="LaunchLogger.Decoding.Import.InputException">The settings file is unusable.</exception>
        public CarSettingsChange Read(ParseResult parse)
        {
            FileInfo? file = parse.GetValue(Settings);
            return new CarSettingsChange
            {
                Pickup = parse.GetValue(Pickup),
                PulsesPerRevolution = parse.GetValue(PulsesPerRev),
                Tyre = parse.GetValue(Tyre),
                CircumferenceM = parse.GetValue(Circumference),
                Calibration = file is null ? null : CalibrationFile.Load(file.FullName),
                CalibrationSource = file?.Name,
            };
        }
    }
}
