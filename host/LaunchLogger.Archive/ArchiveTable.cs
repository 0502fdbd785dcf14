namespace LaunchLogger.Archive;

/// <summary>Rows read from the archive for listing and export: named columns (snake_case,
/// units in the name) and values (text, integers, reals or null).</summary>
public sealed class ArchiveTable
{
    /// <summary>A table with these columns and no rows yet.</summary>
    public ArchiveTable(IReadOnlyList<string> columns) => Columns = columns;

    /// <summary>The column names.</summary>
    public IReadOnlyList<string> Columns { get; }

    /// <summary>The rows; each has one value per column.</summary>
    public List<object?[]> Rows { get; } = [];

    /// <summary>The rows as name → value maps (for JSON).</summary>
    public IEnumerable<Dictionary<string, object?>> AsObjects() =>
        Rows.Select(r => Columns.Select((c, i) => (c, r[i])).ToDictionary(p => p.c, p => p.Item2));
}
