using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Braking;

/// <summary>Finds the final stop of a trajectory and measures it.</summary>
/// <remarks>
/// The stop is the fall from the highest speed to standstill at the end of the run. Onset is the
/// pedal's first movement where the box had a brake switch wired (SAE J299 measures stopping
/// distance from the first movement of the brake control), found from the switch's reading by
/// <see cref="BrakeSwitchTiming"/> (the loop's lag and the switch's delay subtracted, both in σ);
/// when the delay was not measured and an accelerometer was logged, the switch's window and the
/// deceleration's onset are combined (<see cref="BrakeOnsetFusion"/>). Otherwise it is estimated from the deceleration by fitting a level, a linear rise and
/// a plateau together (<see cref="BrakeOnsetFit"/>); where that fit finds no rise, a straight
/// line through the rise between 20 % and 80 % of the full deceleration, extrapolated back to
/// the level before it.
/// </remarks>
public static class BrakingAnalyzer
{
    /// <summary>1-σ of a pedal onset time given directly (the overload taking plain times), s.</summary>
    public const double GivenOnsetSigmaS = 0.001;

    /// <summary><see cref="BrakingResult.OnsetMethod"/> for an onset from the brake switch alone.</summary>
    public const string SwitchMethod = "brake switch";

    /// <summary><see cref="BrakingResult.OnsetMethod"/> for an onset from the brake switch and the
    /// accelerometer's deceleration together (<see cref="BrakeOnsetFusion"/>).</summary>
    public const string FusedMethod = "brake switch and deceleration";

    /// <summary><see cref="BrakingResult.OnsetMethod"/> for an onset from the deceleration alone.</summary>
    public const string DecelerationMethod = "deceleration onset";

    /// <summary>Below this speed the car counts as standing, m/s.</summary>
    public const double StandstillMps = 0.05;

    /// <summary>A stop must lose at least this much speed to count, m/s (about 11 mph).</summary>
    public const double MinimumStopSpeedMps = 5.0;

    /// <summary>A brake rise at least this long is timed by the ramp fit, s.</summary>
    public const double SlowRiseS = 0.5;

    /// <summary>The line through a quick rise is kept only while it lies within this many
    /// combined σ of the ramp fit: further off, it has taken something else for the rise (the
    /// lift-off into a coast whose drag and the box's tilt read as 20 % of the stop, or a smoother's
    /// swing at a lift-off) and the fit, which places its window after the last drive, is taken.</summary>
    public const double AgreementSigmas = 3;

    /// <summary>1-σ of the onset read off a trajectory smoothed from pulses alone, beyond the
    /// position noise's spread, s: the smoother meets a brake rise with a swing that starts early.
    /// Measured on the simulator's pulses-only stops (rise 0.15–0.2 s): 12–28 ms early even with
    /// 80–100 teeth and exact edges, where the position noise alone explains under 10 ms. Traced
    /// since to the braked wheel's slip step (<see cref="BrakeOnsetFit"/>'s slipStepS), now fitted;
    /// this term is kept, as the smoother still spreads the rise.</summary>
    public const double SmootherSpreadS = 0.02;

    /// <summary>Nominal-speed corrections are given only within this fraction of the nominal speed.</summary>
    public const double CorrectionTolerance = 0.10;

    /// <summary>Measures the final stop, or returns null when the trajectory does not end with one.</summary>
    /// <param name="trajectory">The run.</param>
    /// <param name="brakeSwitchOnS">Times the pedal started to move, each known to
    /// <see cref="GivenOnsetSigmaS"/> (from a brake switch whose delay and reading are already
    /// accounted for).</param>
    /// <param name="nominalSpeedsMps">Extra nominal speeds to correct to (60 mph and 100 km/h are always included).</param>
    /// <param name="rawAccel">The accelerometer's own longitudinal samples (time, m/s²), when there
    /// are any: the onset fit then uses them rather than the trajectory's smoothed acceleration,
    /// whose smoothing would spread the rise and move the onset early.</param>
    /// <param name="pulsePositionSigmaM">Without raw samples, the onset is read off the trajectory's
    /// acceleration, which the pulses alone resolve only as finely as their positions are known
    /// (1-σ per observation, m: tooth spacing, and the speed times the bracket width). A rise to a
    /// deceleration D shows against a position noise σ after about √(σ / D) (kinematics:
    /// D·τ²/2 ≈ σ), and the smoother spreads it over that much either side: 2τ counts in the
    /// onset's σ. Measured on the simulator's pulses-only stops: onset 13–17 ms early with exact
    /// edges on 36 teeth (τ = √(0.5 mm / 5 m/s²) = 10 ms), 106 ms early polled every 7.5 ms on
    /// 16 teeth (τ = √(58 mm / 5 m/s²) = 108 ms).</param>
    public static BrakingResult? Analyze(Trajectory trajectory, IReadOnlyList<double>? brakeSwitchOnS = null, IReadOnlyList<double>? nominalSpeedsMps = null, (double[] TimeS, double[] AccelMps2)? rawAccel = null, double pulsePositionSigmaM = 0) =>
        Analyze(trajectory, (brakeSwitchOnS ?? []).Select(s => new Estimate(s, GivenOnsetSigmaS)).ToArray(), nominalSpeedsMps, rawAccel, pulsePositionSigmaM);

    /// <summary>Measures the final stop, or returns null when the trajectory does not end with one.</summary>
    /// <param name="trajectory">The run.</param>
    /// <param name="brakeSwitchOnsets">The pedal's first movement at each closing of the brake
    /// switch, with σ (<see cref="BrakeSwitchTiming.Onset"/>); the last one from 0.5 s before the
    /// top speed to standstill times the stop.</param>
    /// <param name="nominalSpeedsMps">As in the other overload.</param>
    /// <param name="rawAccel">As in the other overload.</param>
    /// <param name="pulsePositionSigmaM">As in the other overload; above 0 also says the pulses
    /// carry the distance, so the braked wheel's slip is corrected for (<see cref="BrakeSlipPrior"/>).</param>
    /// <param name="pulsesSetAside">Stretches where the reconstruction set the pulses aside and the
    /// accelerometer carried the distance (the wheel slid, as under ABS): no slip correction there.</param>
    /// <param name="brakeSlip">The pickup tyre's slip stiffness; <see cref="BrakeSlipPrior.CarTyres"/> when null.</param>
    /// <param name="fusedSlipDistanceM">What the fusion added to the pulses' distance for the
    /// braked wheel's slip, on the trajectory's grid (<see cref="ReconstructedRun.BrakeSlipDistanceM"/>):
    /// kept when the fusion measured the slip (<paramref name="fusedBrakeSlip"/>, <see cref="FusedSlipMeasured"/>),
    /// otherwise taken off again over the stop, which is then measured as from the pulses alone with
    /// the prior's correction. The MFDD is the fused trajectory's.</param>
    /// <param name="fusedBrakeSlip">The fusion's brake slip k_b = 1/(g0·C), s²/m, and its σ
    /// (<see cref="ReconstructedRun.BrakeSlipPerMps2"/>); null when it fitted none.</param>
    /// <param name="switchDelaySpanS">The width of the switch delay's uniform prior that
    /// <paramref name="brakeSwitchOnsets"/> include (<see cref="BrakeSwitchTiming.DelaySpanS"/>), s;
    /// 0 when the delay was measured. Above 0, and with <paramref name="rawAccel"/>, the switch's
    /// window and the deceleration's onset are combined (<see cref="BrakeOnsetFusion"/>).</param>
    public static BrakingResult? Analyze(Trajectory trajectory, IReadOnlyList<Estimate> brakeSwitchOnsets, IReadOnlyList<double>? nominalSpeedsMps, (double[] TimeS, double[] AccelMps2)? rawAccel, double pulsePositionSigmaM, IReadOnlyList<TimeWindow>? pulsesSetAside = null, BrakeSlipPrior? brakeSlip = null, double[]? fusedSlipDistanceM = null, Estimate? fusedBrakeSlip = null, double switchDelaySpanS = 0)
    {
        ArgumentNullException.ThrowIfNull(trajectory);
        ArgumentNullException.ThrowIfNull(brakeSwitchOnsets);
        double[] t = trajectory.TimeS;
        double[] v = trajectory.SpeedMps;
        double[] a = trajectory.AccelMps2;
        int n = trajectory.Count;
        if (n < 3)
        {
            return null;
        }

        int stop = -1;
        for (int i = n - 1; i >= 0 && v[i] <= StandstillMps; i--)
        {
            stop = i;
        }

        if (stop <= 0)
        {
            return null;
        }

        int peak = 0;
        for (int i = 0; i < stop; i++)
        {
            if (v[i] > v[peak])
            {
                peak = i;
            }
        }

        if (v[peak] < MinimumStopSpeedMps)
        {
            return null;
        }

        double standstillS = t[stop - 1] + ((t[stop] - t[stop - 1]) * (v[stop - 1] - StandstillMps) / Math.Max(v[stop - 1] - v[stop], 1e-9));
        double peakDecel = 0;
        for (int i = peak; i <= stop; i++)
        {
            peakDecel = Math.Max(peakDecel, -a[i]);
        }

        Estimate? switchOn = brakeSwitchOnsets.Where(s => s.Value >= t[peak] - 0.5 && s.Value < standstillS).Select(s => (Estimate?)s).LastOrDefault();

        bool accelerometer = rawAccel is { } raw && raw.TimeS.Length > 10;
        Estimate onset;
        string onsetMethod;
        if (switchOn is { } sw)
        {
            onset = sw;
            onsetMethod = SwitchMethod;

            // An unmeasured delay leaves the switch a window as wide as the delay's range; the
            // accelerometer's rise measures the onset within it (BrakeOnsetFusion). Pulses alone
            // are not asked: their smoother starts a rise 12–28 ms early (SmootherSpreadS), as
            // much as that window.
            if (switchDelaySpanS > 0 && accelerometer
                && BrakeOnsetFusion.Combine(sw, switchDelaySpanS, DecelerationOnsetEstimate(trajectory, rawAccel, peak, standstillS, peakDecel, pulsePositionSigmaM, brakeSlip)) is { } both)
            {
                onset = both;
                onsetMethod = FusedMethod;
            }
        }
        else
        {
            onset = DecelerationOnsetEstimate(trajectory, rawAccel, peak, standstillS, peakDecel, pulsePositionSigmaM, brakeSlip);
            onsetMethod = DecelerationMethod;
        }

        double fromMps = trajectory.ValueAt(v, onset.Value);
        double fromDistance = trajectory.ValueAt(trajectory.DistanceM, onset.Value);
        // Where the pulses carry the distance, the braked wheel's slip made them count short: the
        // expected shortfall is added, and its spread over the tyres' stiffness range is in σ.
        // What the fusion's own slip estimate added is taken off first.
        IReadOnlyList<TimeWindow> slid = pulsesSetAside ?? [];
        BrakeSlipPrior tyre = brakeSlip ?? BrakeSlipPrior.CarTyres;
        bool pulsesCarry = pulsePositionSigmaM > 0;
        bool fused = fusedSlipDistanceM is not null;
        double fusedSlip = fused ? trajectory.ValueAt(fusedSlipDistanceM!, standstillS) - trajectory.ValueAt(fusedSlipDistanceM!, onset.Value) : 0;
        double slipWork = pulsesCarry ? BrakingWorkM(trajectory, onset.Value, standstillS, slid) : 0;
        bool measured = fused && fusedBrakeSlip is { } kb && FusedSlipMeasured(kb, tyre);
        // The prior's wheel works at an unknown share of the car's deceleration (its axle is not
        // told): the mean share and its spread go into the correction and its σ.
        double slipCorrection = measured ? fusedSlip : slipWork * tyre.MeanWheelSlip;
        double stopDistance = trajectory.ValueAt(trajectory.DistanceM, standstillS) - fromDistance - fusedSlip + slipCorrection;
        // The path's own σ between onset and standstill (a circumference error counts on the stop's
        // length, not on the whole run's), and the onset's σ at the speed there.
        double pathSigma = trajectory.IntervalSigmaM(onset.Value, standstillS);
        double meanDecel = BrakingFormulas.MeanDecelerationMps2(fromMps, stopDistance);
        double slipSigma = slipWork * (measured ? MeasuredInverseSigma(fusedBrakeSlip!.Value) : tyre.WheelSlipSigma);
        double distanceSigma = Math.Sqrt((pathSigma * pathSigma) + Math.Pow(fromMps * onset.Sigma, 2) + (slipSigma * slipSigma));

        return new BrakingResult
        {
            FromMps = fromMps,
            OnsetS = onset,
            OnsetMethod = onsetMethod,
            StandstillS = standstillS,
            StoppingDistanceM = new Estimate(stopDistance, distanceSigma),
            BrakeSlipCorrectionM = slipCorrection,
            MeanDecelMps2 = meanDecel,
            PeakDecelMps2 = peakDecel,
            MfddMps2 = Mfdd(trajectory, onset.Value, fromMps, fromDistance, stop, pulsesCarry && !fused ? tyre.MeanWheelSlip : 0, slid),
            CorrectedStops = CorrectedStops(stopDistance, fromMps, nominalSpeedsMps),
            TractionBound0To60S = BrakingFormulas.TractionBoundS(60 * Units.MpsPerMph, meanDecel),
            TractionBound0To100KmhS = BrakingFormulas.TractionBoundS(100 * Units.MpsPerKmh, meanDecel),
        };
    }

    /// <summary>The onset from the deceleration alone: the ramp fit, or the line through a quick
    /// rise where the two agree; read off the trajectory's acceleration (with the pulses' spread
    /// in σ) when there are no raw samples.</summary>
    private static Estimate DecelerationOnsetEstimate(Trajectory trajectory, (double[] TimeS, double[] AccelMps2)? rawAccel, int peak, double standstillS, double peakDecel, double pulsePositionSigmaM, BrakeSlipPrior? brakeSlip)
    {
        double[] t = trajectory.TimeS;
        double[] a = trajectory.AccelMps2;
        bool accelerometer = rawAccel is { } raw && raw.TimeS.Length > 10;
        (double[] st, double[] sa) = accelerometer ? rawAccel!.Value : (t, a);
        // Without raw samples, pulses that carry the distance are a braked wheel's, whose tyre
        // slips more as the deceleration builds: its deceleration steps up at the onset
        // (BrakeOnsetFit's slip step), which the line through 20–80 % cannot tell from the rise.
        // The step's height is at most v·κ·P/T, κ the prior's largest slip per m/s².
        double slipStepS = !accelerometer && pulsePositionSigmaM > 0 ? trajectory.SpeedMps[peak] * (brakeSlip ?? BrakeSlipPrior.CarTyres).MostWheelSlip / Units.StandardGravity : 0;
        bool slipStep = slipStepS > 0;
        // A quick rise leaves a clean level before it, and the line through its 20–80 % part
        // is then the steadier answer; a slow one contaminates any level window, so the ramp
        // fit (level and rise together) takes over from SlowRiseS.
        Estimate? fitted = BrakeOnsetFit.Fit(st, sa, t, a, t[0], t[peak], standstillS, out double riseS, slipStepS);
        Estimate line = DecelerationOnset(st, sa, t[peak], TopFrom(t, trajectory.SpeedMps, peak), standstillS);
        Estimate onset = fitted is not { } f ? line
            : slipStep || riseS >= SlowRiseS || !Agree(line, f) ? f
            : line with { Sigma = Math.Sqrt((line.Sigma * line.Sigma) + (f.Sigma * f.Sigma)) }; // the line's own σ misses the shape of the rise
        if (!accelerometer && pulsePositionSigmaM > 0)
        {
            double spread = peakDecel > 0 ? 2 * Math.Sqrt(pulsePositionSigmaM / peakDecel) : 0;
            onset = onset with { Sigma = Math.Sqrt((onset.Sigma * onset.Sigma) + (spread * spread) + (SmootherSpreadS * SmootherSpreadS)) };
        }

        return onset;
    }

    /// <summary>The fusion's brake slip is taken for the stop when its σ is at most this share of
    /// the prior's: the pulses and the accelerometer then measured the tyre, rather than leaving
    /// the prior as it was (a record with little firm braking, or one whose braking was mostly
    /// set aside as a slide). The prior's σ is that of share/C (<see cref="BrakeSlipPrior.WheelSlipSigma"/>),
    /// the one the stop otherwise takes, as k_b measures the wheel's slip per unit of the car's
    /// deceleration whatever its axle: weighed against the spread of 1/C alone, two of the
    /// generator's slow stops (`bench accuracy --runs 400 --seed 1 --calibrated-tyre`, runs 250
    /// and 297) kept the prior's mean, 24 and 28 % off their tyres, where k_b was 9 and 2 % off.</summary>
    public const double MeasuredSlipShare = 0.5;

    /// <summary>What the fused slip may be off beyond its own σ, as a share of it. Measured on
    /// the generator's stops from cruise (rises 0.05 s to a steady rise through the stop, C 15–30,
    /// accelerometer scale ±1.2 %): within 5 % of the tyre's on rings of 24 teeth and more, and on
    /// coarse rings (8–12 teeth, 48 records, edges and polled) within 1.7σ of its own σ (mean
    /// |error| 2.8 %) since the slip signal carries the car's speed down to the stop (before, the
    /// last metres counted no slip there and slow rises read 0.4–0.85 of it at 3–14σ). 0.1 is
    /// kept as the allowance for what the linear slip law and the signal's speeds miss.</summary>
    public const double MeasuredSlipModelShare = 0.1;

    /// <summary>True when the fused slip <paramref name="kb"/> (s²/m) was measured (<see cref="MeasuredSlipShare"/>).</summary>
    private static bool FusedSlipMeasured(Estimate kb, BrakeSlipPrior tyre) =>
        tyre.WheelSlipSigma > 0 && kb.Sigma * Units.StandardGravity <= MeasuredSlipShare * tyre.WheelSlipSigma;

    /// <summary>σ of 1/C from the fused slip: its own and <see cref="MeasuredSlipModelShare"/> of it.</summary>
    private static double MeasuredInverseSigma(Estimate kb)
    {
        double own = kb.Sigma * Units.StandardGravity;
        double model = MeasuredSlipModelShare * Math.Abs(kb.Value) * Units.StandardGravity;
        return Math.Sqrt((own * own) + (model * model));
    }

    /// <summary>Within this of the highest speed before the stop the trajectory is at its top, m/s:
    /// a fusion's speed on a flat top (a cruise, a hold after a pull) wanders by a few mm/s, and
    /// where the brakes come on its error may tip the highest speed past their onset (a generated
    /// rolling start's: 0.04–0.09 m/s² of acceleration over the last 0.13 s before the onset, the
    /// speed 5 mm/s up and its peak 5.5 ms late), so the onset is not held back to the peak
    /// itself but to where the speed first came within this of it.</summary>
    public const double TopSpeedToleranceMps = 0.02;

    /// <summary>Where the trajectory's speed first came within <see cref="TopSpeedToleranceMps"/>
    /// of its value at <paramref name="peak"/> and stayed there up to it, s.</summary>
    private static double TopFrom(double[] t, double[] v, int peak)
    {
        int top = peak;
        while (top > 0 && v[top - 1] >= v[peak] - TopSpeedToleranceMps)
        {
            top--;
        }

        return t[top];
    }

    /// <summary>Onset of the deceleration that ends the run, found on samples (t, a) between
    /// the speed peak and standstill. Deceleration is measured from its level just before the
    /// rise (coasting drag and slope: the mean over 0.3 s to 0.05 s before the rise first passes
    /// 20 % of the full deceleration); a straight line is fitted to the rise between 20 % and 80 %
    /// of the full deceleration (a robust high value, the 90th percentile over the stop), and the
    /// onset is where that line crosses the level before it, no earlier than
    /// <paramref name="topS"/>, where the speed reached its top (<see cref="TopFrom"/>).</summary>
    private static Estimate DecelerationOnset(double[] t, double[] a, double peakS, double topS, double standstillS)
    {
        int peak = FigureCalculator.FirstIndexAtOrAfter(t, peakS);
        int stop = FigureCalculator.FirstIndexAtOrAfter(t, standstillS);
        if (stop - peak < 5)
        {
            return new Estimate(peakS, 0.05);
        }

        double[] sorted = new double[stop - peak];
        for (int i = peak; i < stop; i++)
        {
            sorted[i - peak] = -a[i];
        }

        Array.Sort(sorted);
        double full = sorted[(int)(0.9 * (sorted.Length - 1))];
        double baseline = 0;
        int lo = 0, hi = 0;
        for (int pass = 0; pass < 2; pass++)
        {
            // The last sample below 20 % before the first one at 80 %: the rising edge.
            double span = full + baseline;
            hi = peak;
            while (hi < stop - 1 && (baseline - a[hi]) < 0.8 * span)
            {
                hi++;
            }

            lo = hi;
            while (lo > peak && (baseline - a[lo]) > 0.2 * span)
            {
                lo--;
            }

            int from = FigureCalculator.FirstIndexAtOrAfter(t, t[lo] - 0.3);
            int to = FigureCalculator.FirstIndexAtOrAfter(t, t[lo] - 0.05);
            baseline = 0;
            for (int i = from; i < to; i++)
            {
                baseline += a[i];
            }

            baseline = to > from ? baseline / (to - from) : 0;
        }

        double gridStep = t[Math.Min(peak + 1, t.Length - 1)] - t[peak];
        if (hi - lo < 3)
        {
            return new Estimate(t[lo], Math.Max(gridStep, 0.002));
        }

        // Least-squares line through (t, deceleration above the level) on the rising edge.
        double st = 0, sd = 0, stt = 0, std = 0;
        int m = hi - lo + 1;
        for (int i = lo; i <= hi; i++)
        {
            double d = baseline - a[i];
            st += t[i];
            sd += d;
            stt += t[i] * t[i];
            std += t[i] * d;
        }

        double slope = ((m * std) - (st * sd)) / ((m * stt) - (st * st));
        double intercept = (sd - (slope * st)) / m;
        if (!(slope > 0))
        {
            return new Estimate(t[lo], t[hi] - t[lo]);
        }

        double residual = 0;
        for (int i = lo; i <= hi; i++)
        {
            double r = baseline - a[i] - (intercept + (slope * t[i]));
            residual += r * r;
        }

        // σ of the crossing: the fit's scatter over the slope, and the sample step.
        double scatter = Math.Sqrt(residual / Math.Max(m - 2, 1) / m);
        double sigma = Math.Sqrt(Math.Pow(scatter / slope, 2) + (gridStep * gridStep / 12));
        return new Estimate(Math.Clamp(-intercept / slope, Math.Min(topS, t[peak]), t[hi]), sigma);
    }

    /// <summary>∫ max(−a, 0)·v dt / g0 from <paramref name="fromS"/> to <paramref name="toS"/>,
    /// outside <paramref name="setAside"/>, m: the distance a braked wheel's pulses miss there,
    /// per unit of share/C. Over a whole stop from v0 it is v0²/(2·g0), whatever the deceleration's
    /// shape. The whole deceleration is taken as the brakes' (drag, which the tyres do not pass,
    /// is a few per cent of it at motorway speed).</summary>
    private static double BrakingWorkM(Trajectory trajectory, double fromS, double toS, IReadOnlyList<TimeWindow> setAside)
    {
        double[] t = trajectory.TimeS;
        double sum = 0;
        for (int i = 1; i < t.Length && t[i - 1] < toS; i++)
        {
            double lo = Math.Max(t[i - 1], fromS);
            double hi = Math.Min(t[i], toS);
            if (hi <= lo || InAny(setAside, 0.5 * (lo + hi)))
            {
                continue;
            }

            double fLo = Math.Max(-trajectory.ValueAt(trajectory.AccelMps2, lo), 0) * trajectory.ValueAt(trajectory.SpeedMps, lo);
            double fHi = Math.Max(-trajectory.ValueAt(trajectory.AccelMps2, hi), 0) * trajectory.ValueAt(trajectory.SpeedMps, hi);
            sum += 0.5 * (fLo + fHi) * (hi - lo);
        }

        return sum / Units.StandardGravity;
    }

    private static bool InAny(IReadOnlyList<TimeWindow> windows, double timeS)
    {
        foreach (TimeWindow w in windows)
        {
            if (w.Contains(timeS))
            {
                return true;
            }
        }

        return false;
    }

    private static bool Agree(Estimate line, Estimate fit) =>
        Math.Abs(line.Value - fit.Value) <= AgreementSigmas * Math.Sqrt((line.Sigma * line.Sigma) + (fit.Sigma * fit.Sigma));

    /// <summary>MFDD between the 0.8·v0 and 0.1·v0 crossings. Where the pulses carry the
    /// distance, the wheel's speed and distance both read (1 − s) of the car's, so its MFDD is the
    /// car's times (1 − s): it is divided by that, s the wheel's expected shortfall between the
    /// crossings. From the wheel's own speed and deceleration (each (1 − s) of the car's) that
    /// shortfall over the distance it counted is r = s·(1 − s), so s = 2r / (1 + √(1 − 4r)).</summary>
    private static double? Mfdd(Trajectory trajectory, double onsetS, double fromMps, double fromDistance, int stop, double meanWheelSlip, IReadOnlyList<TimeWindow> slid)
    {
        int start = FigureCalculator.FirstIndexAtOrAfter(trajectory.TimeS, onsetS);
        double? tb = FallCrossing(trajectory, start, stop, BrakingFormulas.MfddWindowStartFraction * fromMps);
        double? te = FallCrossing(trajectory, start, stop, BrakingFormulas.MfddWindowEndFraction * fromMps);
        if (tb is not { } b || te is not { } e || e <= b)
        {
            return null;
        }

        double sb = trajectory.ValueAt(trajectory.DistanceM, b) - fromDistance;
        double se = trajectory.ValueAt(trajectory.DistanceM, e) - fromDistance;
        double missed = meanWheelSlip > 0 ? BrakingWorkM(trajectory, b, e, slid) * meanWheelSlip : 0;
        double share = missed / (se - sb);
        double slip = 2 * share / (1 + Math.Sqrt(Math.Max(1 - (4 * share), 0)));
        return BrakingFormulas.Mfdd(fromMps / Units.MpsPerKmh, sb, se) / (1 - slip);
    }

    private static double? FallCrossing(Trajectory trajectory, int start, int stop, double speed)
    {
        double[] t = trajectory.TimeS;
        double[] v = trajectory.SpeedMps;
        for (int i = Math.Max(start, 1); i <= stop; i++)
        {
            if (v[i] <= speed && v[i - 1] > speed)
            {
                return t[i - 1] + ((t[i] - t[i - 1]) * (v[i - 1] - speed) / (v[i - 1] - v[i]));
            }
        }

        return null;
    }

    private static List<CorrectedStop> CorrectedStops(double distance, double fromMps, IReadOnlyList<double>? extra)
    {
        var nominals = new List<(string Label, double Mps)>
        {
            ("60-0 mph", 60 * Units.MpsPerMph),
            ("100-0 km/h", 100 * Units.MpsPerKmh),
        };
        foreach (double mps in extra ?? [])
        {
            nominals.Add((FormattableString.Invariant($"{mps / Units.MpsPerMph:0.#}-0 mph ({mps / Units.MpsPerKmh:0.#}-0 km/h)"), mps));
        }

        var result = new List<CorrectedStop>(nominals.Count);
        foreach ((string label, double nominal) in nominals)
        {
            bool close = Math.Abs(fromMps - nominal) <= CorrectionTolerance * nominal;
            result.Add(new CorrectedStop(
                label,
                nominal,
                close ? BrakingFormulas.CorrectToNominalSpeed(distance, fromMps, nominal) : null,
                close
                    ? "distance × (nominal ÷ actual speed at onset)², exact for constant deceleration without dead time"
                    : FormattableString.Invariant($"not corrected: onset speed {fromMps:0.0} m/s is more than {CorrectionTolerance:P0} from {nominal:0.0} m/s")));
        }

        return result;
    }
}
