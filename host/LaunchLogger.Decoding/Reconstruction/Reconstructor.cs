using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>Rebuilds a run's motion from its pulse observations and accelerometer samples:
/// first motion with its uncertainty, then distance and speed on a fine time grid, fused by a
/// Kalman filter with a Rauch–Tung–Striebel smoother.</summary>
/// <remarks>
/// <para>First motion: with an accelerometer, the onset of forward acceleration (a change-point
/// fit, <see cref="AccelOnsetFit"/>), checked against and combined with a kinematic
/// back-extrapolation of the first pulses to zero distance (<see cref="KinematicStartFit"/>);
/// without one, the back-extrapolation alone, with its model uncertainty.</para>
/// <para>Motion: the state [distance, speed, accelerometer bias, pulse phase] is driven by the
/// forward acceleration (the reading minus its resting level, which holds the gravity leaking in
/// through the resting pitch) and corrected by every pulse observation taken as an interval;
/// without an accelerometer the third state is the acceleration itself. The pickup's starting
/// phase is unknown (the first edge comes anywhere within one pulse pitch of the standstill
/// position) and is estimated with the rest. When the run has a known stop, the speed is held at
/// zero from the moment the car came to rest.</para>
/// <para>Wheelspin on a driven-wheel pickup shows as pulses running ahead of the accelerometer;
/// such stretches are found, their pulses are not used, and the phase may jump across them.</para>
/// </remarks>
public static class Reconstructor
{
    /// <summary>Reconstructs <paramref name="run"/>.</summary>
    /// <param name="run">The decoded run.</param>
    /// <param name="options">Knobs; <see cref="ReconstructionOptions.Default"/> when null.</param>
    /// <returns>The reconstruction; problems with the data are reported in its warnings.</returns>
    /// <exception cref="ArgumentNullException"><paramref name="run"/> is null.</exception>
    public static ReconstructedRun Reconstruct(DecodedRun run, ReconstructionOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(run);
        return new ReconstructionPass(run, options ?? ReconstructionOptions.Default).Run();
    }
}
