using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>What a basic timer does, kept as a fair yardstick for <see cref="Reconstructor"/>:
/// the first pulse is the start (distance 0 there), distance is interpolated linearly between
/// pulse observations, and speed is the pulses counted in a sliding window of
/// <see cref="SpeedWindowS"/> times the distance per pulse, divided by the window.</summary>
/// <remarks>
/// Observations are taken at their bracket midpoints. The window is centred on the time it
/// reports, as an offline timer can afford: v(t) = mpp·(N(t + w/2) − N(t − w/2))/w, with N(t) the
/// pulses observed up to t. Crossings of speeds and distances are then interpolated linearly by
/// the shared <see cref="Metrics.FigureCalculator"/>, like every other trajectory's.
/// The start is late by the time the car needs to reach the first edge, about √(2·d₁/a) at a
/// constant acceleration a with the first edge d₁ from the standstill position (kinematics, any
/// textbook); distances are short by d₁. No uncertainties are claimed: the trajectory's σ
/// columns are null and every σ is 0.
/// </remarks>
public static class NaiveReconstruction
{
    /// <summary>The speed window, s: 0.1 s, as a basic timer counts pulses (common practice).</summary>
    public const double SpeedWindowS = 0.1;

    /// <summary>Reconstructs <paramref name="run"/> the naive way.</summary>
    /// <param name="run">The run; only its distance channel's pulses are used.</param>
    /// <param name="options">Grid step, pre-roll and rollout distance; defaults when null.</param>
    /// <exception cref="ArgumentNullException"><paramref name="run"/> is null.</exception>
    public static ReconstructedRun Reconstruct(DecodedRun run, ReconstructionOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(run);
        options ??= ReconstructionOptions.Default;
        double rolloutM = options.RolloutM ?? run.Configuration.RolloutM;
        double mpp = PulseChannel.MetresPerPulse(run.Configuration);
        var warnings = new List<string>();

        // Observation times and distances, equal times merged (the later count wins).
        var times = new List<double>(run.Pulses.Count);
        var distances = new List<double>(run.Pulses.Count);
        long firstCount = run.Pulses.Count > 0 ? run.Pulses[0].Count : 0;
        foreach (PulseRecord p in run.Pulses)
        {
            double d = (p.Count - firstCount) * mpp;
            if (times.Count > 0 && p.MidS <= times[^1])
            {
                distances[^1] = Math.Max(distances[^1], d);
                continue;
            }

            times.Add(p.MidS);
            distances.Add(d);
        }

        if (times.Count == 0 || mpp <= 0)
        {
            warnings.Add("no pulses (or no distance per pulse): the naive method has nothing to work with");
            double t = run.Configuration.OpenedS;
            return new ReconstructedRun
            {
                Source = run,
                Trajectory = new Trajectory { TimeS = [t], DistanceM = [0], SpeedMps = [0], AccelMps2 = [0] },
                FirstMotionS = new Estimate(t, 0),
                RolloutM = rolloutM,
                Method = ReconstructionMethod.NaiveFirstEdge,
                Warnings = warnings,
            };
        }

        double start = times[0];
        double end = times[^1];
        double step = options.GridStepS;
        int before = (int)Math.Ceiling(options.PreRollS / step);
        int count = before + (int)Math.Floor((end - start) / step) + 1;
        var grid = new double[count];
        for (int i = 0; i < count; i++)
        {
            grid[i] = start + ((i - before) * step);
        }

        if (grid[^1] < end)
        {
            Array.Resize(ref grid, count + 1);
            grid[^1] = end;
            count++;
        }

        var distance = new double[count];
        var speed = new double[count];
        var accel = new double[count];
        double half = 0.5 * SpeedWindowS;
        for (int i = 0; i < count; i++)
        {
            distance[i] = Interpolate(times, distances, grid[i]);
            speed[i] = grid[i] < start ? 0 : (CountedBy(times, distances, grid[i] + half) - CountedBy(times, distances, grid[i] - half)) / SpeedWindowS;
        }

        for (int i = 0; i < count; i++)
        {
            int a = Math.Max(0, i - 1);
            int b = Math.Min(count - 1, i + 1);
            accel[i] = b > a ? (speed[b] - speed[a]) / (grid[b] - grid[a]) : 0;
        }

        var trajectory = new Trajectory { TimeS = grid, DistanceM = distance, SpeedMps = speed, AccelMps2 = accel };
        Estimate? rolloutTime = null;
        Estimate? rolloutSpeed = null;
        for (int i = 1; i < times.Count; i++)
        {
            if (distances[i] >= rolloutM && distances[i - 1] < rolloutM)
            {
                double f = (rolloutM - distances[i - 1]) / (distances[i] - distances[i - 1]);
                double t = times[i - 1] + (f * (times[i] - times[i - 1]));
                rolloutTime = new Estimate(t, 0);
                rolloutSpeed = new Estimate(trajectory.ValueAt(speed, t), 0);
                break;
            }
        }

        return new ReconstructedRun
        {
            Source = run,
            Trajectory = trajectory,
            FirstMotionS = new Estimate(start, 0),
            RolloutTimeS = rolloutTime,
            RolloutSpeedMps = rolloutSpeed,
            RolloutM = rolloutM,
            Method = ReconstructionMethod.NaiveFirstEdge,
            Warnings = warnings,
        };
    }

    /// <summary>Distance of the pulses observed at or before <paramref name="t"/> (a step
    /// function of time: pulses are counted, not interpolated).</summary>
    private static double CountedBy(List<double> xs, List<double> distances, double t)
    {
        int i = xs.BinarySearch(t);
        i = i >= 0 ? i : ~i - 1;
        return i < 0 ? 0 : distances[i];
    }

    /// <summary>Linear interpolation in ascending <paramref name="xs"/>, held flat beyond the ends.</summary>
    private static double Interpolate(List<double> xs, List<double> ys, double x)
    {
        if (x <= xs[0])
        {
            return ys[0];
        }

        if (x >= xs[^1])
        {
            return ys[^1];
        }

        int i = xs.BinarySearch(x);
        if (i >= 0)
        {
            return ys[i];
        }

        i = ~i;
        double f = (x - xs[i - 1]) / (xs[i] - xs[i - 1]);
        return ys[i - 1] + (f * (ys[i] - ys[i - 1]));
    }
}
