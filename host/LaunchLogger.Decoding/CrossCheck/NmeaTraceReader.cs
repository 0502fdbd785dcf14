using System.Globalization;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Decoding.CrossCheck;

/// <summary>Reads a satellite receiver's NMEA 0183 log into a <see cref="SpeedTrace"/>.</summary>
/// <remarks>
/// Sentences used (NMEA 0183 field numbering): RMC — 1 UTC time hhmmss.ss, 2 status (A valid,
/// V void), 3–6 latitude/longitude, 7 speed over ground in knots, 9 date ddmmyy; VTG — 5 speed in
/// knots, 7 speed in km/h, 9 mode (N = not valid); GGA — 1 UTC time, 2–5 position, 6 fix quality
/// (0 = invalid). One epoch gathers the sentences that share a UTC time; VTG carries no time, so it
/// joins the epoch of the time-bearing sentence before it. Speed per epoch: VTG's km/h when
/// present (finer), else VTG's knots, else RMC's knots; with no speed anywhere, speed is
/// differenced from the positions. Sentences with a bad or missing checksum, a void status or no
/// fix are counted and skipped; other sentence types are ignored.
/// </remarks>
public static class NmeaTraceReader
{
    private const double MpsPerKnot = 1852.0 / 3600.0;

    /// <summary>Reads the file at <paramref name="path"/>.</summary>
    /// <exception cref="InputException">Missing file, or fewer than two usable epochs.</exception>
    public static SpeedTrace Read(string path)
    {
        using StreamReader text = InputFiles.OpenText(path);
        return Read(text, path);
    }

    /// <summary>Reads sentences from <paramref name="text"/>; <paramref name="file"/> names it in messages.</summary>
    /// <exception cref="InputException">Fewer than two usable epochs.</exception>
    public static SpeedTrace Read(TextReader text, string file)
    {
        var epochs = new List<Epoch>();
        Epoch? current = null;
        int read = 0;
        int rejected = 0;
        double dayOffsetS = 0;
        double lastClockS = double.NaN;
        string? line;
        while ((line = text.ReadLine()) != null)
        {
            if (line.AsSpan().Trim().IsEmpty)
            {
                continue;
            }

            read++;
            if (!NmeaSentence.TryParse(line, out NmeaSentence? sentence))
            {
                rejected++;
                continue;
            }

            switch (sentence!.Type)
            {
                case "RMC":
                case "GGA":
                    if (!TryClock(sentence.Field(1), out double clockS) || !IsValidFix(sentence))
                    {
                        rejected++;
                        continue;
                    }

                    // Midnight: the time of day falls back by most of a day.
                    if (!double.IsNaN(lastClockS) && clockS < lastClockS - 43_200)
                    {
                        dayOffsetS += 86_400;
                    }

                    lastClockS = clockS;
                    double t = clockS + dayOffsetS;
                    if (current == null || Math.Abs(current.TimeS - t) > 1e-6)
                    {
                        current = new Epoch(t);
                        epochs.Add(current);
                    }

                    if (TryPosition(sentence, sentence.Type == "RMC" ? 3 : 2, out double lat, out double lon))
                    {
                        current.LatDeg = lat;
                        current.LonDeg = lon;
                    }

                    if (sentence.Type == "RMC" && TryNumber(sentence.Field(7), out double knots))
                    {
                        current.RmcSpeedMps = knots * MpsPerKnot;
                    }

                    break;
                case "VTG":
                    if (current == null || sentence.Field(9) == "N")
                    {
                        rejected++;
                        continue;
                    }

                    if (TryNumber(sentence.Field(7), out double kmh))
                    {
                        current.VtgSpeedMps = kmh * Units.MpsPerKmh;
                    }
                    else if (TryNumber(sentence.Field(5), out double vtgKnots))
                    {
                        current.VtgSpeedMps = vtgKnots * MpsPerKnot;
                    }

                    break;
            }
        }

        return Build(epochs, file, read, rejected);
    }

    private static SpeedTrace Build(List<Epoch> epochs, string file, int read, int rejected)
    {
        epochs.Sort((a, b) => a.TimeS.CompareTo(b.TimeS));
        var kept = new List<Epoch>(epochs.Count);
        foreach (Epoch e in epochs)
        {
            if (kept.Count > 0 && !(e.TimeS > kept[^1].TimeS))
            {
                rejected++;
                continue;
            }

            kept.Add(e);
        }

        // Epochs without a speed are dropped, unless every epoch has a position: then the
        // whole trace takes its speed from the positions instead.
        if (!kept.All(e => e.SpeedMps.HasValue) && !kept.All(e => e.LatDeg.HasValue))
        {
            int before = kept.Count;
            kept = kept.Where(e => e.SpeedMps.HasValue).ToList();
            rejected += before - kept.Count;
        }

        if (kept.Count < 2)
        {
            throw new InputException(file, 0, "fewer than two usable NMEA epochs (RMC, GGA with VTG) with a valid fix and a verified checksum");
        }

        double[] time = kept.Select(e => e.TimeS).ToArray();
        double[]? east = null;
        double[]? north = null;
        if (kept.All(e => e.LatDeg.HasValue))
        {
            (east, north) = GeoProjection.Project(kept.Select(e => e.LatDeg!.Value).ToList(), kept.Select(e => e.LonDeg!.Value).ToList());
        }

        bool measured = kept.All(e => e.SpeedMps.HasValue);
        double[] speed = measured
            ? kept.Select(e => e.SpeedMps!.Value).ToArray()
            : GeoProjection.SpeedFromPositions(time, east!, north!);
        return new SpeedTrace
        {
            TimeS = time,
            SpeedMps = speed,
            EastM = east,
            NorthM = north,
            SpeedMeasured = measured,
            Source = $"NMEA 0183 {Path.GetFileName(file)}",
            RecordsRead = read,
            RecordsRejected = rejected,
        };
    }

    private static bool IsValidFix(NmeaSentence s) => s.Type == "RMC"
        ? s.Field(2) == "A"
        : TryNumber(s.Field(6), out double quality) && quality > 0;

    /// <summary>hhmmss(.ss) → seconds of the day.</summary>
    private static bool TryClock(string field, out double seconds)
    {
        seconds = double.NaN;
        if (field.Length < 6
            || !int.TryParse(field.AsSpan(0, 2), NumberStyles.None, CultureInfo.InvariantCulture, out int h)
            || !int.TryParse(field.AsSpan(2, 2), NumberStyles.None, CultureInfo.InvariantCulture, out int m)
            || !double.TryParse(field.AsSpan(4), NumberStyles.AllowDecimalPoint, CultureInfo.InvariantCulture, out double s)
            || h > 23 || m > 59 || s >= 61)
        {
            return false;
        }

        seconds = (h * 3600) + (m * 60) + s;
        return true;
    }

    /// <summary>ddmm.mmmm,N,dddmm.mmmm,E → signed degrees, from the field numbered <paramref name="first"/>.</summary>
    private static bool TryPosition(NmeaSentence s, int first, out double lat, out double lon)
    {
        lat = lon = double.NaN;
        if (!TryDegreesMinutes(s.Field(first), 2, out lat) || !TryDegreesMinutes(s.Field(first + 2), 3, out lon))
        {
            return false;
        }

        string ns = s.Field(first + 1);
        string ew = s.Field(first + 3);
        if ((ns != "N" && ns != "S") || (ew != "E" && ew != "W"))
        {
            return false;
        }

        lat = ns == "S" ? -lat : lat;
        lon = ew == "W" ? -lon : lon;
        return true;
    }

    private static bool TryDegreesMinutes(string field, int degreeDigits, out double degrees)
    {
        degrees = double.NaN;
        if (field.Length <= degreeDigits
            || !int.TryParse(field.AsSpan(0, degreeDigits), NumberStyles.None, CultureInfo.InvariantCulture, out int d)
            || !double.TryParse(field.AsSpan(degreeDigits), NumberStyles.AllowDecimalPoint, CultureInfo.InvariantCulture, out double minutes)
            || minutes >= 60)
        {
            return false;
        }

        degrees = d + (minutes / 60);
        return true;
    }

    private static bool TryNumber(string field, out double value) =>
        double.TryParse(field, NumberStyles.AllowDecimalPoint | NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out value)
        && double.IsFinite(value);

    private sealed class Epoch(double timeS)
    {
        public double TimeS { get; } = timeS;

        public double? LatDeg { get; set; }

        public double? LonDeg { get; set; }

        public double? RmcSpeedMps { get; set; }

        public double? VtgSpeedMps { get; set; }

        public double? SpeedMps => VtgSpeedMps ?? RmcSpeedMps;
    }
}
