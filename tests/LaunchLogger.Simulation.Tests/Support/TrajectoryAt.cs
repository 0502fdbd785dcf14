using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Simulation.Tests.Support;

/// <summary>Linear interpolation in a trajectory at a time.</summary>
internal static class TrajectoryAt
{
    internal static double Distance(Trajectory t, double timeS) => Interpolate(t.TimeS, t.DistanceM, timeS);

    internal static double Speed(Trajectory t, double timeS) => Interpolate(t.TimeS, t.SpeedMps, timeS);

    private static double Interpolate(double[] x, double[] y, double at)
    {
        int i = Array.BinarySearch(x, at);
        if (i >= 0)
        {
            return y[i];
        }

        i = ~i;
        if (i == 0 || i == x.Length)
        {
            throw new ArgumentOutOfRangeException(nameof(at), "outside the trajectory");
        }

        double f = (at - x[i - 1]) / (x[i] - x[i - 1]);
        return y[i - 1] + (f * (y[i] - y[i - 1]));
    }
}
