using LaunchLogger.Decoding.CrossCheck;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Simulation.Sensors;

namespace LaunchLogger.Decoding.Tests.CrossCheck;

/// <summary>Sentences are checksummed by the simulator's receiver, whose checksum
/// <see cref="NmeaSentenceTests"/> holds to the published example sentences.</summary>
public sealed class NmeaTraceReaderTests
{
    [Fact]
    public void Epochs_take_vtg_speed_in_kmh_and_gga_positions()
    {
        string text = string.Join('\n',
            SatelliteReceiver.Sentence("GPGGA,120000.00,4807.0000,N,01131.0000,E,1,08,0.9,545.4,M,46.9,M,,"),
            SatelliteReceiver.Sentence("GPRMC,120000.00,A,4807.0000,N,01131.0000,E,0.000,0.0,030326,,,A"),
            SatelliteReceiver.Sentence("GPVTG,0.0,T,,M,0.000,N,0.000,K,A"),
            SatelliteReceiver.Sentence("GPGGA,120000.10,4807.0001,N,01131.0000,E,1,08,0.9,545.4,M,46.9,M,,"),
            SatelliteReceiver.Sentence("GPRMC,120000.10,A,4807.0001,N,01131.0000,E,1.944,0.0,030326,,,A"),
            SatelliteReceiver.Sentence("GPVTG,0.0,T,,M,1.944,N,3.600,K,A"));
        SpeedTrace trace = NmeaTraceReader.Read(new StringReader(text), "t.nmea");
        Assert.Equal(2, trace.Count);
        Assert.Equal(0.1, trace.TimeS[1] - trace.TimeS[0], 9);
        Assert.Equal(43_200.0, trace.TimeS[0], 9);

        // 3.600 km/h is exactly 1 m/s.
        Assert.Equal(1.0, trace.SpeedMps[1], 12);
        Assert.True(trace.SpeedMeasured);

        // 0.0001 arc-minute of latitude is 1/600,000 degree: about 0.185 m on the IUGG mean sphere.
        Assert.Equal(GeoProjection.EarthRadiusM * Math.PI / 180 / 600_000, trace.NorthM![1], 9);
        Assert.Equal(0, trace.RecordsRejected);
    }

    [Fact]
    public void Rmc_knots_serve_when_there_is_no_vtg()
    {
        string text = string.Join('\n',
            SatelliteReceiver.Sentence("GPRMC,235959.90,A,4807.0000,N,01131.0000,E,10.000,0.0,030326,,,A"),
            SatelliteReceiver.Sentence("GPRMC,000000.00,A,4807.0000,N,01131.0000,E,20.000,0.0,040326,,,A"));
        SpeedTrace trace = NmeaTraceReader.Read(new StringReader(text), "t.nmea");

        // 1 knot = 1852/3600 m/s exactly (international nautical mile, 1929).
        Assert.Equal(10 * 1852.0 / 3600.0, trace.SpeedMps[0], 12);

        // Midnight: the time of day falls back, the trace's time goes on.
        Assert.Equal(0.1, trace.TimeS[1] - trace.TimeS[0], 9);
    }

    [Fact]
    public void Bad_checksums_void_fixes_and_invalid_vtg_are_counted_and_skipped()
    {
        string good1 = SatelliteReceiver.Sentence("GPRMC,120000.00,A,4807.0000,N,01131.0000,E,1.000,0.0,030326,,,A");
        string good2 = SatelliteReceiver.Sentence("GPRMC,120000.20,A,4807.0000,N,01131.0000,E,3.000,0.0,030326,,,A");
        string text = string.Join('\n',
            good1,
            good1.Replace("120000.00", "120000.10", StringComparison.Ordinal), // checksum now wrong
            SatelliteReceiver.Sentence("GPRMC,120000.15,V,4807.0000,N,01131.0000,E,2.000,0.0,030326,,,N"), // void
            SatelliteReceiver.Sentence("GPVTG,0.0,T,,M,9.000,N,16.668,K,N"), // mode N: not valid
            "garbage line",
            good2);
        SpeedTrace trace = NmeaTraceReader.Read(new StringReader(text), "t.nmea");
        Assert.Equal(2, trace.Count);
        Assert.Equal(6, trace.RecordsRead);
        Assert.Equal(4, trace.RecordsRejected);
        Assert.Equal(1 * 1852.0 / 3600.0, trace.SpeedMps[0], 12);
    }

    [Fact]
    public void A_file_with_no_usable_epoch_is_one_clear_error()
    {
        var e = Assert.Throws<InputException>(() => NmeaTraceReader.Read(new StringReader("$GPVTG,140.88,T,,M,8.04,N,14.89,K,D*06\n"), "bad.nmea"));
        Assert.StartsWith("bad.nmea: fewer than two usable NMEA epochs", e.Message, StringComparison.Ordinal);
    }
}
