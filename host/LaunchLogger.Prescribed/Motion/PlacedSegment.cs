namespace LaunchLogger.Prescribed.Motion;

/// <summary>A segment placed on the record's time axis, with the state it starts from.</summary>
/// <param name="Segment">The acceleration history.</param>
/// <param name="StartS">When it starts, s.</param>
/// <param name="DurationS">How long it applies: its own duration, or less when the car came to
/// rest inside it.</param>
/// <param name="StartSpeedMps">Speed at its start.</param>
/// <param name="StartDistanceM">Distance at its start.</param>
/// <param name="AtRest">True for a wait at standstill (no motion, acceleration 0).</param>
public sealed record PlacedSegment(AccelSegment Segment, double StartS, double DurationS, double StartSpeedMps, double StartDistanceM, bool AtRest)
{
    /// <summary>When it ends, s.</summary>
    public double EndS => StartS + DurationS;

    /// <summary>The state <paramref name="tauS"/> seconds into it (clamped to the segment).</summary>
    public MotionState StateAt(double tauS)
    {
        double tau = Math.Clamp(tauS, 0, DurationS);
        if (AtRest)
        {
            return new MotionState(StartS + tau, StartDistanceM, 0, 0);
        }

        (double v, double a) = SpeedAndAccelAt(tau);
        double x = StartDistanceM + (StartSpeedMps * tau) + Segment.DistanceGainM(tau);
        return new MotionState(StartS + tau, x, v, a);
    }

    /// <summary>The speed and acceleration <paramref name="tauS"/> seconds into it, as
    /// <see cref="StateAt"/> gives them, without the distance (for integrands that need none:
    /// a tabulated piece's distance costs twice its speed).</summary>
    public (double SpeedMps, double AccelMps2) SpeedAndAccelAt(double tauS)
    {
        double tau = Math.Clamp(tauS, 0, DurationS);
        return AtRest ? (0, 0) : (Math.Max(0, StartSpeedMps + Segment.SpeedGainMps(tau)), Segment.AccelMps2(tau));
    }
}
