using System.Globalization;
using System.Text;
using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Simulation.Sensors;

/// <summary>A second instrument in the car: a satellite receiver that writes NMEA 0183 (GGA, RMC
/// and VTG each epoch) on its own clock, from the simulator's truth — the other side of a
/// cross-check, for demos and tests.</summary>
/// <remarks>Epochs fall on whole multiples of the period on the receiver's clock (UTC of day,
/// which reads the box's clock plus <see cref="ClockAheadS"/>). Speed over ground is the truth plus
/// Gaussian noise, never below zero; positions follow a straight strip on the given heading with
/// Gaussian noise per axis. Checksums are written by the NMEA 0183 rule (XOR of every character
/// between '$' and '*').</remarks>
public sealed record SatelliteReceiver
{
    /// <summary>Epochs per second.</summary>
    public double RateHz { get; init; } = 10;

    /// <summary>How far the receiver's clock (seconds of the UTC day) reads ahead of the box's, s.</summary>
    public double ClockAheadS { get; init; } = 43_000.0371;

    /// <summary>Speed noise, m/s (1-σ).</summary>
    public double SpeedNoiseMps { get; init; } = 0.05;

    /// <summary>Position noise per axis, m (1-σ).</summary>
    public double PositionNoiseM { get; init; } = 0.5;

    /// <summary>Every how many GGA sentences one is damaged (0 = none), to exercise checksum checks.</summary>
    public int DamageEveryGga { get; init; }

    /// <summary>Writes the receiver's log of <paramref name="truth"/>.</summary>
    public string WriteNmea(Trajectory truth, int seed)
    {
        ArgumentNullException.ThrowIfNull(truth);
        var random = new Random(seed);
        var text = new StringBuilder();
        double period = 1.0 / RateHz;
        double first = Math.Ceiling((truth.TimeS[0] + ClockAheadS) * RateHz) / RateHz;
        double last = truth.TimeS[^1] + ClockAheadS;
        const double Lat0 = 48.1, Lon0 = 11.5, Heading = Math.PI / 4, EarthRadiusM = 6_371_008.8;
        var c = CultureInfo.InvariantCulture;
        int gga = 0;
        for (int k = 0; first + (k * period) <= last; k++)
        {
            double theirsS = Math.Round((first + (k * period)) * RateHz) / RateHz;
            double oursS = theirsS - ClockAheadS;
            double speed = Math.Max(0, truth.ValueAt(truth.SpeedMps, oursS) + (SpeedNoiseMps * Gaussian(random)));
            double along = truth.ValueAt(truth.DistanceM, oursS);
            double north = (along * Math.Cos(Heading)) + (PositionNoiseM * Gaussian(random));
            double east = (along * Math.Sin(Heading)) + (PositionNoiseM * Gaussian(random));
            double lat = Lat0 + (north / EarthRadiusM * 180 / Math.PI);
            double lon = Lon0 + (east / (EarthRadiusM * Math.Cos(Lat0 * Math.PI / 180)) * 180 / Math.PI);
            double dayS = theirsS % 86_400;
            string clock = string.Create(c, $"{(int)(dayS / 3600):00}{(int)(dayS / 60) % 60:00}{dayS % 60:00.00}");
            string position = string.Create(c, $"{(int)lat:00}{(lat - (int)lat) * 60:00.000000},N,{(int)lon:000}{(lon - (int)lon) * 60:00.000000},E");
            double knots = speed * 3600 / 1852;
            string ggaSentence = Sentence($"GNGGA,{clock},{position},1,12,0.8,500.0,M,47.0,M,,");
            if (DamageEveryGga > 0 && ++gga % DamageEveryGga == 0)
            {
                ggaSentence = ggaSentence.Replace(",1,12,", ",1,13,", StringComparison.Ordinal);
            }

            text.Append(ggaSentence).Append('\n');
            text.Append(Sentence(string.Create(c, $"GNRMC,{clock},A,{position},{knots:0.000},45.0,030326,,,A"))).Append('\n');
            text.Append(Sentence(string.Create(c, $"GNVTG,45.0,T,,M,{knots:0.000},N,{speed * 3.6:0.000},K,A"))).Append('\n');
        }

        return text.ToString();
    }

    /// <summary>A sentence with its checksum.</summary>
    public static string Sentence(string body)
    {
        byte sum = 0;
        foreach (char ch in body)
        {
            sum ^= (byte)ch;
        }

        return $"${body}*{sum:X2}";
    }

    private static double Gaussian(Random random) =>
        Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
}
