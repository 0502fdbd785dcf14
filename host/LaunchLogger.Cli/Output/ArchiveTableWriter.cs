using System.Globalization;
using System.Text.Json;
using CsvHelper;
using LaunchLogger.Archive;

namespace LaunchLogger.Cli.Output;

/// <summary>Writes archive rows as an aligned text table, CSV (RFC 4180, via CsvHelper) or JSON.</summary>
public static class ArchiveTableWriter
{
    /// <summary>JSON for archive output: snake_case, indented.</summary>
    public static JsonSerializerOptions JsonOptions { get; } = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
        WriteIndented = true,
    };

    /// <summary>An aligned table for people; reals to 3 decimals.</summary>
    public static void WriteText(ArchiveTable table, TextWriter output)
    {
        ArgumentNullException.ThrowIfNull(table);
        if (table.Rows.Count == 0)
        {
            output.WriteLine("(none)");
            return;
        }

        var cells = table.Rows.Select(r => r.Select(Cell).ToArray()).ToList();
        int[] widths = table.Columns.Select((c, i) => Math.Max(c.Length, cells.Max(r => r[i].Length))).ToArray();
        output.WriteLine(string.Join("  ", table.Columns.Select((c, i) => c.PadRight(widths[i]))).TrimEnd());
        foreach (string[] row in cells)
        {
            output.WriteLine(string.Join("  ", row.Select((c, i) => c.PadRight(widths[i]))).TrimEnd());
        }
    }

    /// <summary>One record as "name: value" lines, empty fields left out.</summary>
    public static void WriteRecord(ArchiveTable table, TextWriter output)
    {
        ArgumentNullException.ThrowIfNull(table);
        foreach (object?[] row in table.Rows)
        {
            int width = table.Columns.Max(c => c.Length);
            for (int i = 0; i < row.Length; i++)
            {
                if (row[i] is not null)
                {
                    output.WriteLine($"{table.Columns[i].PadRight(width)}  {Cell(row[i])}");
                }
            }
        }
    }

    /// <summary>CSV with a header row; reals at full precision.</summary>
    public static void WriteCsv(ArchiveTable table, TextWriter output)
    {
        ArgumentNullException.ThrowIfNull(table);
        using CsvWriter csv = CsvWriter.Create(output, null, leaveOpen: true);
        csv.WriteRecord(table.Columns.ToArray());
        foreach (object?[] row in table.Rows)
        {
            csv.WriteRecord(row.Select(value => value switch
            {
                null => "",
                double d => d.ToString("R", CultureInfo.InvariantCulture),
                IFormattable f => f.ToString(null, CultureInfo.InvariantCulture),
                _ => value.ToString() ?? "",
            }).ToArray());
        }

        csv.Flush();
    }

    /// <summary>A JSON array of objects, one per row.</summary>
    public static void WriteJson(ArchiveTable table, TextWriter output)
    {
        ArgumentNullException.ThrowIfNull(table);
        output.WriteLine(JsonSerializer.Serialize(table.AsObjects(), JsonOptions));
    }

    private static string Cell(object? value) => value switch
    {
        null => "",
        double d => d.ToString("0.000", CultureInfo.InvariantCulture),
        IFormattable f => f.ToString(null, CultureInfo.InvariantCulture),
        _ => value.ToString() ?? "",
    };
}
