using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Reconstruction;

/// <content>Events after fusion: the rollout mark, the box's own mark, and the mode warnings.</content>
internal sealed partial class ReconstructionPass
{
    private (Estimate? Time, Estimate? Speed) Rollout(Trajectory trajectory, double startS)
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

    private void AddModeWarnings(Trajectory trajectory, Estimate firstMotion, double? stopS)
    {
        if (pulses is null && accel != null)
        {
            double[] t = trajectory.TimeS;
            int k = FusionSmoother.FirstIndexAfter(t, firstMotion.Value + 10);
            k = Math.Min(k, t.Length - 1);
            warnings.Add(stopS is null
                ? $"accelerometer only: speed and distance come from integrating acceleration and drift; after {t[k] - firstMotion.Value:F1} s they are uncertain by ±{trajectory.SpeedSigmaMps![k]:F2} m/s and ±{trajectory.DistanceSigmaM![k]:F1} m"
                : $"accelerometer only: speed and distance come from integrating acceleration and drift; the car taken to be at rest at the end pins the drift down, leaving ±{MaxOf(trajectory.SpeedSigmaMps!):F2} m/s at worst");
        }

        if (accel is null && pulses != null && Staged)
        {
            warnings.Add($"no accelerometer: first motion is back-extrapolated from the first pulses (±{firstMotion.Sigma * 1e3:F0} ms)");
        }

        if (stopS is null && pulses != null)
        {
            warnings.Add("the run has no known stop: the speed is not brought to zero at its end");
        }

    }
}
