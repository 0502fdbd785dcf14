using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Truth;
using static System.FormattableString;

namespace LaunchLogger.Prescribed.Shapes;

/// <summary>The generator's catalogue of records: standing starts of many profiles, rolling
/// starts, cruise then a stop, launch then a stop, stop-and-go, slow and fast brake rises and a
/// long idle. Every record idles at rest before a standing start long enough for the box to
/// stage (<see cref="IdleS"/>), and rests after its last stop long enough for the box to close
/// the run (<see cref="RestAfterS"/>).</summary>
public static class PrescribedShapes
{
    /// <summary>Wait at rest before a standing start, s (the box stages after 1 s still).</summary>
    public const double IdleS = 2;

    /// <summary>Rest after the last stop, s (the box closes a run after 2 s without pulses).</summary>
    public const double RestAfterS = 3;

    /// <summary>Distance a standing start is driven before braking: past the quarter mile, m.</summary>
    public const double StandingRunM = 420;

    private const double G = TruthUnits.StandardGravity;

    /// <summary>A launch shaped like a real car's, drawn from <paramref name="random"/>: the
    /// acceleration rises jerk-limited to a peak of 0.25–1.1 g in 0.05–0.4 s, then falls
    /// exponentially toward 0.05–0.2 g with a time constant of 3–12 s, with 0–3 gear changes
    /// (a dip of 0.15–0.35 s to a third of the level) as a table; run past the quarter mile,
    /// coast 0.5 s, brake to rest with a rise of 0.05–0.6 s at 0.6–1.0 g, and at least 0.1 g
    /// harder than the launch's peak (a car brakes harder than it launches; common practice),
    /// unless <paramref name="brakeG"/> sets the deceleration.</summary>
    /// <param name="random">Draws the shape.</param>
    /// <param name="idleS">Wait at rest before the launch.</param>
    /// <param name="brakeG">The stop's deceleration in g, instead of the drawn one.</param>
    /// <param name="launchRiseS">The launch's rise time instead of the drawn one (0 = a step).</param>
    /// <param name="brakeRiseS">The stop's rise time instead of the drawn one (0 = a step).</param>
    /// <param name="takeUp">How the launch rises to its peak. The draws above are the same for
    /// every take-up, so a seed gives the same car; the lagged one then draws its lag, 0.02–0.15 s,
    /// last (after the gear changes), so nothing else moves.</param>
    public static Shape StandingStart(Random random, double idleS = IdleS, double? brakeG = null, double? launchRiseS = null, double? brakeRiseS = null, LaunchTakeUp takeUp = LaunchTakeUp.Ramp)
    {
        ArgumentNullException.ThrowIfNull(random);
        double peak = G * Uniform(random, 0.25, 1.1);
        double rise = Uniform(random, 0.05, 0.4);
        rise = launchRiseS ?? rise;
        double final = G * Uniform(random, 0.05, 0.2);
        double tau = Uniform(random, 3, 12);
        int shifts = random.Next(0, 4);
        double brake = brakeG is { } fixedG ? G * fixedG : Math.Max(G * Uniform(random, 0.6, 1.0), peak + (0.1 * G));
        double brakeRise = brakeRiseS ?? Uniform(random, 0.05, 0.6);
        var pull = new ExponentialSegment(60, peak, final, tau);
        AccelSegment pulling = shifts == 0 ? pull : ShiftedPull(pull, shifts, random);
        // The driveline's compliance (clutch, shafts, tyre) as one lag of 0.02–0.15 s (from memory).
        double lag = takeUp == LaunchTakeUp.Lagged ? Uniform(random, 0.02, 0.15) : 0;
        AccelSegment? rising = !(rise > 0) ? null : takeUp switch
        {
            LaunchTakeUp.RaisedCosine => SmoothRise(rise, peak),
            LaunchTakeUp.Lagged => LaggedRise(rise, peak, lag),
            _ => new RampSegment(rise, 0, peak),
        };
        var b = new MotionProfileBuilder().Hold(idleS);
        if (rising != null)
        {
            b.Then(rising);
        }

        b.Then(pulling);
        CutAtDistance(b, StandingRunM);
        b.Hold(0.5).BrakeToStop(brakeRise, brake).Hold(RestAfterS);
        string how = takeUp switch
        {
            LaunchTakeUp.RaisedCosine => " (smooth)",
            LaunchTakeUp.Lagged => Invariant($" (lag {lag:0.000} s)"),
            _ => string.Empty,
        };
        string name = Invariant($"standing start, peak {peak / G:0.00} g in {rise:0.00} s{how}, {shifts} shifts, T {tau:0.0} s");
        return new Shape(name, ShapeKind.StandingStart, b.Build());
    }

    /// <summary>A launch's smooth take-up (a clutch or torque coming in): the acceleration rises
    /// from rest to <paramref name="peakMps2"/> over <paramref name="riseS"/> as a raised cosine,
    /// a(τ) = peak·(1 − cos(πτ/T))/2, so the jerk itself starts from zero and the rise begins
    /// like τ², not τ.</summary>
    public static AccelSegment SmoothRise(double riseS, double peakMps2) => new RaisedCosineSegment(riseS, peakMps2);

    /// <summary>A launch's take-up through the driveline's compliance: the driver's demand ramps
    /// to <paramref name="peakMps2"/> in <paramref name="rampS"/> and the acceleration follows it
    /// through a first-order lag of <paramref name="lagS"/> (<see cref="LaggedRampSegment"/>),
    /// starting like k·τ²/(2λ) and easing into the ramp; it reaches the peak later than the demand,
    /// by up to the lag, and the pull takes over from there.</summary>
    public static AccelSegment LaggedRise(double rampS, double peakMps2, double lagS) => new LaggedRampSegment(rampS, peakMps2, lagS);

    /// <summary>A standing start at a constant acceleration, for closed-form checks.</summary>
    public static Shape ConstantLaunch(double accelMps2, double idleS = IdleS)
    {
        var b = new MotionProfileBuilder().Hold(idleS).Constant(60, accelMps2);
        CutAtDistance(b, StandingRunM);
        b.Hold(0.5).BrakeToStop(0.2, 0.8 * G).Hold(RestAfterS);
        return new Shape(Invariant($"constant {accelMps2 / G:0.00} g launch"), ShapeKind.StandingStart, b.Build());
    }

    /// <summary>A standing start whose acceleration carries a driveline oscillation: it rises in
    /// <paramref name="riseS"/> to <paramref name="accelMps2"/> a₀, then for <paramref name="cycles"/>
    /// whole cycles of <paramref name="frequencyHz"/> f it is a₀ + A·sin(2πfτ) (τ from the rise's
    /// end; A = <paramref name="amplitudeMps2"/>, at most a₀ so the car never slows), then a₀ on
    /// past the quarter mile. Whole cycles keep the acceleration continuous at both joins. A shunt
    /// of about 2–10 Hz and ±0.5–1.5 m/s² on a launch is common in cars (from memory).</summary>
    public static Shape ShuntedStart(double accelMps2, double riseS, double amplitudeMps2, double frequencyHz, int cycles, double idleS = IdleS)
    {
        if (!(amplitudeMps2 >= 0 && amplitudeMps2 <= accelMps2))
        {
            throw new ArgumentOutOfRangeException(nameof(amplitudeMps2), "the oscillation must not make the car slow");
        }

        double omega = 2 * Math.PI * frequencyHz;
        var shunt = new FunctionSegment(cycles / frequencyHz, tau => accelMps2 + (amplitudeMps2 * Math.Sin(omega * tau)), Invariant($"shunt ±{amplitudeMps2:0.0#} m/s² at {frequencyHz:0.0#} Hz"));
        var b = new MotionProfileBuilder().Hold(idleS).Ramp(riseS, 0, accelMps2).Then(shunt).Constant(60, accelMps2);
        CutAtDistance(b, StandingRunM);
        b.Hold(0.5).BrakeToStop(0.2, 0.8 * G).Hold(RestAfterS);
        return new Shape(Invariant($"{accelMps2 / G:0.00} g launch with a shunt of ±{amplitudeMps2:0.0#} m/s² at {frequencyHz:0.0#} Hz for {cycles} cycles"), ShapeKind.StandingStart, b.Build());
    }

    /// <summary>A long wait at rest, then a standing start.</summary>
    public static Shape LongIdle(Random random, double idleS = 60, double? launchRiseS = null, double? brakeRiseS = null)
    {
        Shape s = StandingStart(random, idleS, launchRiseS: launchRiseS, brakeRiseS: brakeRiseS);
        return s with { Name = Invariant($"{idleS:0} s idle, then {s.Name}"), Kind = ShapeKind.LongIdle };
    }

    /// <summary>The record opens at <paramref name="speedMps"/>: 1.5 s of cruise, then
    /// acceleration rising in 0.2 s to 0.2–0.5 g and falling off, until 80 mph or 25 s, then
    /// a coast and a stop. 80 mph, not 75: 120 km/h is 74.6 mph, and a pull cut just above an
    /// interval's end speed ends it where the speed runs flat, which no measurement can time
    /// (the decoder then declines it unless the speed goes on past it by 2σ).</summary>
    public static Shape RollingStart(double speedMps, Random random)
    {
        ArgumentNullException.ThrowIfNull(random);
        double peak = G * Uniform(random, 0.2, 0.5);
        var b = new MotionProfileBuilder(speedMps).Hold(1.5).Ramp(0.2, 0, peak).Then(new ExponentialSegment(60, peak, 0.05 * G, Uniform(random, 6, 14)));
        CutAtSpeed(b, Math.Max(speedMps + 10, 80 * TruthUnits.MpsPerMph), 25);
        b.Hold(0.5).BrakeToStop(0.3, 0.7 * G).Hold(RestAfterS);
        return new Shape(Invariant($"rolling start at {speedMps / TruthUnits.MpsPerMph:0} mph"), ShapeKind.RollingStart, b.Build());
    }

    /// <summary>The record opens at a steady <paramref name="speedMps"/>; after
    /// <paramref name="cruiseS"/> the brakes come on, the deceleration rising over
    /// <paramref name="riseS"/> to <paramref name="decelMps2"/> (a rise of +∞ = a steady rise
    /// through the whole stop at <paramref name="decelMps2"/> per second).</summary>
    public static Shape CruiseThenStop(double speedMps, double riseS, double decelMps2, double cruiseS = 3)
    {
        var b = new MotionProfileBuilder(speedMps).Hold(cruiseS);
        if (double.IsPositiveInfinity(riseS))
        {
            b.BrakeRisingToStop(decelMps2);
        }
        else
        {
            b.BrakeToStop(riseS, decelMps2);
        }

        b.Hold(RestAfterS);
        string rise = double.IsPositiveInfinity(riseS) ? Invariant($"steady rise {decelMps2:0.#} m/s³") : Invariant($"rise {riseS:0.00} s to {decelMps2 / G:0.00} g");
        return new Shape(Invariant($"cruise at {speedMps / TruthUnits.MpsPerMph:0} mph, stop with {rise}"), ShapeKind.CruiseThenStop, b.Build());
    }

    /// <summary>Launch at <paramref name="accelMps2"/> to <paramref name="speedMps"/>, then brake
    /// at once with a rise of <paramref name="riseS"/> to 0.8 g.</summary>
    public static Shape LaunchThenStop(double accelMps2, double speedMps, double riseS)
    {
        var b = new MotionProfileBuilder().Hold(IdleS).Ramp(0.1, 0, accelMps2).Constant(60, accelMps2);
        CutAtSpeed(b, speedMps, 60);
        b.BrakeToStop(riseS, 0.8 * G).Hold(RestAfterS);
        return new Shape(Invariant($"launch to {speedMps / TruthUnits.MpsPerMph:0} mph, stop at once"), ShapeKind.LaunchThenStop, b.Build());
    }

    /// <summary>Two standing runs to 55 and 70 mph with <paramref name="waitS"/> at rest between.</summary>
    /// <remarks>The first run tops out between 50 and 60 mph: it never reaches 60 mph, and it
    /// passes 50 mph while still pulling, so its 30–50 mph is a timing. A pull cut at exactly
    /// 50 mph and held there ends that interval where the speed curve is flat: a speed error of
    /// 1–5 mm/s (0.01–0.02 %) then moves the crossing anywhere along the hold (+43 to +137 ms
    /// measured), and whether the truth's own root-finding reaches 50 mph at all depends on its
    /// rounding.</remarks>
    public static Shape StopAndGo(Random random, double waitS = 5)
    {
        ArgumentNullException.ThrowIfNull(random);
        var b = new MotionProfileBuilder().Hold(IdleS);
        double[] topsMph = [55.0, 70.0];
        for (int k = 0; k < topsMph.Length; k++)
        {
            double peak = G * Uniform(random, 0.3, 0.8);
            b.Ramp(0.15, 0, peak).Then(new ExponentialSegment(60, peak, 0.1 * G, Uniform(random, 4, 10)));
            CutAtSpeed(b, topsMph[k] * TruthUnits.MpsPerMph, 40);
            b.Hold(0.3).BrakeToStop(0.25, 0.7 * G).Hold(k + 1 < topsMph.Length ? waitS : RestAfterS);
        }

        return new Shape(Invariant($"stop and go, {waitS:0} s between"), ShapeKind.StopAndGo, b.Build());
    }

    /// <summary>A table of acceleration with the pull broken by <paramref name="shifts"/> gear
    /// changes, sampled every 50 ms from <paramref name="pull"/>.</summary>
    private static TabulatedSegment ShiftedPull(ExponentialSegment pull, int shifts, Random random)
    {
        var shiftAt = Enumerable.Range(0, shifts).Select(i => Uniform(random, 2, 4) * (i + 1)).ToArray();
        double dip = Uniform(random, 0.15, 0.35);
        var times = new List<double>();
        var accels = new List<double>();
        for (double t = 0; t <= 40 + 1e-9; t += 0.05)
        {
            bool inShift = shiftAt.Any(s => t >= s && t < s + dip);
            times.Add(t);
            accels.Add(inShift ? pull.AccelMps2(t) / 3 : pull.AccelMps2(t));
        }

        return new TabulatedSegment(times, accels);
    }

    /// <summary>Cuts the last segment where the distance of the current run reaches
    /// <paramref name="runM"/> from its start.</summary>
    private static void CutAtDistance(MotionProfileBuilder b, double runM) =>
        CutWhere(b, (p, run) => p.TimeAtDistance(p.StateAt(run.StartS).DistanceM + runM, run.StartS));

    /// <summary>Cuts the last segment where the speed reaches <paramref name="speedMps"/> (or
    /// after <paramref name="maxS"/> of the run).</summary>
    private static void CutAtSpeed(MotionProfileBuilder b, double speedMps, double maxS) =>
        CutWhere(b, (p, run) => Math.Min(p.TimeAtSpeed(speedMps, run.StartS) ?? double.MaxValue, run.StartS + maxS));

    private static void CutWhere(MotionProfileBuilder b, Func<MotionProfile, RunMarks, double?> when)
    {
        MotionProfile sofar = b.Build();
        RunMarks run = sofar.Runs[^1];
        double cut = when(sofar, run) ?? throw new InvalidOperationException("the run never reaches its end within its last segment");
        b.CutAt(cut);
    }

    private static double Uniform(Random random, double lo, double hi) => lo + (random.NextDouble() * (hi - lo));
}
