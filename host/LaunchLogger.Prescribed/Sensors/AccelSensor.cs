using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Truth;
using MathNet.Numerics.Distributions;

namespace LaunchLogger.Prescribed.Sensors;

/// <summary>An accelerometer fixed in the car: samples at its own (drifting) rate the specific
/// force along its axes, with bias, scale error, mounting tilt, road grade and white noise.</summary>
/// <remarks>
/// Specific force along the road on a grade γ (uphill positive): f_long = a + g·sin γ,
/// f_vert = g·cos γ (statics, any mechanics text). A sensor pitched nose-up by θ about the lateral
/// axis reads
/// <code>
/// x = f_long·cos θ + f_vert·sin θ
/// z = −f_long·sin θ + f_vert·cos θ
/// </code>
/// then each axis (1 + scale)·value + bias + noise. Noise per sample is the density times
/// √(rate/2) (the sensor's bandwidth taken as half its output rate; common practice for MEMS
/// data sheets, from memory). The sensor's clock runs fast by <see cref="ClockDriftPpm"/>: sample
/// i is taken at t₀ + i·(1 − drift)/rate but stamped t₀ + i/rate, as a box that trusts the
/// nominal rate would.
/// </remarks>
public sealed record AccelSensor
{
    /// <summary>Nominal output rate, Hz (100–1600 in practice).</summary>
    public double RateHz { get; init; } = 400;

    /// <summary>Forward-axis bias, m/s².</summary>
    public double BiasXMps2 { get; init; }

    /// <summary>Vertical-axis bias, m/s².</summary>
    public double BiasZMps2 { get; init; }

    /// <summary>Scale error of every axis, a fraction.</summary>
    public double ScaleError { get; init; }

    /// <summary>Mounting pitch, nose up positive, rad.</summary>
    public double PitchRad { get; init; }

    /// <summary>Road grade, uphill positive, rad.</summary>
    public double GradeRad { get; init; }

    /// <summary>Noise density, µg/√Hz.</summary>
    public double NoiseMicroGPerRootHz { get; init; }

    /// <summary>How fast the sensor's clock runs against the box's, parts per million.</summary>
    public double ClockDriftPpm { get; init; }

    /// <summary>Time of the first sample, s.</summary>
    public double FirstSampleS { get; init; }

    /// <summary>1-σ of the noise on one sample, m/s².</summary>
    public double NoisePerSampleMps2 => NoiseMicroGPerRootHz * 1e-6 * TruthUnits.StandardGravity * Math.Sqrt(RateHz / 2);

    /// <summary>The samples over the whole profile.</summary>
    public AccelSample[] Sample(MotionProfile profile, Random random)
    {
        ArgumentNullException.ThrowIfNull(profile);
        ArgumentNullException.ThrowIfNull(random);
        if (!(RateHz > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(RateHz), RateHz, "the rate is positive");
        }

        double nominal = 1 / RateHz;
        double truePeriod = nominal * (1 - (ClockDriftPpm * 1e-6));
        int count = (int)Math.Floor((profile.EndS - FirstSampleS) / nominal) + 1;
        var samples = new AccelSample[Math.Max(0, count)];
        double g = TruthUnits.StandardGravity;
        double sigma = NoisePerSampleMps2;
        double cosP = Math.Cos(PitchRad);
        double sinP = Math.Sin(PitchRad);
        double vertical = g * Math.Cos(GradeRad);
        double along = g * Math.Sin(GradeRad);
        for (int i = 0; i < samples.Length; i++)
        {
            double trueS = FirstSampleS + (i * truePeriod);
            double fLong = profile.StateAt(trueS).AccelMps2 + along;
            double x = (fLong * cosP) + (vertical * sinP);
            double z = (-fLong * sinP) + (vertical * cosP);
            samples[i] = new AccelSample(
                FirstSampleS + (i * nominal),
                trueS,
                ((1 + ScaleError) * x) + BiasXMps2 + Noise(random, sigma),
                Noise(random, sigma),
                ((1 + ScaleError) * z) + BiasZMps2 + Noise(random, sigma));
        }

        return samples;
    }

    private static double Noise(Random random, double sigma) => sigma > 0 ? Normal.Sample(random, 0, sigma) : 0;
}
