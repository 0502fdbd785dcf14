using System.Globalization;
using LaunchLogger.Prescribed.Sensors;

namespace LaunchLogger.Prescribed.Output;

/// <summary>Writes the plain-text inputs the command line reads (README "Plain-text inputs"):
/// edges <c>t_s</c>; counts <c>t_lo_s,t_hi_s,count</c>; accelerometer
/// <c>t_s,ax_mps2,ay_mps2,az_mps2</c>. Numbers in the invariant culture, round-trip precision.</summary>
public static class PrescribedCsv
{
    /// <summary>One edge time per line.</summary>
    public static void WriteEdges(TextWriter writer, IEnumerable<double> edgesS)
    {
        ArgumentNullException.ThrowIfNull(writer);
        writer.WriteLine("t_s");
        foreach (double t in edgesS)
        {
            writer.WriteLine(Format(t));
        }
    }

    /// <summary>One bracket per line.</summary>
    public static void WriteCounts(TextWriter writer, IEnumerable<CountBracket> rows)
    {
        ArgumentNullException.ThrowIfNull(writer);
        writer.WriteLine("t_lo_s,t_hi_s,count");
        foreach (CountBracket r in rows)
        {
            writer.WriteLine($"{Format(r.LoS)},{Format(r.HiS)},{r.Count.ToString(CultureInfo.InvariantCulture)}");
        }
    }

    /// <summary>One sample per line, all three axes, at the box's stamp.</summary>
    public static void WriteAccel(TextWriter writer, IEnumerable<AccelSample> samples)
    {
        ArgumentNullException.ThrowIfNull(writer);
        writer.WriteLine("t_s,ax_mps2,ay_mps2,az_mps2");
        foreach (AccelSample s in samples)
        {
            writer.WriteLine($"{Format(s.StampS)},{Format(s.XMps2)},{Format(s.YMps2)},{Format(s.ZMps2)}");
        }
    }

    /// <summary>The text of <paramref name="write"/>'s output, for in-memory use.</summary>
    public static string ToText(Action<TextWriter> write)
    {
        ArgumentNullException.ThrowIfNull(write);
        using var text = new StringWriter(CultureInfo.InvariantCulture);
        write(text);
        return text.ToString();
    }

    private static string Format(double value) => value.ToString("R", CultureInfo.InvariantCulture);
}
