namespace LaunchLogger.Prescribed.Sensors;

/// <summary>How much faster a driven wheel turns than the car moves: its longitudinal slip while
/// it passes drive force.</summary>
/// <remarks>The wheel's tread speed is v·(1 + κ) with
/// <code>κ = max(a, 0)·(k + k_launch·exp(−x / L))</code>
/// a the car's acceleration, x the distance from the record's start. A tyre's slip grows with the
/// force it passes (the linear part of its force–slip curve; H. B. Pacejka, "Tire and Vehicle
/// Dynamics", ch. 1), hence k·a; at the launch a driven tyre works near its grip limit, where it
/// slips several times more per unit of force (the same chapter's curve flattens towards its
/// peak), hence the extra k_launch that fades over the first metres. The figures are ours:
/// k = 0.003 s²/m is 1.5 % at 5 m/s²; k_launch = 0.015 s²/m adds 7.5 % at the start.</remarks>
/// <param name="PerMps2">k, s²/m.</param>
/// <param name="LaunchPerMps2">k_launch, s²/m.</param>
/// <param name="LaunchFadeM">L, m.</param>
public sealed record DriveSlip(double PerMps2 = 0.003, double LaunchPerMps2 = 0.015, double LaunchFadeM = 0.5)
{
    /// <summary>κ at one state of the car.</summary>
    public double At(double distanceM, double accelMps2) =>
        Math.Max(accelMps2, 0) * (PerMps2 + (LaunchPerMps2 * Math.Exp(-distanceM / LaunchFadeM)));
}
