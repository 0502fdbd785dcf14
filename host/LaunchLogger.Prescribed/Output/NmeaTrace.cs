using System.Globalization;
using System.Text;
using LaunchLogger.Prescribed.Motion;
using MathNet.Numerics.Distributions;

namespace LaunchLogger.Prescribed.Output;

/// <summary>The prescribed motion as a satellite receiver in the same car would log it: NMEA 0183
/// sentences (GGA, RMC, VTG) each epoch, on the receiver's own clock, from the exact trajectory —
/// the second instrument of a cross-check whose truth comes from the generator, not from the
/// simulator nor from the decoder.</summary>
/// <remarks>
/// Epochs fall on whole multiples of the period of the receiver's clock (seconds of the UTC day,
/// reading the record's time plus <see cref="ClockAheadS"/>). Speed over ground is the exact speed
/// at the epoch plus Gaussian noise, never below zero; the position follows a straight strip on
/// <see cref="HeadingDeg"/> from <see cref="StartLatDeg"/>, <see cref="StartLonDeg"/> on a sphere
/// of the mean Earth radius (6 371 008.8 m, IUGG mean radius R1, from memory), with Gaussian noise
/// per axis. Sentence layout (NMEA 0183, fields from memory): GGA time, latitude ddmm.mmmmm, N/S,
/// longitude dddmm.mmmmm, E/W, fix quality, satellites, HDOP, altitude, M, geoid separation, M,
/// two empty; RMC time, status A, position, knots, course, date ddmmyy, two empty, mode A; VTG
/// true course, T, empty, M, knots, N, km/h, K, mode A. Checksum: XOR of the characters between
/// '$' and '*', two upper-case hex digits (NMEA 0183).
/// </remarks>
public sealed record NmeaTrace
{
    private const double EarthRadiusM = 6_371_008.8;
    private const double MetresPerNauticalMile = 1852;

    /// <summary>Epochs per second.</summary>
    public double RateHz { get; init; } = 10;

    /// <summary>How far the receiver's clock (seconds of the UTC day) reads ahead of the record's, s.</summary>
    public double ClockAheadS { get; init; } = 61_234.0567;

    /// <summary>Speed noise, m/s (1-σ).</summary>
    public double SpeedNoiseMps { get; init; } = 0.05;

    /// <summary>Position noise per axis, m (1-σ).</summary>
    public double PositionNoiseM { get; init; } = 0.5;

    /// <summary>Where the strip starts (south of the equator by default, so the hemisphere letters
    /// are exercised), degrees.</summary>
    public double StartLatDeg { get; init; } = -33.4567;

    /// <summary>Where the strip starts (west of Greenwich by default), degrees.</summary>
    public double StartLonDeg { get; init; } = -70.6543;

    /// <summary>The strip's true heading, degrees clockwise from north.</summary>
    public double HeadingDeg { get; init; } = 212.5;

    /// <summary>The sentences for <paramref name="profile"/> from its start to its end.</summary>
    public string Write(MotionProfile profile, int seed)
    {
        ArgumentNullException.ThrowIfNull(profile);
        var random = new Random(seed);
        var text = new StringBuilder();
        double heading = HeadingDeg * Math.PI / 180;
        long firstEpoch = (long)Math.Ceiling(ClockAheadS * RateHz);
        for (long k = firstEpoch; (k / RateHz) - ClockAheadS <= profile.EndS; k++)
        {
            double theirsS = k / RateHz;
            MotionState truth = profile.StateAt(theirsS - ClockAheadS);
            double speed = Math.Max(0, truth.SpeedMps + Noise(random, SpeedNoiseMps));
            double north = (truth.DistanceM * Math.Cos(heading)) + Noise(random, PositionNoiseM);
            double east = (truth.DistanceM * Math.Sin(heading)) + Noise(random, PositionNoiseM);
            double lat = StartLatDeg + (north / EarthRadiusM * 180 / Math.PI);
            double lon = StartLonDeg + (east / (EarthRadiusM * Math.Cos(StartLatDeg * Math.PI / 180)) * 180 / Math.PI);
            string time = Clock(theirsS);
            string position = Angle(lat, 2, 'N', 'S') + "," + Angle(lon, 3, 'E', 'W');
            double knots = speed * 3600 / MetresPerNauticalMile;
            string course = F(((HeadingDeg % 360) + 360) % 360, "0.0");
            Line(text, $"GPGGA,{time},{position},1,09,0.9,512.3,M,31.2,M,,");
            Line(text, $"GPRMC,{time},A,{position},{F(knots, "0.000")},{course},{Date(theirsS)},,,A");
            Line(text, $"GPVTG,{course},T,,M,{F(knots, "0.000")},N,{F(speed * 3.6, "0.000")},K,A");
        }

        return text.ToString();
    }

    /// <summary>A sentence body with its '$', checksum and line end.</summary>
    public static string Sentence(string body)
    {
        ArgumentNullException.ThrowIfNull(body);
        int sum = 0;
        foreach (char c in body)
        {
            sum ^= c;
        }

        return "$" + body + "*" + sum.ToString("X2", CultureInfo.InvariantCulture);
    }

    private static void Line(StringBuilder text, string body) => text.Append(Sentence(body)).Append("\r\n");

    private static double Noise(Random random, double sigma) => sigma > 0 ? Normal.Sample(random, 0, sigma) : 0;

    private static string F(double value, string format) => value.ToString(format, CultureInfo.InvariantCulture);

    /// <summary>hhmmss.ss of the UTC day.</summary>
    private static string Clock(double seconds)
    {
        long hundredths = (long)Math.Round(seconds * 100) % 8_640_000;
        long h = hundredths / 360_000;
        long m = hundredths / 6000 % 60;
        double s = hundredths % 6000 / 100.0;
        return h.ToString("00", CultureInfo.InvariantCulture) + m.ToString("00", CultureInfo.InvariantCulture) + s.ToString("00.00", CultureInfo.InvariantCulture);
    }

    /// <summary>An invented date, ddmmyy, one day later for each whole day of the clock.</summary>
    private static string Date(double seconds) => (14 + (int)(seconds / 86_400)).ToString("00", CultureInfo.InvariantCulture) + "0526";

    /// <summary>Degrees and decimal minutes (five decimals) with a hemisphere letter.</summary>
    private static string Angle(double degrees, int degreeDigits, char positive, char negative)
    {
        // Rounded once in units of 1e-5 minute, so that 59.999996' becomes the next degree.
        long units = (long)Math.Round(Math.Abs(degrees) * 60 * 1e5);
        long whole = units / 6_000_000;
        double minutes = units % 6_000_000 / 1e5;
        return whole.ToString(new string('0', degreeDigits), CultureInfo.InvariantCulture) + minutes.ToString("00.00000", CultureInfo.InvariantCulture)
            + "," + (degrees < 0 ? negative : positive);
    }
}
