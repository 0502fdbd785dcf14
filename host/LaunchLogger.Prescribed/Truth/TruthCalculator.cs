using LaunchLogger.Prescribed.Motion;

namespace LaunchLogger.Prescribed.Truth;

/// <summary>Computes the exact figures of every run of a prescribed trajectory by root-finding on
/// the trajectory itself (<see cref="MotionProfile.TimeAtDistance"/>,
/// <see cref="MotionProfile.TimeAtSpeed"/>), independently of the decoder's figure code.</summary>
/// <remarks>Acceleration figures are taken only while the run accelerates: a speed or mark first
/// reached after the brake onset is no acceleration figure and stays null. A run that opens
/// moving has no standing-start figures and no distance marks (there is no standstill to
/// measure from); its passing intervals count only when the lower speed is crossed after the
/// record's start.</remarks>
public static class TruthCalculator
{
    /// <summary>The figures of every run of <paramref name="profile"/>.</summary>
    public static IReadOnlyList<TruthRun> Compute(MotionProfile profile, TruthRequest? request = null)
    {
        ArgumentNullException.ThrowIfNull(profile);
        request ??= TruthRequest.Standard;
        return profile.Runs.Select(r => ComputeRun(profile, r, request)).ToArray();
    }

    private static TruthRun ComputeRun(MotionProfile profile, RunMarks run, TruthRequest request)
    {
        double start = run.StartS;
        double accelEnd = run.BrakeOnsetS ?? run.StandstillS ?? profile.EndS;
        double origin = profile.StateAt(start).DistanceM;
        double? firstMotion = run.Standing ? start : null;
        double? rollout = run.Standing ? Before(profile.TimeAtDistance(origin + request.RolloutM, start), accelEnd) : null;

        var intervals = new List<TruthInterval>(request.Intervals.Count);
        foreach (TruthSpeedSpan span in request.Intervals)
        {
            intervals.Add(Interval(profile, run, span, rollout, accelEnd));
        }

        var marks = new List<TruthMark>(request.Marks.Count);
        foreach (TruthDistanceSpan span in request.Marks)
        {
            marks.Add(run.Standing ? Mark(profile, start, origin, span, rollout, accelEnd) : new TruthMark(span, null, null, null, null));
        }

        double end = run.StandstillS ?? profile.EndS;
        double peak = 0;
        foreach (PlacedSegment s in profile.Segments.Where(s => s.EndS > start && s.StartS < end))
        {
            for (int k = 0; k <= 32; k++)
            {
                peak = Math.Max(peak, s.StateAt(s.DurationS * k / 32).SpeedMps);
            }
        }

        return new TruthRun
        {
            Marks = run,
            FirstMotionS = firstMotion,
            RolloutS = rollout,
            RolloutSpeedMps = rollout is { } r ? profile.StateAt(r).SpeedMps : null,
            OriginM = origin,
            Intervals = intervals,
            DistanceMarks = marks,
            Stop = Stop(profile, run),
            PeakSpeedMps = peak,
        };
    }

    private static TruthInterval Interval(MotionProfile profile, RunMarks run, TruthSpeedSpan span, double? rollout, double accelEnd)
    {
        double start = run.StartS;
        double? end = Before(profile.TimeAtSpeed(span.ToMps, start), accelEnd);
        if (end is not { } e)
        {
            return new TruthInterval(span, null, null, null);
        }

        if (span.Standing)
        {
            return run.Standing ? new TruthInterval(span, e - start, e - rollout, e) : new TruthInterval(span, null, null, null);
        }

        // A passing interval needs its lower speed crossed on the way up, after the record began.
        if (profile.StateAt(start).SpeedMps >= span.FromMps && !run.Standing)
        {
            return new TruthInterval(span, null, null, null);
        }

        double? begin = profile.TimeAtSpeed(span.FromMps, start);
        return begin is { } b && b < e ? new TruthInterval(span, e - b, e - b, e) : new TruthInterval(span, null, null, null);
    }

    private static TruthMark Mark(MotionProfile profile, double start, double origin, TruthDistanceSpan span, double? rollout, double accelEnd)
    {
        double? at = Before(profile.TimeAtDistance(origin + span.DistanceM, start), accelEnd);
        if (at is not { } a)
        {
            return new TruthMark(span, null, null, null, null);
        }

        double? trap = null;
        if (span.TrapLengthM is { } length && profile.TimeAtDistance(origin + span.DistanceM - length, start) is { } trapStart && a > trapStart)
        {
            trap = length / (a - trapStart);
        }

        return new TruthMark(span, a - start, a - rollout, profile.StateAt(a).SpeedMps, trap);
    }

    private static TruthStop? Stop(MotionProfile profile, RunMarks run)
    {
        if (run.BrakeOnsetS is not { } onset || run.StandstillS is not { } still)
        {
            return null;
        }

        MotionState at = profile.StateAt(onset);
        double v0 = at.SpeedMps;
        double distance = profile.StateAt(still).DistanceM - at.DistanceM;
        double vb = 0.8 * v0;
        double ve = 0.1 * v0;
        double sb = profile.StateAt(profile.TimeAtSpeed(vb, onset, rising: false)!.Value).DistanceM - at.DistanceM;
        double se = profile.StateAt(profile.TimeAtSpeed(ve, onset, rising: false)!.Value).DistanceM - at.DistanceM;
        return new TruthStop(onset, v0, still, distance, v0 * v0 / (2 * distance), ((vb * vb) - (ve * ve)) / (2 * (se - sb)), run.BrakeRiseS ?? 0);
    }

    private static double? Before(double? t, double limitS) => t is { } v && v <= limitS ? v : null;
}
