using MathNet.Numerics.RootFinding;

namespace LaunchLogger.Prescribed.Motion;

/// <summary>Builds a <see cref="MotionProfile"/> segment by segment and marks its runs: a run
/// starts at a launch from rest (or at the record's start when the record opens moving) and ends
/// where the car comes to rest.</summary>
/// <remarks>The car never reverses: a segment during which the speed falls to zero is cut there
/// and the car stays at rest until a segment accelerates it again. Asking a car at rest to
/// decelerate is a mistake in the prescription and throws.</remarks>
public sealed class MotionProfileBuilder
{
    /// <summary>Longest a brake is held while waiting for the car to stop, s.</summary>
    public const double LongestStopS = 120;

    private const int StopSamples = 64;
    private readonly List<PlacedSegment> segments = [];
    private readonly List<RunMarks> runs = [];
    private double timeS;
    private double distanceM;
    private double speedMps;
    private RunMarks? open;

    /// <summary>Starts a record at time 0 with speed <paramref name="startSpeedMps"/> (0 = at
    /// rest; more opens a run already moving, a rolling start).</summary>
    /// <exception cref="ArgumentOutOfRangeException">The speed is negative or not finite.</exception>
    public MotionProfileBuilder(double startSpeedMps = 0)
    {
        if (!(startSpeedMps >= 0) || !double.IsFinite(startSpeedMps))
        {
            throw new ArgumentOutOfRangeException(nameof(startSpeedMps), startSpeedMps, "the start speed is zero or positive");
        }

        speedMps = startSpeedMps;
        if (startSpeedMps > 0)
        {
            open = new RunMarks(0, false, startSpeedMps, null, null, null);
        }
    }

    /// <summary>True while the car is at rest.</summary>
    public bool AtRest => speedMps <= 0;

    /// <summary>The time the next segment will start, s.</summary>
    public double NowS => timeS;

    /// <summary>The speed the next segment will start from, m/s.</summary>
    public double SpeedMps => speedMps;

    /// <summary>No acceleration for <paramref name="durationS"/>: a wait at rest, or a cruise.</summary>
    public MotionProfileBuilder Hold(double durationS) => Then(new ConstantSegment(durationS, 0));

    /// <summary>Constant acceleration.</summary>
    public MotionProfileBuilder Constant(double durationS, double accelMps2) => Then(new ConstantSegment(durationS, accelMps2));

    /// <summary>Acceleration changing linearly (a jerk-limited change).</summary>
    public MotionProfileBuilder Ramp(double durationS, double fromMps2, double toMps2) => Then(new RampSegment(durationS, fromMps2, toMps2));

    /// <summary>Acceleration approaching <paramref name="finalMps2"/> exponentially.</summary>
    public MotionProfileBuilder Exponential(double durationS, double fromMps2, double finalMps2, double timeConstantS) =>
        Then(new ExponentialSegment(durationS, fromMps2, finalMps2, timeConstantS));

    /// <summary>Applies the brakes now: the deceleration builds linearly from 0 to
    /// <paramref name="decelMps2"/> over <paramref name="riseS"/> (0 = a step) and holds until
    /// the car stops. Marks the brake onset at the current time.</summary>
    /// <exception cref="InvalidOperationException">The car is at rest.</exception>
    public MotionProfileBuilder BrakeToStop(double riseS, double decelMps2)
    {
        if (!(decelMps2 > 0) || !(riseS >= 0))
        {
            throw new ArgumentOutOfRangeException(nameof(decelMps2), "a positive deceleration and a rise time of zero or more");
        }

        MarkBrakeOnset(riseS);
        if (riseS > 0)
        {
            Then(new RampSegment(riseS, 0, -decelMps2));
        }

        return AtRest ? this : Then(new ConstantSegment(LongestStopS, -decelMps2));
    }

    /// <summary>Applies the brakes now with a deceleration that keeps building at
    /// <paramref name="jerkMps3"/> until the car stops (a steady rise through the whole stop).</summary>
    /// <exception cref="InvalidOperationException">The car is at rest.</exception>
    public MotionProfileBuilder BrakeRisingToStop(double jerkMps3)
    {
        if (!(jerkMps3 > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(jerkMps3), jerkMps3, "the jerk is positive");
        }

        MarkBrakeOnset(double.PositiveInfinity);

        // From v₀ at a = −j·τ the car stops at τ = √(2·v₀/j); the segment is cut there.
        double reach = 2 * Math.Sqrt(2 * speedMps / jerkMps3);
        return Then(new RampSegment(reach, 0, -jerkMps3 * reach));
    }

    /// <summary>Appends any segment.</summary>
    /// <exception cref="InvalidOperationException">The car is at rest and the segment would
    /// decelerate it.</exception>
    public MotionProfileBuilder Then(AccelSegment segment)
    {
        ArgumentNullException.ThrowIfNull(segment);
        if (AtRest)
        {
            return StartFromRest(segment);
        }

        double cut = StopWithin(segment);
        double duration = Math.Min(cut, segment.DurationS);
        double v0 = speedMps > double.Epsilon ? speedMps : 0;
        var placed = new PlacedSegment(segment, timeS, duration, v0, distanceM, false);
        segments.Add(placed);
        MotionState end = placed.StateAt(duration);
        timeS += duration;
        distanceM = end.DistanceM;
        speedMps = cut < segment.DurationS ? 0 : end.SpeedMps;
        if (AtRest && open is { } run)
        {
            runs.Add(run with { StandstillS = timeS });
            open = null;
        }

        return this;
    }

    /// <summary>Ends the last segment early, at <paramref name="timeS"/> (used to stop a pull
    /// where a speed or distance is reached).</summary>
    /// <exception cref="InvalidOperationException">No segment, the time is not inside the last
    /// one, or the last one brought the car to rest.</exception>
    public MotionProfileBuilder CutAt(double timeS)
    {
        if (segments.Count == 0 || AtRest)
        {
            throw new InvalidOperationException("only a segment that leaves the car moving can be cut");
        }

        PlacedSegment last = segments[^1];
        if (!(timeS > last.StartS && timeS <= last.EndS))
        {
            throw new InvalidOperationException("the cut must fall inside the last segment");
        }

        var cut = last with { DurationS = timeS - last.StartS };
        segments[^1] = cut;
        MotionState end = cut.StateAt(cut.DurationS);
        timeS = cut.EndS;
        this.timeS = timeS;
        distanceM = end.DistanceM;
        speedMps = end.SpeedMps;
        return this;
    }

    /// <summary>The profile.</summary>
    /// <exception cref="InvalidOperationException">No segment was added.</exception>
    public MotionProfile Build()
    {
        if (segments.Count == 0)
        {
            throw new InvalidOperationException("a profile needs at least one segment");
        }

        var all = new List<RunMarks>(runs);
        if (open != null)
        {
            all.Add(open);
        }

        return new MotionProfile([.. segments], all);
    }

    private MotionProfileBuilder StartFromRest(AccelSegment segment)
    {
        // Probe just after the start: a segment that begins at a = 0 (a jerk-limited launch)
        // still moves the car at once if its speed gain is positive.
        double probe = Math.Min(segment.DurationS, 1e-6);
        double gain = segment.SpeedGainMps(probe);
        if (gain < 0 || (gain == 0 && segment.AccelMps2(0) < 0))
        {
            throw new InvalidOperationException("a car at rest cannot decelerate: brake only while moving");
        }

        if (gain == 0 && segment.AccelMps2(0) == 0 && segment.SpeedGainMps(segment.DurationS) == 0)
        {
            segments.Add(new PlacedSegment(segment, timeS, segment.DurationS, 0, distanceM, true));
            timeS += segment.DurationS;
            return this;
        }

        open = new RunMarks(timeS, true, 0, null, null, null);

        // Not at rest any more, though still at speed 0 (Then starts the segment from 0).
        speedMps = double.Epsilon;
        return Then(segment);
    }

    private void MarkBrakeOnset(double riseS)
    {
        if (AtRest || open is null)
        {
            throw new InvalidOperationException("the brakes are applied only while moving");
        }

        open = open with { BrakeOnsetS = timeS, BrakeRiseS = riseS };
    }

    /// <summary>Time into <paramref name="segment"/> at which the speed, from the current speed,
    /// falls to zero; +∞ when it does not within the segment.</summary>
    private double StopWithin(AccelSegment segment)
    {
        double v0 = speedMps > double.Epsilon ? speedMps : 0;
        double Speed(double tau) => v0 + segment.SpeedGainMps(tau);
        double previous = 0;
        for (int k = 1; k <= StopSamples; k++)
        {
            double tau = segment.DurationS * k / StopSamples;
            if (Speed(tau) <= 0)
            {
                return Brent.FindRoot(Speed, previous, tau, MotionProfile.RootToleranceS, 200);
            }

            previous = tau;
        }

        return double.PositiveInfinity;
    }
}
