using System.Globalization;
using CsvHelper;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Import;

/// <summary>One plain-text input table: comma separated, header required, '#' comment lines and
/// blank lines allowed, numbers in the invariant culture. Every problem becomes an
/// <see cref="InputException"/> naming the file and line.</summary>
/// <remarks>Tokenising is CsvHelper's (quoting, trimming, comments, byte order marks, line
/// counting that includes comment and blank lines, and the separator found from the first lines);
/// cell checks are ours, so that each message can name the column and say exactly what is wrong.
/// <para>A spreadsheet set to a language that writes a decimal comma exports ';' between cells
/// and "12,5" for twelve and a half. Such a file is read as it means: with ';' as the separator a
/// number's decimal mark may be a comma or a point, but one file uses one (the first number with
/// either decides), and a number holding both, or the other mark, is refused by name — so no
/// thousands separator is ever taken for a decimal mark. A tab- or '|'-separated table is read
/// with decimal points. In a comma-separated file a decimal comma cannot be told from a cell
/// boundary; the cell-count and number messages then say so.</para></remarks>
internal sealed class CsvTable : IDisposable
{
    private static readonly CsvReaderOptions Options = CsvReaderOptions.Default with
    {
        Separator = null,
        HasHeader = true,
        CommentPrefix = '#',
        SkipEmptyLines = true,
        TrimWhitespace = true,
        TrackLineNumbers = true,
        MalformedData = CsvMalformedDataHandling.Throw,
        FormatProvider = CultureInfo.InvariantCulture,
    };

    private static readonly NumberFormatInfo DecimalComma = new() { NumberDecimalSeparator = ",", NumberGroupSeparator = "\u00A0" };

    /// <summary>What a cell count or a number refused in a comma-separated file may mean.</summary>
    private const string DecimalCommaHint = "if the numbers are written with a decimal comma, write them with a decimal point, or separate the columns with ';' (a spreadsheet's own export does)";

    private readonly CsvReader reader;
    private double? firstTimeS;

    /// <summary>The decimal mark the file's numbers use: '.' unless the table is ';'-separated,
    /// where the first number with a mark decides; '\0' until then.</summary>
    private char decimalMark;

    private CsvTable(CsvReader reader, string file, IReadOnlyList<string> columns, int headerLine)
    {
        this.reader = reader;
        Separator = reader.Separator;
        decimalMark = Separator == ';' ? '\0' : '.';
        File = file;
        Columns = columns;
        HeaderLine = headerLine;
    }

    /// <summary>The file as the user named it.</summary>
    public string File { get; }

    /// <summary>The header's column names, as the file spells them.</summary>
    public IReadOnlyList<string> Columns { get; }

    /// <summary>The separator between cells, as found from the file's first lines.</summary>
    public char Separator { get; }

    /// <summary>The header's line.</summary>
    public int HeaderLine { get; }

    /// <summary>The current row's line.</summary>
    public int Line => (int)reader.LineNumber;

    /// <summary>Data rows read so far.</summary>
    public int Rows { get; private set; }

    /// <summary>Opens a table and checks its header against the accepted forms (matched ignoring
    /// case and spaces around names).</summary>
    /// <exception cref="InputException">No header, or not one of the accepted forms.</exception>
    public static CsvTable Open(TextReader text, string file, params string[][] acceptedHeaders)
    {
        CsvReader reader = CsvReader.Create(text, Options, leaveOpen: false);
        try
        {
            Wrap(file, () => reader.ReadHeader());
            IReadOnlyList<string> header = reader.Headers;
            string expected = string.Join(" or ", acceptedHeaders.Select(h => "'" + string.Join(',', h) + "'"));
            if (header.Count == 0)
            {
                throw new InputException(file, 0, $"no header line: expected {expected}");
            }

            bool matches = acceptedHeaders.Any(h => h.Length == header.Count
                && h.Zip(header).All(p => string.Equals(p.First, p.Second.Trim(), StringComparison.OrdinalIgnoreCase)));
            if (!matches)
            {
                throw new InputException(file, (int)reader.LineNumber, $"wrong header '{string.Join(',', header)}': expected {expected}");
            }

            return new CsvTable(reader, file, header.Select(h => h.Trim().ToLowerInvariant()).ToArray(), (int)reader.LineNumber);
        }
        catch
        {
            reader.Dispose();
            throw;
        }
    }

    /// <summary>Opens a table whose header may hold any columns, as long as it names every one
    /// of <paramref name="required"/> (matched ignoring case and spaces around names).</summary>
    /// <exception cref="InputException">No header, or a required column missing.</exception>
    public static CsvTable OpenNamed(TextReader text, string file, IReadOnlyCollection<string> required)
    {
        CsvReader reader = CsvReader.Create(text, Options, leaveOpen: false);
        try
        {
            Wrap(file, () => reader.ReadHeader());
            string[] header = reader.Headers.Select(h => h.Trim().ToLowerInvariant()).ToArray();
            if (header.Length == 0)
            {
                throw new InputException(file, 0, $"no header line: expected columns {string.Join(',', required)}");
            }

            foreach (string name in required)
            {
                if (Array.IndexOf(header, name.Trim().ToLowerInvariant()) < 0)
                {
                    throw new InputException(file, (int)reader.LineNumber, $"no column '{name}' in the header '{string.Join(',', reader.Headers)}'");
                }
            }

            return new CsvTable(reader, file, header, (int)reader.LineNumber);
        }
        catch
        {
            reader.Dispose();
            throw;
        }
    }

    /// <summary>The index of the column named <paramref name="name"/> (ignoring case), or -1.</summary>
    public int ColumnIndex(string name) => Array.IndexOf(Columns.ToArray(), name.Trim().ToLowerInvariant());

    /// <summary>Moves to the next data row and checks it has one cell per column.</summary>
    /// <exception cref="InputException">Malformed quoting or a wrong number of cells.</exception>
    public bool Read()
    {
        bool more = false;
        Wrap(File, () => more = reader.Read());
        if (!more)
        {
            return false;
        }

        Rows++;
        if (reader.FieldCount != Columns.Count)
        {
            throw Error($"expected {Columns.Count} cell(s) ({string.Join(Separator, Columns)}), found {reader.FieldCount}" + (Separator == ',' && reader.FieldCount > Columns.Count ? $"; {DecimalCommaHint}" : ""));
        }

        return true;
    }

    /// <summary>The cell of <paramref name="column"/> as a finite number.</summary>
    /// <exception cref="InputException">Empty, not a number, or not finite.</exception>
    public double Number(int column)
    {
        string text = Cell(column);
        if (!double.TryParse(text, NumberStyles.Float, MarkOf(text, column), out double value))
        {
            throw Error($"column '{Columns[column]}': '{text}' is not a number" + (Separator == ',' && text.Contains(',', StringComparison.Ordinal) ? $"; {DecimalCommaHint}" : ""));
        }

        if (!double.IsFinite(value))
        {
            throw Error($"column '{Columns[column]}': '{text}' is not a finite number");
        }

        return value;
    }

    /// <summary>The cell of <paramref name="column"/> as a time in seconds, within the bounds of
    /// <see cref="InputLimits"/>: at most <see cref="InputLimits.MaxTextTimeS"/> in size and within
    /// <see cref="InputLimits.MaxRunSpanS"/> of the table's first time (so times written in
    /// microseconds or milliseconds are caught at the first line that gives them away).</summary>
    /// <exception cref="InputException">Not a number, or out of bounds.</exception>
    public double Time(int column)
    {
        double t = Number(column);
        if (Math.Abs(t) > InputLimits.MaxTextTimeS)
        {
            throw Error(string.Create(CultureInfo.InvariantCulture, $"column '{Columns[column]}': {t} s is beyond the {InputLimits.MaxTextTimeS:0e0} s limit (times must be in seconds)"));
        }

        firstTimeS ??= t;
        if (Math.Abs(t - firstTimeS.Value) > InputLimits.MaxRunSpanS)
        {
            throw Error(string.Create(CultureInfo.InvariantCulture, $"column '{Columns[column]}': {t} s is more than {InputLimits.MaxRunSpanS} s (the longest run) from the first time, {firstTimeS.Value} s: are the times in seconds?"));
        }

        return t;
    }

    /// <summary>The cell of <paramref name="column"/> as a number no larger than <paramref name="limit"/> in size.</summary>
    /// <exception cref="InputException">Not a number, or out of bounds.</exception>
    public double Bounded(int column, double limit, string unit)
    {
        double v = Number(column);
        if (Math.Abs(v) > limit)
        {
            throw Error(string.Create(CultureInfo.InvariantCulture, $"column '{Columns[column]}': {v} {unit} is beyond the ±{limit} {unit} limit"));
        }

        return v;
    }

    /// <summary>The cell of <paramref name="column"/> as a whole number.</summary>
    /// <exception cref="InputException">Empty or not a whole number.</exception>
    public long WholeNumber(int column)
    {
        string text = Cell(column);
        if (!long.TryParse(text, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out long value))
        {
            throw Error($"column '{Columns[column]}': '{text}' is not a whole number");
        }

        return value;
    }

    /// <summary>An exception for the current row.</summary>
    public InputException Error(string detail) => new(File, Line, detail);

    /// <summary>Fails unless at least <paramref name="minimum"/> data rows were read.</summary>
    /// <exception cref="InputException">Too few rows.</exception>
    public void RequireRows(int minimum)
    {
        if (Rows < minimum)
        {
            throw new InputException(File, HeaderLine, $"too few rows: at least {minimum} data rows are needed after the header, found {Rows}");
        }
    }

    /// <inheritdoc/>
    public void Dispose() => reader.Dispose();

    /// <summary>How to read <paramref name="text"/>'s decimal mark: the invariant culture's
    /// point, or in a ';'-separated table the file's own mark, fixed by its first number that has one.</summary>
    /// <exception cref="InputException">The number holds both marks, or the mark the file does not use.</exception>
    private NumberFormatInfo MarkOf(string text, int column)
    {
        if (Separator != ';')
        {
            return NumberFormatInfo.InvariantInfo;
        }

        bool comma = text.Contains(',', StringComparison.Ordinal);
        bool point = text.Contains('.', StringComparison.Ordinal);
        if (comma && point)
        {
            throw Error($"column '{Columns[column]}': '{text}' holds both a point and a comma; write numbers without a thousands separator");
        }

        char mark = comma ? ',' : point ? '.' : decimalMark;
        if (decimalMark == '\0')
        {
            decimalMark = mark;
        }
        else if (mark != decimalMark)
        {
            throw Error($"column '{Columns[column]}': '{text}' has a decimal {(comma ? "comma" : "point")} where the numbers above have a decimal {(comma ? "point" : "comma")}; one file uses one mark");
        }

        return mark == ',' ? DecimalComma : NumberFormatInfo.InvariantInfo;
    }

    private string Cell(int column)
    {
        string text = reader.GetString(column);
        if (text.Length == 0)
        {
            throw Error($"column '{Columns[column]}' is empty");
        }

        return text;
    }

    private static string FirstSentence(string message)
    {
        int colon = message.IndexOf("): ", StringComparison.Ordinal);
        return colon >= 0 ? message[(colon + 3)..] : message;
    }

    private static void Wrap(string file, Action action)
    {
        try
        {
            action();
        }
        catch (CsvFormatException e)
        {
            // CsvHelper counts lines as we do (comments and blank lines included); 0 = unknown.
            throw new InputException(file, (int)Math.Max(0, e.LineNumber), "bad quoting: " + FirstSentence(e.Message), e);
        }
    }
}
