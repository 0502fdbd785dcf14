using LaunchLogger.Decoding.Statistics;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Calibration;

/// <summary>The accelerometer's forward axis against gravity: its scale factor and offset from two
/// rests, the axis pointing straight up and then straight down (the box off the car, standing on
/// its end on a still, firm surface).</summary>
/// <remarks>
/// <para>At rest an accelerometer reads the reaction to gravity, +g along an axis pointing up and
/// −g pointing down (the definition of specific force; any navigation text). An axis that reads
/// k times the force plus an offset b gives r↑ = k·g·cos α↑ + b and r↓ = −k·g·cos α↓ + b for axes
/// tipped α from the vertical, so
/// <code>
/// k = (r↑ − r↓) / (2·g·c̄),   c̄ = (cos α↑ + cos α↓) / 2
/// b = (r↑ + r↓) / 2 − k·g·(cos α↑ − cos α↓) / 2
/// </code>
/// — the two-position form of the multi-position static test of an accelerometer against gravity
/// (common practice; IEEE Std 1293 describes multi-position tests of this kind, cited from
/// memory). The tilts are not measured: each is taken as uniform over 0…α_max, so 1 − cos α is
/// uniform over 0…(1 − cos α_max): c̄ = 1 − (1 − cos α_max)/2 with σ (1 − cos α_max)/√24, and the
/// offset carries k·g·(1 − cos α_max)/√24 for the two tilts' difference.</para>
/// <para>g is the local gravity: the normal gravity of the GRS80/WGS84 ellipsoid at the given
/// latitude (Somigliana's closed form, in NIMA TR8350.2 §4) less 3.086·10⁻⁶ s⁻² per metre of
/// height (the free-air gradient), with σ 0.001 m/s² for local anomalies (from memory: they rarely
/// pass 100 mGal). Without a latitude, standard gravity with σ 0.015 m/s², a spread uniform
/// over the 9.780–9.832 m/s² that normal gravity takes from the equator to the poles.</para>
/// </remarks>
public static class AccelerometerScaleCalibration
{
    /// <summary>Standard gravity, m/s² (3rd CGPM, 1901; ISO 80000-3).</summary>
    public const double StandardGravityMps2 = 9.80665;

    /// <summary>σ of standard gravity taken as the local one when no latitude is given, m/s².</summary>
    public const double UnknownPlaceGravitySigmaMps2 = 0.052 / 3.4641016151377544;

    /// <summary>σ of normal gravity as the local one (anomalies), m/s².</summary>
    public const double AnomalyGravitySigmaMps2 = 0.001;

    /// <summary>Tilt of the axis from the vertical allowed by default, degrees: a box stood on its
    /// end against a square or a wall, by eye.</summary>
    public const double DefaultTiltDeg = 3;

    /// <summary>Fewest samples a rest must hold.</summary>
    public const int MinimumSamples = 50;

    /// <summary>Per-sample scatter above which the box was not still, m/s² (about 50 milli-g).</summary>
    public const double StillNoiseLimitMps2 = 0.5;

    /// <summary>Normal gravity at <paramref name="latitudeDeg"/> and <paramref name="heightM"/>
    /// above the ellipsoid, m/s² (Somigliana's formula with the WGS84 constants, less the free-air
    /// gradient).</summary>
    public static double NormalGravityMps2(double latitudeDeg, double heightM = 0)
    {
        const double equator = 9.7803253359;
        const double k = 0.00193185265241;
        const double e2 = 0.00669437999013;
        double s = Math.Sin(latitudeDeg * Math.PI / 180);
        double s2 = s * s;
        return (equator * (1 + (k * s2)) / Math.Sqrt(1 - (e2 * s2))) - (3.086e-6 * heightM);
    }

    /// <summary>The local gravity the calibration takes: normal gravity at the latitude given, or
    /// standard gravity with the spread of the whole globe.</summary>
    public static Estimate LocalGravity(double? latitudeDeg, double heightM = 0) => latitudeDeg is { } lat
        ? new Estimate(NormalGravityMps2(lat, heightM), AnomalyGravitySigmaMps2)
        : new Estimate(StandardGravityMps2, UnknownPlaceGravitySigmaMps2);

    /// <summary>The mean forward reading of a rest: all its samples but the first and last
    /// half second (the hand letting go, the hand coming back), outliers clipped; σ the larger of
    /// the mean's own and half the difference of the two halves' means (a level that drifts).</summary>
    /// <exception cref="CalibrationException">Too few samples, or not still.</exception>
    public static Estimate RestLevel(double[] timeS, double[] forwardMps2, string source)
    {
        ArgumentNullException.ThrowIfNull(timeS);
        ArgumentNullException.ThrowIfNull(forwardMps2);
        int from = 0;
        int to = forwardMps2.Length;
        if (to > 0 && timeS[^1] - timeS[0] > 3)
        {
            while (from < to && timeS[from] < timeS[0] + 0.5)
            {
                from++;
            }

            while (to > from && timeS[to - 1] > timeS[^1] - 0.5)
            {
                to--;
            }
        }

        if (to - from < MinimumSamples)
        {
            throw new CalibrationException(Invariant($"{source}: {to - from} still samples; a rest needs at least {MinimumSamples} (hold the box still for a few seconds)"));
        }

        Robust whole = Robust.Mean(forwardMps2, from, to, varianceFloor: 1e-12);
        if (whole.NoiseSigma > StillNoiseLimitMps2)
        {
            throw new CalibrationException(Invariant($"{source}: the forward axis scatters by {whole.NoiseSigma:0.000} m/s² per sample; the box was not still"));
        }

        int middle = from + ((to - from) / 2);
        double drift = Math.Abs(Robust.Mean(forwardMps2, from, middle, 1e-12).Value - Robust.Mean(forwardMps2, middle, to, 1e-12).Value) / 2;
        return new Estimate(whole.Value, Math.Max(whole.Sigma, drift));
    }

    /// <summary>Scale factor and offset from the two rests' mean forward readings.</summary>
    /// <param name="upMps2">Mean reading with the forward axis pointing up, m/s², with its σ.</param>
    /// <param name="downMps2">Mean reading with it pointing down, m/s², with its σ.</param>
    /// <param name="gravityMps2">Local gravity with its σ (<see cref="LocalGravity"/>).</param>
    /// <param name="tiltDeg">Largest tilt of the axis from the vertical in either rest, degrees.</param>
    /// <exception cref="CalibrationException">The readings do not look like up and down.</exception>
    public static AccelerometerScaleEstimate FromRests(Estimate upMps2, Estimate downMps2, Estimate gravityMps2, double tiltDeg = DefaultTiltDeg)
    {
        double span = upMps2.Value - downMps2.Value;
        double g = gravityMps2.Value;
        if (!(span > g) || !(span < 3 * g))
        {
            throw new CalibrationException(Invariant($"the rests read {upMps2.Value:0.000} and {downMps2.Value:0.000} m/s²: not +g and −g on the forward axis (was the axis up in the first rest and down in the second?)"));
        }

        double tiltLoss = 1 - Math.Cos(tiltDeg * Math.PI / 180);
        double cosMean = 1 - (tiltLoss / 2);
        double cosSigma = tiltLoss / Math.Sqrt(24);
        double k = span / (2 * g * cosMean);
        double reading = Math.Sqrt((upMps2.Sigma * upMps2.Sigma) + (downMps2.Sigma * downMps2.Sigma));
        double kSigma = k * Math.Sqrt(Square(reading / span) + Square(gravityMps2.Sigma / g) + Square(cosSigma / cosMean));
        double bias = (upMps2.Value + downMps2.Value) / 2;
        double biasSigma = Math.Sqrt(Square(reading / 2) + Square(k * g * cosSigma));
        var warnings = new List<string>();
        if (Math.Abs(k - 1) > 0.05)
        {
            warnings.Add(Invariant($"the forward axis reads {(k - 1) * 100:+0.0;-0.0} % from the force: far beyond a sensor's usual 1–3 %; check the rests and the axis"));
        }

        return new AccelerometerScaleEstimate
        {
            Scale = new Estimate(k, kSigma),
            BiasMps2 = new Estimate(bias, biasSigma),
            GravityMps2 = gravityMps2,
            TiltDeg = tiltDeg,
            UpMps2 = upMps2,
            DownMps2 = downMps2,
            Warnings = warnings,
        };
    }

    private static double Square(double x) => x * x;
}
