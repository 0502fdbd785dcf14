namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>Events after fusion, read from the trajectory alone: the rollout mark and the notes on
/// what the reconstruction had to work with.</summary>
internal static class EventFinder
{
    /// <summary>When and at what speed the car has covered <paramref name="rolloutM"/> from
    /// <paramref name="startS"/>: the trajectory interpolated linearly between its points, the
    /// time's σ the distance's σ over the speed there; null when it never gets so far.</summary>
    public static (Estimate? Time, Estimate? Speed) Rollout(Trajectory trajectory, double startS, double rolloutM)
    {
        double[] t = trajectory.TimeS;
        double[] d = trajectory.DistanceM;
        double[] v = trajectory.SpeedMps;
        double[] sd = trajectory.DistanceSigmaM!;
        double[] sv = trajectory.SpeedSigmaMps!;
        int k0 = Math.Max(1, FusionSmoother.FirstIndexAfter(t, startS));
        for (int k = k0; k < t.Length; k++)
        {
            if (d[k] < rolloutM)
            {
                continue;
            }

            double f = d[k] > d[k - 1] ? (rolloutM - d[k - 1]) / (d[k] - d[k - 1]) : 1;
            double time = t[k - 1] + (f * (t[k] - t[k - 1]));
            double speed = v[k - 1] + (f * (v[k] - v[k - 1]));
            double sigmaD = sd[k - 1] + (f * (sd[k] - sd[k - 1]));
            double sigmaV = sv[k - 1] + (f * (sv[k] - sv[k - 1]));
            return (new Estimate(time, sigmaD / Math.Max(speed, 1e-3)), new Estimate(speed, sigmaV));
        }

        return (null, null);
    }

    /// <summary>Notes on the sensors the run had: accelerometer only (and how far its drift
    /// leaves speed and distance), no accelerometer on a standing start, no known stop.</summary>
    public static List<string> ModeWarnings(Trajectory trajectory, Estimate firstMotion, double? stopS, bool withPulses, bool withAccelerometer, bool staged)
    {
        var warnings = new List<string>();
        if (!withPulses && withAccelerometer)
        {
            double[] t = trajectory.TimeS;
            int k = FusionSmoother.FirstIndexAfter(t, firstMotion.Value + 10);
            k = Math.Min(k, t.Length - 1);
            warnings.Add(stopS is null
                ? $"accelerometer only: speed and distance come from integrating acceleration and drift; after {t[k] - firstMotion.Value:F1} s they are uncertain by ±{trajectory.SpeedSigmaMps![k]:F2} m/s and ±{trajectory.DistanceSigmaM![k]:F1} m"
                : $"accelerometer only: speed and distance come from integrating acceleration and drift; the car taken to be at rest at the end pins the drift down, leaving ±{MaxOf(trajectory.SpeedSigmaMps!):F2} m/s at worst");
        }

        if (!withAccelerometer && withPulses && staged)
        {
            warnings.Add($"no accelerometer: first motion is back-extrapolated from the first pulses (±{firstMotion.Sigma * 1e3:F0} ms)");
        }

        if (stopS is null && withPulses)
        {
            warnings.Add("the run has no known stop: the speed is not brought to zero at its end");
        }

        return warnings;
    }

    private static double MaxOf(double[] values)
    {
        double max = 0;
        foreach (double v in values)
        {
            max = Math.Max(max, v);
        }

        return max;
    }
}
