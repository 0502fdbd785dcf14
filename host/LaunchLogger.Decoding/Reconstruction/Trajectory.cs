namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>Distance, speed and acceleration of the car along its path, sampled on a time grid,
/// with 1-σ uncertainties. The hand-over from reconstruction (or from the simulator's truth) to
/// the figures: every figure is computed from one of these by the same code.</summary>
/// <remarks>Times ascend and are on the input's own axis. Distance is measured from the car's
/// standstill position (0 at first motion). All arrays have the same length.</remarks>
public sealed class Trajectory
{
    /// <summary>Sample times, seconds, ascending.</summary>
    public required double[] TimeS { get; init; }

    /// <summary>Distance from the standstill position, metres.</summary>
    public required double[] DistanceM { get; init; }

    /// <summary>Speed, m/s.</summary>
    public required double[] SpeedMps { get; init; }

    /// <summary>Longitudinal acceleration (not specific force: gravity and tilt removed), m/s².</summary>
    public required double[] AccelMps2 { get; init; }

    /// <summary>1-σ of <see cref="DistanceM"/>, metres; null when exact (truth).</summary>
    public double[]? DistanceSigmaM { get; init; }

    /// <summary>The part of <see cref="DistanceSigmaM"/> every later sample shares, m: errors of
    /// scale along the path (circumference, tyre growth, wheel slip) that a distance between two
    /// times carries only as the growth between them; null when not known apart (then the two
    /// ends' σ add as if independent). See <see cref="IntervalSigmaM"/>.</summary>
    public double[]? SharedDistanceSigmaM { get; init; }

    /// <summary>1-σ of <see cref="SpeedMps"/>, m/s; null when exact (truth).</summary>
    public double[]? SpeedSigmaMps { get; init; }

    /// <summary>Number of samples.</summary>
    public int Count => TimeS.Length;

    /// <summary>The value of one of this trajectory's series (or any array on its time grid) at
    /// <paramref name="timeS"/>, interpolated linearly; held at the ends.</summary>
    public double ValueAt(double[] series, double timeS)
    {
        double[] t = TimeS;
        int i = Array.BinarySearch(t, timeS);
        if (i >= 0)
        {
            return series[i];
        }

        i = ~i;
        if (i == 0)
        {
            return series[0];
        }

        if (i >= t.Length)
        {
            return series[^1];
        }

        double f = (timeS - t[i - 1]) / (t[i] - t[i - 1]);
        return series[i - 1] + (f * (series[i] - series[i - 1]));
    }

    /// <summary>1-σ of the distance covered from <paramref name="fromS"/> to <paramref name="toS"/>, m:
    /// each end's own σ (what is not shared along the path) root-sum-squared with the growth of
    /// the shared part between them. Exact when the shared errors grow in proportion to each
    /// other (a circumference error alone); 0 for a trajectory without σ.</summary>
    /// <remarks><code>
    /// σ_s(t)  = SharedDistanceSigmaM(t)
    /// σ_o(t)² = DistanceSigmaM(t)² − σ_s(t)²
    /// σ²      = σ_o(from)² + σ_o(to)² + (σ_s(to) − σ_s(from))²
    /// </code></remarks>
    public double IntervalSigmaM(double fromS, double toS)
    {
        if (DistanceSigmaM is not { } sd)
        {
            return 0;
        }

        double from = ValueAt(sd, fromS), to = ValueAt(sd, toS);
        if (SharedDistanceSigmaM is not { } shared)
        {
            return Math.Sqrt((from * from) + (to * to));
        }

        double sharedFrom = ValueAt(shared, fromS), sharedTo = ValueAt(shared, toS);
        double ownFrom = Math.Max((from * from) - (sharedFrom * sharedFrom), 0);
        double ownTo = Math.Max((to * to) - (sharedTo * sharedTo), 0);
        double growth = sharedTo - sharedFrom;
        return Math.Sqrt(ownFrom + ownTo + (growth * growth));
    }

    /// <summary>Checks the arrays agree in length and the times ascend.</summary>
    /// <exception cref="ArgumentException">They do not.</exception>
    public void Validate()
    {
        int n = TimeS.Length;
        if (DistanceM.Length != n || SpeedMps.Length != n || AccelMps2.Length != n
            || (DistanceSigmaM != null && DistanceSigmaM.Length != n)
            || (SharedDistanceSigmaM != null && SharedDistanceSigmaM.Length != n)
            || (SpeedSigmaMps != null && SpeedSigmaMps.Length != n))
        {
            throw new ArgumentException("trajectory arrays differ in length");
        }

        for (int i = 1; i < n; i++)
        {
            if (!(TimeS[i] > TimeS[i - 1]))
            {
                throw new ArgumentException($"trajectory times do not ascend at sample {i}");
            }
        }
    }
}
