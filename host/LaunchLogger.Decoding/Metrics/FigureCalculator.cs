using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Metrics;

/// <summary>Computes every acceleration figure from a trajectory. The same code serves the
/// decoder (on reconstructed trajectories), the naive method and the simulator's truth, so the
/// three can be compared figure by figure.</summary>
/// <remarks>
/// Crossing times are found by linear interpolation between trajectory samples, at the first
/// crossing after first motion. Conventions: "from standstill" times standing intervals and
/// distance marks from first motion; "from rollout" times them from the moment the car has moved
/// <see cref="FigureSet.RolloutDistanceM"/> (one foot by default), as a drag strip's clock does.
/// Distances are always measured from the standstill position.
/// Uncertainties: a crossing's 1-σ is the trajectory's σ at the crossing divided by the slope
/// there (σ_v / a for a speed, σ_d / v for a distance), combined root-sum-square with the σ of the
/// start time; a speed crossing adds the time the speed holds or falls back within ±2σ/±3σ of it
/// (<see cref="HeldInBandS"/>: a gear change). Errors of neighbouring estimates are correlated, so
/// this is an approximation.
/// </remarks>
public static class FigureCalculator
{
    private const double MinimumSlope = 1e-3;

    /// <summary>Speed within this of the top speed still counts as the top speed (a car holding its
    /// top speed is not yet coasting), m/s; widened by 3σ of the speed there.</summary>
    public const double TopSpeedToleranceMps = 0.1;

    /// <summary>An interval's end speed counts as reached when the speed goes on past it by this
    /// many σ of the speed there.</summary>
    public const double ClearPassSigmas = 2;

    /// <summary>The bands, in σ of the speed, over which <see cref="HeldInBandS"/> looks for a
    /// hold: those the coverage is promised at.</summary>
    private static readonly int[] HeldBandSigmas = [2, 3];

    /// <summary>Computes the figures.</summary>
    /// <param name="trajectory">Distance 0 at first motion; times on the input's axis.</param>
    /// <param name="firstMotionS">First motion, s, with its σ.</param>
    /// <param name="rolloutDistanceM">The rollout distance, m (0.3048 by default).</param>
    /// <param name="request">Which figures; <see cref="FigureRequest.Standard"/> when null.</param>
    /// <param name="standingStart">False when the trajectory opens moving (no rest was seen before
    /// the motion): then no standing-start figure exists (standing intervals, distance marks and
    /// the rollout are null), and a rolling interval counts only from a real crossing of its lower
    /// speed, never from a speed the trajectory already had at its start.</param>
    /// <param name="brakeOnsetS">Brake onset, when known: nothing reached after it is an
    /// acceleration figure.</param>
    /// <exception cref="ArgumentException">The trajectory is malformed.</exception>
    /// <remarks>Marks and intervals are acceleration figures: one reached after the acceleration
    /// ended (<see cref="AccelerationEnd"/>: brake onset, or the car already slowing from its top
    /// speed) is null, so no trap is timed while braking or coasting.</remarks>
    public static FigureSet Compute(Trajectory trajectory, Estimate firstMotionS, double rolloutDistanceM = Units.RolloutM, FigureRequest? request = null, bool standingStart = true, double? brakeOnsetS = null)
    {
        ArgumentNullException.ThrowIfNull(trajectory);
        trajectory.Validate();
        request ??= FigureRequest.Standard;
        int start = FirstIndexAtOrAfter(trajectory.TimeS, firstMotionS.Value);
        double endS = AccelerationEnd(trajectory, start, brakeOnsetS);
        Estimate? rollout = standingStart ? DistanceCrossing(trajectory, start, rolloutDistanceM, endS) : null;
        Estimate? rolloutSpeed = rollout is { } r ? At(trajectory, trajectory.SpeedMps, trajectory.SpeedSigmaMps, r.Value) : null;

        var intervals = new List<IntervalFigure>(request.SpeedIntervals.Count);
        var declined = new List<(SpeedInterval, double, double)>();
        foreach (SpeedInterval interval in request.SpeedIntervals)
        {
            intervals.Add(standingStart ? TimeInterval(trajectory, start, endS, firstMotionS, rollout, interval, declined) : RollingInterval(trajectory, start, endS, interval, declined));
        }

        var marks = new List<MarkFigure>(request.DistanceMarks.Count);
        foreach (DistanceMark mark in request.DistanceMarks)
        {
            marks.Add(standingStart ? TimeMark(trajectory, start, endS, firstMotionS, rollout, mark) : new MarkFigure(mark, null, null, null, null, null, null, null));
        }

        double peak = 0;
        double maxSpeed = 0;
        for (int i = start; i < trajectory.Count; i++)
        {
            peak = Math.Max(peak, trajectory.AccelMps2[i]);
            maxSpeed = Math.Max(maxSpeed, trajectory.SpeedMps[i]);
        }

        double? zeroTo60 = standingStart ? TimeInterval(trajectory, start, endS, firstMotionS, rollout, SpeedInterval.Mph(0, 60), null).FromStandstillS : null;
        return new FigureSet
        {
            FirstMotionS = firstMotionS,
            RolloutTimeS = rollout,
            RolloutSpeedMps = rolloutSpeed,
            RolloutDistanceM = rolloutDistanceM,
            SpeedIntervals = intervals,
            DistanceMarks = marks,
            PeakAccelMps2 = peak,
            MeanAccel0To60Mps2 = zeroTo60 is > 0 ? 60 * Units.MpsPerMph / zeroTo60.Value : null,
            MaxSpeedMps = maxSpeed,
            DistanceM = trajectory.Count > 0 ? trajectory.DistanceM[^1] : 0,
            NotClearlyReached = declined,
        };
    }

    /// <summary>Where the acceleration ends: the last moment the speed is still at its top
    /// (within <see cref="TopSpeedToleranceMps"/> and 3σ), or brake onset if that is earlier.</summary>
    /// <param name="trajectory">The trajectory.</param>
    /// <param name="start">Index of first motion.</param>
    /// <param name="brakeOnsetS">Brake onset, when known.</param>
    public static double AccelerationEnd(Trajectory trajectory, int start, double? brakeOnsetS = null)
    {
        ArgumentNullException.ThrowIfNull(trajectory);
        double[] t = trajectory.TimeS;
        double[] v = trajectory.SpeedMps;
        if (t.Length == 0)
        {
            return double.PositiveInfinity;
        }

        int top = start;
        for (int i = start; i < v.Length; i++)
        {
            if (v[i] > v[top])
            {
                top = i;
            }
        }

        double floor = v[top] - TopSpeedToleranceMps - (3 * (trajectory.SpeedSigmaMps?[top] ?? 0));
        int last = top;
        for (int i = v.Length - 1; i > top; i--)
        {
            if (v[i] >= floor)
            {
                last = i;
                break;
            }
        }

        double end = last == v.Length - 1 ? double.PositiveInfinity : t[last];
        return brakeOnsetS is { } onset && onset < end ? onset : end;
    }

    /// <summary>The first time after sample <paramref name="start"/> at which the speed reaches
    /// <paramref name="speedMps"/>, with its σ; null when it never does.</summary>
    /// <remarks>The σ is the speed's σ over the slope, plus the time the speed holds or falls back
    /// within its own ±2σ and ±3σ about <paramref name="speedMps"/> (<see cref="HeldInBandS"/>):
    /// a gear change just above the speed leaves the crossing before or after it as the speed's
    /// error has it, a shift's length apart, which the slope alone does not show.</remarks>
    public static Estimate? SpeedCrossing(Trajectory trajectory, int start, double speedMps, double endS = double.PositiveInfinity)
    {
        ArgumentNullException.ThrowIfNull(trajectory);
        Estimate? at = Crossing(trajectory, start, trajectory.SpeedMps, trajectory.SpeedSigmaMps, trajectory.AccelMps2, speedMps, endS);
        if (at is not { } e || trajectory.SpeedSigmaMps is not { } sv)
        {
            return at;
        }

        double held = HeldInBandS(trajectory, start, speedMps, trajectory.ValueAt(sv, e.Value), e.Value, endS);
        return held > 0 ? new Estimate(e.Value, e.Sigma + held) : at;
    }

    /// <summary>How far a speed error of up to k σ moves the first crossing of
    /// <paramref name="speedMps"/> beyond what the slope there says, per σ, at k = 2 and 3 (the
    /// larger): the time the speed spends not above its own earlier top (a gear change's dip, a
    /// lift) between the first crossings of <paramref name="speedMps"/> ∓ k·σ and the crossing at
    /// <paramref name="crossingS"/>, on the side where there is more of it, divided by k. The
    /// first crossing of a speed is the moment the speed's running top reaches it, so a speed read
    /// δ low (or high) moves the crossing to that of <paramref name="speedMps"/> + δ (or − δ): along
    /// the slope while the speed rises, and across the whole hold where it does not. With this
    /// added to σ, ±k·σ spans every crossing a speed error within ±k·σ can give.</summary>
    /// <param name="trajectory">The trajectory.</param>
    /// <param name="start">Index of first motion.</param>
    /// <param name="speedMps">The speed crossed.</param>
    /// <param name="sigmaMps">The speed's σ at the crossing.</param>
    /// <param name="crossingS">The crossing's time.</param>
    /// <param name="endS">Where the acceleration ends: nothing later counts.</param>
    /// <returns>Seconds per σ of the crossing; 0 where the speed rises all through the band.</returns>
    public static double HeldInBandS(Trajectory trajectory, int start, double speedMps, double sigmaMps, double crossingS, double endS = double.PositiveInfinity)
    {
        ArgumentNullException.ThrowIfNull(trajectory);
        if (!(sigmaMps > 0))
        {
            return 0;
        }

        double[] t = trajectory.TimeS;
        double[] v = trajectory.SpeedMps;
        double worst = 0;
        foreach (int k in HeldBandSigmas)
        {
            double low = speedMps - (k * sigmaMps);
            double high = speedMps + (k * sigmaMps);
            int i = Math.Max(start, 0);
            while (i < v.Length && v[i] < low)
            {
                i++;
            }

            double before = 0;
            double after = 0;
            double top = i < v.Length ? v[i] : double.PositiveInfinity;
            for (i++; i < v.Length && top < high && t[i - 1] < endS; i++)
            {
                if (v[i] > top)
                {
                    top = v[i];
                    continue;
                }

                // Not above the earlier top over this step: a speed error anywhere in the band
                // moves the crossing across it at once. Split at the crossing's time.
                double from = t[i - 1];
                double to = Math.Min(t[i], endS);
                before += Math.Max(0, Math.Min(to, crossingS) - from);
                after += Math.Max(0, to - Math.Max(from, crossingS));
            }

            worst = Math.Max(worst, Math.Max(before, after) / k);
        }

        return worst;
    }

    /// <summary>The first time after sample <paramref name="start"/> at which the distance
    /// reaches <paramref name="distanceM"/>, with its σ; null when it never does.</summary>
    public static Estimate? DistanceCrossing(Trajectory trajectory, int start, double distanceM, double endS = double.PositiveInfinity) =>
        Crossing(trajectory, start, trajectory.DistanceM, trajectory.DistanceSigmaM, trajectory.SpeedMps, distanceM, endS);

    /// <summary>Index of the first sample at or after <paramref name="timeS"/> (the last sample
    /// when none is).</summary>
    public static int FirstIndexAtOrAfter(double[] timeS, double t)
    {
        int i = Array.BinarySearch(timeS, t);
        if (i < 0)
        {
            i = ~i;
        }

        return Math.Min(i, Math.Max(0, timeS.Length - 1));
    }

    // declined: where an interval whose end speed is crossed but not clearly passed is listed,
    // with the top speed reached and the speed's σ at the crossing; null for none.
    private static IntervalFigure TimeInterval(Trajectory trajectory, int start, double endS, Estimate firstMotion, Estimate? rollout, SpeedInterval interval, List<(SpeedInterval, double, double)>? declined)
    {
        Estimate? end = SpeedCrossing(trajectory, start, interval.ToMps, endS);
        if (end is not { } e)
        {
            return new IntervalFigure(interval, null, null, null, null);
        }

        // Timed only when the speed goes on past the end speed by 2σ before the acceleration ends:
        // a car that holds it, or tops out just above it, may not have reached it at all, and
        // where the speed runs flat the crossing is anywhere along the flat.
        double top = TopSpeed(trajectory, e.Value, endS);
        double sigmaV = trajectory.SpeedSigmaMps is { } sv ? trajectory.ValueAt(sv, e.Value) : 0;
        if (top < interval.ToMps + (ClearPassSigmas * sigmaV))
        {
            declined?.Add((interval, top, sigmaV));
            return new IntervalFigure(interval, null, null, null, null);
        }

        if (!interval.IsStanding)
        {
            Estimate? begin = SpeedCrossing(trajectory, start, interval.FromMps, endS);
            if (begin is not { } b)
            {
                return new IntervalFigure(interval, null, null, null, null);
            }

            double duration = e.Value - b.Value;
            double sigma = Hypot(e.Sigma, b.Sigma);
            return new IntervalFigure(interval, duration, duration, sigma, sigma);
        }

        double fromStandstill = e.Value - firstMotion.Value;
        double? fromRollout = rollout is { } r ? e.Value - r.Value : null;
        double? rolloutSigma = rollout is { } r2 ? Hypot(e.Sigma, r2.Sigma) : null;
        return new IntervalFigure(interval, fromStandstill, fromRollout, Hypot(e.Sigma, firstMotion.Sigma), rolloutSigma);
    }

    /// <summary>A rolling interval of a trajectory that opens moving: timed only when the speed
    /// at the start is below the interval's lower speed, so that both ends are real crossings.</summary>
    private static IntervalFigure RollingInterval(Trajectory trajectory, int start, double endS, SpeedInterval interval, List<(SpeedInterval, double, double)> declined)
    {
        if (interval.IsStanding || trajectory.SpeedMps[start] >= interval.FromMps)
        {
            return new IntervalFigure(interval, null, null, null, null);
        }

        return TimeInterval(trajectory, start, endS, new Estimate(trajectory.TimeS[start], 0), null, interval, declined);
    }

    private static MarkFigure TimeMark(Trajectory trajectory, int start, double endS, Estimate firstMotion, Estimate? rollout, DistanceMark mark)
    {
        Estimate? at = DistanceCrossing(trajectory, start, mark.DistanceM, endS);
        if (at is not { } a)
        {
            return new MarkFigure(mark, null, null, null, null, null, null, null);
        }

        Estimate speed = At(trajectory, trajectory.SpeedMps, trajectory.SpeedSigmaMps, a.Value);
        double? trap = null;
        double? trapSigma = null;
        if (mark.TrapLengthM is { } length && DistanceCrossing(trajectory, start, mark.DistanceM - length, endS) is { } trapStart && a.Value > trapStart.Value)
        {
            trap = length / (a.Value - trapStart.Value);
            Estimate speedAtStart = At(trajectory, trajectory.SpeedMps, trajectory.SpeedSigmaMps, trapStart.Value);

            // The trap speed is the mean speed over the trap; its error follows the speed errors
            // at both ends, which a smoother makes strongly correlated: take their mean.
            trapSigma = 0.5 * (speed.Sigma + speedAtStart.Sigma);
        }

        return new MarkFigure(
            mark,
            a.Value - firstMotion.Value,
            rollout is { } r ? a.Value - r.Value : null,
            Hypot(a.Sigma, firstMotion.Sigma),
            rollout is { } r2 ? Hypot(a.Sigma, r2.Sigma) : null,
            speed.Value,
            trap,
            trapSigma);
    }

    private static Estimate? Crossing(Trajectory trajectory, int start, double[] values, double[]? sigmas, double[] slopes, double target, double endS)
    {
        double[] t = trajectory.TimeS;
        for (int i = Math.Max(start, 1); i < values.Length; i++)
        {
            if (t[i - 1] > endS)
            {
                return null;
            }

            if (values[i] < target)
            {
                continue;
            }

            if (values[i - 1] >= target || i == start)
            {
                // Already at or past the target at the first sample considered.
                return t[i] > endS ? null : new Estimate(t[i], sigmas is null ? 0 : sigmas[i] / Math.Max(Math.Abs(slopes[i]), MinimumSlope));
            }

            double f = (target - values[i - 1]) / (values[i] - values[i - 1]);
            double time = t[i - 1] + (f * (t[i] - t[i - 1]));
            double slope = slopes[i - 1] + (f * (slopes[i] - slopes[i - 1]));
            double sigma = sigmas is null ? 0 : (sigmas[i - 1] + (f * (sigmas[i] - sigmas[i - 1]))) / Math.Max(Math.Abs(slope), MinimumSlope);
            return time > endS ? null : new Estimate(time, sigma);
        }

        return null;
    }

    /// <summary>The highest speed from <paramref name="fromS"/> up to <paramref name="endS"/>, m/s.</summary>
    private static double TopSpeed(Trajectory trajectory, double fromS, double endS)
    {
        double top = trajectory.ValueAt(trajectory.SpeedMps, fromS);
        for (int i = FirstIndexAtOrAfter(trajectory.TimeS, fromS); i < trajectory.Count && trajectory.TimeS[i] <= endS; i++)
        {
            top = Math.Max(top, trajectory.SpeedMps[i]);
        }

        return top;
    }

    private static Estimate At(Trajectory trajectory, double[] values, double[]? sigmas, double time) =>
        new(trajectory.ValueAt(values, time), sigmas is null ? 0 : trajectory.ValueAt(sigmas, time));

    private static double Hypot(double a, double b) => Math.Sqrt((a * a) + (b * b));
}
