using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>What the windows stage reads: the step grid, the pulse channel, the accelerometer's
/// input and how the run opened. Nothing here is changed by the stage.</summary>
internal sealed class WheelWindowInputs
{
    /// <summary>The time grid with the accelerometer input integrated over each step.</summary>
    public required StepGrid Steps { get; init; }

    /// <summary>The distance channel, or null without pulses.</summary>
    public PulseChannel? Pulses { get; init; }

    /// <summary>Distance per pulse of <see cref="Pulses"/>, m.</summary>
    public double MetresPerPulse { get; init; }

    /// <summary>The accelerometer's sample instants, s, or null without an accelerometer.</summary>
    public double[]? AccelTimeS { get; init; }

    /// <summary>The forward input at each of <see cref="AccelTimeS"/>, m/s².</summary>
    public double[] AccelInputMps2 { get; init; } = [];

    /// <summary>True when a rest was seen before the motion.</summary>
    public bool Staged { get; init; }

    /// <summary>First motion (or the record's first observation when it opens moving), s.</summary>
    public double StartS { get; init; }

    /// <summary>The stop, s, or null when the run does not end at rest.</summary>
    public double? StopS { get; init; }

    /// <summary>Where the search for wheelspin ends, s: the stop, or the end of the data.</summary>
    public double EndS { get; init; }

    /// <summary>Speed at <see cref="StartS"/>, m/s: 0 for a standing start.</summary>
    public double StartSpeedMps { get; init; }

    /// <summary>Thresholds and allowances.</summary>
    public required ReconstructionOptions Options { get; init; }
}

/// <summary>Where the wheel does not measure the car, as the windows stage found it.</summary>
internal sealed class WheelWindows
{
    /// <summary>Stretches of braking where the wheel slid (its pulses fell behind the
    /// accelerometer); the pulses there are set aside.</summary>
    public required List<TimeWindow> Slides { get; init; }

    /// <summary>The largest shortfall of the pulses' speed in <see cref="Slides"/>, a fraction of the speed.</summary>
    public double LargestBehindFraction { get; init; }

    /// <summary>Stretches where the pulses are not used for distance: wheelspin, and slides the
    /// wheelspin detector found.</summary>
    public required List<TimeWindow> Spin { get; init; }

    /// <summary>The notes on <see cref="Spin"/> (one for spin, one for slides, when there are
    /// any) and on <see cref="LaunchSpin"/>.</summary>
    public required List<string> SpinWarnings { get; init; }

    /// <summary>Spin at the launch (<see cref="WheelspinDetector.FindAtLaunch"/>): for the
    /// verdict; the pulses there are kept.</summary>
    public required List<TimeWindow> LaunchSpin { get; init; }

    /// <summary>The part of <see cref="Spin"/> the verdict counts: spin past a tyre's grip peak
    /// (<see cref="WheelspinDetector.BeyondPeak"/>) and the slides the wheelspin detector found.</summary>
    public required List<TimeWindow> PastPeak { get; init; }

    /// <summary>The launch's slip swing (<see cref="SlipSwingTest"/>); null where it is not looked for.</summary>
    public SlipSwing? Swing { get; init; }

    /// <summary>Spin at the launch seen in the pulses alone (<see cref="PulseSpinBound"/>), on a
    /// staged run without an accelerometer: for the verdict; the pulses there are kept.</summary>
    public List<TimeWindow> PulseSpin { get; init; } = [];

    /// <summary>The drive slip signal S(t) on the grid, or null when no drive slip is fitted.</summary>
    public double[]? DriveSlipSignal { get; init; }

    /// <summary>The braking slip signal S_b(t) on the grid, or null when no brake slip is fitted.</summary>
    public double[]? BrakeSlipSignal { get; init; }

    /// <summary>Firm braking where the pulses are kept (none that hold a slide); empty when
    /// <see cref="BrakeSlipSignal"/> is null.</summary>
    public required List<TimeWindow> FirmBraking { get; init; }
}

/// <summary>The windows stage: where the wheel does not measure the car — wheelspin, slides
/// under braking, firm braking — and the slip signals the filter fits the wheel's slip to.
/// Pulses are set against the accelerometer here; the windows read from the drive force alone
/// are <see cref="DriveForceWindows"/>.</summary>
internal sealed class WheelWindowFinder
{
    /// <summary>How long before the stop <see cref="SpeedBackFromStop"/> stands in for the pulses'
    /// speed, s: the slowest stop's last few metres (a braking force under 1 m/s² from 3 m/s),
    /// and not so long that the input's bias adds up (0.05 m/s² over 3 s is 0.15 m/s).</summary>
    private const double LongestBackFromStopS = 3;

    private readonly WheelWindowInputs input;
    private readonly StepGrid steps;
    private readonly PulseChannel? pulses;
    private readonly double mpp;
    private readonly ReconstructionOptions options;
    private readonly DriveForceWindows forces;

    private WheelWindowFinder(WheelWindowInputs input)
    {
        this.input = input;
        steps = input.Steps;
        pulses = input.Pulses;
        mpp = input.MetresPerPulse;
        options = input.Options;
        forces = new DriveForceWindows(steps, options);
    }

    private bool WithAccelerometer => input.AccelTimeS is not null;

    /// <summary>Finds the windows and slip signals of one run.</summary>
    public static WheelWindows Find(WheelWindowInputs input)
    {
        var finder = new WheelWindowFinder(input);
        List<TimeWindow> slides = finder.SlidingUnderBraking(finder.SlideSearchWindows(), out double behind);
        List<TimeWindow> spin = finder.FindWheelspin(slides, out List<string> spinWarnings, out List<TimeWindow> launchSpin, out List<TimeWindow> pastPeak);
        SlipSwing? swing = finder.SlipSwing();
        List<TimeWindow> pulseSpin = finder.PulseSpin(spinWarnings);
        double[]? slipSignal = finder.SlipSignal();
        List<TimeWindow> firm = finder.FirmBraking();
        double[]? brakeSlipSignal = finder.BrakeSlipSignal(firm);
        return new WheelWindows
        {
            Slides = slides,
            LargestBehindFraction = behind,
            Spin = spin,
            SpinWarnings = spinWarnings,
            LaunchSpin = launchSpin,
            PastPeak = pastPeak,
            Swing = swing,
            PulseSpin = pulseSpin,
            DriveSlipSignal = slipSignal,
            BrakeSlipSignal = brakeSlipSignal,
            FirmBraking = brakeSlipSignal is null ? [] : firm.Where(w => !slides.Any(s => s.StartS < w.EndS && s.EndS > w.StartS)).ToList(),
        };
    }

    /// <summary>Where a slide is looked for: firm braking on a staged run with both sensors
    /// (<see cref="DriveForceWindows.BrakingWindows(double, double?, double, double)"/> over
    /// <see cref="ReconstructionOptions.BrakingDecelMps2"/>, the drag's speed from the grid's own start).</summary>
    private List<TimeWindow> SlideSearchWindows()
    {
        if (!WithAccelerometer || pulses is null || !input.Staged || options.BrakingDecelMps2 <= 0)
        {
            return [];
        }

        return forces.BrakingWindows(input.StartS, input.StopS, options.BrakingDecelMps2, steps.StartSpeedMps);
    }

    /// <summary>Firm braking where the pulses are kept, staged or not (those that hold a slide
    /// are left to <see cref="FusionSettings.BrakeWindows"/>).</summary>
    private List<TimeWindow> FirmBraking()
    {
        if (!WithAccelerometer || pulses is null || options.BrakingDecelMps2 <= 0)
        {
            return [];
        }

        return forces.FirmBraking(input.StartS, input.StopS, input.StartSpeedMps);
    }

    /// <summary>The launch's slip swing (<see cref="SlipSwingTest.Measure"/>), where the spin
    /// finder looks: a staged run with both sensors.</summary>
    private SlipSwing? SlipSwing()
    {
        if (!options.DetectWheelspin || pulses is null || !WithAccelerometer || !input.Staged)
        {
            return null;
        }

        return SlipSwingTest.Measure(
            pulses, mpp, options.ToothSpacingErrorFraction * mpp, options.EdgeJitterS, input.AccelTimeS!, input.AccelInputMps2, input.StartS, input.EndS, options.LaunchSpinSlip);
    }

    /// <summary>Spin at the launch from the pulses alone (<see cref="PulseSpinBound"/>), where the
    /// spin finder cannot look: a staged run without an accelerometer. Its note goes to
    /// <paramref name="notes"/>.</summary>
    private List<TimeWindow> PulseSpin(List<string> notes)
    {
        if (!options.DetectWheelspin || pulses is null || WithAccelerometer || !input.Staged)
        {
            return [];
        }

        List<TimeWindow> found = PulseSpinBound.Find(pulses, mpp, options.ToothSpacingErrorFraction * mpp, input.StartS, input.EndS, options, out double excess);
        if (found.Count > 0)
        {
            string list = string.Join(", ", found.Select(w => FormattableString.Invariant($"{w.StartS - input.StartS:F2}–{w.EndS - input.StartS:F2} s")));
            notes.Add(FormattableString.Invariant($"wheelspin at the launch suspected: the wheel's speed ran up or fell back faster than a car can move it with its tyre at or below its grip peak (by up to {excess:F2} m/s beyond that bound) at {list} after first motion; the launch marks may read early"));
        }
        else if (options.PickupWheel != PickupWheel.Undriven)
        {
            // What the data cannot show, said where it matters: a wheel that may be driven.
            notes.Add(FormattableString.Invariant($"no accelerometer: wheelspin is seen only where the wheel's speed runs up or falls back past what a car can do with its tyre at its grip peak (a slip of {options.LaunchSpinSlip:0.0#}); a wheel that slipped just past its peak, or spun below a few m/s, leaves no sign in the pulses"));
        }

        return found;
    }

    private List<TimeWindow> FindWheelspin(List<TimeWindow> braking, out List<string> notes, out List<TimeWindow> atLaunch, out List<TimeWindow> pastPeak)
    {
        notes = [];
        atLaunch = [];
        pastPeak = [];
        if (!options.DetectWheelspin || pulses is null || !WithAccelerometer || !input.Staged)
        {
            return [];
        }

        double startS = input.StartS;
        List<TimeWindow> windows = WheelspinDetector.Find(
            pulses, mpp, options.ToothSpacingErrorFraction * mpp, input.AccelTimeS!, input.AccelInputMps2, startS, input.EndS, braking, options, out double ahead, out double behind, out List<TimeWindow> spinning, out List<TimeWindow> spunPastPeak);
        List<TimeWindow> slid = windows.Except(spinning).ToList();
        if (spunPastPeak.Count > 0)
        {
            string list = string.Join(", ", spinning.Select(w => $"{w.StartS - startS:F2}–{w.EndS - startS:F2} s"));
            notes.Add($"wheelspin suspected (pulses up to {ahead * 100:F0} % ahead of the accelerometer, beyond the {options.LaunchSpinSlip * 100:F0} % a tyre slips at its grip peak) at {list} after first motion; the pulses there were not used for distance");
        }
        else if (spinning.Count > 0)
        {
            string list = string.Join(", ", spinning.Select(w => $"{w.StartS - startS:F2}–{w.EndS - startS:F2} s"));
            notes.Add($"the driven wheel ran up to {ahead * 100:F0} % ahead of the accelerometer at {list} after first motion: wheelspin or a tyre at its grip peak, not clearly past the {options.LaunchSpinSlip * 100:F0} % a tyre slips there, so not held against the run; the pulses there were not used for distance");
        }

        pastPeak = WheelspinDetector.Union([.. spunPastPeak, .. slid]);

        atLaunch = WheelspinDetector.FindAtLaunch(
            pulses, mpp, options.ToothSpacingErrorFraction * mpp, input.AccelTimeS!, input.AccelInputMps2, startS, input.EndS, options, out double launchSlip);
        if (atLaunch.Count > 0)
        {
            string list = string.Join(", ", atLaunch.Select(w => $"{w.StartS - startS:F2}–{w.EndS - startS:F2} s"));
            notes.Add($"wheelspin at the launch suspected (the pulses counted up to {launchSlip * 100:F0} % more than the accelerometer's distance, beyond the {options.LaunchSpinSlip * 100:F0} % a tyre slips at its grip peak) at {list} after first motion: the launch marks may read early");
        }

        if (slid.Count > 0)
        {
            string list = string.Join(", ", slid.Select(w => $"{w.StartS - startS:F2}–{w.EndS - startS:F2} s"));
            notes.Add($"the wheel slid (pulses up to {behind * 100:F0} % behind the accelerometer) at {list} after first motion; the pulses there were not used for distance");
        }

        return windows;
    }

    /// <summary>The slip signal S(t) = ∫ v·a_drive dt on the grid, where a_drive is the drive
    /// force per unit mass: the measured forward acceleration plus typical air drag and rolling
    /// resistance, or 0 when that is negative (coasting, braking). A tyre's longitudinal slip grows in proportion to the force it passes (the
    /// linear part of its force–slip curve; H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1),
    /// so a wheel slipping by k·a_drive counts k·S(t) more than the car covered. Speeds come
    /// from the pulses themselves (their own slip changes S by only that much), counted over a
    /// window (<see cref="PulseChannel.PulsePeriod"/>).</summary>
    private double[]? SlipSignal()
    {
        if (!WithAccelerometer || pulses is null || !input.Staged || options.WheelSlipSigma <= 0 || pulses.Length < 3)
        {
            return null;
        }

        double[] grid = steps.TimeS;
        var signal = new double[grid.Length];
        double stop = input.StopS ?? double.PositiveInfinity;
        int i = 0;
        double sum = 0;
        for (int k = FusionSmoother.FirstIndexAfter(grid, input.StartS); k + 1 < grid.Length; k++)
        {
            double mid = 0.5 * (grid[k] + grid[k + 1]);
            while (i + 1 < pulses.Length && pulses.MidS(i + 1) <= mid)
            {
                i++;
            }

            double speed = 0;
            if (mid < stop && i + 1 < pulses.Length && pulses.MidS(i) <= mid)
            {
                // Over a window of pulses, not from one bracket to the next: the slip is fitted to
                // the same brackets, and a signal carrying their errors would find a slip in them.
                pulses.PulsePeriod(i, out double period, out _);
                speed = double.IsInfinity(period) ? 0 : mpp / period;
            }

            double dt = grid[k + 1] - grid[k];
            // Drive only: under braking every wheel slips, driven or not, by its own measure, and
            // that is left to the accelerometer's error model.
            double drive = Math.Max((steps.StepSpeedMps[k] / dt) + (options.DragPerMassPerSpeedSquared * speed * speed) + (options.RollingResistance * Units.StandardGravity), 0);
            sum += speed * drive * dt;
            signal[k + 1] = sum;
        }

        return signal;
    }

    /// <summary>The braking signal S_b(t) = ∫ v·max(−a, 0) dt on the grid, a the measured forward
    /// acceleration at each step, counted inside <paramref name="braking"/> only (firm braking,
    /// widened by 0.1 s each side, <see cref="DriveForceWindows.FirmBraking"/>):
    /// a braked tyre runs slower than the road by deceleration ÷ (g0·C), so the wheel's pulses
    /// fall short of the car's distance by S_b/(g0·C) (<see cref="FusionSettings.BrakeSlipSignal"/>).
    /// Outside braking the input's noise and a coasting car's drag (which its tyres do not pass)
    /// would add up over a long drive; inside, the whole deceleration is taken as the brakes'
    /// (drag is a few per cent of it at motorway speed). Speeds from the pulses, interpolated
    /// between observations (<see cref="BrakedWheelSpeed"/>), and over the stop's last
    /// <see cref="LongestBackFromStopS"/> s, where the pulses are too far apart for a speed, from the
    /// input integrated back from the stop (<see cref="SpeedBackFromStop"/>). Null without both
    /// sensors, or when the tyre is taken not to slip.</summary>
    private double[]? BrakeSlipSignal(List<TimeWindow> braking)
    {
        if (!WithAccelerometer || pulses is null || pulses.Length < 3 || options.BrakeSlip.MeanInverse <= 0)
        {
            return null;
        }

        double[] grid = steps.TimeS;
        double[] dv = steps.StepSpeedMps;
        int n = grid.Length;
        var signal = new double[n];
        double? stopS = input.StopS;
        double stop = stopS ?? double.PositiveInfinity;
        int k0 = FusionSmoother.FirstIndexAfter(grid, input.StartS);
        double[]? toStop = stopS is null ? null : SpeedBackFromStop(steps, k0, stop);
        int i = 0;
        int w = 0;
        double sum = 0;
        for (int k = k0; k + 1 < n; k++)
        {
            double mid = 0.5 * (grid[k] + grid[k + 1]);
            while (w < braking.Count && braking[w].EndS < mid)
            {
                w++;
            }

            while (i + 1 < pulses.Length && pulses.MidS(i + 1) <= mid)
            {
                i++;
            }

            double dt = grid[k + 1] - grid[k];
            double decel = w < braking.Count && braking[w].Contains(mid) ? Math.Max(-dv[k] / dt, 0) : 0;
            if (decel > 0 && mid < stop && pulses.MidS(i) <= mid)
            {
                // The braked wheel's own speed reads (1 − s) of the car's; the prior's s puts it
                // back (else the fitted k_b would come out 1/(1 − s) high, 3–6 % in a hard stop).
                // Where the pulses are too far apart for a speed (the last metres of a stop on a
                // coarse ring, and after the last pulse), the car's speed from the stop back.
                double speed = BrakedWheelSpeed(i, mid) is { } wheel
                    ? wheel / Math.Max(1 - (decel * options.BrakeSlip.MeanInverse / Units.StandardGravity), 0.5)
                    : toStop is not null && stop - mid <= LongestBackFromStopS ? toStop[k] : 0;
                sum += speed * decel * dt;
            }

            signal[k + 1] = sum;
        }

        return signal;
    }

    /// <summary>The pulses' speed at <paramref name="timeS"/>, between observation
    /// <paramref name="i"/> (at or before it) and the next: each one's speed over its window
    /// (<see cref="PulseChannel.PulsePeriod"/>), interpolated in time (the window's speed is the
    /// observation's, and under braking it is a pulse period behind by the next one); null where
    /// either has no speed (too few pulses within the window's time) or after the last pulse.</summary>
    private double? BrakedWheelSpeed(int i, double timeS)
    {
        if (i + 1 >= pulses!.Length)
        {
            return null;
        }

        pulses.PulsePeriod(i, out double period, out _);
        pulses.PulsePeriod(i + 1, out double nextPeriod, out _);
        if (double.IsInfinity(period) || double.IsInfinity(nextPeriod))
        {
            return null;
        }

        double t0 = pulses.MidS(i);
        double t1 = pulses.MidS(i + 1);
        double f = t1 > t0 ? Math.Clamp((timeS - t0) / (t1 - t0), 0, 1) : 0;
        return mpp * (((1 - f) / period) + (f / nextPeriod));
    }

    /// <summary>The speed at each step's middle from the input integrated back from the stop at
    /// <paramref name="stopS"/> (0 there and after), m/s: under braking, the car's speed over its
    /// last seconds from the accelerometer alone, whose error (its bias times the time to the stop)
    /// is then a few cm/s (at most <see cref="LongestBackFromStopS"/> s of it is used).</summary>
    private static double[] SpeedBackFromStop(StepGrid steps, int k0, double stopS)
    {
        double[] grid = steps.TimeS;
        double[] dv = steps.StepSpeedMps;
        var result = new double[grid.Length];
        double after = 0;
        for (int k = grid.Length - 2; k >= k0; k--)
        {
            if (grid[k] >= stopS)
            {
                continue;
            }

            double part = grid[k + 1] > stopS ? (stopS - grid[k]) / (grid[k + 1] - grid[k]) : 1;
            result[k] = Math.Max(after - (0.5 * part * dv[k]), 0);
            after -= part * dv[k];
        }

        return result;
    }

    /// <summary>Where, under braking, the pulses fall behind the accelerometer: the speed from the
    /// pulses over spans of about 40 ms against the speed they had just before braking plus the
    /// integrated input, from where the drive is over (a driven wheel no longer slips ahead) and
    /// before the brakes bite. A span is behind when it falls short, beyond the first span's
    /// difference, by more than 4 % and 0.3 m/s, plus 0.1 m/s per second since the anchor for the input's drift;
    /// with three such spans the pulses
    /// are set aside from where the shortfall first passed 1 % and 0.1 m/s to the window's end
    /// (the margin widens as the speed falls, while ABS keeps cycling and the wheel may lock at
    /// the end).
    /// Only the shortfall the pulses' brackets cannot explain counts against the margin: each
    /// span at the fastest speed its brackets allow, the first span (the reference, lengthened up
    /// to 0.25 s until its brackets leave it within 2 %) at its slowest; on exact edges that is
    /// the span itself, on a coarse ring read by a slow loop it keeps bracket noise from reading
    /// as a slide over a whole ordinary stop.
    /// Under ABS a braked wheel slips by 5–20 %; a wheel that keeps up keeps its pulses.</summary>
    private List<TimeWindow> SlidingUnderBraking(List<TimeWindow> braking, out double largestBehind)
    {
        largestBehind = 0;
        var sliding = new List<TimeWindow>();
        if (pulses is null)
        {
            return sliding;
        }

        double[] grid = steps.TimeS;
        foreach (TimeWindow w in braking)
        {
            // The anchor: where the drive is over (a driven wheel no longer slips ahead) and
            // before the brakes bite.
            int i0 = pulses.FirstMidAtOrAfter(w.StartS - 0.1);
            double roughSpeed = i0 + 1 < pulses.Length ? (pulses.Counts[i0 + 1] - pulses.Counts[i0]) * mpp / Math.Max(pulses.MidS(i0 + 1) - pulses.MidS(i0), 1e-6) : 0;
            double resistance = (options.RollingResistance * Units.StandardGravity) + (options.DragPerMassPerSpeedSquared * roughSpeed * roughSpeed);
            int ka = FusionSmoother.FirstIndexAfter(grid, w.StartS);
            while (ka + 6 < grid.Length && grid[ka] < w.EndS
                && ((steps.StepSpeedMps[ka] + steps.StepSpeedMps[ka + 1] + steps.StepSpeedMps[ka + 2] + steps.StepSpeedMps[ka + 3] + steps.StepSpeedMps[ka + 4]) / (grid[ka + 5] - grid[ka])) + resistance > 0)
            {
                ka++;
            }

            if (ka >= grid.Length)
            {
                continue;
            }

            i0 = pulses.FirstMidAtOrAfter(grid[ka]);
            int i1 = pulses.FirstMidAtOrAfter(grid[ka] + 0.04);
            i1 = Math.Max(i1, i0 + 2);
            if (i1 >= pulses.Length)
            {
                continue;
            }

            double anchor = 0.5 * (pulses.MidS(i0) + pulses.MidS(i1));
            double speed = (pulses.Counts[i1] - pulses.Counts[i0]) * mpp / (pulses.MidS(i1) - pulses.MidS(i0));
            int k = Math.Max(FusionSmoother.FirstIndexAfter(grid, anchor) - 1, 0);
            double cumulative = 0;
            int behind = 0;
            double worst = 0;
            double firstBehindS = double.NaN;
            double slightSinceS = double.NaN;
            double? first = null;
            double firstSlowBy = 0;
            double from = double.NaN;
            int i = i1;
            while (i < pulses.Length && pulses.MidS(i) < w.EndS)
            {
                int j = i + 1;
                // The first span is every later one's reference, so its brackets count against
                // all of them: it runs on (up to 0.25 s, at 0.5 g a 1.2 m/s fall the integrated
                // input follows) until they leave it uncertain by no more than 2 %.
                while (j < pulses.Length
                    && (pulses.MidS(j) < pulses.MidS(i) + 0.04
                        || (first is null && pulses.MidS(j) < pulses.MidS(i) + 0.25 && pulses.HiS[j] - pulses.LoS[i] > 1.02 * (pulses.MidS(j) - pulses.MidS(i)))))
                {
                    j++;
                }

                if (j >= pulses.Length || pulses.MidS(j) > w.EndS)
                {
                    break;
                }

                double mid = 0.5 * (pulses.MidS(i) + pulses.MidS(j));
                while (k + 1 < grid.Length && grid[k + 1] <= mid)
                {
                    cumulative += steps.StepSpeedMps[k];
                    k++;
                }

                double fromAccel = speed + cumulative;
                double fromPulses = (pulses.Counts[j] - pulses.Counts[i]) * mpp / (pulses.MidS(j) - pulses.MidS(i));
                // Each count was reached somewhere in its bracket, so a span may have lasted from
                // the first bracket's end to the last one's start, or from the first one's start to
                // the last one's end: on a coarse ring read by a slow loop (12 teeth, a 5 ms poll:
                // one pulse a poll at speed) a tenth of a 40 ms span either way.
                double shortest = pulses.LoS[j] - pulses.HiS[i];
                double fastest = shortest > 0 ? (pulses.Counts[j] - pulses.Counts[i]) * mpp / shortest : double.PositiveInfinity;
                double slowest = (pulses.Counts[j] - pulses.Counts[i]) * mpp / (pulses.HiS[j] - pulses.LoS[i]);
                // Measured from the first span's difference, which the anchor's own error shares.
                if (first is null)
                {
                    first = fromAccel - fromPulses;
                    firstSlowBy = fromPulses - slowest;
                }

                double deficit = fromAccel - fromPulses - first.Value;
                // Only what the brackets cannot explain is the wheel's own: the span at the fastest
                // speed they allow, the first span (every deficit's reference) at its slowest.
                double deficitBeyondBrackets = fromAccel - fastest - first.Value - firstSlowBy;
                bool slight = deficit > (0.01 * fromAccel) + 0.1;
                slightSinceS = !slight ? double.NaN : double.IsNaN(slightSinceS) ? pulses.MidS(i) : slightSinceS;
                // The integrated input drifts by up to about 0.1 m/s² (what pitch compensation and
                // the bias leave), so the margin grows with the time since the anchor.
                if (fromAccel > 1 && deficitBeyondBrackets > (0.04 * fromAccel) + 0.3 + (0.1 * (mid - anchor)))
                {
                    behind++;
                    worst = Math.Max(worst, deficit / fromAccel);
                    if (double.IsNaN(firstBehindS))
                    {
                        from = slightSinceS;
                        firstBehindS = pulses.MidS(i);
                    }

                }

                i = j;
            }

            if (behind >= 3)
            {
                // A slide within a second of the brakes biting began with them: the slip
                // builds with the pressure before it shows above the margin.
                double start = Math.Max(Math.Min(from, firstBehindS) - 0.05, w.StartS);
                start = start - w.StartS < 1.0 ? w.StartS : start;
                sliding.Add(new TimeWindow(start, w.EndS));
                largestBehind = Math.Max(largestBehind, worst);
            }
        }

        return sliding;
    }
}
