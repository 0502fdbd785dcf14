namespace LaunchLogger.Decoding.Reconstruction;

/// <content>Where the wheel does not measure the car: wheelspin, slides under braking, drive and brake windows, the slip signal.</content>
internal sealed partial class ReconstructionPass
{
    private List<TimeWindow> FindWheelspin(double startS, double endS, List<TimeWindow> braking)
    {
        if (!options.DetectWheelspin || pulses is null || accel is null || !Staged)
        {
            return [];
        }

        List<TimeWindow> windows = WheelspinDetector.Find(
            pulses, mpp, options.ToothSpacingErrorFraction * mpp, accel.TimeS, accelInput, startS, endS, braking, options.WheelspinMinExcessMps, options.WheelspinFraction, out double ahead, out double behind, out List<TimeWindow> spinning);
        if (spinning.Count > 0)
        {
            string list = string.Join(", ", spinning.Select(w => $"{w.StartS - startS:F2}–{w.EndS - startS:F2} s"));
            warnings.Add($"wheelspin suspected (pulses up to {ahead * 100:F0} % ahead of the accelerometer) at {list} after first motion; the pulses there were not used for distance");
        }

        if (windows.Count > spinning.Count)
        {
            string list = string.Join(", ", windows.Except(spinning).Select(w => $"{w.StartS - startS:F2}–{w.EndS - startS:F2} s"));
            warnings.Add($"the wheel slid (pulses up to {behind * 100:F0} % behind the accelerometer) at {list} after first motion; the pulses there were not used for distance");
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
    private double[]? SlipSignal(StepGrid steps, double startS, double? stopS)
    {
        if (accel is null || pulses is null || !Staged || options.WheelSlipSigma <= 0 || pulses.Length < 3)
        {
            return null;
        }

        double[] grid = steps.TimeS;
        var signal = new double[grid.Length];
        double stop = stopS ?? double.PositiveInfinity;
        int i = 0;
        double sum = 0;
        for (int k = FusionSmoother.FirstIndexAfter(grid, startS); k + 1 < grid.Length; k++)
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
            double drive = Math.Max((steps.StepSpeedM[k] / dt) + (options.DragPerMassPerSpeedSquared * speed * speed) + (options.RollingResistance * G0), 0);
            sum += speed * drive * dt;
            signal[k + 1] = sum;
        }

        return signal;
    }

    /// <summary>The braking signal S_b(t) = ∫ v·max(−a, 0) dt on the grid, a the measured forward
    /// acceleration at each step, counted inside <paramref name="braking"/> only (firm braking,
    /// widened by 0.1 s each side, <see cref="BrakingWindows(StepGrid, double, double?, double, double)"/>):
    /// a braked tyre runs slower than the road by deceleration ÷ (g0·C), so the wheel's pulses
    /// fall short of the car's distance by S_b/(g0·C) (<see cref="FusionSettings.BrakeSlipSignal"/>).
    /// Outside braking the input's noise and a coasting car's drag (which its tyres do not pass)
    /// would add up over a long drive; inside, the whole deceleration is taken as the brakes'
    /// (drag is a few per cent of it at motorway speed). Speeds from the pulses, interpolated
    /// between observations (<see cref="BrakedWheelSpeed"/>), and over the stop's last
    /// <see cref="LongestBackFromStopS"/> s, where the pulses are too far apart for a speed, from the
    /// input integrated back from the stop (<see cref="SpeedBackFromStop"/>). Null without both
    /// sensors, or when the tyre is taken not to slip.</summary>
    private double[]? BrakeSlipSignal(StepGrid steps, double startS, double? stopS, List<TimeWindow> braking)
    {
        if (accel is null || pulses is null || pulses.Length < 3 || options.BrakeSlip.MeanInverse <= 0)
        {
            return null;
        }

        double[] grid = steps.TimeS;
        double[] dv = steps.StepSpeedM;
        int n = grid.Length;
        var signal = new double[n];
        double stop = stopS ?? double.PositiveInfinity;
        int k0 = FusionSmoother.FirstIndexAfter(grid, startS);
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
                    ? wheel / Math.Max(1 - (decel * options.BrakeSlip.MeanInverse / G0), 0.5)
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

    /// <summary>How long before the stop <see cref="SpeedBackFromStop"/> stands in for the pulses'
    /// speed, s: the slowest stop's last few metres (a braking force under 1 m/s² from 3 m/s),
    /// and not so long that the input's bias adds up (0.05 m/s² over 3 s is 0.15 m/s).</summary>
    private const double LongestBackFromStopS = 3;

    /// <summary>The speed at each step's middle from the input integrated back from the stop at
    /// <paramref name="stopS"/> (0 there and after), m/s: under braking, the car's speed over its
    /// last seconds from the accelerometer alone, whose error (its bias times the time to the stop)
    /// is then a few cm/s (at most <see cref="LongestBackFromStopS"/> s of it is used).</summary>
    private static double[] SpeedBackFromStop(StepGrid steps, int k0, double stopS)
    {
        double[] grid = steps.TimeS;
        double[] dv = steps.StepSpeedM;
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

    /// <summary>Firm braking where the pulses are kept (<see cref="FusionSettings.FirmBrakeWindows"/>):
    /// the stretches of <see cref="BrakingWindows(StepGrid, double, double?, double, double)"/>,
    /// staged or not (those that hold a slide are left to <see cref="FusionSettings.BrakeWindows"/>).</summary>
    private List<TimeWindow> FirmBraking(StepGrid steps, double startS, double? stopS)
    {
        if (accel is null || pulses is null || options.BrakingDecelMps2 <= 0)
        {
            return [];
        }

        double startSpeed = Staged ? 0 : opening?.SpeedMps.Value ?? accelOpeningSpeed?.Value ?? 0;
        var input = new double[steps.TimeS.Length];
        double[] drive = DriveForce(steps, startS, stopS, startSpeed, input);
        return FromRiseFoot(steps, startS, drive, input, BrakingWindows(steps, startS, stopS, options.BrakingDecelMps2, drive));
    }

    /// <summary>Stretches where the drive force per unit mass (measured acceleration plus typical
    /// drag and rolling resistance, averaged over 0.1 s) exceeds 0.5 m/s², widened by 0.1 s.</summary>
    private List<TimeWindow> DriveWindows(StepGrid steps, double startS, double? stopS)
    {
        double[] grid = steps.TimeS;
        var windows = new List<TimeWindow>();
        double stop = stopS ?? double.PositiveInfinity;
        int k0 = FusionSmoother.FirstIndexAfter(grid, startS);
        double open = double.NaN;
        for (int k = k0; k + 1 < grid.Length; k++)
        {
            // Mean input over the steps within ±0.05 s.
            double sum = 0;
            double span = 0;
            for (int j = k; j + 1 < grid.Length && grid[j] < grid[k] + 0.05; j++)
            {
                sum += steps.StepSpeedM[j];
                span += grid[j + 1] - grid[j];
            }

            for (int j = k - 1; j >= k0 && grid[j] > grid[k] - 0.05; j--)
            {
                sum += steps.StepSpeedM[j];
                span += grid[j + 1] - grid[j];
            }

            bool drive = grid[k] < stop && span > 0 && (sum / span) + (options.RollingResistance * G0) > 0.5;
            if (drive && double.IsNaN(open))
            {
                open = k == k0 ? startS : grid[k] - 0.1;
            }
            else if (!drive && !double.IsNaN(open))
            {
                windows.Add(new TimeWindow(open, grid[k] + 0.1));
                open = double.NaN;
            }
        }

        if (!double.IsNaN(open))
        {
            windows.Add(new TimeWindow(open, Math.Min(stop, grid[^1])));
        }

        return windows;
    }

    /// <summary>Stretches of firm braking: the braking force per unit mass (the measured
    /// deceleration, averaged over ±0.05 s, less typical drag and rolling resistance) exceeds
    /// <see cref="ReconstructionOptions.BrakingDecelMps2"/>; widened by 0.1 s each side (the slip
    /// builds with the brake pressure), joined across gaps under 0.2 s, cut at the stop.</summary>
    private List<TimeWindow> BrakingWindows(StepGrid steps, double startS, double? stopS)
    {
        if (accel is null || pulses is null || !Staged || options.BrakingDecelMps2 <= 0)
        {
            return [];
        }

        return BrakingWindows(steps, startS, stopS, options.BrakingDecelMps2, steps.StartSpeedM);
    }

    /// <summary>Stretches where the braking force per unit mass exceeds <paramref name="decelMps2"/>
    /// (as above), the speed taken as <paramref name="startSpeedMps"/> at
    /// <paramref name="startS"/> for the drag.</summary>
    private List<TimeWindow> BrakingWindows(StepGrid steps, double startS, double? stopS, double decelMps2, double startSpeedMps) =>
        BrakingWindows(steps, startS, stopS, decelMps2, DriveForce(steps, startS, stopS, startSpeedMps));

    /// <summary>The same over a drive force already found (<see cref="DriveForce"/>).</summary>
    private static List<TimeWindow> BrakingWindows(StepGrid steps, double startS, double? stopS, double decelMps2, double[] drive)
    {
        var windows = new List<TimeWindow>();
        double[] grid = steps.TimeS;
        double stop = stopS ?? double.PositiveInfinity;
        int k0 = FusionSmoother.FirstIndexAfter(grid, startS);
        int n = grid.Length;
        double open = double.NaN;
        double last = double.NaN;
        for (int k = k0; k + 1 < n && grid[k] < stop; k++)
        {
            if (drive[k] < -decelMps2)
            {
                if (double.IsNaN(open))
                {
                    open = Math.Max(grid[k] - 0.1, startS);
                }
                else if (grid[k] - last > 0.2)
                {
                    windows.Add(new TimeWindow(open, Math.Min(last + 0.1, stop)));
                    open = Math.Max(grid[k] - 0.1, startS);
                }

                last = grid[k];
            }
        }

        if (!double.IsNaN(open))
        {
            windows.Add(new TimeWindow(open, Math.Min(last + 0.1, stop)));
        }

        return windows;
    }

    /// <summary>The drive force per unit mass at each grid point (the input averaged over ±0.05 s
    /// plus typical drag and rolling resistance; negative under braking), from
    /// <paramref name="startS"/> to <paramref name="stopS"/> (0 elsewhere), the speed taken as
    /// <paramref name="startSpeedMps"/> at the start for the drag; the averaged input alone in
    /// <paramref name="meanInput"/> when given.</summary>
    private double[] DriveForce(StepGrid steps, double startS, double? stopS, double startSpeedMps, double[]? meanInput = null)
    {
        double[] grid = steps.TimeS;
        double[] dv = steps.StepSpeedM;
        double stop = stopS ?? double.PositiveInfinity;
        int k0 = FusionSmoother.FirstIndexAfter(grid, startS);
        int n = grid.Length;
        var drive = new double[n];
        double sum = 0;
        double span = 0;
        int lo = k0;
        int hi = k0;
        double speed = startSpeedMps;
        for (int k = k0; k + 1 < n && grid[k] < stop; k++)
        {
            // Running mean of the input over the steps within ±0.05 s.
            while (hi + 1 < n && grid[hi] < grid[k] + 0.05)
            {
                sum += dv[hi];
                span += grid[hi + 1] - grid[hi];
                hi++;
            }

            while (lo < k && grid[lo] <= grid[k] - 0.05)
            {
                sum -= dv[lo];
                span -= grid[lo + 1] - grid[lo];
                lo++;
            }

            speed = Math.Max(speed + dv[k], 0);
            drive[k] = span > 0 ? (sum / span) + (options.RollingResistance * G0) + (options.DragPerMassPerSpeedSquared * speed * speed) : 0;
            if (meanInput != null)
            {
                meanInput[k] = span > 0 ? sum / span : 0;
            }
        }

        return drive;
    }

    /// <summary>Each window opened back to the foot of its brake rise: the last point before it
    /// where the braking force (<paramref name="drive"/>, <see cref="DriveForce"/>; the averaged
    /// input alone in <paramref name="input"/>) was under <see cref="RiseFootMps2"/>,
    /// at most <see cref="LongestRiseS"/> earlier, not before <paramref name="startS"/> or the
    /// window before. A braked tyre slips from the first touch of the pedal, by the deceleration
    /// over g0·C: on a slow rise (0.5–2 s) the 0.1 s widening of a firm window opened up to half
    /// a second after the slip began, and the pulse speed's shortfall there, up to 0.15 m/s at
    /// 60 mph, was taken up by the accelerometer's error before the slip state could have it.</summary>
    private static List<TimeWindow> FromRiseFoot(StepGrid steps, double startS, double[] drive, double[] input, List<TimeWindow> windows)
    {
        if (windows.Count == 0)
        {
            return windows;
        }

        double[] grid = steps.TimeS;
        int k0 = FusionSmoother.FirstIndexAfter(grid, startS);
        var result = new List<TimeWindow>(windows.Count);
        double earliest = startS;
        foreach (TimeWindow w in windows)
        {
            int k = Math.Min(FusionSmoother.FirstIndexAfter(grid, w.StartS), grid.Length - 1);
            double from = Math.Max(earliest, w.StartS - LongestRiseS);
            while (k > k0 && grid[k - 1] > from && -drive[k - 1] >= RiseFootMps2)
            {
                k--;
            }

            // The force is net of typical drag, which a coasting car's own deceleration may not
            // show: back on while the force still rises, 0.1 s at a time, as long as the car was
            // slowing at all (not into the drive before a lift-off).
            int back = FusionSmoother.FirstIndexAfter(grid, grid[k] - RiseStepS);
            while (back > k0 && back < k && grid[back] > from && input[back] < 0 && drive[back] - drive[k] > RiseFootJerkMps3 * (grid[k] - grid[back]))
            {
                k = back;
                back = FusionSmoother.FirstIndexAfter(grid, grid[k] - RiseStepS);
            }

            // Half the force's averaging span before the foot, where the rise's first steps lie.
            double open = Math.Max(Math.Min(w.StartS, grid[k] - 0.05), earliest);
            result.Add(new TimeWindow(open, w.EndS));
            earliest = w.EndS;
        }

        return result;
    }

    /// <summary>Braking force per unit mass under which a brake rise counts as not yet begun, m/s².</summary>
    private const double RiseFootMps2 = 0.3;

    /// <summary>Below this rate of rise of the braking force the rise counts as not yet begun,
    /// m/s³ (half the slowest rise the bench draws, 0.5 g over 2 s; the ±0.05 s mean of a 100 Hz
    /// input moves by a few hundredths of a m/s² from noise alone).</summary>
    private const double RiseFootJerkMps3 = 1.0;

    /// <summary>The step of the walk back to a rise's foot, s.</summary>
    private const double RiseStepS = 0.1;

    /// <summary>How far back a firm window may be opened to its rise's foot, s.</summary>
    private const double LongestRiseS = 3;

    /// <summary>Where, under braking, the pulses fall behind the accelerometer: the speed from the
    /// pulses over spans of about 40 ms against the speed they had just before braking plus the
    /// integrated input, from where the drive is over (a driven wheel no longer slips ahead) and
    /// before the brakes bite. A span is behind when it falls short, beyond the first span's
    /// difference, by more than 4 % and 0.3 m/s, plus 0.1 m/s per second since the anchor for the input's drift;
    /// with three such spans the pulses
    /// are set aside from where the shortfall first passed 1 % and 0.1 m/s to the window's end
    /// (the margin widens as the speed falls, while ABS keeps cycling and the wheel may lock at
    /// the end).
    /// Under ABS a braked wheel slips by 5–20 %; a wheel that keeps up keeps its pulses.</summary>
    private List<TimeWindow> SlidingUnderBraking(StepGrid steps, List<TimeWindow> braking, out double largestBehind)
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
            int i0 = FirstPulseAtOrAfter(w.StartS - 0.1);
            double roughSpeed = i0 + 1 < pulses.Length ? (pulses.Counts[i0 + 1] - pulses.Counts[i0]) * mpp / Math.Max(pulses.MidS(i0 + 1) - pulses.MidS(i0), 1e-6) : 0;
            double resistance = (options.RollingResistance * G0) + (options.DragPerMassPerSpeedSquared * roughSpeed * roughSpeed);
            int ka = FusionSmoother.FirstIndexAfter(grid, w.StartS);
            while (ka + 6 < grid.Length && grid[ka] < w.EndS
                && ((steps.StepSpeedM[ka] + steps.StepSpeedM[ka + 1] + steps.StepSpeedM[ka + 2] + steps.StepSpeedM[ka + 3] + steps.StepSpeedM[ka + 4]) / (grid[ka + 5] - grid[ka])) + resistance > 0)
            {
                ka++;
            }

            if (ka >= grid.Length)
            {
                continue;
            }

            i0 = FirstPulseAtOrAfter(grid[ka]);
            int i1 = FirstPulseAtOrAfter(grid[ka] + 0.04);
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
            double from = double.NaN;
            int i = i1;
            while (i < pulses.Length && pulses.MidS(i) < w.EndS)
            {
                int j = i + 1;
                while (j < pulses.Length && pulses.MidS(j) < pulses.MidS(i) + 0.04)
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
                    cumulative += steps.StepSpeedM[k];
                    k++;
                }

                double fromAccel = speed + cumulative;
                double fromPulses = (pulses.Counts[j] - pulses.Counts[i]) * mpp / (pulses.MidS(j) - pulses.MidS(i));
                // Measured from the first span's difference, which the anchor's own error shares.
                first ??= fromAccel - fromPulses;
                double deficit = fromAccel - fromPulses - first.Value;
                bool slight = deficit > (0.01 * fromAccel) + 0.1;
                slightSinceS = !slight ? double.NaN : double.IsNaN(slightSinceS) ? pulses.MidS(i) : slightSinceS;
                // The integrated input drifts by up to about 0.1 m/s² (what pitch compensation and
                // the bias leave), so the margin grows with the time since the anchor.
                if (fromAccel > 1 && deficit > (0.04 * fromAccel) + 0.3 + (0.1 * (mid - anchor)))
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

    /// <summary>Variance of the accelerometer's error stepping as each brake window starts: its
    /// scale error times the mean deceleration there (<paramref name="withScale"/>; not where the
    /// scale error is a state of its own), and what pitch compensation leaves.</summary>
    private double[] BrakeStepVariances(StepGrid steps, List<TimeWindow> braking, bool withScale)
    {
        var result = new double[braking.Count];
        double[] grid = steps.TimeS;
        for (int i = 0; i < braking.Count; i++)
        {
            int k = FusionSmoother.FirstIndexAfter(grid, braking[i].StartS);
            double dv = 0;
            double dt = 0;
            for (; k + 1 < grid.Length && grid[k] < braking[i].EndS; k++)
            {
                dv += steps.StepSpeedM[k];
                dt += grid[k + 1] - grid[k];
            }

            double decel = dt > 0 ? Math.Abs(dv / dt) : 0;
            double scale = withScale ? options.AccelScaleSigma * decel : 0;
            result[i] = (scale * scale) + (options.BrakeBiasStepSigmaMps2 * options.BrakeBiasStepSigmaMps2);
        }

        return result;
    }
}
