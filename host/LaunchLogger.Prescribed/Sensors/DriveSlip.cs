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
/// k = 0.003 s²/m is 1.5 % at 5 m/s²; k_launch = 0.015 s²/m adds 7.5 % at the start.
/// <para>What a tyre's slip follows is the force it passes, and the drive force also overcomes the
/// air and the rolling resistance: with <paramref name="DragPerSpeedSquared"/> c_d and
/// <paramref name="RollingMps2"/> c_r the slip is
/// <code>κ = max(a + c_d·v² + c_r, 0)·(k + k_launch·exp(−x / L))</code>
/// (both 0 by default: the car's acceleration alone). Slip laws of real car tyres: k = share/(C·g0)
/// with a slip stiffness C of 15–30 per unit slip (Pacejka, ch. 1; from memory) and a driven pair's
/// share of its axle's load 1.4–2.3 (T. D. Gillespie, "Fundamentals of Vehicle Dynamics", ch. 2;
/// from memory) is 0.005–0.016 s²/m, all four wheels driven 0.003–0.008 s²/m; the default k lies
/// at the stiff end of the second, below the first.</para></remarks>
/// <param name="PerMps2">k, s²/m.</param>
/// <param name="LaunchPerMps2">k_launch, s²/m.</param>
/// <param name="LaunchFadeM">L, m.</param>
/// <param name="DragPerSpeedSquared">c_d, the air's drag per unit mass per speed squared, 1/m.</param>
/// <param name="RollingMps2">c_r, the rolling resistance per unit mass, m/s².</param>
public sealed record DriveSlip(double PerMps2 = 0.003, double LaunchPerMps2 = 0.015, double LaunchFadeM = 0.5, double DragPerSpeedSquared = 0, double RollingMps2 = 0)
{
    /// <summary>κ at one state of the car.</summary>
    public double At(double distanceM, double accelMps2, double speedMps = 0) =>
        Math.Max(accelMps2 + (DragPerSpeedSquared * speedMps * speedMps) + RollingMps2, 0) * (PerMps2 + (LaunchPerMps2 * Math.Exp(-distanceM / LaunchFadeM)));
}
