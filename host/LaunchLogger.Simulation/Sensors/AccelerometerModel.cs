using LaunchLogger.Simulation.Scenarios;
using MathNet.Numerics.Distributions;

namespace LaunchLogger.Simulation.Sensors;

/// <summary>The accelerometer: samples the specific force at its own clock's rate, in its own axes,
/// with scale error, bias, noise, quantisation to whole milli-g and clipping at full scale.</summary>
/// <remarks>
/// Specific force is acceleration minus gravity. In the road frame (x along the road, z normal to
/// it) a car accelerating at a on a grade θ feels f = (a + g·sin θ, 0, g·cos θ). The body pitches
/// nose up by φ; the sensor is turned from the body by its mounting yaw ψ, pitch β and roll ρ, so
/// its axes in body coordinates are the columns of R = Rz(ψ)·Ry(−β)·Rx(ρ) (z up, y left, so a
/// raised nose is a negative turn about y), and it reads Rᵀ·f_body. Noise per sample is white
/// with σ = √((noise density·√(ODR/2))² + vibration²): the sensor's noise over its Nyquist band
/// plus the car's vibration. Sample k is taken at t₀ + k/(ODR·(1 + drift)), so a positive drift
/// means more samples than nominal per second of the box's clock.
/// Not modelled: the sensor's digital low-pass filter and the lever-arm effect of pitch rate.
/// </remarks>
internal sealed class AccelerometerModel
{
    private readonly AccelerometerSpec spec;
    private readonly Random random;
    private readonly double sinGrade;
    private readonly double cosGrade;
    private readonly double[,] rotation;
    private readonly double sigmaMilliG;
    private readonly double fullScaleMilliG;
    private readonly double firstSampleS;
    private double nextSampleS;
    private long index;

    internal AccelerometerModel(AccelerometerSpec spec, double gradeRad, Random random)
    {
        this.spec = spec;
        this.random = random;
        sinGrade = Math.Sin(gradeRad);
        cosGrade = Math.Cos(gradeRad);
        TruePeriodS = 1 / (spec.OutputDataRateHz * (1 + (spec.ClockDriftPpm * 1e-6)));
        double sensorNoise = spec.NoiseDensityMicroGPerRootHz * 1e-3 * Math.Sqrt(spec.OutputDataRateHz / 2);
        sigmaMilliG = Math.Sqrt((sensorNoise * sensorNoise) + (spec.VibrationMilliGRms * spec.VibrationMilliGRms));
        fullScaleMilliG = spec.FullScaleG * 1000;
        rotation = MountRotation(spec.MountYawDeg, spec.MountPitchDeg, spec.MountRollDeg);
        firstSampleS = random.NextDouble() * TruePeriodS;
        nextSampleS = firstSampleS;
    }

    /// <summary>The true time between samples on the box's clock, s.</summary>
    internal double TruePeriodS { get; }

    /// <summary>1-σ of the noise added to each axis of each sample, milli-g.</summary>
    internal double NoiseSigmaMilliG => sigmaMilliG;

    /// <summary>True sample times (simulation s), in order.</summary>
    internal List<double> SampleTimesS { get; } = [];

    /// <summary>Samples as x, y, z triples in milli-g, in order.</summary>
    internal List<short> SamplesMilliG { get; } = [];

    /// <summary>Takes the samples that fall in (<paramref name="t0"/>, <paramref name="t1"/>], with
    /// the body's acceleration over the step and its pitch at both ends.</summary>
    internal void Advance(double t0, double t1, double accelMps2, double pitch0Rad, double pitch1Rad)
    {
        while (nextSampleS <= t1)
        {
            double f = t1 > t0 ? (nextSampleS - t0) / (t1 - t0) : 1;
            double pitch = pitch0Rad + (Math.Clamp(f, 0, 1) * (pitch1Rad - pitch0Rad));
            Sample(accelMps2, pitch);
            SampleTimesS.Add(nextSampleS);
            index++;
            nextSampleS = firstSampleS + (index * TruePeriodS);
        }
    }

    private void Sample(double accelMps2, double pitchRad)
    {
        const double G0 = 9.80665; // standard gravity, m/s² (3rd CGPM, 1901)
        double roadX = accelMps2 + (G0 * sinGrade);
        double roadZ = G0 * cosGrade;
        double c = Math.Cos(pitchRad);
        double s = Math.Sin(pitchRad);
        double bodyX = (roadX * c) + (roadZ * s);
        double bodyZ = (-roadX * s) + (roadZ * c);
        AxisTriple scale = spec.ScaleError;
        AxisTriple bias = spec.BiasMilliG;
        for (int axis = 0; axis < 3; axis++)
        {
            double sensor = (rotation[0, axis] * bodyX) + (rotation[2, axis] * bodyZ);
            double milliG = sensor / G0 * 1000;
            double scaleError = axis == 0 ? scale.X : axis == 1 ? scale.Y : scale.Z;
            double offset = axis == 0 ? bias.X : axis == 1 ? bias.Y : bias.Z;
            milliG = (milliG * (1 + scaleError)) + offset;
            if (sigmaMilliG > 0)
            {
                milliG += Normal.Sample(random, 0, sigmaMilliG);
            }

            milliG = Math.Clamp(Math.Round(milliG), -fullScaleMilliG, fullScaleMilliG);
            SamplesMilliG.Add((short)Math.Clamp(milliG, short.MinValue, short.MaxValue));
        }
    }

    /// <summary>R = Rz(yaw)·Ry(−pitch)·Rx(roll): columns are the sensor's axes in body coordinates.</summary>
    internal static double[,] MountRotation(double yawDeg, double pitchDeg, double rollDeg)
    {
        double y = yawDeg * Math.PI / 180;
        double p = -pitchDeg * Math.PI / 180;
        double r = rollDeg * Math.PI / 180;
        double[,] rz = { { Math.Cos(y), -Math.Sin(y), 0 }, { Math.Sin(y), Math.Cos(y), 0 }, { 0, 0, 1 } };
        double[,] ry = { { Math.Cos(p), 0, Math.Sin(p) }, { 0, 1, 0 }, { -Math.Sin(p), 0, Math.Cos(p) } };
        double[,] rx = { { 1, 0, 0 }, { 0, Math.Cos(r), -Math.Sin(r) }, { 0, Math.Sin(r), Math.Cos(r) } };
        return Multiply(Multiply(rz, ry), rx);
    }

    private static double[,] Multiply(double[,] a, double[,] b)
    {
        var m = new double[3, 3];
        for (int i = 0; i < 3; i++)
        {
            for (int j = 0; j < 3; j++)
            {
                m[i, j] = (a[i, 0] * b[0, j]) + (a[i, 1] * b[1, j]) + (a[i, 2] * b[2, j]);
            }
        }

        return m;
    }
}
