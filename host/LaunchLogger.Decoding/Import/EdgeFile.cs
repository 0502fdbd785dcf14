using LaunchLogger.Decoding.Runs;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Import;

/// <summary>Reads pulse edge times, one per line, header <c>t_s</c> (<c>--edges</c>).</summary>
/// <remarks>Each line is one pulse edge at an exact time, so it becomes a
/// <see cref="PulseRecord"/> with <c>LoS == HiS</c>; counts run 1, 2, … N in file order. Times
/// are seconds on any axis and must increase strictly. At least two edges are needed.</remarks>
public static class EdgeFile
{
    /// <summary>The header the file must have.</summary>
    public static readonly string[] Header = ["t_s"];

    /// <summary>Reads the file at <paramref name="path"/>.</summary>
    /// <exception cref="InputException">The file is missing or its content is unusable.</exception>
    public static IReadOnlyList<PulseRecord> Read(string path)
    {
        using StreamReader text = InputFiles.OpenText(path);
        return Read(text, path);
    }

    /// <summary>Reads edges from <paramref name="text"/>; <paramref name="file"/> names it in messages.</summary>
    /// <exception cref="InputException">The content is unusable.</exception>
    public static IReadOnlyList<PulseRecord> Read(TextReader text, string file)
    {
        using CsvTable table = CsvTable.Open(text, file, Header);
        var edges = new List<PulseRecord>();
        double previous = double.NegativeInfinity;
        while (table.Read())
        {
            double t = table.Time(0);
            if (!(t > previous))
            {
                throw table.Error(Invariant($"time goes backwards: t_s {t} is not after the previous edge's {previous}"));
            }

            if (t - previous < InputLimits.MinEdgeSpacingS)
            {
                throw table.Error(Invariant($"t_s {t} is {t - previous:G3} s after the previous edge: closer than the {InputLimits.MinEdgeSpacingS * 1e6} µs clock tick any pickup can resolve"));
            }

            edges.Add(new PulseRecord(edges.Count + 1, t, t));
            previous = t;
        }

        table.RequireRows(2);
        return edges;
    }
}
