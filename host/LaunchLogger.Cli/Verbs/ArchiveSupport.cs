using System.CommandLine;
using LaunchLogger.Archive;
using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding.Import;

namespace LaunchLogger.Cli.Verbs;

/// <summary>What the archive verbs share: the <c>--archive</c> option, opening the file, turning
/// failures into one line and an exit code, and writing tables.</summary>
internal static class ArchiveSupport
{
    /// <summary>A new <c>--archive FILE</c> option (every verb has its own instance).</summary>
    public static Option<FileInfo?> ArchiveOption() => new("--archive")
    {
        Description = $"The archive file (default: ${ArchiveLocation.EnvironmentVariable}, else {ArchiveLocation.Default}); created on first use.",
    };

    /// <summary>A new <c>--json</c> option.</summary>
    public static Option<bool> JsonOption() => new("--json") { Description = "Write the output as JSON." };

    /// <summary>The archive path an option gave, or the default.</summary>
    public static string PathOf(FileInfo? archive) => archive?.FullName ?? ArchiveLocation.Default;

    /// <summary>Opens the archive and runs <paramref name="work"/>; archive, input and usage
    /// failures become one line on <paramref name="error"/> and an exit code.</summary>
    public static ExitCode With(string? archivePath, string verb, TextWriter error, Func<SessionArchive, ExitCode> work) =>
        With(archivePath, verb, error, work, readOnly: false);

    /// <summary>As <see cref="With(string?, string, TextWriter, Func{SessionArchive, ExitCode})"/>,
    /// opening an existing archive for reading only when <paramref name="readOnly"/> (nothing
    /// created, nothing written).</summary>
    public static ExitCode With(string? archivePath, string verb, TextWriter error, Func<SessionArchive, ExitCode> work, bool readOnly)
    {
        try
        {
            string path = archivePath ?? ArchiveLocation.Default;
            using SessionArchive archive = readOnly ? SessionArchive.OpenReadOnly(path) : SessionArchive.Open(path);
            return work(archive);
        }
        catch (ArchiveException e)
        {
            error.WriteLine($"launchlogger {verb}: {e.Message}");
            return ExitCode.BadInput;
        }
        catch (InputException e)
        {
            error.WriteLine($"launchlogger {verb}: {e.Message}");
            return ExitCode.BadInput;
        }
        catch (UsageException e)
        {
            error.WriteLine($"launchlogger {verb}: {e.Message}");
            return ExitCode.Usage;
        }
        catch (OperationCanceledException)
        {
            error.WriteLine($"launchlogger {verb}: stopped; everything filed before stays filed");
            return ExitCode.Cancelled;
        }
        catch (IOException e)
        {
            error.WriteLine($"launchlogger {verb}: {e.Message}");
            return ExitCode.BadInput;
        }
        catch (UnauthorizedAccessException e)
        {
            error.WriteLine($"launchlogger {verb}: {e.Message}");
            return ExitCode.BadInput;
        }
    }

    /// <summary>Writes one text file whole or not at all (<see cref="AtomicFile"/>), UTF-8 without a byte-order mark.</summary>
    public static void WriteText(FileInfo file, string text, CancellationToken cancel = default) =>
        AtomicFile.WriteAll([(file.FullName, stream =>
        {
            using var writer = new StreamWriter(stream, new System.Text.UTF8Encoding(false), leaveOpen: true);
            writer.Write(text);
        })], cancel);

    /// <summary>Writes a table as text, or JSON when asked.</summary>
    public static void Write(ArchiveTable table, bool json, TextWriter output)
    {
        if (json)
        {
            ArchiveTableWriter.WriteJson(table, output);
        }
        else
        {
            ArchiveTableWriter.WriteText(table, output);
        }
    }

    /// <summary>Exports a table as CSV or JSON to a file (written whole or not at all) or to the output.</summary>
    /// <exception cref="UsageException">An unknown format.</exception>
    public static void Export(ArchiveTable table, string format, FileInfo? file, TextWriter output)
    {
        Action<TextWriter> write = format.ToLowerInvariant() switch
        {
            "csv" => w => ArchiveTableWriter.WriteCsv(table, w),
            "json" => w => ArchiveTableWriter.WriteJson(table, w),
            _ => throw new UsageException($"--format {format}: give csv or json"),
        };
        if (file is null)
        {
            write(output);
            return;
        }

        AtomicFile.WriteAll([(file.FullName, stream =>
        {
            using var writer = new StreamWriter(stream, new System.Text.UTF8Encoding(false), leaveOpen: true);
            write(writer);
        })]);
        output.WriteLine($"wrote {table.Rows.Count} row(s) to {file.FullName}");
    }

    /// <summary>A new <c>--format csv|json</c> option.</summary>
    public static Option<string> FormatOption() => new("--format") { Description = "csv or json.", DefaultValueFactory = _ => "csv" };

    /// <summary>A new <c>--out FILE</c> option for exports.</summary>
    public static Option<FileInfo?> ExportFileOption() => new("--out") { Description = "Write the export to this file (default: standard output)." };
}
