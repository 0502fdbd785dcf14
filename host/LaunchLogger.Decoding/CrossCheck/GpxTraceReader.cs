using System.Globalization;
using System.Xml;
using System.Xml.Linq;
using LaunchLogger.Decoding.Import;

namespace LaunchLogger.Decoding.CrossCheck;

/// <summary>Reads a GPX track into a <see cref="SpeedTrace"/>.</summary>
/// <remarks>GPX 1.1 (the GPS Exchange Format schema, namespace
/// <c>http://www.topografix.com/GPX/1/1</c>; 1.0 is read the same way): every <c>trkpt</c> of
/// every <c>trkseg</c>, with its <c>lat</c>/<c>lon</c> attributes in decimal degrees and its
/// <c>time</c> element (ISO 8601, UTC). GPX 1.1 has no speed element of its own; a <c>speed</c>
/// element in m/s (GPX 1.0's, or one inside <c>extensions</c>, in any namespace) is used when
/// every point has one, otherwise speed is differenced from the positions. Points without a time
/// or a position are counted and skipped.</remarks>
public static class GpxTraceReader
{
    /// <summary>Reads the file at <paramref name="path"/>.</summary>
    /// <exception cref="InputException">Missing file, not GPX, or fewer than two usable points.</exception>
    public static SpeedTrace Read(string path)
    {
        using StreamReader text = InputFiles.OpenText(path);
        return Read(text, path);
    }

    /// <summary>Reads GPX from <paramref name="text"/>; <paramref name="file"/> names it in messages.</summary>
    /// <exception cref="InputException">Not GPX, or fewer than two usable points.</exception>
    public static SpeedTrace Read(TextReader text, string file)
    {
        XDocument document;
        try
        {
            // No DTDs, no external entities: a track file is data, never instructions.
            using var xml = XmlReader.Create(text, new XmlReaderSettings { DtdProcessing = DtdProcessing.Prohibit, XmlResolver = null });
            document = XDocument.Load(xml, LoadOptions.SetLineInfo);
        }
        catch (XmlException e)
        {
            throw new InputException(file, e.LineNumber, $"not well-formed XML: {e.Message}");
        }

        if (document.Root is not { } root || root.Name.LocalName != "gpx")
        {
            throw new InputException(file, 0, "not a GPX file (its root element is not <gpx>)");
        }

        var time = new List<double>();
        var lat = new List<double>();
        var lon = new List<double>();
        var speed = new List<double?>();
        int read = 0;
        int rejected = 0;
        DateTime? origin = null;
        foreach (XElement point in root.Descendants().Where(e => e.Name.LocalName == "trkpt"))
        {
            read++;
            string? timeText = point.Elements().FirstOrDefault(e => e.Name.LocalName == "time")?.Value;
            if (!TryDegrees(point.Attribute("lat")?.Value, 90, out double la)
                || !TryDegrees(point.Attribute("lon")?.Value, 180, out double lo)
                || timeText == null
                || !DateTime.TryParse(timeText, CultureInfo.InvariantCulture, DateTimeStyles.AdjustToUniversal | DateTimeStyles.AssumeUniversal, out DateTime at))
            {
                rejected++;
                continue;
            }

            origin ??= at.Date;
            double t = (at - origin.Value).TotalSeconds;
            if (time.Count > 0 && !(t > time[^1]))
            {
                rejected++;
                continue;
            }

            time.Add(t);
            lat.Add(la);
            lon.Add(lo);
            string? speedText = point.Descendants().FirstOrDefault(e => e.Name.LocalName == "speed")?.Value;
            speed.Add(double.TryParse(speedText, NumberStyles.Float, CultureInfo.InvariantCulture, out double v) && double.IsFinite(v) && v >= 0 ? v : null);
        }

        if (time.Count < 2)
        {
            throw new InputException(file, 0, "fewer than two track points with a time and a position");
        }

        double[] timeS = [.. time];
        (double[] east, double[] north) = GeoProjection.Project(lat, lon);
        bool measured = speed.All(v => v.HasValue);
        return new SpeedTrace
        {
            TimeS = timeS,
            SpeedMps = measured ? speed.Select(v => v!.Value).ToArray() : GeoProjection.SpeedFromPositions(timeS, east, north),
            EastM = east,
            NorthM = north,
            SpeedMeasured = measured,
            Source = $"GPX {Path.GetFileName(file)}",
            RecordsRead = read,
            RecordsRejected = rejected,
        };
    }

    private static bool TryDegrees(string? text, double limit, out double degrees) =>
        double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out degrees)
        && double.IsFinite(degrees) && Math.Abs(degrees) <= limit;
}
