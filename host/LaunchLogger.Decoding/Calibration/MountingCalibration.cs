using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Statistics;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Calibration;

/// <summary>The accelerometer's mounting from the samples of staged runs: pitch from the resting
/// gravity vector, yaw from the direction of the horizontal specific force during a straight
/// acceleration, and — from two rests on one spot facing opposite ways — the mounting separated
/// from the ground's slope (hardware-notes/mounting-and-axes.md §3, calibration.md §3).</summary>
/// <remarks>
/// <para>Pitch: at rest an accelerometer reads the reaction to gravity, +g straight up (the
/// definition of specific force; any navigation text). The forward axis then reads g·sin(pitch)
/// plus its own offset, and the resting pitch is asin(forward / |mean vector|) — the same
/// quantity the reconstruction computes at every staging, offset included. On level ground that
/// is the mounting pitch the grade estimate must subtract. On a slope θ along the car it reads
/// mounting + θ; facing the other way on the same spot, mounting − θ; so the mean of the two is
/// the mounting and half their difference the slope.</para>
/// <para>Yaw: on a straight, level road the car's acceleration points along its centre line, so
/// the change of the readings from rest, (Δforward, Δlateral), is a·(cos ψ, −sin ψ) for a box
/// turned ψ to the left. ψ = −atan(k), k the least-squares slope of Δlateral on Δforward over the
/// samples of firm acceleration (gravity leaking in through squat pitch changes both alike and
/// cancels in the ratio). Its 1 σ comes from the residual scatter, widened for correlation from
/// sample to sample, plus an allowance for what the ratio cannot see: a box rolled by ρ also
/// turns the car's squat pitch into lateral readings, an error of about sin ρ·sin φ, taken with
/// φ = <see cref="SquatPitchAllowanceDeg"/>. It assumes no steering and no change of camber.</para>
/// </remarks>
public static class MountingCalibration
{
    /// <summary>Forward acceleration above rest that counts as firm, m/s² (about 0.1 g).</summary>
    public const double FirmAccelerationMps2 = 1.0;

    /// <summary>Fewest resting samples to average; fewer and the staging event's vector is used.</summary>
    public const int MinimumRestSamples = 50;

    /// <summary>Fewest samples of firm acceleration for a yaw estimate.</summary>
    public const int MinimumYawSamples = 100;

    /// <summary>Resting per-sample noise above which the car was not still, m/s² (about 50 milli-g).</summary>
    public const double StillNoiseLimitMps2 = 0.5;

    /// <summary>Body pitch under acceleration allowed for in the yaw's uncertainty, degrees
    /// (cars squat a degree or two at launch; from memory, mounting-and-axes.md §3).</summary>
    public const double SquatPitchAllowanceDeg = 2.0;

    /// <summary>Standard gravity, m/s² (3rd CGPM, 1901; ISO 80000-3).</summary>
    private const double G0 = 9.80665;

    /// <summary>Time kept clear before first motion, seconds.</summary>
    private const double MotionMarginS = 0.05;

    /// <summary>The mounting from one run on level ground.</summary>
    /// <remarks>The ground is taken as level and nothing in the data can check it: each 1 % of
    /// slope along the car adds 0.57° to the pitch (<see cref="MountingEstimate.TwoWay"/> is false).</remarks>
    /// <exception cref="CalibrationException">The run has no usable rest.</exception>
    public static MountingEstimate FromLevelRest(DecodedRun run)
    {
        ArgumentNullException.ThrowIfNull(run);
        RestReading rest = ReadRest(run, out List<string> warnings);
        YawReading? yaw = ReadYaw(run, rest);
        if (yaw is null)
        {
            warnings.Add(Invariant($"{run.Source}: no firm straight acceleration (at least {MinimumYawSamples} samples above {FirmAccelerationMps2:0.#} m/s²), so the yaw was not measured"));
        }

        return new MountingEstimate
        {
            PitchRad = rest.PitchRad,
            RollRad = rest.RollRad,
            YawRad = yaw?.YawRad,
            TwoWay = false,
            Rests = [rest],
            Yaws = yaw is null ? [] : [yaw],
            Warnings = warnings,
        };
    }

    /// <summary>The mounting and the spot's slope from two rests on one spot, the car facing
    /// opposite ways.</summary>
    /// <exception cref="CalibrationException">A run has no usable rest.</exception>
    public static MountingEstimate FromOppositeRests(DecodedRun first, DecodedRun second)
    {
        ArgumentNullException.ThrowIfNull(first);
        ArgumentNullException.ThrowIfNull(second);
        RestReading a = ReadRest(first, out List<string> warnings);
        RestReading b = ReadRest(second, out List<string> more);
        warnings.AddRange(more);
        double magnitudeA = Magnitude(a);
        double magnitudeB = Magnitude(b);
        if (Math.Abs((magnitudeA / magnitudeB) - 1) > 0.02)
        {
            warnings.Add(Invariant($"the two rests read gravity as {magnitudeA / G0:0.000} g and {magnitudeB / G0:0.000} g: were both logs made with the same box and sensor?"));
        }

        Estimate pitch = HalfSum(a.PitchRad, b.PitchRad);
        Estimate grade = HalfDifference(a.PitchRad, b.PitchRad);
        if (Math.Abs(Math.Tan(grade.Value)) > 0.1)
        {
            warnings.Add(Invariant($"the spot slopes {Math.Tan(grade.Value):P1}: were both rests on the same spot, facing exactly opposite ways?"));
        }

        var yaws = new List<YawReading>();
        foreach ((DecodedRun run, RestReading rest) in new[] { (first, a), (second, b) })
        {
            if (ReadYaw(run, rest) is { } yaw)
            {
                yaws.Add(yaw);
            }
        }

        Estimate? combinedYaw = CombineYaws(yaws, warnings);
        if (combinedYaw is null)
        {
            warnings.Add(Invariant($"neither run had a firm straight acceleration (at least {MinimumYawSamples} samples above {FirmAccelerationMps2:0.#} m/s²), so the yaw was not measured"));
        }

        return new MountingEstimate
        {
            PitchRad = pitch,
            RollRad = HalfSum(a.RollRad, b.RollRad),
            YawRad = combinedYaw,
            TwoWay = true,
            GradeRad = grade,
            CrossSlopeRad = HalfDifference(a.RollRad, b.RollRad),
            Rests = [a, b],
            Yaws = yaws,
            Warnings = warnings,
        };
    }

    /// <summary>The mean readings while the car stood staged before first motion.</summary>
    /// <exception cref="CalibrationException">No accelerometer, not staged, or no still samples
    /// and no staging vector.</exception>
    public static RestReading ReadRest(DecodedRun run) => ReadRest(run, out _);

    /// <summary>The yaw from the run's firm acceleration after <paramref name="rest"/>, or null
    /// when there is too little of it.</summary>
    public static YawReading? ReadYaw(DecodedRun run, RestReading rest)
    {
        ArgumentNullException.ThrowIfNull(run);
        ArgumentNullException.ThrowIfNull(rest);
        AccelSeries? a = run.Accel;
        if (a is null || !a.HasAllAxes)
        {
            return null;
        }

        var forward = new List<double>();
        var lateral = new List<double>();
        var index = new List<int>();
        for (int i = 0; i < a.Count; i++)
        {
            double df = a.ForwardMps2[i] - rest.ForwardMps2.Value;
            if (a.TimeS[i] > rest.EndS && df >= FirmAccelerationMps2)
            {
                forward.Add(df);
                lateral.Add(a.LateralMps2[i] - rest.LateralMps2.Value);
                index.Add(i);
            }
        }

        int n = forward.Count;
        if (n < MinimumYawSamples)
        {
            return null;
        }

        double sff = 0;
        double sfl = 0;
        for (int i = 0; i < n; i++)
        {
            sff += forward[i] * forward[i];
            sfl += forward[i] * lateral[i];
        }

        double slope = sfl / sff;
        var residual = new double[n];
        double sumSquares = 0;
        for (int i = 0; i < n; i++)
        {
            residual[i] = lateral[i] - (slope * forward[i]);
            sumSquares += residual[i] * residual[i];
        }

        double sigmaResidual = Math.Sqrt(sumSquares / (n - 1));
        double correlation = CorrelationFactor(residual, index);
        double slopeSigma = sigmaResidual * correlation / Math.Sqrt(sff);
        double yaw = -Math.Atan(slope);
        double coupling = Math.Abs(Math.Sin(rest.RollRad.Value)) * Math.Sin(SquatPitchAllowanceDeg * Math.PI / 180);
        double statistical = slopeSigma / (1 + (slope * slope));
        double yawSigma = Math.Sqrt((statistical * statistical) + (coupling * coupling));
        double duration = n * a.SamplePeriodS;
        return new YawReading(run.Source, new Estimate(yaw, yawSigma), n, duration, forward.Average());
    }

    private static RestReading ReadRest(DecodedRun run, out List<string> warnings)
    {
        ArgumentNullException.ThrowIfNull(run);
        warnings = [];
        AccelSeries? a = run.Accel;
        if (a is null || a.Count == 0)
        {
            throw new CalibrationException($"{run.Source}: the run has no accelerometer samples");
        }

        if (!a.HasAllAxes)
        {
            throw new CalibrationException($"{run.Source}: the mounting needs all three accelerometer axes; this input has the forward axis only");
        }

        if (!run.Configuration.Staged)
        {
            throw new CalibrationException($"{run.Source}: the run opened while rolling, so it has no rest; stage the car and wait before driving off");
        }

        double endS = RestEndS(run);
        int end = Array.BinarySearch(a.TimeS, endS);
        end = end >= 0 ? end + 1 : ~end;
        if (end < MinimumRestSamples)
        {
            return RestFromStagingVector(run, a, endS, warnings);
        }

        Robust forward = Robust.Mean(a.ForwardMps2, 0, end);
        Robust lateral = Robust.Mean(a.LateralMps2, 0, end);
        Robust vertical = Robust.Mean(a.VerticalMps2, 0, end);
        double noise = Math.Max(forward.NoiseSigma, Math.Max(lateral.NoiseSigma, vertical.NoiseSigma));
        if (noise > StillNoiseLimitMps2)
        {
            warnings.Add(Invariant($"{run.Source}: the readings before first motion scatter by {noise / G0 * 1000:0} milli-g: the car was not quite still (engine, people moving?)"));
        }

        return Reading(run.Source, a.TimeS[0], a.TimeS[end - 1], forward.Count, forward.Estimate, lateral.Estimate, vertical.Estimate);
    }

    /// <summary>When the still window ends: kept clear of first motion as the box, the first
    /// pulse and the reconstruction's onset fit (less three σ) each place it.</summary>
    private static double RestEndS(DecodedRun run)
    {
        double end = double.PositiveInfinity;
        if (run.FirmwareMotionS is { } firmware)
        {
            end = Math.Min(end, firmware);
        }

        if (run.Pulses.Count > 0)
        {
            end = Math.Min(end, run.Pulses[0].LoS);
        }

        ReconstructedRun rebuilt = Reconstructor.Reconstruct(run);
        end = Math.Min(end, rebuilt.FirstMotionS.Value - (3 * rebuilt.FirstMotionS.Sigma));
        return end - MotionMarginS;
    }

    /// <summary>The staging event's vector (the box's mean over its whole still window, whole
    /// milli-g) when too few samples before first motion were logged.</summary>
    private static RestReading RestFromStagingVector(DecodedRun run, AccelSeries a, double endS, List<string> warnings)
    {
        if (run.RestGravityMilliG is not { } g || a.Axes is not { } axes)
        {
            throw new CalibrationException($"{run.Source}: too few accelerometer samples before first motion and no resting vector in the log");
        }

        double[] v = [g.X, g.Y, g.Z];
        int samples = run.Events.FirstOrDefault(e => e.Kind == Firmware.Wire.EventKind.Staged)?.Values is { Length: 4 } values ? (int)values[3] : 1;

        // The box rounds the mean to whole milli-g: a uniform error of 1/√12 milli-g.
        double sigma = G0 / 1000 / Math.Sqrt(12);
        Estimate Axis(int axis, int sign) => new(sign * v[axis] * G0 / 1000, sigma);
        warnings.Add(Invariant($"{run.Source}: too few samples before first motion; the box's resting vector (whole milli-g) was used"));
        return Reading(run.Source, endS, endS, samples, Axis(axes.ForwardAxis, axes.ForwardSign), Axis(axes.LateralAxis, axes.LateralSign), Axis(axes.VerticalAxis, axes.VerticalSign));
    }

    private static RestReading Reading(string source, double startS, double endS, int samples, Estimate forward, Estimate lateral, Estimate vertical)
    {
        double f = forward.Value;
        double l = lateral.Value;
        double u = vertical.Value;
        double magnitude = Math.Sqrt((f * f) + (l * l) + (u * u));
        if (!(magnitude > 0.5 * G0 && magnitude < 1.5 * G0))
        {
            throw new CalibrationException(Invariant($"{source}: the resting readings add up to {magnitude / G0:0.00} g, not about 1 g: check the accelerometer's range and scale"));
        }

        double pitch = Math.Asin(Math.Clamp(f / magnitude, -1, 1));
        double pitchSigma = forward.Sigma / (magnitude * Math.Cos(pitch));
        double roll = Math.Atan2(l, u);
        double horizontal = (l * l) + (u * u);
        double rollSigma = Math.Sqrt((lateral.Sigma * u * lateral.Sigma * u) + (vertical.Sigma * l * vertical.Sigma * l)) / horizontal;
        return new RestReading(source, startS, endS, samples, forward, lateral, vertical, new Estimate(pitch, pitchSigma), new Estimate(roll, rollSigma));
    }

    private static double Magnitude(RestReading r)
    {
        double f = r.ForwardMps2.Value;
        double l = r.LateralMps2.Value;
        double u = r.VerticalMps2.Value;
        return Math.Sqrt((f * f) + (l * l) + (u * u));
    }

    private static Estimate HalfSum(Estimate a, Estimate b)
        => new(0.5 * (a.Value + b.Value), 0.5 * Math.Sqrt((a.Sigma * a.Sigma) + (b.Sigma * b.Sigma)));

    private static Estimate HalfDifference(Estimate a, Estimate b)
        => new(0.5 * (a.Value - b.Value), 0.5 * Math.Sqrt((a.Sigma * a.Sigma) + (b.Sigma * b.Sigma)));

    /// <summary>Inverse-variance weighted mean of the yaws; warns when they disagree.</summary>
    private static Estimate? CombineYaws(List<YawReading> yaws, List<string> warnings)
    {
        if (yaws.Count == 0)
        {
            return null;
        }

        double weights = 0;
        double sum = 0;
        foreach (YawReading y in yaws)
        {
            double w = 1 / Math.Max(y.YawRad.Sigma * y.YawRad.Sigma, 1e-12);
            weights += w;
            sum += w * y.YawRad.Value;
        }

        var combined = new Estimate(sum / weights, 1 / Math.Sqrt(weights));
        if (yaws.Count == 2)
        {
            Estimate a = yaws[0].YawRad;
            Estimate b = yaws[1].YawRad;
            double limit = (3 * Math.Sqrt((a.Sigma * a.Sigma) + (b.Sigma * b.Sigma))) + (0.2 * Math.PI / 180);
            if (Math.Abs(a.Value - b.Value) > limit)
            {
                warnings.Add(Invariant($"the two accelerations give yaws {a.Value * 180 / Math.PI:0.00}° and {b.Value * 180 / Math.PI:0.00}°: was one of them not straight?"));
            }
        }

        return combined;
    }

    /// <summary>√((1 + ρ)/(1 − ρ)) for the lag-one correlation ρ of consecutive samples (ρ kept
    /// in [0, 0.8]): how much correlation widens the uncertainty of an average or a slope.</summary>
    private static double CorrelationFactor(double[] residual, List<int> index)
    {
        double c0 = 0;
        double c1 = 0;
        for (int i = 0; i < residual.Length; i++)
        {
            c0 += residual[i] * residual[i];
            if (i + 1 < residual.Length && index[i + 1] == index[i] + 1)
            {
                c1 += residual[i] * residual[i + 1];
            }
        }

        double rho = c0 > 0 ? Math.Clamp(c1 / c0, 0, 0.8) : 0;
        return Math.Sqrt((1 + rho) / (1 - rho));
    }
}
