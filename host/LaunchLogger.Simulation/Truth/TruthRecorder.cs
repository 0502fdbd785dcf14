using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Simulation.Truth;

/// <summary>Collects the true trajectory on a regular grid, with extra samples at the exact
/// moments of first motion, the rollout mark and standstill, so that figures computed from it by
/// interpolation land on those moments exactly.</summary>
internal sealed class TruthRecorder
{
    private readonly double offsetS;
    private readonly List<double> time = [];
    private readonly List<double> distance = [];
    private readonly List<double> speed = [];
    private readonly List<double> accel = [];

    /// <param name="offsetS">Added to simulation time to get the box's clock, s.</param>
    internal TruthRecorder(double offsetS) => this.offsetS = offsetS;

    internal void Add(double simTimeS, double distanceM, double speedMps, double accelMps2)
    {
        double t = offsetS + simTimeS;
        if (time.Count > 0 && !(t > time[^1]))
        {
            return;
        }

        time.Add(t);
        distance.Add(distanceM);
        speed.Add(speedMps);
        accel.Add(accelMps2);
    }

    internal Trajectory ToTrajectory()
    {
        var trajectory = new Trajectory
        {
            TimeS = [.. time],
            DistanceM = [.. distance],
            SpeedMps = [.. speed],
            AccelMps2 = [.. accel],
        };
        trajectory.Validate();
        return trajectory;
    }
}
