
namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>What the third state of <see cref="FusionSmoother"/> means.</summary>
internal enum FusionMode
{
    /// <summary>The accelerometer drives the motion; the third state is its bias (m/s²).</summary>
    Accelerometer,

    /// <summary>No accelerometer: the third state is the acceleration itself, a random walk
    /// driven by white jerk.</summary>
    Kinematic,
}

/// <summary>Everything <see cref="FusionSmoother.Run"/> needs.</summary>
internal sealed class FusionSettings
{
    public required FusionMode Mode { get; init; }

    /// <summary>The most grid points whose filtered states are kept whole (<see cref="ReconstructionOptions.FilterStatesKept"/>).</summary>
    public int MaxStoredSteps { get; init; } = 1 << 18;

    /// <summary>Grid times, ascending, seconds.</summary>
    public required double[] GridS { get; init; }

    /// <summary>Speed gained from the accelerometer input over step k → k+1, m/s (zeros in kinematic mode).</summary>
    public required double[] StepSpeedMps { get; init; }

    /// <summary>Distance gained from the accelerometer input over step k → k+1 beyond v·Δt, m.</summary>
    public required double[] StepDistanceM { get; init; }

    /// <summary>True for steps the accelerometer does not cover (gaps, beyond its end).</summary>
    public bool[]? NoInput { get; init; }

    /// <summary>First motion: distance and speed are exactly 0 here.</summary>
    public required double StartS { get; init; }

    /// <summary>Input speed and distance gained from <see cref="StartS"/> to the first grid time after it.</summary>
    public double StartSpeedMps { get; init; }

    public double StartDistanceM { get; init; }

    /// <summary>Speed at the start, m/s, and its σ (0 from standstill).</summary>
    public double InitialSpeedMps { get; init; }

    public double InitialSpeedSigma { get; init; }

    /// <summary>Third state at the start: bias or acceleration, m/s², and its σ.</summary>
    public double ThirdMean { get; init; }

    public double ThirdSigma { get; init; }

    /// <summary>Pulse phase φ (count N is reached at distance N·m − φ), metres, and its σ.</summary>
    public double PhaseMean { get; init; }

    public double PhaseSigma { get; init; }

    /// <summary>White acceleration noise density of the input, m²/s³.</summary>
    public double InputDensity { get; init; }

    /// <summary>Acceleration noise density where the accelerometer has no samples, m²/s³.</summary>
    public double GapInputDensity { get; init; } = 5;

    /// <summary>Random-walk density of the third state (bias wander or jerk), m²/s⁵.</summary>
    public double ThirdDensity { get; init; }

    /// <summary>From this grid index on the car is at rest (zero-velocity updates).</summary>
    public int StopIndex { get; init; } = int.MaxValue;

    /// <summary>Speed variance added over the step into <see cref="StopIndex"/>, (m/s)²: what the
    /// input leaves unknown of the speed lost where the car came to rest between two samples
    /// (<see cref="StopFinder.StopGapSpeedVariance"/>).</summary>
    public double StopStepSpeedVariance { get; init; }

    public PulseChannel? Pulses { get; init; }

    public double MetresPerPulse { get; init; }

    /// <summary>Distance the tyre's measured growth with speed adds at each pulse observation
    /// beyond count × <see cref="MetresPerPulse"/>, m (null: none).</summary>
    public double[]? PulseGrowthM { get; init; }

    /// <summary>Each pulse observation's edge place less its count, in pitches (the ring's
    /// measured tooth positions, <see cref="ToothPositions"/>; null: evenly spaced).</summary>
    public double[]? PulseToothOffsets { get; init; }

    public double ToothSigmaM { get; init; }

    public double EdgeJitterS { get; init; }

    /// <summary>Pulses inside these windows are ignored, and the phase may jump at their start.</summary>
    public TimeWindow[] SpinWindows { get; init; } = [];

    /// <summary>Variance added to the phase at the start of each spin window, m².</summary>
    public double SpinPhaseVariance { get; init; }

    /// <summary>Firm braking: pulses inside these windows are ignored (a braked wheel slips), the
    /// phase may jump at their start, and the accelerometer's error may step there by
    /// <see cref="BrakeBiasStepVariance"/> (its scale error times the deceleration) and then
    /// wanders only at <see cref="BrakeThirdDensity"/>.</summary>
    public TimeWindow[] BrakeWindows { get; init; } = [];

    /// <summary>Variance of the step of the third state at the start of each brake window, (m/s²)², one per window.</summary>
    public double[] BrakeBiasStepVariance { get; init; } = [];

    /// <summary>Braking where the pulses are kept (the wheel slips only by its tyre's slip, which
    /// <see cref="BrakeSlipSignal"/> models): as in <see cref="BrakeWindows"/> the accelerometer's
    /// error may step at their start by <see cref="FirmBrakeStepVariance"/> and then wanders only
    /// at <see cref="BrakeThirdDensity"/>, so that its scale error under braking is a step, not a
    /// wander that could mimic the slip.</summary>
    public TimeWindow[] FirmBrakeWindows { get; init; } = [];

    /// <summary>Variance of the third state's step at the start of each firm brake window, (m/s²)².</summary>
    public double[] FirmBrakeStepVariance { get; init; } = [];

    /// <summary>Random-walk density of the third state inside brake windows, m²/s⁵.</summary>
    public double BrakeThirdDensity { get; init; }

    /// <summary>Random-walk density of the third state inside firm brake windows, m²/s⁵.</summary>
    public double FirmBrakeThirdDensity { get; init; }

    /// <summary>Slip signal S(t) at the grid times: ∫ v·a_drive dt, m²/s² (zeros for none). The
    /// pulses count d + φ + k·S, k being the wheel's slip per unit of drive acceleration.</summary>
    public double[]? SlipSignal { get; init; }

    /// <summary>Prior of the slip coefficient k, s²/m, and its σ (0 to leave slip out).</summary>
    public double SlipMean { get; init; }

    public double SlipSigma { get; init; }

    /// <summary>Braking signal S_b(t) at the grid times: ∫ v·max(−a, 0) dt, m²/s² (null for none).
    /// A braked tyre turns slower than the road by its slip, deceleration ÷ (g0·C), so the pulses
    /// count d + φ + k·S − k_b·S_b, k_b = 1/(g0·C) the wheel's brake slip per unit of
    /// deceleration: a constant state, like k, whatever wheel carries the pickup.</summary>
    public double[]? BrakeSlipSignal { get; init; }

    /// <summary>Prior of the brake slip coefficient k_b, s²/m, and its σ (the tyres' stiffness range).</summary>
    public double BrakeSlipMean { get; init; }

    public double BrakeSlipSigma { get; init; }

    /// <summary>Prior σ of the accelerometer's scale error under firm braking ε (there the input
    /// reads (1 + ε) times the motion), a fraction, held as one state over every firm brake
    /// window of the record; 0 leaves the state out (the third state's step at each window then
    /// stands for it). A braked wheel's slip shifts the pulses by k_b·∫v·a dt, which vanishes as
    /// the car comes to rest, where a scale error moves the speed by ε·∫a dt and the distance by
    /// ε·∫∫a: held as one number, the scale cannot take up a slow brake rise's slip as a
    /// window's free step could. Outside braking the input is taken as it was (the launch keeps
    /// its own model: the body squats there and dives under braking, so the two need not share a
    /// scale, and a scale fitted on the stop bent the simulator's launches).</summary>
    public double ScaleSigma { get; init; }

    /// <summary>Slip coefficients smaller than this (or under three σ) are not kept: the result
    /// is then conditioned on k ~ N(<see cref="UnkeptSlipMean"/>, <see cref="UnkeptSlipSigma"/>²), s²/m.</summary>
    public double SlipMinimum { get; init; }

    /// <summary>What a slip coefficient not kept is taken to be, s²/m: an undriven wheel's
    /// spin-up slip (0 for none).</summary>
    public double UnkeptSlipMean { get; init; }

    /// <summary>1-σ of <see cref="UnkeptSlipMean"/>, s²/m (0: conditioned on it exactly).</summary>
    public double UnkeptSlipSigma { get; init; }

    /// <summary>How much better a kept slip coefficient must explain the pulses than no slip:
    /// twice the log-likelihood ratio, at least this (25: the evidence of a five-σ effect) plus
    /// <see cref="SlipEvidencePerPulse"/> per pulse observation used.</summary>
    public double SlipEvidence { get; init; } = 25;

    /// <summary>The part of <see cref="SlipEvidence"/> that grows with the pulses used. The filter
    /// takes bracket and tooth errors as independent, yet neighbouring brackets err alike (the
    /// edge train beats against the poll period), so the likelihood overstates what many pulses
    /// prove. Measured: constant-acceleration inputs without slip, written as brackets at
    /// 0.1–10 ms polls with 10–40 mm per pulse, gain up to 0.03 per pulse; a driven wheel slipping
    /// 1–3 % in the simulator's launches gains 0.4–5 per pulse. 0.1 sits between.</summary>
    public double SlipEvidencePerPulse { get; init; } = 0.1;
}

/// <summary>The smoothed states on the grid (zeros before first motion).</summary>
internal sealed class FusionResult
{
    public required double[] DistanceM { get; init; }

    public required double[] SpeedMps { get; init; }

    public required double[] DistanceSigmaM { get; init; }

    public required double[] SpeedSigmaMps { get; init; }

    /// <summary>Smoothed third state (bias or acceleration) and its σ.</summary>
    public required double[] Third { get; init; }

    public required double[] ThirdSigma { get; init; }

    public required Estimate PhaseM { get; init; }

    /// <summary>Smoothed brake slip coefficient k_b, s²/m, after any conditioning of the drive slip
    /// (its prior when <see cref="FusionSettings.BrakeSlipSignal"/> is null).</summary>
    public Estimate BrakeSlip { get; init; }

    /// <summary>Smoothed accelerometer scale error ε, a fraction (0 ± 0 without the state).</summary>
    public Estimate AccelScale { get; init; }

    /// <summary>Smoothed slip coefficient, s²/m (before any conditioning on an undriven wheel's).</summary>
    public Estimate Slip { get; set; }

    /// <summary>The slip coefficient the states hold, s²/m: <see cref="Slip"/> when kept,
    /// otherwise it conditioned on an undriven wheel's prior.</summary>
    public Estimate SlipUsed { get; set; }

    /// <summary>True when the slip coefficient was kept; false when it was too small to tell
    /// from an undriven wheel's and the result was conditioned on that.</summary>
    public bool SlipKept { get; init; }

    public int PulsesUsed { get; init; }

    public int Outliers { get; init; }

    /// <summary>Log-likelihood of the measurements under the filter (sum over the innovations of
    /// −½·(ν²/S + ln S), constants left out).</summary>
    public double LogLikelihood { get; init; }
}

/// <summary>A linear Kalman filter with a Rauch–Tung–Striebel smoother over the state
/// [distance, speed, third, pulse phase, wheel slip, brake slip, accelerometer scale], its 7×7 algebra written out as straight-line code so
/// that a step allocates nothing. Distance and speed start exactly at 0 at first motion.</summary>
/// <remarks>
/// Filter and smoother: R. E. Kalman (1960), "A new approach to linear filtering and prediction
/// problems"; H. E. Rauch, F. Tung, C. T. Striebel (1965), "Maximum likelihood estimates of linear
/// dynamic systems", AIAA J. 3(8). Process noise of integrated white noise as in Bar-Shalom, Li,
/// Kirubarajan, "Estimation with Applications to Tracking and Navigation" (2001), §6.2–6.3.
/// A pulse observation "count N reached in (lo, hi]" becomes the measurement d(t) + φ = N·m at
/// the middle of the interval the edge lies in uniformly (<see cref="BracketModel"/>: the bracket,
/// narrowed at speed by the pulse period and the count's rise), with variance v²·w²/12 for an
/// interval of width w plus the ring's tooth-position spread.
/// </remarks>
internal static class FusionSmoother
{
    /// <summary>Runs the filter and smoother. With a slip state, a slip coefficient that passes
    /// its own test is kept only when it also explains the pulses better than an undriven wheel's slip by
    /// <see cref="FusionSettings.SlipEvidence"/> (twice the log-likelihood ratio of the two
    /// filters' innovations): under a steady drive a slip is all but indistinguishable from an
    /// accelerometer bias, and a coefficient that wandered there with the bias explains nothing.</summary>
    public static FusionResult Run(FusionSettings s)
    {
        FusionResult withSlip = RunOnce(s, slipAllowed: true);
        if (!withSlip.SlipKept)
        {
            return withSlip;
        }

        FusionResult without = RunOnce(s, slipAllowed: false);
        double needed = s.SlipEvidence + (s.SlipEvidencePerPulse * withSlip.PulsesUsed);
        // Without the slip kept, its estimate still says how much slip the data leave room for.
        if (2 * (withSlip.LogLikelihood - without.LogLikelihood) >= needed)
        {
            return withSlip;
        }

        without.Slip = withSlip.Slip;
        without.SlipUsed = new Estimate(s.UnkeptSlipMean, 0);
        return without;
    }

    private static FusionResult RunOnce(FusionSettings s, bool slipAllowed)
    {
        double slipPrior = slipAllowed ? s.SlipSigma : 0;
        double[] grid = s.GridS;
        int n = grid.Length;
        int k0 = FirstIndexAfter(grid, s.StartS);
        int m = Math.Max(n - k0, 0);
        byte[] jump = Marks(s, grid, k0);
        var f = new FilterState
        {
            // Without a slip state k is held at an undriven wheel's (the null the kept slip must beat).
            X = new Vec { V = s.InitialSpeedMps, T = s.ThirdMean, F = s.PhaseMean, K = slipAllowed ? s.SlipMean : s.UnkeptSlipMean, B = s.BrakeSlipSignal is null ? 0 : s.BrakeSlipMean },
            P = new Sym
            {
                P11 = s.InitialSpeedSigma * s.InitialSpeedSigma,
                P22 = s.ThirdSigma * s.ThirdSigma,
                P33 = s.PhaseSigma * s.PhaseSigma,
                P44 = Math.Max(slipPrior * slipPrior, 1e-30),
                P55 = s.BrakeSlipSignal is null ? 1e-30 : Math.Max(s.BrakeSlipSigma * s.BrakeSlipSigma, 1e-30),
                P66 = Math.Max(s.ScaleSigma * s.ScaleSigma, 1e-30),
            },
        };
        if (m > 0)
        {
            Predict(s, ref f.X, ref f.P, grid[k0] - s.StartS, s.StartSpeedMps, s.StartDistanceM, frozen: k0 > s.StopIndex, noInput: false, marks: 0, stepVariance: 0, stopVariance: 0);
        }

        PulseChannel? pulses = s.Pulses;
        if (pulses != null)
        {
            while (f.Ip < pulses.Length && pulses.MidS(f.Ip) <= s.StartS)
            {
                f.Ip++;
            }
        }

        // The filtered states, kept for the backward pass (or, for a long run, every
        // CheckpointSteps-th filter state, from which the backward pass replays them).
        var states = new FilteredStates(s, grid, jump, k0, m);
        try
        {
            for (int k = k0; k < n; k++)
            {
                states.BeforeStep(k - k0, in f);
                FilterStep(s, grid, jump, k0, k, ref f);
                states.AfterStep(k - k0, in f);
            }

            return Smooth(s, slipPrior, grid, k0, states, jump, f.Used, f.Outliers, f.LogLikelihood);
        }
        finally
        {
            states.Dispose();
        }
    }

    /// <summary>One step of the forward (filter) pass at grid point <paramref name="k"/>: the
    /// pulse observations before the next grid point, the hold at a stop, the filtered state
    /// (<see cref="FilterState.FilteredX"/>, <see cref="FilterState.FilteredP"/>), then the
    /// prediction to the next grid point. It depends on nothing but its arguments, so that a
    /// stretch of the pass can be replayed from a saved state with the same result.</summary>
    private static void FilterStep(FusionSettings s, double[] grid, byte[] jump, int k0, int k, ref FilterState f)
    {
        int n = grid.Length;
        PulseChannel? pulses = s.Pulses;
        double[]? slip = s.SlipSignal;
        double[]? brakeSlip = s.BrakeSlipSignal;
        double mpp = s.MetresPerPulse;
        double toothVar = s.ToothSigmaM * s.ToothSigmaM;
        double jitterVar = s.EdgeJitterS * s.EdgeJitterS;
        bool accelMode = s.Mode == FusionMode.Accelerometer;
        double tk = grid[k];
        double tNext = k + 1 < n ? grid[k + 1] : double.PositiveInfinity;
        double meanInput = k + 1 < n && accelMode ? s.StepSpeedMps[k] / (tNext - tk) : 0;
        bool frozen = k >= s.StopIndex;
        while (pulses != null && f.Ip < pulses.Length && pulses.MidS(f.Ip) < tNext)
        {
            int ip = f.Ip;
            double mid = pulses.MidS(ip);
            if (!frozen && !InSpin(s.SpinWindows, mid) && !InSpin(s.BrakeWindows, mid))
            {
                double speed = Math.Max(f.X.V, 0);
                double lo = pulses.LoS[ip];
                double hi = pulses.HiS[ip];
                pulses.PulsePeriod(ip, out double period, out double periodSigma);
                BracketModel.LastEdge(lo, hi, pulses.Increment(ip), period, Math.Min(0.5, periodSigma + (3 * s.ToothSigmaM / Math.Max(mpp, 1e-9))), out lo, out hi);

                double delta = (0.5 * (lo + hi)) - tk;
                double w = hi - lo;
                double z = ((pulses.Counts[ip] + (s.PulseToothOffsets?[ip] ?? 0)) * mpp) + (s.PulseGrowthM?[ip] ?? 0);
                double h2 = 0.5 * delta * delta;
                if (accelMode)
                {
                    z -= meanInput * h2;
                    h2 = -h2;
                }

                double r = toothVar + (speed * speed * ((w * w / 12) + jitterVar)) + 1e-12;
                double fraction = k + 1 < n ? delta / (tNext - tk) : 0;
                double h4 = slip is null ? 0 : slip[k] + (fraction * ((k + 1 < n ? slip[k + 1] : slip[k]) - slip[k]));
                double h5 = brakeSlip is null ? 0 : -(brakeSlip[k] + (fraction * ((k + 1 < n ? brakeSlip[k + 1] : brakeSlip[k]) - brakeSlip[k])));
                // The scale error's share of the input gained since the grid point.
                double h6 = accelMode && s.ScaleSigma > 0 && (jump[k] & InFirmBrake) != 0 ? -meanInput * 0.5 * delta * delta : 0;
                Update(ref f.X, ref f.P, 1, delta, h2, 1, h4, h5, h6, z, r, gate: f.Used >= 6, out bool ok, ref f.LogLikelihood);
                if (ok)
                {
                    f.Used++;
                }
                else
                {
                    f.Outliers++;
                }
            }

            f.Ip++;
        }

        if (frozen)
        {
            Update(ref f.X, ref f.P, 0, 1, 0, 0, 0, 0, 0, 0, 1e-8, gate: false, out _, ref f.LogLikelihood);
        }

        f.FilteredX = f.X;
        f.FilteredP = f.P;
        if (k + 1 < n)
        {
            bool noInput = s.NoInput != null && s.NoInput[k];
            Predict(s, ref f.X, ref f.P, tNext - tk, s.StepSpeedMps[k], s.StepDistanceM[k], frozen, noInput, jump[k], StepVariance(s, grid, k0, k, jump[k]), StopVariance(s, k));
        }
    }

    private static FusionResult Smooth(FusionSettings s, double slipPrior, double[] grid, int k0, FilteredStates filtered, byte[] jump, int used, int outliers, double logLikelihood)
    {
        int n = grid.Length;
        var d = new double[n];
        var v = new double[n];
        var sd = new double[n];
        var sv = new double[n];
        var third = new double[n];
        var sthird = new double[n];
        for (int k = 0; k < Math.Min(k0, n); k++)
        {
            third[k] = s.Mode == FusionMode.Accelerometer ? s.ThirdMean : 0;
        }

        if (k0 >= n)
        {
            return new FusionResult
            {
                DistanceM = d, SpeedMps = v, DistanceSigmaM = sd, SpeedSigmaMps = sv, Third = third, ThirdSigma = sthird,
                PhaseM = new Estimate(s.PhaseMean, s.PhaseSigma), BrakeSlip = new Estimate(s.BrakeSlipMean, s.BrakeSlipSigma), PulsesUsed = used, Outliers = outliers, LogLikelihood = logLikelihood,
            };
        }

        filtered.Get(n - 1 - k0, out Vec xs, out Sym ps);

        // The slip coefficient is constant, so its last filtered value is already the smoothed
        // one: decide now whether the wheel slips more than an undriven one. If not, every
        // smoothed state is conditioned on k being the undriven wheel's, as a measurement
        // k = μ ± σᵤ (Gaussian conditioning with the smoothed cross-covariances; σᵤ = 0 holds k
        // at μ exactly). The filter's own prior on k is wide (a driven wheel's), so the data's
        // estimate and the undriven prior combine as two independent measurements of k.
        double slipSigma = Math.Sqrt(Math.Max(ps.P44, 0));
        bool slipKept = slipPrior > 0 && Math.Abs(xs.K) >= s.SlipMinimum && Math.Abs(xs.K) >= 3 * slipSigma;
        bool conditioned = slipPrior > 0 && !slipKept && ps.P44 > 0;
        double slipInverse = conditioned ? 1 / (ps.P44 + (s.UnkeptSlipSigma * s.UnkeptSlipSigma)) : 0;
        double slipShift = (xs.K - s.UnkeptSlipMean) * slipInverse;
        var slipEstimate = new Estimate(xs.K, slipSigma);
        Estimate slipUsed = !conditioned ? (slipKept ? slipEstimate : new Estimate(0, 0))
            : new Estimate(xs.K - (ps.P44 * slipShift), Math.Sqrt(Math.Max(ps.P44 - (ps.P44 * ps.P44 * slipInverse), 0)));
        Emit(n - 1, xs, ps, d, v, sd, sv, third, sthird, slipShift, slipInverse);
        for (int k = n - 2; k >= k0; k--)
        {
            int j = k - k0;
            bool frozen = k >= s.StopIndex;
            bool noInput = s.NoInput != null && s.NoInput[k];
            double dt = grid[k + 1] - grid[k];
            filtered.Get(j, out Vec xj, out Sym pj);
            Vec xp = xj;
            Sym pp = pj;
            Predict(s, ref xp, ref pp, dt, s.StepSpeedMps[k], s.StepDistanceM[k], frozen, noInput, jump[k], StepVariance(s, grid, k0, k, jump[k]), StopVariance(s, k));
            Transition(s, dt, s.StepSpeedMps[k], s.StepDistanceM[k], frozen, jump[k], out double f01, out double f02, out double f12, out double f06, out double f16);
            SmoothStep(xj, pj, xp, pp, f01, f02, f12, f06, f16, ref xs, ref ps);
            Emit(k, xs, ps, d, v, sd, sv, third, sthird, slipShift, slipInverse);
        }

        return new FusionResult
        {
            DistanceM = d, SpeedMps = v, DistanceSigmaM = sd, SpeedSigmaMps = sv, Third = third, ThirdSigma = sthird,
            PhaseM = new Estimate(xs.F - (ps.P34 * slipShift), Math.Sqrt(Math.Max(ps.P33 - (ps.P34 * ps.P34 * slipInverse), 0))),
            BrakeSlip = s.BrakeSlipSignal is null ? new Estimate(s.BrakeSlipMean, s.BrakeSlipSigma)
                : new Estimate(xs.B - (ps.P45 * slipShift), Math.Sqrt(Math.Max(ps.P55 - (ps.P45 * ps.P45 * slipInverse), 0))),
            AccelScale = s.ScaleSigma <= 0 ? new Estimate(0, 0)
                : new Estimate(xs.E - (ps.P46 * slipShift), Math.Sqrt(Math.Max(ps.P66 - (ps.P46 * ps.P46 * slipInverse), 0))),
            Slip = slipEstimate, SlipUsed = slipUsed, SlipKept = slipKept, PulsesUsed = used, Outliers = outliers, LogLikelihood = logLikelihood,
        };
    }

    /// <summary>Stores a smoothed state, conditioned on k = μ ± σᵤ when <paramref name="shift"/>
    /// ((k − μ)/(Pkk + σᵤ²)) and <paramref name="inverse"/> (1/(Pkk + σᵤ²)) are not 0.</summary>
    private static void Emit(int k, in Vec x, in Sym p, double[] d, double[] v, double[] sd, double[] sv, double[] third, double[] sthird, double shift, double inverse)
    {
        d[k] = x.D - (p.P04 * shift);
        v[k] = x.V - (p.P14 * shift);
        third[k] = x.T - (p.P24 * shift);
        sd[k] = Math.Sqrt(Math.Max(p.P00 - (p.P04 * p.P04 * inverse), 0));
        sv[k] = Math.Sqrt(Math.Max(p.P11 - (p.P14 * p.P14 * inverse), 0));
        sthird[k] = Math.Sqrt(Math.Max(p.P22 - (p.P24 * p.P24 * inverse), 0));
    }

    /// <summary>The transition's off-diagonal terms: distance on speed (f01) and on the third state
    /// (f02), speed on the third state (f12), and, with a scale state, inside firm braking
    /// (<paramref name="marks"/>), distance and speed on the accelerometer's scale error under
    /// braking (f06, f16: minus the input's own gain over the step).</summary>
    private static void Transition(FusionSettings s, double dt, double inputSpeed, double inputDistance, bool frozen, byte marks, out double f01, out double f02, out double f12, out double f06, out double f16)
    {
        f01 = dt;
        f06 = 0;
        f16 = 0;
        if (frozen)
        {
            f02 = 0;
            f12 = 0;
        }
        else if (s.Mode == FusionMode.Accelerometer)
        {
            f02 = -0.5 * dt * dt;
            f12 = -dt;
            if (s.ScaleSigma > 0 && (marks & InFirmBrake) != 0)
            {
                f06 = -inputDistance;
                f16 = -inputSpeed;
            }
        }
        else
        {
            f02 = 0.5 * dt * dt;
            f12 = dt;
        }
    }

    /// <summary>x ← F·x + input, P ← F·P·Fᵀ + Q over one step of <paramref name="dt"/>.</summary>
    private static void Predict(FusionSettings s, ref Vec x, ref Sym p, double dt, double inputSpeed, double inputDistance, bool frozen, bool noInput, byte marks, double stepVariance, double stopVariance)
    {
        Transition(s, dt, inputSpeed, inputDistance, frozen, marks, out double f01, out double f02, out double f12, out double f06, out double f16);
        if (frozen)
        {
            x.D += x.V * dt;
        }
        else if (s.Mode == FusionMode.Accelerometer)
        {
            // The input reads (1 + ε) times the motion: its scale error's share is taken off.
            x.D += (x.V * dt) + inputDistance - (0.5 * x.T * dt * dt) + (f06 * x.E);
            x.V += inputSpeed - (x.T * dt) + (f16 * x.E);
        }
        else
        {
            x.D += (x.V * dt) + (0.5 * x.T * dt * dt);
            x.V += x.T * dt;
        }

        Propagate(ref p, f01, f02, f12, f06, f16);

        // Integrated white noise: input acceleration (accelerometer mode) and the third state's
        // random walk, with tiny floors that keep the predicted covariance invertible.
        double dt2 = dt * dt;
        double dt3 = dt2 * dt;
        double q3 = (marks & InFirmBrake) != 0 ? s.FirmBrakeThirdDensity : (marks & InBrake) != 0 ? s.BrakeThirdDensity : s.ThirdDensity;
        p.P00 += 1e-14;
        p.P11 += 1e-12 + stopVariance;
        p.P33 += 1e-16 + ((marks & PhaseJump) != 0 ? s.SpinPhaseVariance : 0);
        p.P22 += stepVariance;

        p.P44 += 1e-20;
        p.P55 += 1e-20;
        p.P66 += 1e-20;
        if (frozen)
        {
            p.P22 += (q3 * dt) + 1e-16;
            return;
        }

        if (s.Mode == FusionMode.Accelerometer)
        {
            double qa = noInput ? s.GapInputDensity : s.InputDensity;
            p.P00 += qa * dt3 / 3;
            p.P01 += qa * dt2 / 2;
            p.P11 += qa * dt;
        }

        double sign = s.Mode == FusionMode.Accelerometer ? -1 : 1;
        p.P00 += q3 * dt3 * dt2 / 20;
        p.P01 += q3 * dt2 * dt2 / 8;
        p.P02 += sign * q3 * dt3 / 6;
        p.P11 += q3 * dt3 / 3;
        p.P12 += sign * q3 * dt2 / 2;
        p.P22 += (q3 * dt) + 1e-16;
    }

    private static bool InSpin(TimeWindow[] windows, double t)
    {
        foreach (TimeWindow w in windows)
        {
            if (w.Contains(t))
            {
                return true;
            }
        }

        return false;
    }

    /// <summary>The speed variance of step k: <see cref="FusionSettings.StopStepSpeedVariance"/>
    /// on the step into the stop, 0 elsewhere.</summary>
    private static double StopVariance(FusionSettings s, int k) => k + 1 == s.StopIndex ? s.StopStepSpeedVariance : 0;

    /// <summary>The third state's step variance at step k (0 unless a brake window starts there).</summary>
    private static double StepVariance(FusionSettings s, double[] grid, int k0, int k, byte marks)
    {
        if ((marks & BiasStep) == 0)
        {
            return 0;
        }

        double variance = 0;
        for (int i = 0; i < s.BrakeWindows.Length; i++)
        {
            if (Math.Max(FirstIndexAfter(grid, s.BrakeWindows[i].StartS) - 1, k0) == k)
            {
                variance += i < s.BrakeBiasStepVariance.Length ? s.BrakeBiasStepVariance[i] : 0;
            }
        }

        for (int i = 0; i < s.FirmBrakeWindows.Length; i++)
        {
            if (Math.Max(FirstIndexAfter(grid, s.FirmBrakeWindows[i].StartS) - 1, k0) == k)
            {
                variance += i < s.FirmBrakeStepVariance.Length ? s.FirmBrakeStepVariance[i] : 0;
            }
        }

        return variance;
    }

    private const byte PhaseJump = 1;
    private const byte InBrake = 2;
    private const byte BiasStep = 4;
    private const byte InFirmBrake = 8;

    /// <summary>Per step k → k+1: the phase jumps (a spin or brake window starts), the step lies in
    /// a brake window, the third state steps (a brake window starts).</summary>
    private static byte[] Marks(FusionSettings s, double[] grid, int k0)
    {
        var marks = new byte[grid.Length];
        foreach (TimeWindow w in s.SpinWindows)
        {
            int k = Math.Max(FirstIndexAfter(grid, w.StartS) - 1, k0);
            if (k < grid.Length)
            {
                marks[k] |= PhaseJump;
            }
        }

        foreach (TimeWindow w in s.FirmBrakeWindows)
        {
            int k = Math.Max(FirstIndexAfter(grid, w.StartS) - 1, k0);
            if (k < grid.Length)
            {
                marks[k] |= BiasStep;
            }

            for (; k < grid.Length && grid[k] < w.EndS; k++)
            {
                marks[k] |= InBrake | InFirmBrake;
            }
        }

        foreach (TimeWindow w in s.BrakeWindows)
        {
            int k = Math.Max(FirstIndexAfter(grid, w.StartS) - 1, k0);
            if (k < grid.Length)
            {
                marks[k] |= PhaseJump | BiasStep;
            }

            for (; k < grid.Length && grid[k] < w.EndS; k++)
            {
                marks[k] |= InBrake;
            }
        }

        return marks;
    }

    /// <summary>Index of the first grid time strictly after <paramref name="t"/> (the length when none).</summary>
    public static int FirstIndexAfter(double[] grid, double t)
    {
        int lo = 0;
        int hi = grid.Length;
        while (lo < hi)
        {
            int mid = (lo + hi) >>> 1;
            if (grid[mid] > t)
            {
                hi = mid;
            }
            else
            {
                lo = mid + 1;
            }
        }

        return lo;
    }

    /// <summary>One Rauch–Tung–Striebel step: from the smoothed state at k+1 (in <paramref name="xs"/>,
    /// <paramref name="ps"/>) to the smoothed state at k, with gain C = Pk·Fᵀ·Pp⁻¹.</summary>
    private static void SmoothStep(in Vec xk, in Sym pk, in Vec xp, in Sym pp, double f01, double f02, double f12, double f06, double f16, ref Vec xs, ref Sym ps)
    {
        double a00 = pk.P00 + (f01 * pk.P01) + (f02 * pk.P02) + (f06 * pk.P06);
        double a10 = pk.P01 + (f12 * pk.P02) + (f16 * pk.P06);
        double a20 = pk.P02;
        double a30 = pk.P03;
        double a40 = pk.P04;
        double a50 = pk.P05;
        double a60 = pk.P06;
        double a01 = pk.P01 + (f01 * pk.P11) + (f02 * pk.P12) + (f06 * pk.P16);
        double a11 = pk.P11 + (f12 * pk.P12) + (f16 * pk.P16);
        double a21 = pk.P12;
        double a31 = pk.P13;
        double a41 = pk.P14;
        double a51 = pk.P15;
        double a61 = pk.P16;
        double a02 = pk.P02 + (f01 * pk.P12) + (f02 * pk.P22) + (f06 * pk.P26);
        double a12 = pk.P12 + (f12 * pk.P22) + (f16 * pk.P26);
        double a22 = pk.P22;
        double a32 = pk.P23;
        double a42 = pk.P24;
        double a52 = pk.P25;
        double a62 = pk.P26;
        double a03 = pk.P03 + (f01 * pk.P13) + (f02 * pk.P23) + (f06 * pk.P36);
        double a13 = pk.P13 + (f12 * pk.P23) + (f16 * pk.P36);
        double a23 = pk.P23;
        double a33 = pk.P33;
        double a43 = pk.P34;
        double a53 = pk.P35;
        double a63 = pk.P36;
        double a04 = pk.P04 + (f01 * pk.P14) + (f02 * pk.P24) + (f06 * pk.P46);
        double a14 = pk.P14 + (f12 * pk.P24) + (f16 * pk.P46);
        double a24 = pk.P24;
        double a34 = pk.P34;
        double a44 = pk.P44;
        double a54 = pk.P45;
        double a64 = pk.P46;
        double a05 = pk.P05 + (f01 * pk.P15) + (f02 * pk.P25) + (f06 * pk.P56);
        double a15 = pk.P15 + (f12 * pk.P25) + (f16 * pk.P56);
        double a25 = pk.P25;
        double a35 = pk.P35;
        double a45 = pk.P45;
        double a55 = pk.P55;
        double a65 = pk.P56;
        double a06 = pk.P06 + (f01 * pk.P16) + (f02 * pk.P26) + (f06 * pk.P66);
        double a16 = pk.P16 + (f12 * pk.P26) + (f16 * pk.P66);
        double a26 = pk.P26;
        double a36 = pk.P36;
        double a46 = pk.P46;
        double a56 = pk.P56;
        double a66 = pk.P66;
        // Cholesky factor of the predicted covariance, pivots floored so a nearly singular one still factors.
        double d0 = pp.P00;
        double l00 = Math.Sqrt(Math.Max(d0, Math.Max(1e-12 * pp.P00, 1e-300)));
        double l10 = (pp.P01) / l00;
        double l20 = (pp.P02) / l00;
        double l30 = (pp.P03) / l00;
        double l40 = (pp.P04) / l00;
        double l50 = (pp.P05) / l00;
        double l60 = (pp.P06) / l00;
        double d1 = pp.P11 - (l10 * l10);
        double l11 = Math.Sqrt(Math.Max(d1, Math.Max(1e-12 * pp.P11, 1e-300)));
        double l21 = (pp.P12 - (l20 * l10)) / l11;
        double l31 = (pp.P13 - (l30 * l10)) / l11;
        double l41 = (pp.P14 - (l40 * l10)) / l11;
        double l51 = (pp.P15 - (l50 * l10)) / l11;
        double l61 = (pp.P16 - (l60 * l10)) / l11;
        double d2 = pp.P22 - (l20 * l20) - (l21 * l21);
        double l22 = Math.Sqrt(Math.Max(d2, Math.Max(1e-12 * pp.P22, 1e-300)));
        double l32 = (pp.P23 - (l30 * l20) - (l31 * l21)) / l22;
        double l42 = (pp.P24 - (l40 * l20) - (l41 * l21)) / l22;
        double l52 = (pp.P25 - (l50 * l20) - (l51 * l21)) / l22;
        double l62 = (pp.P26 - (l60 * l20) - (l61 * l21)) / l22;
        double d3 = pp.P33 - (l30 * l30) - (l31 * l31) - (l32 * l32);
        double l33 = Math.Sqrt(Math.Max(d3, Math.Max(1e-12 * pp.P33, 1e-300)));
        double l43 = (pp.P34 - (l40 * l30) - (l41 * l31) - (l42 * l32)) / l33;
        double l53 = (pp.P35 - (l50 * l30) - (l51 * l31) - (l52 * l32)) / l33;
        double l63 = (pp.P36 - (l60 * l30) - (l61 * l31) - (l62 * l32)) / l33;
        double d4 = pp.P44 - (l40 * l40) - (l41 * l41) - (l42 * l42) - (l43 * l43);
        double l44 = Math.Sqrt(Math.Max(d4, Math.Max(1e-12 * pp.P44, 1e-300)));
        double l54 = (pp.P45 - (l50 * l40) - (l51 * l41) - (l52 * l42) - (l53 * l43)) / l44;
        double l64 = (pp.P46 - (l60 * l40) - (l61 * l41) - (l62 * l42) - (l63 * l43)) / l44;
        double d5 = pp.P55 - (l50 * l50) - (l51 * l51) - (l52 * l52) - (l53 * l53) - (l54 * l54);
        double l55 = Math.Sqrt(Math.Max(d5, Math.Max(1e-12 * pp.P55, 1e-300)));
        double l65 = (pp.P56 - (l60 * l50) - (l61 * l51) - (l62 * l52) - (l63 * l53) - (l64 * l54)) / l55;
        double d6 = pp.P66 - (l60 * l60) - (l61 * l61) - (l62 * l62) - (l63 * l63) - (l64 * l64) - (l65 * l65);
        double l66 = Math.Sqrt(Math.Max(d6, Math.Max(1e-12 * pp.P66, 1e-300)));
        double m00 = 1 / l00;
        double m11 = 1 / l11;
        double m22 = 1 / l22;
        double m33 = 1 / l33;
        double m44 = 1 / l44;
        double m55 = 1 / l55;
        double m66 = 1 / l66;
        double m10 = -((l10 * m00)) / l11;
        double m21 = -((l21 * m11)) / l22;
        double m20 = -((l20 * m00) + (l21 * m10)) / l22;
        double m32 = -((l32 * m22)) / l33;
        double m31 = -((l31 * m11) + (l32 * m21)) / l33;
        double m30 = -((l30 * m00) + (l31 * m10) + (l32 * m20)) / l33;
        double m43 = -((l43 * m33)) / l44;
        double m42 = -((l42 * m22) + (l43 * m32)) / l44;
        double m41 = -((l41 * m11) + (l42 * m21) + (l43 * m31)) / l44;
        double m40 = -((l40 * m00) + (l41 * m10) + (l42 * m20) + (l43 * m30)) / l44;
        double m54 = -((l54 * m44)) / l55;
        double m53 = -((l53 * m33) + (l54 * m43)) / l55;
        double m52 = -((l52 * m22) + (l53 * m32) + (l54 * m42)) / l55;
        double m51 = -((l51 * m11) + (l52 * m21) + (l53 * m31) + (l54 * m41)) / l55;
        double m50 = -((l50 * m00) + (l51 * m10) + (l52 * m20) + (l53 * m30) + (l54 * m40)) / l55;
        double m65 = -((l65 * m55)) / l66;
        double m64 = -((l64 * m44) + (l65 * m54)) / l66;
        double m63 = -((l63 * m33) + (l64 * m43) + (l65 * m53)) / l66;
        double m62 = -((l62 * m22) + (l63 * m32) + (l64 * m42) + (l65 * m52)) / l66;
        double m61 = -((l61 * m11) + (l62 * m21) + (l63 * m31) + (l64 * m41) + (l65 * m51)) / l66;
        double m60 = -((l60 * m00) + (l61 * m10) + (l62 * m20) + (l63 * m30) + (l64 * m40) + (l65 * m50)) / l66;
        double q00 = (m00 * m00) + (m10 * m10) + (m20 * m20) + (m30 * m30) + (m40 * m40) + (m50 * m50) + (m60 * m60);
        double q01 = (m10 * m11) + (m20 * m21) + (m30 * m31) + (m40 * m41) + (m50 * m51) + (m60 * m61);
        double q02 = (m20 * m22) + (m30 * m32) + (m40 * m42) + (m50 * m52) + (m60 * m62);
        double q03 = (m30 * m33) + (m40 * m43) + (m50 * m53) + (m60 * m63);
        double q04 = (m40 * m44) + (m50 * m54) + (m60 * m64);
        double q05 = (m50 * m55) + (m60 * m65);
        double q06 = (m60 * m66);
        double q11 = (m11 * m11) + (m21 * m21) + (m31 * m31) + (m41 * m41) + (m51 * m51) + (m61 * m61);
        double q12 = (m21 * m22) + (m31 * m32) + (m41 * m42) + (m51 * m52) + (m61 * m62);
        double q13 = (m31 * m33) + (m41 * m43) + (m51 * m53) + (m61 * m63);
        double q14 = (m41 * m44) + (m51 * m54) + (m61 * m64);
        double q15 = (m51 * m55) + (m61 * m65);
        double q16 = (m61 * m66);
        double q22 = (m22 * m22) + (m32 * m32) + (m42 * m42) + (m52 * m52) + (m62 * m62);
        double q23 = (m32 * m33) + (m42 * m43) + (m52 * m53) + (m62 * m63);
        double q24 = (m42 * m44) + (m52 * m54) + (m62 * m64);
        double q25 = (m52 * m55) + (m62 * m65);
        double q26 = (m62 * m66);
        double q33 = (m33 * m33) + (m43 * m43) + (m53 * m53) + (m63 * m63);
        double q34 = (m43 * m44) + (m53 * m54) + (m63 * m64);
        double q35 = (m53 * m55) + (m63 * m65);
        double q36 = (m63 * m66);
        double q44 = (m44 * m44) + (m54 * m54) + (m64 * m64);
        double q45 = (m54 * m55) + (m64 * m65);
        double q46 = (m64 * m66);
        double q55 = (m55 * m55) + (m65 * m65);
        double q56 = (m65 * m66);
        double q66 = (m66 * m66);
        double c00 = (a00 * q00) + (a10 * q01) + (a20 * q02) + (a30 * q03) + (a40 * q04) + (a50 * q05) + (a60 * q06);
        double c01 = (a00 * q01) + (a10 * q11) + (a20 * q12) + (a30 * q13) + (a40 * q14) + (a50 * q15) + (a60 * q16);
        double c02 = (a00 * q02) + (a10 * q12) + (a20 * q22) + (a30 * q23) + (a40 * q24) + (a50 * q25) + (a60 * q26);
        double c03 = (a00 * q03) + (a10 * q13) + (a20 * q23) + (a30 * q33) + (a40 * q34) + (a50 * q35) + (a60 * q36);
        double c04 = (a00 * q04) + (a10 * q14) + (a20 * q24) + (a30 * q34) + (a40 * q44) + (a50 * q45) + (a60 * q46);
        double c05 = (a00 * q05) + (a10 * q15) + (a20 * q25) + (a30 * q35) + (a40 * q45) + (a50 * q55) + (a60 * q56);
        double c06 = (a00 * q06) + (a10 * q16) + (a20 * q26) + (a30 * q36) + (a40 * q46) + (a50 * q56) + (a60 * q66);
        double c10 = (a01 * q00) + (a11 * q01) + (a21 * q02) + (a31 * q03) + (a41 * q04) + (a51 * q05) + (a61 * q06);
        double c11 = (a01 * q01) + (a11 * q11) + (a21 * q12) + (a31 * q13) + (a41 * q14) + (a51 * q15) + (a61 * q16);
        double c12 = (a01 * q02) + (a11 * q12) + (a21 * q22) + (a31 * q23) + (a41 * q24) + (a51 * q25) + (a61 * q26);
        double c13 = (a01 * q03) + (a11 * q13) + (a21 * q23) + (a31 * q33) + (a41 * q34) + (a51 * q35) + (a61 * q36);
        double c14 = (a01 * q04) + (a11 * q14) + (a21 * q24) + (a31 * q34) + (a41 * q44) + (a51 * q45) + (a61 * q46);
        double c15 = (a01 * q05) + (a11 * q15) + (a21 * q25) + (a31 * q35) + (a41 * q45) + (a51 * q55) + (a61 * q56);
        double c16 = (a01 * q06) + (a11 * q16) + (a21 * q26) + (a31 * q36) + (a41 * q46) + (a51 * q56) + (a61 * q66);
        double c20 = (a02 * q00) + (a12 * q01) + (a22 * q02) + (a32 * q03) + (a42 * q04) + (a52 * q05) + (a62 * q06);
        double c21 = (a02 * q01) + (a12 * q11) + (a22 * q12) + (a32 * q13) + (a42 * q14) + (a52 * q15) + (a62 * q16);
        double c22 = (a02 * q02) + (a12 * q12) + (a22 * q22) + (a32 * q23) + (a42 * q24) + (a52 * q25) + (a62 * q26);
        double c23 = (a02 * q03) + (a12 * q13) + (a22 * q23) + (a32 * q33) + (a42 * q34) + (a52 * q35) + (a62 * q36);
        double c24 = (a02 * q04) + (a12 * q14) + (a22 * q24) + (a32 * q34) + (a42 * q44) + (a52 * q45) + (a62 * q46);
        double c25 = (a02 * q05) + (a12 * q15) + (a22 * q25) + (a32 * q35) + (a42 * q45) + (a52 * q55) + (a62 * q56);
        double c26 = (a02 * q06) + (a12 * q16) + (a22 * q26) + (a32 * q36) + (a42 * q46) + (a52 * q56) + (a62 * q66);
        double c30 = (a03 * q00) + (a13 * q01) + (a23 * q02) + (a33 * q03) + (a43 * q04) + (a53 * q05) + (a63 * q06);
        double c31 = (a03 * q01) + (a13 * q11) + (a23 * q12) + (a33 * q13) + (a43 * q14) + (a53 * q15) + (a63 * q16);
        double c32 = (a03 * q02) + (a13 * q12) + (a23 * q22) + (a33 * q23) + (a43 * q24) + (a53 * q25) + (a63 * q26);
        double c33 = (a03 * q03) + (a13 * q13) + (a23 * q23) + (a33 * q33) + (a43 * q34) + (a53 * q35) + (a63 * q36);
        double c34 = (a03 * q04) + (a13 * q14) + (a23 * q24) + (a33 * q34) + (a43 * q44) + (a53 * q45) + (a63 * q46);
        double c35 = (a03 * q05) + (a13 * q15) + (a23 * q25) + (a33 * q35) + (a43 * q45) + (a53 * q55) + (a63 * q56);
        double c36 = (a03 * q06) + (a13 * q16) + (a23 * q26) + (a33 * q36) + (a43 * q46) + (a53 * q56) + (a63 * q66);
        double c40 = (a04 * q00) + (a14 * q01) + (a24 * q02) + (a34 * q03) + (a44 * q04) + (a54 * q05) + (a64 * q06);
        double c41 = (a04 * q01) + (a14 * q11) + (a24 * q12) + (a34 * q13) + (a44 * q14) + (a54 * q15) + (a64 * q16);
        double c42 = (a04 * q02) + (a14 * q12) + (a24 * q22) + (a34 * q23) + (a44 * q24) + (a54 * q25) + (a64 * q26);
        double c43 = (a04 * q03) + (a14 * q13) + (a24 * q23) + (a34 * q33) + (a44 * q34) + (a54 * q35) + (a64 * q36);
        double c44 = (a04 * q04) + (a14 * q14) + (a24 * q24) + (a34 * q34) + (a44 * q44) + (a54 * q45) + (a64 * q46);
        double c45 = (a04 * q05) + (a14 * q15) + (a24 * q25) + (a34 * q35) + (a44 * q45) + (a54 * q55) + (a64 * q56);
        double c46 = (a04 * q06) + (a14 * q16) + (a24 * q26) + (a34 * q36) + (a44 * q46) + (a54 * q56) + (a64 * q66);
        double c50 = (a05 * q00) + (a15 * q01) + (a25 * q02) + (a35 * q03) + (a45 * q04) + (a55 * q05) + (a65 * q06);
        double c51 = (a05 * q01) + (a15 * q11) + (a25 * q12) + (a35 * q13) + (a45 * q14) + (a55 * q15) + (a65 * q16);
        double c52 = (a05 * q02) + (a15 * q12) + (a25 * q22) + (a35 * q23) + (a45 * q24) + (a55 * q25) + (a65 * q26);
        double c53 = (a05 * q03) + (a15 * q13) + (a25 * q23) + (a35 * q33) + (a45 * q34) + (a55 * q35) + (a65 * q36);
        double c54 = (a05 * q04) + (a15 * q14) + (a25 * q24) + (a35 * q34) + (a45 * q44) + (a55 * q45) + (a65 * q46);
        double c55 = (a05 * q05) + (a15 * q15) + (a25 * q25) + (a35 * q35) + (a45 * q45) + (a55 * q55) + (a65 * q56);
        double c56 = (a05 * q06) + (a15 * q16) + (a25 * q26) + (a35 * q36) + (a45 * q46) + (a55 * q56) + (a65 * q66);
        double c60 = (a06 * q00) + (a16 * q01) + (a26 * q02) + (a36 * q03) + (a46 * q04) + (a56 * q05) + (a66 * q06);
        double c61 = (a06 * q01) + (a16 * q11) + (a26 * q12) + (a36 * q13) + (a46 * q14) + (a56 * q15) + (a66 * q16);
        double c62 = (a06 * q02) + (a16 * q12) + (a26 * q22) + (a36 * q23) + (a46 * q24) + (a56 * q25) + (a66 * q26);
        double c63 = (a06 * q03) + (a16 * q13) + (a26 * q23) + (a36 * q33) + (a46 * q34) + (a56 * q35) + (a66 * q36);
        double c64 = (a06 * q04) + (a16 * q14) + (a26 * q24) + (a36 * q34) + (a46 * q44) + (a56 * q45) + (a66 * q46);
        double c65 = (a06 * q05) + (a16 * q15) + (a26 * q25) + (a36 * q35) + (a46 * q45) + (a56 * q55) + (a66 * q56);
        double c66 = (a06 * q06) + (a16 * q16) + (a26 * q26) + (a36 * q36) + (a46 * q46) + (a56 * q56) + (a66 * q66);
        double e0 = xs.D - xp.D;
        double e1 = xs.V - xp.V;
        double e2 = xs.T - xp.T;
        double e3 = xs.F - xp.F;
        double e4 = xs.K - xp.K;
        double e5 = xs.B - xp.B;
        double e6 = xs.E - xp.E;
        xs.D = xk.D + (c00 * e0) + (c01 * e1) + (c02 * e2) + (c03 * e3) + (c04 * e4) + (c05 * e5) + (c06 * e6);
        xs.V = xk.V + (c10 * e0) + (c11 * e1) + (c12 * e2) + (c13 * e3) + (c14 * e4) + (c15 * e5) + (c16 * e6);
        xs.T = xk.T + (c20 * e0) + (c21 * e1) + (c22 * e2) + (c23 * e3) + (c24 * e4) + (c25 * e5) + (c26 * e6);
        xs.F = xk.F + (c30 * e0) + (c31 * e1) + (c32 * e2) + (c33 * e3) + (c34 * e4) + (c35 * e5) + (c36 * e6);
        xs.K = xk.K + (c40 * e0) + (c41 * e1) + (c42 * e2) + (c43 * e3) + (c44 * e4) + (c45 * e5) + (c46 * e6);
        xs.B = xk.B + (c50 * e0) + (c51 * e1) + (c52 * e2) + (c53 * e3) + (c54 * e4) + (c55 * e5) + (c56 * e6);
        xs.E = xk.E + (c60 * e0) + (c61 * e1) + (c62 * e2) + (c63 * e3) + (c64 * e4) + (c65 * e5) + (c66 * e6);
        double g00 = ps.P00 - pp.P00;
        double g01 = ps.P01 - pp.P01;
        double g02 = ps.P02 - pp.P02;
        double g03 = ps.P03 - pp.P03;
        double g04 = ps.P04 - pp.P04;
        double g05 = ps.P05 - pp.P05;
        double g06 = ps.P06 - pp.P06;
        double g11 = ps.P11 - pp.P11;
        double g12 = ps.P12 - pp.P12;
        double g13 = ps.P13 - pp.P13;
        double g14 = ps.P14 - pp.P14;
        double g15 = ps.P15 - pp.P15;
        double g16 = ps.P16 - pp.P16;
        double g22 = ps.P22 - pp.P22;
        double g23 = ps.P23 - pp.P23;
        double g24 = ps.P24 - pp.P24;
        double g25 = ps.P25 - pp.P25;
        double g26 = ps.P26 - pp.P26;
        double g33 = ps.P33 - pp.P33;
        double g34 = ps.P34 - pp.P34;
        double g35 = ps.P35 - pp.P35;
        double g36 = ps.P36 - pp.P36;
        double g44 = ps.P44 - pp.P44;
        double g45 = ps.P45 - pp.P45;
        double g46 = ps.P46 - pp.P46;
        double g55 = ps.P55 - pp.P55;
        double g56 = ps.P56 - pp.P56;
        double g66 = ps.P66 - pp.P66;
        double t00 = (c00 * g00) + (c01 * g01) + (c02 * g02) + (c03 * g03) + (c04 * g04) + (c05 * g05) + (c06 * g06);
        double t01 = (c00 * g01) + (c01 * g11) + (c02 * g12) + (c03 * g13) + (c04 * g14) + (c05 * g15) + (c06 * g16);
        double t02 = (c00 * g02) + (c01 * g12) + (c02 * g22) + (c03 * g23) + (c04 * g24) + (c05 * g25) + (c06 * g26);
        double t03 = (c00 * g03) + (c01 * g13) + (c02 * g23) + (c03 * g33) + (c04 * g34) + (c05 * g35) + (c06 * g36);
        double t04 = (c00 * g04) + (c01 * g14) + (c02 * g24) + (c03 * g34) + (c04 * g44) + (c05 * g45) + (c06 * g46);
        double t05 = (c00 * g05) + (c01 * g15) + (c02 * g25) + (c03 * g35) + (c04 * g45) + (c05 * g55) + (c06 * g56);
        double t06 = (c00 * g06) + (c01 * g16) + (c02 * g26) + (c03 * g36) + (c04 * g46) + (c05 * g56) + (c06 * g66);
        double t10 = (c10 * g00) + (c11 * g01) + (c12 * g02) + (c13 * g03) + (c14 * g04) + (c15 * g05) + (c16 * g06);
        double t11 = (c10 * g01) + (c11 * g11) + (c12 * g12) + (c13 * g13) + (c14 * g14) + (c15 * g15) + (c16 * g16);
        double t12 = (c10 * g02) + (c11 * g12) + (c12 * g22) + (c13 * g23) + (c14 * g24) + (c15 * g25) + (c16 * g26);
        double t13 = (c10 * g03) + (c11 * g13) + (c12 * g23) + (c13 * g33) + (c14 * g34) + (c15 * g35) + (c16 * g36);
        double t14 = (c10 * g04) + (c11 * g14) + (c12 * g24) + (c13 * g34) + (c14 * g44) + (c15 * g45) + (c16 * g46);
        double t15 = (c10 * g05) + (c11 * g15) + (c12 * g25) + (c13 * g35) + (c14 * g45) + (c15 * g55) + (c16 * g56);
        double t16 = (c10 * g06) + (c11 * g16) + (c12 * g26) + (c13 * g36) + (c14 * g46) + (c15 * g56) + (c16 * g66);
        double t20 = (c20 * g00) + (c21 * g01) + (c22 * g02) + (c23 * g03) + (c24 * g04) + (c25 * g05) + (c26 * g06);
        double t21 = (c20 * g01) + (c21 * g11) + (c22 * g12) + (c23 * g13) + (c24 * g14) + (c25 * g15) + (c26 * g16);
        double t22 = (c20 * g02) + (c21 * g12) + (c22 * g22) + (c23 * g23) + (c24 * g24) + (c25 * g25) + (c26 * g26);
        double t23 = (c20 * g03) + (c21 * g13) + (c22 * g23) + (c23 * g33) + (c24 * g34) + (c25 * g35) + (c26 * g36);
        double t24 = (c20 * g04) + (c21 * g14) + (c22 * g24) + (c23 * g34) + (c24 * g44) + (c25 * g45) + (c26 * g46);
        double t25 = (c20 * g05) + (c21 * g15) + (c22 * g25) + (c23 * g35) + (c24 * g45) + (c25 * g55) + (c26 * g56);
        double t26 = (c20 * g06) + (c21 * g16) + (c22 * g26) + (c23 * g36) + (c24 * g46) + (c25 * g56) + (c26 * g66);
        double t30 = (c30 * g00) + (c31 * g01) + (c32 * g02) + (c33 * g03) + (c34 * g04) + (c35 * g05) + (c36 * g06);
        double t31 = (c30 * g01) + (c31 * g11) + (c32 * g12) + (c33 * g13) + (c34 * g14) + (c35 * g15) + (c36 * g16);
        double t32 = (c30 * g02) + (c31 * g12) + (c32 * g22) + (c33 * g23) + (c34 * g24) + (c35 * g25) + (c36 * g26);
        double t33 = (c30 * g03) + (c31 * g13) + (c32 * g23) + (c33 * g33) + (c34 * g34) + (c35 * g35) + (c36 * g36);
        double t34 = (c30 * g04) + (c31 * g14) + (c32 * g24) + (c33 * g34) + (c34 * g44) + (c35 * g45) + (c36 * g46);
        double t35 = (c30 * g05) + (c31 * g15) + (c32 * g25) + (c33 * g35) + (c34 * g45) + (c35 * g55) + (c36 * g56);
        double t36 = (c30 * g06) + (c31 * g16) + (c32 * g26) + (c33 * g36) + (c34 * g46) + (c35 * g56) + (c36 * g66);
        double t40 = (c40 * g00) + (c41 * g01) + (c42 * g02) + (c43 * g03) + (c44 * g04) + (c45 * g05) + (c46 * g06);
        double t41 = (c40 * g01) + (c41 * g11) + (c42 * g12) + (c43 * g13) + (c44 * g14) + (c45 * g15) + (c46 * g16);
        double t42 = (c40 * g02) + (c41 * g12) + (c42 * g22) + (c43 * g23) + (c44 * g24) + (c45 * g25) + (c46 * g26);
        double t43 = (c40 * g03) + (c41 * g13) + (c42 * g23) + (c43 * g33) + (c44 * g34) + (c45 * g35) + (c46 * g36);
        double t44 = (c40 * g04) + (c41 * g14) + (c42 * g24) + (c43 * g34) + (c44 * g44) + (c45 * g45) + (c46 * g46);
        double t45 = (c40 * g05) + (c41 * g15) + (c42 * g25) + (c43 * g35) + (c44 * g45) + (c45 * g55) + (c46 * g56);
        double t46 = (c40 * g06) + (c41 * g16) + (c42 * g26) + (c43 * g36) + (c44 * g46) + (c45 * g56) + (c46 * g66);
        double t50 = (c50 * g00) + (c51 * g01) + (c52 * g02) + (c53 * g03) + (c54 * g04) + (c55 * g05) + (c56 * g06);
        double t51 = (c50 * g01) + (c51 * g11) + (c52 * g12) + (c53 * g13) + (c54 * g14) + (c55 * g15) + (c56 * g16);
        double t52 = (c50 * g02) + (c51 * g12) + (c52 * g22) + (c53 * g23) + (c54 * g24) + (c55 * g25) + (c56 * g26);
        double t53 = (c50 * g03) + (c51 * g13) + (c52 * g23) + (c53 * g33) + (c54 * g34) + (c55 * g35) + (c56 * g36);
        double t54 = (c50 * g04) + (c51 * g14) + (c52 * g24) + (c53 * g34) + (c54 * g44) + (c55 * g45) + (c56 * g46);
        double t55 = (c50 * g05) + (c51 * g15) + (c52 * g25) + (c53 * g35) + (c54 * g45) + (c55 * g55) + (c56 * g56);
        double t56 = (c50 * g06) + (c51 * g16) + (c52 * g26) + (c53 * g36) + (c54 * g46) + (c55 * g56) + (c56 * g66);
        double t60 = (c60 * g00) + (c61 * g01) + (c62 * g02) + (c63 * g03) + (c64 * g04) + (c65 * g05) + (c66 * g06);
        double t61 = (c60 * g01) + (c61 * g11) + (c62 * g12) + (c63 * g13) + (c64 * g14) + (c65 * g15) + (c66 * g16);
        double t62 = (c60 * g02) + (c61 * g12) + (c62 * g22) + (c63 * g23) + (c64 * g24) + (c65 * g25) + (c66 * g26);
        double t63 = (c60 * g03) + (c61 * g13) + (c62 * g23) + (c63 * g33) + (c64 * g34) + (c65 * g35) + (c66 * g36);
        double t64 = (c60 * g04) + (c61 * g14) + (c62 * g24) + (c63 * g34) + (c64 * g44) + (c65 * g45) + (c66 * g46);
        double t65 = (c60 * g05) + (c61 * g15) + (c62 * g25) + (c63 * g35) + (c64 * g45) + (c65 * g55) + (c66 * g56);
        double t66 = (c60 * g06) + (c61 * g16) + (c62 * g26) + (c63 * g36) + (c64 * g46) + (c65 * g56) + (c66 * g66);
        ps.P00 = pk.P00 + (t00 * c00) + (t01 * c01) + (t02 * c02) + (t03 * c03) + (t04 * c04) + (t05 * c05) + (t06 * c06);
        ps.P01 = pk.P01 + (t00 * c10) + (t01 * c11) + (t02 * c12) + (t03 * c13) + (t04 * c14) + (t05 * c15) + (t06 * c16);
        ps.P02 = pk.P02 + (t00 * c20) + (t01 * c21) + (t02 * c22) + (t03 * c23) + (t04 * c24) + (t05 * c25) + (t06 * c26);
        ps.P03 = pk.P03 + (t00 * c30) + (t01 * c31) + (t02 * c32) + (t03 * c33) + (t04 * c34) + (t05 * c35) + (t06 * c36);
        ps.P04 = pk.P04 + (t00 * c40) + (t01 * c41) + (t02 * c42) + (t03 * c43) + (t04 * c44) + (t05 * c45) + (t06 * c46);
        ps.P05 = pk.P05 + (t00 * c50) + (t01 * c51) + (t02 * c52) + (t03 * c53) + (t04 * c54) + (t05 * c55) + (t06 * c56);
        ps.P06 = pk.P06 + (t00 * c60) + (t01 * c61) + (t02 * c62) + (t03 * c63) + (t04 * c64) + (t05 * c65) + (t06 * c66);
        ps.P11 = pk.P11 + (t10 * c10) + (t11 * c11) + (t12 * c12) + (t13 * c13) + (t14 * c14) + (t15 * c15) + (t16 * c16);
        ps.P12 = pk.P12 + (t10 * c20) + (t11 * c21) + (t12 * c22) + (t13 * c23) + (t14 * c24) + (t15 * c25) + (t16 * c26);
        ps.P13 = pk.P13 + (t10 * c30) + (t11 * c31) + (t12 * c32) + (t13 * c33) + (t14 * c34) + (t15 * c35) + (t16 * c36);
        ps.P14 = pk.P14 + (t10 * c40) + (t11 * c41) + (t12 * c42) + (t13 * c43) + (t14 * c44) + (t15 * c45) + (t16 * c46);
        ps.P15 = pk.P15 + (t10 * c50) + (t11 * c51) + (t12 * c52) + (t13 * c53) + (t14 * c54) + (t15 * c55) + (t16 * c56);
        ps.P16 = pk.P16 + (t10 * c60) + (t11 * c61) + (t12 * c62) + (t13 * c63) + (t14 * c64) + (t15 * c65) + (t16 * c66);
        ps.P22 = pk.P22 + (t20 * c20) + (t21 * c21) + (t22 * c22) + (t23 * c23) + (t24 * c24) + (t25 * c25) + (t26 * c26);
        ps.P23 = pk.P23 + (t20 * c30) + (t21 * c31) + (t22 * c32) + (t23 * c33) + (t24 * c34) + (t25 * c35) + (t26 * c36);
        ps.P24 = pk.P24 + (t20 * c40) + (t21 * c41) + (t22 * c42) + (t23 * c43) + (t24 * c44) + (t25 * c45) + (t26 * c46);
        ps.P25 = pk.P25 + (t20 * c50) + (t21 * c51) + (t22 * c52) + (t23 * c53) + (t24 * c54) + (t25 * c55) + (t26 * c56);
        ps.P26 = pk.P26 + (t20 * c60) + (t21 * c61) + (t22 * c62) + (t23 * c63) + (t24 * c64) + (t25 * c65) + (t26 * c66);
        ps.P33 = pk.P33 + (t30 * c30) + (t31 * c31) + (t32 * c32) + (t33 * c33) + (t34 * c34) + (t35 * c35) + (t36 * c36);
        ps.P34 = pk.P34 + (t30 * c40) + (t31 * c41) + (t32 * c42) + (t33 * c43) + (t34 * c44) + (t35 * c45) + (t36 * c46);
        ps.P35 = pk.P35 + (t30 * c50) + (t31 * c51) + (t32 * c52) + (t33 * c53) + (t34 * c54) + (t35 * c55) + (t36 * c56);
        ps.P36 = pk.P36 + (t30 * c60) + (t31 * c61) + (t32 * c62) + (t33 * c63) + (t34 * c64) + (t35 * c65) + (t36 * c66);
        ps.P44 = pk.P44 + (t40 * c40) + (t41 * c41) + (t42 * c42) + (t43 * c43) + (t44 * c44) + (t45 * c45) + (t46 * c46);
        ps.P45 = pk.P45 + (t40 * c50) + (t41 * c51) + (t42 * c52) + (t43 * c53) + (t44 * c54) + (t45 * c55) + (t46 * c56);
        ps.P46 = pk.P46 + (t40 * c60) + (t41 * c61) + (t42 * c62) + (t43 * c63) + (t44 * c64) + (t45 * c65) + (t46 * c66);
        ps.P55 = pk.P55 + (t50 * c50) + (t51 * c51) + (t52 * c52) + (t53 * c53) + (t54 * c54) + (t55 * c55) + (t56 * c56);
        ps.P56 = pk.P56 + (t50 * c60) + (t51 * c61) + (t52 * c62) + (t53 * c63) + (t54 * c64) + (t55 * c65) + (t56 * c66);
        ps.P66 = pk.P66 + (t60 * c60) + (t61 * c61) + (t62 * c62) + (t63 * c63) + (t64 * c64) + (t65 * c65) + (t66 * c66);
    }

    /// <summary>Scalar measurement z = h·x + noise of variance r. Returns false in <paramref name="used"/>
    /// when the innovation was over 10 σ (the measurement was down-weighted to count as 5 σ).</summary>
    private static void Update(ref Vec x, ref Sym p, double h0, double h1, double h2, double h3, double h4, double h5, double h6, double z, double r, bool gate, out bool used, ref double logLikelihood)
    {
        double ph0 = (p.P00 * h0) + (p.P01 * h1) + (p.P02 * h2) + (p.P03 * h3) + (p.P04 * h4) + (p.P05 * h5) + (p.P06 * h6);
        double ph1 = (p.P01 * h0) + (p.P11 * h1) + (p.P12 * h2) + (p.P13 * h3) + (p.P14 * h4) + (p.P15 * h5) + (p.P16 * h6);
        double ph2 = (p.P02 * h0) + (p.P12 * h1) + (p.P22 * h2) + (p.P23 * h3) + (p.P24 * h4) + (p.P25 * h5) + (p.P26 * h6);
        double ph3 = (p.P03 * h0) + (p.P13 * h1) + (p.P23 * h2) + (p.P33 * h3) + (p.P34 * h4) + (p.P35 * h5) + (p.P36 * h6);
        double ph4 = (p.P04 * h0) + (p.P14 * h1) + (p.P24 * h2) + (p.P34 * h3) + (p.P44 * h4) + (p.P45 * h5) + (p.P46 * h6);
        double ph5 = (p.P05 * h0) + (p.P15 * h1) + (p.P25 * h2) + (p.P35 * h3) + (p.P45 * h4) + (p.P55 * h5) + (p.P56 * h6);
        double ph6 = (p.P06 * h0) + (p.P16 * h1) + (p.P26 * h2) + (p.P36 * h3) + (p.P46 * h4) + (p.P56 * h5) + (p.P66 * h6);
        double innovation = z - ((h0 * x.D) + (h1 * x.V) + (h2 * x.T) + (h3 * x.F) + (h4 * x.K) + (h5 * x.B) + (h6 * x.E));
        double variance = r + (h0 * ph0) + (h1 * ph1) + (h2 * ph2) + (h3 * ph3) + (h4 * ph4) + (h5 * ph5) + (h6 * ph6);
        double nis = innovation * innovation / variance;

        // A far-out observation counts as a 5-σ one: it still pulls, so a filter that has drifted
        // comes back instead of refusing everything after; beyond 10 σ it is reported.
        used = !(gate && nis > 100);
        double sv = gate && nis > 25 ? variance * nis / 25 : variance;
        logLikelihood -= 0.5 * ((innovation * innovation / sv) + Math.Log(sv));
        double k = innovation / sv;
        x.D += ph0 * k;
        x.V += ph1 * k;
        x.T += ph2 * k;
        x.F += ph3 * k;
        x.K += ph4 * k;
        x.B += ph5 * k;
        x.E += ph6 * k;
        p.P00 -= ph0 * ph0 / sv;
        p.P01 -= ph0 * ph1 / sv;
        p.P02 -= ph0 * ph2 / sv;
        p.P03 -= ph0 * ph3 / sv;
        p.P04 -= ph0 * ph4 / sv;
        p.P05 -= ph0 * ph5 / sv;
        p.P06 -= ph0 * ph6 / sv;
        p.P11 -= ph1 * ph1 / sv;
        p.P12 -= ph1 * ph2 / sv;
        p.P13 -= ph1 * ph3 / sv;
        p.P14 -= ph1 * ph4 / sv;
        p.P15 -= ph1 * ph5 / sv;
        p.P16 -= ph1 * ph6 / sv;
        p.P22 -= ph2 * ph2 / sv;
        p.P23 -= ph2 * ph3 / sv;
        p.P24 -= ph2 * ph4 / sv;
        p.P25 -= ph2 * ph5 / sv;
        p.P26 -= ph2 * ph6 / sv;
        p.P33 -= ph3 * ph3 / sv;
        p.P34 -= ph3 * ph4 / sv;
        p.P35 -= ph3 * ph5 / sv;
        p.P36 -= ph3 * ph6 / sv;
        p.P44 -= ph4 * ph4 / sv;
        p.P45 -= ph4 * ph5 / sv;
        p.P46 -= ph4 * ph6 / sv;
        p.P55 -= ph5 * ph5 / sv;
        p.P56 -= ph5 * ph6 / sv;
        p.P66 -= ph6 * ph6 / sv;
    }

    /// <summary>P ← F·P·Fᵀ for F = I + f01·e₀e₁ᵀ + f02·e₀e₂ᵀ + f12·e₁e₂ᵀ + f06·e₀e₆ᵀ + f16·e₁e₆ᵀ.</summary>
    private static void Propagate(ref Sym p, double f01, double f02, double f12, double f06, double f16)
    {
        double a00 = p.P00 + (f01 * p.P01) + (f02 * p.P02) + (f06 * p.P06);
        double a10 = p.P01 + (f12 * p.P02) + (f16 * p.P06);
        double a20 = p.P02;
        double a30 = p.P03;
        double a40 = p.P04;
        double a50 = p.P05;
        double a60 = p.P06;
        double a01 = p.P01 + (f01 * p.P11) + (f02 * p.P12) + (f06 * p.P16);
        double a11 = p.P11 + (f12 * p.P12) + (f16 * p.P16);
        double a21 = p.P12;
        double a31 = p.P13;
        double a41 = p.P14;
        double a51 = p.P15;
        double a61 = p.P16;
        double a02 = p.P02 + (f01 * p.P12) + (f02 * p.P22) + (f06 * p.P26);
        double a12 = p.P12 + (f12 * p.P22) + (f16 * p.P26);
        double a22 = p.P22;
        double a32 = p.P23;
        double a42 = p.P24;
        double a52 = p.P25;
        double a62 = p.P26;
        double a03 = p.P03 + (f01 * p.P13) + (f02 * p.P23) + (f06 * p.P36);
        double a13 = p.P13 + (f12 * p.P23) + (f16 * p.P36);
        double a23 = p.P23;
        double a33 = p.P33;
        double a43 = p.P34;
        double a53 = p.P35;
        double a63 = p.P36;
        double a04 = p.P04 + (f01 * p.P14) + (f02 * p.P24) + (f06 * p.P46);
        double a14 = p.P14 + (f12 * p.P24) + (f16 * p.P46);
        double a24 = p.P24;
        double a34 = p.P34;
        double a44 = p.P44;
        double a54 = p.P45;
        double a64 = p.P46;
        double a05 = p.P05 + (f01 * p.P15) + (f02 * p.P25) + (f06 * p.P56);
        double a15 = p.P15 + (f12 * p.P25) + (f16 * p.P56);
        double a25 = p.P25;
        double a35 = p.P35;
        double a45 = p.P45;
        double a55 = p.P55;
        double a65 = p.P56;
        double a06 = p.P06 + (f01 * p.P16) + (f02 * p.P26) + (f06 * p.P66);
        double a16 = p.P16 + (f12 * p.P26) + (f16 * p.P66);
        double a26 = p.P26;
        double a36 = p.P36;
        double a46 = p.P46;
        double a56 = p.P56;
        double a66 = p.P66;
        p.P00 = a00 + (f01 * a01) + (f02 * a02) + (f06 * a06);
        p.P01 = a01 + (f12 * a02) + (f16 * a06);
        p.P02 = a02;
        p.P03 = a03;
        p.P04 = a04;
        p.P05 = a05;
        p.P06 = a06;
        p.P11 = a11 + (f12 * a12) + (f16 * a16);
        p.P12 = a12;
        p.P13 = a13;
        p.P14 = a14;
        p.P15 = a15;
        p.P16 = a16;
        p.P22 = a22;
        p.P23 = a23;
        p.P24 = a24;
        p.P25 = a25;
        p.P26 = a26;
        p.P33 = a33;
        p.P34 = a34;
        p.P35 = a35;
        p.P36 = a36;
        p.P44 = a44;
        p.P45 = a45;
        p.P46 = a46;
        p.P55 = a55;
        p.P56 = a56;
        p.P66 = a66;
    }

    /// <summary>Everything the forward pass carries from one grid point to the next.</summary>
    private struct FilterState
    {
        /// <summary>The state and covariance predicted for the next grid point.</summary>
        public Vec X;

        public Sym P;

        /// <summary>The filtered state and covariance at the grid point just done.</summary>
        public Vec FilteredX;

        public Sym FilteredP;

        /// <summary>The next pulse observation.</summary>
        public int Ip;

        public int Used;

        public int Outliers;

        public double LogLikelihood;
    }

    /// <summary>The filtered states of the forward pass, as the backward pass asks for them (last
    /// first). A short run keeps them all (280 bytes a grid point); a long one (more than
    /// <see cref="FusionSettings.MaxStoredSteps"/> points: 30 minutes on the 2-ms grid would be 194 MB) keeps the
    /// filter's state every <see cref="CheckpointSteps"/> points and replays one stretch at a
    /// time when the backward pass reaches it — the same arithmetic on the same inputs, so the
    /// same states, for one more forward pass of work and memory of O(√n).</summary>
    private sealed class FilteredStates : IDisposable
    {
        /// <summary>Grid points per replayed stretch.</summary>
        public const int CheckpointSteps = 1024;

        private readonly FusionSettings s;
        private readonly double[] grid;
        private readonly byte[] jump;
        private readonly int k0;
        private readonly int count;
        private readonly bool replay;
        private readonly FilterState[] checkpoints;
        private Vec[] xf;
        private Sym[] pf;
        private int loaded = -1;

        public FilteredStates(FusionSettings s, double[] grid, byte[] jump, int k0, int count)
        {
            this.s = s;
            this.grid = grid;
            this.jump = jump;
            this.k0 = k0;
            this.count = count;
            replay = count > Math.Max(s.MaxStoredSteps, CheckpointSteps);
            int stored = replay ? CheckpointSteps : Math.Max(count, 1);
            checkpoints = replay ? new FilterState[((count - 1) / CheckpointSteps) + 1] : [];
            xf = ScratchArrays.Rent<Vec>(stored);
            pf = ScratchArrays.Rent<Sym>(stored);
        }

        /// <summary>Called with the state before step <paramref name="j"/> (grid point k0 + j).</summary>
        public void BeforeStep(int j, in FilterState state)
        {
            if (replay && j % CheckpointSteps == 0)
            {
                checkpoints[j / CheckpointSteps] = state;
            }
        }

        /// <summary>Called with the state after step <paramref name="j"/>.</summary>
        public void AfterStep(int j, in FilterState state)
        {
            if (!replay)
            {
                xf[j] = state.FilteredX;
                pf[j] = state.FilteredP;
            }
        }

        /// <summary>The filtered state at step <paramref name="j"/>.</summary>
        public void Get(int j, out Vec x, out Sym p)
        {
            if (!replay)
            {
                x = xf[j];
                p = pf[j];
                return;
            }

            int stretch = j / CheckpointSteps;
            if (stretch != loaded)
            {
                FilterState f = checkpoints[stretch];
                int first = stretch * CheckpointSteps;
                int last = Math.Min(first + CheckpointSteps, count);
                for (int i = first; i < last; i++)
                {
                    FilterStep(s, grid, jump, k0, k0 + i, ref f);
                    xf[i - first] = f.FilteredX;
                    pf[i - first] = f.FilteredP;
                }

                loaded = stretch;
            }

            x = xf[j - (stretch * CheckpointSteps)];
            p = pf[j - (stretch * CheckpointSteps)];
        }

        public void Dispose()
        {
            ScratchArrays.Return(xf);
            ScratchArrays.Return(pf);
            xf = [];
            pf = [];
        }
    }

    /// <summary>Distance, speed, third state, phase, slip coefficient, brake slip coefficient,
    /// accelerometer scale error.</summary>
    private struct Vec
    {
        public double D;

        public double V;

        public double T;

        public double F;

        public double K;

        public double B;

        public double E;
    }

    /// <summary>Upper triangle of a symmetric 7×7 matrix.</summary>
    private struct Sym
    {
        public double P00;

        public double P01;

        public double P02;

        public double P03;

        public double P04;

        public double P05;

        public double P11;

        public double P12;

        public double P13;

        public double P14;

        public double P15;

        public double P22;

        public double P23;

        public double P24;

        public double P25;

        public double P33;

        public double P34;

        public double P35;

        public double P44;

        public double P45;

        public double P55;

        public double P06;

        public double P16;

        public double P26;

        public double P36;

        public double P46;

        public double P56;

        public double P66;
    }
}
