using LaunchLogger.Decoding.Runs;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Import;

/// <summary>Reads accelerometer samples, header <c>t_s,ax_mps2</c> or
/// <c>t_s,ax_mps2,ay_mps2,az_mps2</c> (<c>--accel</c>).</summary>
/// <remarks>Specific force in m/s² in the car's frame: ax longitudinal, forward positive; ay
/// lateral, left positive; az vertical, up positive (+g at rest on level ground), as
/// <see cref="AccelSeries"/> holds them. Times must increase strictly; at least two rows. The
/// sample period reported is the mean spacing, with no uncertainty (the times are given).</remarks>
public static class AccelFile
{
    /// <summary>The header with the longitudinal axis only.</summary>
    public static readonly string[] LongitudinalHeader = ["t_s", "ax_mps2"];

    /// <summary>The header with all three axes.</summary>
    public static readonly string[] ThreeAxisHeader = ["t_s", "ax_mps2", "ay_mps2", "az_mps2"];

    /// <summary>Reads the file at <paramref name="path"/>.</summary>
    /// <exception cref="InputException">The file is missing or its content is unusable.</exception>
    public static AccelSeries Read(string path)
    {
        using StreamReader text = InputFiles.OpenText(path);
        return Read(text, path);
    }

    /// <summary>Reads samples from <paramref name="text"/>; <paramref name="file"/> names it in messages.</summary>
    /// <exception cref="InputException">The content is unusable.</exception>
    public static AccelSeries Read(TextReader text, string file)
    {
        using CsvTable table = CsvTable.Open(text, file, LongitudinalHeader, ThreeAxisHeader);
        bool allAxes = table.Columns.Count == ThreeAxisHeader.Length;
        var time = new List<double>();
        var forward = new List<double>();
        var lateral = new List<double>();
        var vertical = new List<double>();
        while (table.Read())
        {
            double t = table.Time(0);
            if (time.Count > 0 && !(t > time[^1]))
            {
                throw table.Error(Invariant($"time goes backwards: t_s {t} is not after the previous row's {time[^1]}"));
            }

            time.Add(t);
            forward.Add(table.Bounded(1, InputLimits.MaxTextAccelMps2, "m/s²"));
            lateral.Add(allAxes ? table.Bounded(2, InputLimits.MaxTextAccelMps2, "m/s²") : 0);
            vertical.Add(allAxes ? table.Bounded(3, InputLimits.MaxTextAccelMps2, "m/s²") : 0);
        }

        table.RequireRows(2);
        return new AccelSeries
        {
            TimeS = time.ToArray(),
            ForwardMps2 = forward.ToArray(),
            LateralMps2 = lateral.ToArray(),
            VerticalMps2 = vertical.ToArray(),
            HasAllAxes = allAxes,
            SamplePeriodS = (time[^1] - time[0]) / (time.Count - 1),
            SamplePeriodUncertaintyS = 0,
        };
    }
}
