using LaunchLogger.Decoding.CrossCheck;
using LaunchLogger.Decoding.Import;

namespace LaunchLogger.Decoding.Tests.CrossCheck;

public sealed class GpxTraceReaderTests
{
    // The layout of GPX 1.1 (the GPS Exchange Format 1.1 schema, gpx.xsd): <gpx version="1.1"
    // creator="…"> in the namespace http://www.topografix.com/GPX/1/1, tracks of <trkseg> of
    // <trkpt lat="…" lon="…"> with an ISO 8601 <time> in UTC; anything else in <extensions>.
    private const string Track = """
        <?xml version="1.0" encoding="UTF-8"?>
        <gpx version="1.1" creator="launchlogger tests" xmlns="http://www.topografix.com/GPX/1/1"
             xmlns:x="urn:example:speed">
          <trk><name>strip pass</name><trkseg>
            <trkpt lat="48.000000" lon="11.000000"><ele>500.0</ele><time>2026-03-04T12:00:00.0Z</time>{0}</trkpt>
            <trkpt lat="48.000090" lon="11.000000"><ele>500.0</ele><time>2026-03-04T12:00:01.0Z</time>{1}</trkpt>
            <trkpt lat="48.000270" lon="11.000000"><ele>500.0</ele><time>2026-03-04T12:00:02.0Z</time>{2}</trkpt>
          </trkseg></trk>
        </gpx>
        """;

    [Fact]
    public void Positions_become_distances_and_speeds_when_there_is_no_speed()
    {
        SpeedTrace trace = GpxTraceReader.Read(new StringReader(string.Format(Track, "", "", "")), "t.gpx");
        Assert.Equal(3, trace.Count);
        Assert.False(trace.SpeedMeasured);
        Assert.Equal(43_200, trace.TimeS[0], 9);
        Assert.Equal(2, trace.TimeS[2] - trace.TimeS[0], 9);

        // 0.00009° of latitude on the IUGG mean sphere (R1 = 6,371,008.8 m): 10.0075 m.
        double metresPerDegree = GeoProjection.EarthRadiusM * Math.PI / 180;
        Assert.Equal(0.00009 * metresPerDegree, trace.NorthM![1], 6);

        // Central difference at the middle point: 0.00027° over 2 s.
        Assert.Equal(0.00027 * metresPerDegree / 2, trace.SpeedMps[1], 6);
    }

    [Fact]
    public void A_speed_element_in_extensions_is_used_when_every_point_has_one()
    {
        string withSpeed = string.Format(Track,
            "<extensions><x:speed>0.5</x:speed></extensions>",
            "<extensions><x:speed>10.5</x:speed></extensions>",
            "<extensions><x:speed>20.5</x:speed></extensions>");
        SpeedTrace trace = GpxTraceReader.Read(new StringReader(withSpeed), "t.gpx");
        Assert.True(trace.SpeedMeasured);
        Assert.Equal([0.5, 10.5, 20.5], trace.SpeedMps);
    }

    [Fact]
    public void Not_gpx_and_broken_xml_are_clear_errors()
    {
        var notGpx = Assert.Throws<InputException>(() => GpxTraceReader.Read(new StringReader("<kml/>"), "a.gpx"));
        Assert.Contains("not a GPX file", notGpx.Message, StringComparison.Ordinal);
        var broken = Assert.Throws<InputException>(() => GpxTraceReader.Read(new StringReader("<gpx><trk>"), "b.gpx"));
        Assert.StartsWith("b.gpx:", broken.Message, StringComparison.Ordinal);
    }
}
