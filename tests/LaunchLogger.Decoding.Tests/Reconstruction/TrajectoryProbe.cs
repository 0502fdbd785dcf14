using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>Reads values off a trajectory the way a timer would: first crossings and values at
/// a time, by linear interpolation between samples.</summary>
internal static class TrajectoryProbe
{
    /// <summary>Units, exact by definition (international yard and pound agreement, 1959).</summary>
    public const double Foot = 0.3048;

    public const double Mph = 0.44704;

    public const double QuarterMile = 402.336;

    /// <summary>First time after <paramref name="afterS"/> that <paramref name="values"/> reach <paramref name="target"/>.</summary>
    public static double? Crossing(Trajectory trajectory, double[] values, double target, double afterS)
    {
        double[] t = trajectory.TimeS;
        for (int k = 1; k < t.Length; k++)
        {
            if (t[k] <= afterS || values[k] < target)
            {
                continue;
            }

            if (values[k - 1] >= target)
            {
                return t[k];
            }

            double f = (target - values[k - 1]) / (values[k] - values[k - 1]);
            return t[k - 1] + (f * (t[k] - t[k - 1]));
        }

        return null;
    }

    /// <summary>Value of <paramref name="values"/> at <paramref name="timeS"/>.</summary>
    public static double At(Trajectory trajectory, double[] values, double timeS)
    {
        double[] t = trajectory.TimeS;
        int i = Array.BinarySearch(t, timeS);
        if (i >= 0)
        {
            return values[i];
        }

        i = ~i;
        if (i == 0)
        {
            return values[0];
        }

        if (i >= t.Length)
        {
            return values[^1];
        }

        double f = (timeS - t[i - 1]) / (t[i] - t[i - 1]);
        return values[i - 1] + (f * (values[i] - values[i - 1]));
    }

    public static double SpeedAt(Trajectory trajectory, double timeS) => At(trajectory, trajectory.SpeedMps, timeS);

    public static double DistanceAt(Trajectory trajectory, double timeS) => At(trajectory, trajectory.DistanceM, timeS);

    /// <summary>Time to reach <paramref name="speedMps"/>, from <paramref name="fromS"/>.</summary>
    public static double TimeToSpeed(ReconstructedRun run, double speedMps, double fromS) =>
        Crossing(run.Trajectory, run.Trajectory.SpeedMps, speedMps, run.FirstMotionS.Value)!.Value - fromS;

    /// <summary>Time to cover <paramref name="distanceM"/> from standstill, from <paramref name="fromS"/>.</summary>
    public static double TimeToDistance(ReconstructedRun run, double distanceM, double fromS) =>
        Crossing(run.Trajectory, run.Trajectory.DistanceM, distanceM, run.FirstMotionS.Value)!.Value - fromS;
}
