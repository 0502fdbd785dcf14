using LaunchLogger.Decoding.Reading;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Runs;

/// <summary>The bounds every number from outside must keep — log fields (even under a correct
/// CRC), plain-text files, command-line options — so that nothing is sized from an unchecked
/// quantity and every figure stays finite. Documented in DEVELOPERS.md ("Input bounds").</summary>
/// <remarks>The limits are generous for any car and any box we know of; the sources of the
/// physical ones are given beside each.</remarks>
public static class InputLimits
{
    /// <summary>The longest a run may last from its opening to its last observation, s (one hour:
    /// a 30-minute endurance run fits twice over). Observations later than this are dropped.</summary>
    public const double MaxRunSpanS = 3600;

    /// <summary>How long before its opening a run may hold observations (the pre-trigger ring,
    /// normally about a second), s.</summary>
    public const double MaxPreRunS = 60;

    /// <summary>The largest time the box's clock may show, µs (2^47 µs ≈ 4.5 years since
    /// power-up); larger values cannot come from a running box.</summary>
    public const long MaxClockMicros = 1L << 47;

    /// <summary>The largest magnitude a plain-text time may have, s (a double still resolves
    /// well under 1 µs there).</summary>
    public const double MaxTextTimeS = 1e9;

    /// <summary>The largest acceleration a plain-text file may give, m/s² (±400 g, the widest
    /// range of common MEMS shock sensors, from memory).</summary>
    public const double MaxTextAccelMps2 = 4000;

    /// <summary>The closest two distinct pulse edges may be, s: the box's clock tick.</summary>
    public const double MinEdgeSpacingS = 1e-6;

    /// <summary>Fewest pulses per wheel revolution.</summary>
    public const int MinPulsesPerRevolution = 1;

    /// <summary>Most pulses per wheel revolution (a fine encoder; tone rings have 40–100 teeth,
    /// common practice).</summary>
    public const int MaxPulsesPerRevolution = 10_000;

    /// <summary>Smallest rolling circumference, m (a 10-inch kart tyre is about 0.8 m; common practice).</summary>
    public const double MinCircumferenceM = 0.3;

    /// <summary>Largest rolling circumference, m (a large truck tyre is about 3.5 m; common practice).</summary>
    public const double MaxCircumferenceM = 5;

    /// <summary>Smallest distance per pulse, m.</summary>
    public const double MinMetresPerPulse = 1e-4;

    /// <summary>Largest distance per pulse, m (one pulse per revolution of the largest wheel).</summary>
    public const double MaxMetresPerPulse = MaxCircumferenceM;

    /// <summary>Largest rollout distance, m.</summary>
    public const double MaxRolloutM = 10;

    /// <summary>Highest accelerometer output data rate, Hz (MEMS parts top out at a few kHz,
    /// e.g. 5.376 kHz in low-power mode on the LIS3DH, from its datasheet).</summary>
    public const double MaxAccelRateHz = 10_000;

    /// <summary>Lowest accelerometer output data rate, Hz, when one is fitted.</summary>
    public const double MinAccelRateHz = 1;

    /// <summary>Largest accelerometer full scale, milli-g.</summary>
    public const long MaxAccelFullScaleMilliG = 400_000;

    /// <summary>Highest speed a figure may show, m/s (about 1,080 km/h: above any land vehicle a
    /// club or test team times; a larger value is a fault of the input).</summary>
    public const double MaxPlausibleSpeedMps = 300;

    /// <summary>Why a configuration frame cannot describe a real box, or null when it can.</summary>
    public static string? CheckConfiguration(ConfigurationBody c)
    {
        if (c.OpenedMicros > MaxClockMicros)
        {
            return Invariant($"run opened at {c.OpenedMicros} µs, beyond the clock limit of {MaxClockMicros} µs");
        }

        string? channel = CheckWheel("channel 0", c.PulsesPerRevolution, c.CircumferenceMicrometres);
        if (channel != null)
        {
            return channel;
        }

        if (c.SecondChannelPresent && CheckWheel("channel 1", c.SecondPulsesPerRevolution, c.SecondCircumferenceMicrometres) is { } second)
        {
            return second;
        }

        if (c.RolloutMicrometres < 1 || c.RolloutMicrometres > MaxRolloutM * 1e6)
        {
            return Invariant($"rollout {c.RolloutMicrometres} µm is outside 1 µm to {MaxRolloutM} m");
        }

        if (c.AccelPresent && (c.AccelOutputDataRateMilliHz < MinAccelRateHz * 1000 || c.AccelOutputDataRateMilliHz > MaxAccelRateHz * 1000))
        {
            return Invariant($"accelerometer rate {c.AccelOutputDataRateMilliHz} mHz is outside {MinAccelRateHz} to {MaxAccelRateHz} Hz");
        }

        if (c.AccelFullScaleMilliG > MaxAccelFullScaleMilliG)
        {
            return Invariant($"accelerometer full scale {c.AccelFullScaleMilliG} milli-g is above {MaxAccelFullScaleMilliG}");
        }

        if (c.StopHoldMicros > MaxRunSpanS * 1e6 || c.BracketLimitMicros > MaxRunSpanS * 1e6)
        {
            return Invariant($"stop hold {c.StopHoldMicros} µs or bracket limit {c.BracketLimitMicros} µs is longer than a run may last");
        }

        return null;
    }

    /// <summary>Why a distance per pulse is implausible, or null when it is plausible.</summary>
    public static string? CheckMetresPerPulse(double metresPerPulse) =>
        metresPerPulse >= MinMetresPerPulse && metresPerPulse <= MaxMetresPerPulse
            ? null
            : Invariant($"{metresPerPulse} m per pulse is outside {MinMetresPerPulse} to {MaxMetresPerPulse} m");

    /// <summary>Why a rolling circumference is implausible, or null when it is plausible.</summary>
    public static string? CheckCircumference(double circumferenceM) =>
        circumferenceM >= MinCircumferenceM && circumferenceM <= MaxCircumferenceM
            ? null
            : Invariant($"circumference {circumferenceM} m is outside {MinCircumferenceM} to {MaxCircumferenceM} m");

    /// <summary>Why a pulses-per-revolution count is implausible, or null when it is plausible.</summary>
    public static string? CheckPulsesPerRevolution(long pulsesPerRevolution) =>
        pulsesPerRevolution >= MinPulsesPerRevolution && pulsesPerRevolution <= MaxPulsesPerRevolution
            ? null
            : Invariant($"{pulsesPerRevolution} pulses per revolution is outside {MinPulsesPerRevolution} to {MaxPulsesPerRevolution}");

    private static string? CheckWheel(string name, long pulsesPerRevolution, long circumferenceMicrometres)
    {
        if (CheckPulsesPerRevolution(pulsesPerRevolution) is { } ppr)
        {
            return name + ": " + ppr;
        }

        if (CheckCircumference(circumferenceMicrometres / 1e6) is { } circumference)
        {
            return name + ": " + circumference;
        }

        return CheckMetresPerPulse(circumferenceMicrometres / 1e6 / pulsesPerRevolution) is { } mpp ? name + ": " + mpp : null;
    }
}
