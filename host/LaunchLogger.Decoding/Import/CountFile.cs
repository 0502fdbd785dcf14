using LaunchLogger.Decoding.Runs;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Import;

/// <summary>Reads bracketed cumulative pulse counts, header <c>t_lo_s,t_hi_s,count</c>
/// (<c>--counts</c>): "the count reached <c>count</c> at some time in (t_lo, t_hi]", the same
/// observation the log keeps, for a capture that polls a hardware counter.</summary>
/// <remarks>
/// <para>The count column is cumulative from an arbitrary origin (whatever the counter held when
/// the capture started). The origin — the count before the run's first pulse — is taken as:
/// the first row's count when the second row repeats it (a capture that writes every poll,
/// standing still at first: the first row is a reading, not a pulse) or when the first row's
/// bracket has no width and the second's has (an opening reading of a record that starts moving);
/// otherwise the first row's
/// count minus one (a capture that writes only changes: the first row is the first pulse, and a
/// first bracket that held more than one pulse cannot be told apart from one that held one).
/// Counts in the result are relative to that origin, so the first pulse has count 1 or more.</para>
/// <para>Rows whose count repeats the previous row's carry no change and are skipped. Counts may
/// never decrease; t_lo ≤ t_hi on every row; t_lo never decreases and t_hi increases strictly
/// from row to row (brackets may overlap a little, as a polling board's do). At least two rows
/// and one count change are needed.</para>
/// </remarks>
public static class CountFile
{
    /// <summary>The header the file must have.</summary>
    public static readonly string[] Header = ["t_lo_s", "t_hi_s", "count"];

    /// <summary>Reads the file at <paramref name="path"/>.</summary>
    /// <exception cref="InputException">The file is missing or its content is unusable.</exception>
    public static IReadOnlyList<PulseRecord> Read(string path)
    {
        using StreamReader text = InputFiles.OpenText(path);
        return Read(text, path);
    }

    /// <summary>Reads counts from <paramref name="text"/>; <paramref name="file"/> names it in messages.</summary>
    /// <exception cref="InputException">The content is unusable.</exception>
    public static IReadOnlyList<PulseRecord> Read(TextReader text, string file)
    {
        using CsvTable table = CsvTable.Open(text, file, Header);
        var rows = new List<(double Lo, double Hi, long Count)>();
        while (table.Read())
        {
            double lo = table.Time(0);
            double hi = table.Time(1);
            long count = table.WholeNumber(2);
            if (hi < lo)
            {
                throw table.Error(Invariant($"t_hi_s {hi} is before t_lo_s {lo}"));
            }

            if (rows.Count > 0)
            {
                (double prevLo, double prevHi, long prevCount) = rows[^1];
                if (!(hi > prevHi))
                {
                    throw table.Error(Invariant($"time goes backwards: t_hi_s {hi} is not after the previous row's {prevHi}"));
                }

                if (lo < prevLo)
                {
                    throw table.Error(Invariant($"time goes backwards: t_lo_s {lo} is before the previous row's {prevLo}"));
                }

                if (count < prevCount)
                {
                    throw table.Error(Invariant($"count goes backwards from {prevCount} to {count}"));
                }
            }

            rows.Add((lo, hi, count));
        }

        table.RequireRows(2);
        // A zero-width first row ahead of brackets with width is the capture's opening reading
        // too (a record that opens moving changes the count at once): no pulse's bracket is empty.
        bool firstIsReading = rows[1].Count == rows[0].Count || (rows[0].Hi == rows[0].Lo && rows[1].Hi > rows[1].Lo);
        long origin = firstIsReading ? rows[0].Count : rows[0].Count - 1;
        var records = new List<PulseRecord>();
        long last = origin;
        foreach ((double lo, double hi, long count) in rows)
        {
            if (count > last)
            {
                records.Add(new PulseRecord(count - origin, lo, hi));
                last = count;
            }
        }

        if (records.Count == 0)
        {
            throw new InputException(file, table.HeaderLine, "the count never changes: no pulses to import");
        }

        return records;
    }
}
