using LaunchLogger.Decoding.Import;
using static System.FormattableString;

namespace LaunchLogger.Decoding.CrossCheck;

/// <summary>Reads another instrument's CSV export into a <see cref="SpeedTrace"/>, with the
/// columns the user maps (<see cref="TraceColumns"/>).</summary>
/// <remarks>Comma separated with a header; other columns are ignored. Times must increase
/// strictly. Every bad cell is an error naming the file and line, as for our own CSV inputs.</remarks>
public static class CsvTraceReader
{
    /// <summary>Reads the file at <paramref name="path"/>.</summary>
    /// <exception cref="InputException">Missing file, a missing column, or unusable content.</exception>
    public static SpeedTrace Read(string path, TraceColumns columns)
    {
        using StreamReader text = InputFiles.OpenText(path);
        return Read(text, path, columns);
    }

    /// <summary>Reads from <paramref name="text"/>; <paramref name="file"/> names it in messages.</summary>
    /// <exception cref="InputException">A missing column or unusable content.</exception>
    public static SpeedTrace Read(TextReader text, string file, TraceColumns columns)
    {
        ArgumentNullException.ThrowIfNull(columns);
        var required = new List<string> { columns.Time };
        required.AddRange(new[] { columns.Speed, columns.Latitude, columns.Longitude }.OfType<string>());
        using CsvTable table = CsvTable.OpenNamed(text, file, required);
        int timeColumn = table.ColumnIndex(columns.Time);
        int speedColumn = columns.Speed is { } s ? table.ColumnIndex(s) : -1;
        int latColumn = columns.Latitude is { } la ? table.ColumnIndex(la) : -1;
        int lonColumn = columns.Longitude is { } lo ? table.ColumnIndex(lo) : -1;
        var time = new List<double>();
        var speed = new List<double>();
        var lat = new List<double>();
        var lon = new List<double>();
        while (table.Read())
        {
            double t = table.Number(timeColumn) * columns.SecondsPerTimeUnit;
            if (time.Count > 0 && !(t > time[^1]))
            {
                throw table.Error(Invariant($"time goes backwards: {t} s is not after the previous row's {time[^1]} s"));
            }

            time.Add(t);
            if (speedColumn >= 0)
            {
                double v = table.Number(speedColumn) * columns.MpsPerSpeedUnit;
                if (v < 0)
                {
                    throw table.Error(Invariant($"column '{columns.Speed}': a speed over ground cannot be negative ({v} m/s)"));
                }

                speed.Add(v);
            }

            if (latColumn >= 0 && lonColumn >= 0)
            {
                lat.Add(table.Number(latColumn));
                lon.Add(table.Number(lonColumn));
            }
        }

        table.RequireRows(2);
        double[] timeS = [.. time];
        double[]? east = null;
        double[]? north = null;
        if (lat.Count == time.Count && lat.Count > 0)
        {
            (east, north) = GeoProjection.Project(lat, lon);
        }

        return new SpeedTrace
        {
            TimeS = timeS,
            SpeedMps = speedColumn >= 0 ? [.. speed] : GeoProjection.SpeedFromPositions(timeS, east!, north!),
            EastM = east,
            NorthM = north,
            SpeedMeasured = speedColumn >= 0,
            Source = $"CSV {Path.GetFileName(file)}",
            RecordsRead = table.Rows,
        };
    }
}
