using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Corrections;

/// <summary>Re-times a run as if it had been driven on level ground.</summary>
/// <remarks>
/// On a slope θ (uphill positive) gravity takes g0·sin θ from the car's acceleration. The level
/// run is taken to have g0·sin θ more acceleration at every moment after first motion, so its
/// speed gains g0·sin θ·τ and its distance ½·g0·sin θ·τ² after τ seconds of motion; the figures
/// are then timed on that trajectory by the same figure code. Exact where the drive force does
/// not depend on speed (traction-limited launches); approximate where power limits, since the
/// faster level car would also meet more drag.
/// </remarks>
public static class LevelCorrection
{
    /// <summary>How the correction is made, in words, for reports.</summary>
    public const string Method = "acceleration + g0·sin(grade) after first motion, re-integrated; exact for traction-limited acceleration, approximate where power and drag limit";

    /// <summary>The level-ground trajectory.</summary>
    public static Trajectory ToLevel(Trajectory trajectory, double firstMotionS, double gradeRad)
    {
        ArgumentNullException.ThrowIfNull(trajectory);
        double extra = Units.StandardGravity * Math.Sin(gradeRad);
        int n = trajectory.Count;
        var d = new double[n];
        var v = new double[n];
        var a = new double[n];
        for (int i = 0; i < n; i++)
        {
            double tau = Math.Max(0, trajectory.TimeS[i] - firstMotionS);
            bool moving = trajectory.TimeS[i] >= firstMotionS;
            d[i] = trajectory.DistanceM[i] + (0.5 * extra * tau * tau);
            v[i] = trajectory.SpeedMps[i] + (extra * tau);
            a[i] = trajectory.AccelMps2[i] + (moving ? extra : 0);
        }

        return new Trajectory
        {
            TimeS = trajectory.TimeS,
            DistanceM = d,
            SpeedMps = v,
            AccelMps2 = a,
            DistanceSigmaM = trajectory.DistanceSigmaM,
            SharedDistanceSigmaM = trajectory.SharedDistanceSigmaM,
            SpeedSigmaMps = trajectory.SpeedSigmaMps,
        };
    }
}
