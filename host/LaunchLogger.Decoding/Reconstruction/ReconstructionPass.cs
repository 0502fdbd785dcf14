using LaunchLogger.Decoding.Runs;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>One reconstruction, step by step; see <see cref="Reconstructor"/>.</summary>
internal sealed class ReconstructionPass
{
    private const double G0 = 9.80665;

    private readonly DecodedRun run;
    private readonly ReconstructionOptions options;
    private readonly RunConfiguration configuration;
    private readonly List<string> warnings = [];
    private readonly double rolloutM;
    private readonly double mpp;
    private readonly PulseChannel? pulses;
    private readonly int channel;
    private readonly string? channelNote;
    private readonly ForwardAcceleration? accel;
    private readonly double? motionHintS;

    private double[] accelInput = [];
    private double pitchRad;
    private double pitchSigmaRad;
    private AccelOnset? onset;
    private KinematicStart? kinematic;

    public ReconstructionPass(DecodedRun run, ReconstructionOptions options)
    {
        this.run = run;
        this.options = options;
        configuration = run.Configuration;
        rolloutM = options.RolloutM ?? (configuration.RolloutM > 0 ? configuration.RolloutM : 0.3048);
        mpp = PulseChannel.MetresPerPulse(configuration);
        if (options.UsePulses && mpp > 0 && run.Pulses.Count > 0)
        {
            var first = PulseChannel.From(run.Pulses);
            pulses = first.Length > 0 ? first : null;
        }

        if (options.UsePulses && options.UseSecondChannel && configuration.Staged && run.SecondPulses.Count > 2 && configuration.SecondMetresPerPulse > 0)
        {
            var second = PulseChannel.From(run.SecondPulses);
            if (pulses is null)
            {
                (pulses, mpp, channel) = (second, configuration.SecondMetresPerPulse, 1);
            }
            else if (DistanceUnderDrive(pulses, mpp, second, configuration.SecondMetresPerPulse) is { } ratio && ratio < 0.998)
            {
                // The second wheel covers less under drive: the first one slips, so it is driven.
                channelNote = $"the second pulse channel turned {(1 - ratio) * 100:F1} % less than the first while accelerating; it is taken as the undriven wheel and used for distance";
                (pulses, mpp, channel) = (second, configuration.SecondMetresPerPulse, 1);
            }
        }

        accel = options.UseAccelerometer ? ForwardAcceleration.From(run.Accel) : null;
        motionHintS = run.FirmwareMotionS ?? run.Events.FirstOrDefault(e => e.Kind == EventKind.Motion)?.TimeS;
    }

    private bool Staged => configuration.Staged;

    /// <summary>Distance the second channel covered divided by the first's, from the later first
    /// pulse (plus 0.2 s) to the first channel's highest speed, when both saw enough of it.</summary>
    private static double? DistanceUnderDrive(PulseChannel a, double mppA, PulseChannel b, double mppB)
    {
        double from = Math.Max(a.MidS(0), b.MidS(0)) + 0.2;

        // Highest speed of channel a over half-second spans.
        double peakS = double.NaN;
        double peak = 0;
        int j = 0;
        for (int i = 0; i < a.Length; i++)
        {
            while (j < a.Length && a.MidS(j) < a.MidS(i) + 0.5)
            {
                j++;
            }

            if (j >= a.Length)
            {
                break;
            }

            double speed = (a.Counts[j] - a.Counts[i]) * mppA / (a.MidS(j) - a.MidS(i));
            if (speed > peak)
            {
                peak = speed;
                peakS = a.MidS(j);
            }
        }

        if (double.IsNaN(peakS) || peakS < from + 1)
        {
            return null;
        }

        double da = (CountAt(a, peakS) - CountAt(a, from)) * mppA;
        double db = (CountAt(b, peakS) - CountAt(b, from)) * mppB;
        return da > 10 && db > 0 ? db / da : null;
    }

    /// <summary>Count at <paramref name="t"/>, interpolated between observation midpoints.</summary>
    private static double CountAt(PulseChannel c, double t)
    {
        int lo = 0;
        int hi = c.Length - 1;
        if (t <= c.MidS(0))
        {
            return c.Counts[0];
        }

        if (t >= c.MidS(hi))
        {
            return c.Counts[hi];
        }

        while (hi - lo > 1)
        {
            int mid = (lo + hi) >>> 1;
            if (c.MidS(mid) <= t)
            {
                lo = mid;
            }
            else
            {
                hi = mid;
            }
        }

        double f = (t - c.MidS(lo)) / (c.MidS(hi) - c.MidS(lo));
        return c.Counts[lo] + (f * (c.Counts[hi] - c.Counts[lo]));
    }

    public ReconstructedRun Run()
    {
        if (pulses is null && accel is null)
        {
            warnings.Add("the run has neither pulses nor accelerometer samples to reconstruct from");
            double t = configuration.OpenedS;
            return new ReconstructedRun
            {
                Source = run,
                Trajectory = new Trajectory { TimeS = [t], DistanceM = [0], SpeedMps = [0], AccelMps2 = [0], DistanceSigmaM = [0], SpeedSigmaMps = [0] },
                FirstMotionS = new Estimate(t, 0),
                RolloutM = rolloutM,
                Method = ReconstructionMethod.PulsesOnly,
                Warnings = warnings,
            };
        }

        string method = pulses is null ? ReconstructionMethod.AccelerometerOnly
            : accel is null ? ReconstructionMethod.PulsesOnly
            : ReconstructionMethod.PulsesAndAccelerometer;

        CheckPulses();
        if (accel != null)
        {
            PrepareAccelerometer(accel);
        }

        if (pulses != null && Staged)
        {
            kinematic = KinematicStartFit.Fit(pulses, mpp, options.ToothSpacingErrorFraction * mpp, options.EdgeJitterS, pulses.MidS(0) - 3.0);
        }

        Estimate firstMotion = FirstMotion();
        double endOfData = Math.Max(accel?.TimeS[^1] ?? double.MinValue, pulses?.HiS[^1] ?? double.MinValue);
        double? stopS = FindStop(firstMotion.Value, endOfData);

        StepGrid steps = BuildGrid(firstMotion.Value, stopS, endOfData);
        double[] grid = steps.TimeS;
        List<TimeWindow> braking = SlidingUnderBraking(steps, BrakingWindows(steps, firstMotion.Value, stopS), out double brakeSlide);
        int warningsBeforeSpin = warnings.Count;
        List<TimeWindow> spin = FindWheelspin(firstMotion.Value, stopS ?? endOfData, braking);
        int spinWarnings = warnings.Count - warningsBeforeSpin;
        if (channelNote != null)
        {
            warnings.Add(channelNote);
        }

        double[]? slipSignal = SlipSignal(steps, firstMotion.Value, stopS);
        FusionResult fused = FusionSmoother.Run(Settings(steps, firstMotion.Value, stopS, spin, braking, slipSignal));
        if (pulses != null && accel != null && Staged
            && (fused.Outliers > 0.25 * pulses.Length || (fused.SlipKept && Math.Abs(fused.Slip.Value) * 0.5 * G0 > 0.15)))
        {
            // The wheel slips too much, too unevenly, for the slip model: let the accelerometer
            // carry the distance while there is drive, and the pulses only where there is none.
            // The spin and slide notes of the first pass measured against a baseline the spin itself set.
            warnings.RemoveRange(warningsBeforeSpin, spinWarnings);
            warnings.Add("the pulses run far ahead of the accelerometer for much of the run (sustained wheelspin on a driven wheel?): distance under drive comes from the accelerometer, the pulses are used only while coasting and braking");
            spin = DriveWindows(steps, firstMotion.Value, stopS);
            slipSignal = null;
            fused = FusionSmoother.Run(Settings(steps, firstMotion.Value, stopS, spin, braking, slipSignal));
        }

        ReportSlip(fused, slipSignal != null);
        if (braking.Count > 0)
        {
            string list = string.Join(", ", braking.Select(w => FormattableString.Invariant($"{w.StartS - firstMotion.Value:F2}–{w.EndS - firstMotion.Value:F2} s")));
            warnings.Add($"the wheel slid under braking (pulses up to {brakeSlide * 100:F0} % behind the accelerometer) at {list} after first motion; the pulses there were not used, distance and speed come from the accelerometer");
        }

        if (fused.Outliers > 0)
        {
            warnings.Add($"{fused.Outliers} pulse observations disagreed with the rest by more than ten σ and were down-weighted");
        }

        Trajectory trajectory = MakeTrajectory(steps, firstMotion.Value, stopS, fused, slipSignal);
        (Estimate? rolloutTime, Estimate? rolloutSpeed) = Rollout(trajectory, firstMotion.Value);
        CheckFirmwareRollout(rolloutTime, rolloutSpeed);
        AddModeWarnings(trajectory, firstMotion, stopS);

        return new ReconstructedRun
        {
            Source = run,
            Trajectory = trajectory,
            FirstMotionS = firstMotion,
            RolloutTimeS = rolloutTime,
            RolloutSpeedMps = rolloutSpeed,
            RolloutM = rolloutM,
            Method = method,
            Warnings = warnings,
            AccelBiasMps2 = accel is null ? null : MeanBias(grid, firstMotion.Value, stopS, fused),
            RestingPitchRad = accel is null ? null : new Estimate(pitchRad, pitchSigmaRad),
            RestingForwardMps2 = accel is null ? null : new Estimate(accel.RestLevelMps2, accel.RestLevelSigmaMps2),
            FirstPulseDistanceM = pulses is null || !Staged ? null : new Estimate(mpp - fused.PhaseM.Value, fused.PhaseM.Sigma),
            StopS = stopS,
            WheelspinWindows = spin,
            BrakingSlideWindows = braking,
            WheelSlipPerMps2 = slipSignal is null ? null : fused.SlipKept ? fused.Slip : new Estimate(0, 0),
            DistanceChannel = channel,
        };
    }

    private void CheckPulses()
    {
        if (pulses is null)
        {
            return;
        }

        if (pulses.Dropped > 0)
        {
            warnings.Add($"{pulses.Dropped} pulse observations went backwards in count or time and were left out");
        }

        double limit = options.WideBracketS ?? (configuration.BracketLimitS > 0 ? configuration.BracketLimitS : 0.002);
        int wide = 0;
        double widest = 0;
        for (int i = 0; i < pulses.Length; i++)
        {
            double w = pulses.HiS[i] - pulses.LoS[i];
            widest = Math.Max(widest, w);
            if (w > limit)
            {
                wide++;
            }
        }

        // A log's run already carries the reader's warning about wide brackets; say it here only
        // for plain-text inputs (format version 0), which have no reader of their own to say it.
        if (wide > 0 && configuration.FormatVersion == 0)
        {
            warnings.Add($"{wide} of {pulses.Length} pulse observations have brackets wider than {limit * 1e3:F1} ms (widest {widest * 1e3:F1} ms); they count with their width");
        }
    }

    private void PrepareAccelerometer(ForwardAcceleration a)
    {
        double? reference = Min(pulses?.LoS[0], motionHintS);
        int restTo = reference is { } r ? a.IndexAtOrAfter(r - 0.05) : a.IndexAtOrAfter(a.TimeS[0] + 0.5);
        int restFrom = a.IndexAtOrAfter((reference ?? a.TimeS[0]) - 2.0);
        if (motionHintS is null && pulses != null)
        {
            // Only the first pulse bounds the onset: it may come long before, so rest on the older half.
            restTo = restFrom + ((restTo - restFrom) / 2);
        }

        if (!a.SetRest(restFrom, restTo))
        {
            double? level = RestGravityForward();
            if (level is { } l)
            {
                a.SetRest(l, 0.05);
                warnings.Add("too few accelerometer samples before first motion: the resting level comes from the staging event");
            }
            else
            {
                a.SetRest(a.ForwardMps2[0], 0.05);
                warnings.Add("too few accelerometer samples before first motion: the first sample is taken as the resting level");
            }
        }

        FindOnset(a);
        if (onset is { } o && a.SetRest(a.IndexAtOrAfter(o.TimeS - 2.0), a.IndexAtOrAfter(o.TimeS - 0.03)))
        {
            FindOnset(a);
        }

        (pitchRad, pitchSigmaRad) = RestingPitch(a);
        accelInput = a.Input(pitchRad, options.CompensateBodyPitch);
    }

    private void FindOnset(ForwardAcceleration a)
    {
        if (pulses != null && Staged)
        {
            onset = AccelOnsetFit.Find(a.TimeS, a.ForwardMps2, a.RestLevelMps2, a.NoiseMps2, a.CorrelationFactor, a.PeriodS, 0, a.IndexAtOrAfter(pulses.HiS[0]), lastRise: true);
        }
        else if (Staged)
        {
            int from = motionHintS is { } h ? a.IndexAtOrAfter(h - 0.5) : a.IndexAtOrAfter(a.TimeS[0] + 0.3);
            onset = AccelOnsetFit.Find(a.TimeS, a.ForwardMps2, a.RestLevelMps2, a.NoiseMps2, a.CorrelationFactor, a.PeriodS, from, a.Count, lastRise: false);
        }
        else
        {
            onset = null;
        }

    }

    private double? RestGravityForward()
    {
        if (run.RestGravityMilliG is not { } g)
        {
            return null;
        }

        double component = configuration.ForwardAxis switch { 1 => g.Y, 2 => g.Z, _ => g.X };
        double sign = configuration.ForwardAxisReversed ? -1 : 1;
        return sign * component * G0 / 1000;
    }

    private (double Pitch, double Sigma) RestingPitch(ForwardAcceleration a)
    {
        double magnitude = G0;
        if (run.RestGravityMilliG is { } g)
        {
            double norm = Math.Sqrt((g.X * g.X) + (g.Y * g.Y) + (g.Z * g.Z)) * G0 / 1000;
            if (norm > 0.5 * G0 && norm < 1.5 * G0)
            {
                magnitude = norm;
            }
        }

        double ratio = Math.Clamp(a.RestLevelMps2 / magnitude, -0.99, 0.99);
        double pitch = Math.Asin(ratio);
        double sigma = a.RestLevelSigmaMps2 / (magnitude * Math.Cos(pitch));
        return (pitch, sigma);
    }

    private Estimate FirstMotion()
    {
        if (!Staged && pulses != null)
        {
            warnings.Add("the run opened while rolling: there is no standstill, distances count from the first pulse observation");
            return new Estimate(pulses.MidS(0), (pulses.HiS[0] - pulses.LoS[0]) / Math.Sqrt(12));
        }

        if (!Staged)
        {
            warnings.Add("the run opened while rolling and has no pulses: distances count from the start of the samples");
            return new Estimate(accel!.TimeS[0], 0);
        }

        Estimate? fromAccel = onset is { } o ? new Estimate(o.TimeS, o.SigmaS) : null;
        if (fromAccel is { } fa && pulses != null && fa.Value >= pulses.HiS[0])
        {
            warnings.Add("the accelerometer onset came after the first pulse; it was not used");
            fromAccel = null;
        }

        Estimate? fromPulses = kinematic is { } k ? new Estimate(k.TimeS, k.SigmaS) : null;
        if (fromAccel is { } a && fromPulses is { } p)
        {
            double gap = a.Value - p.Value;
            double combined = Math.Sqrt((a.Sigma * a.Sigma) + (p.Sigma * p.Sigma));
            if (Math.Abs(gap) > 3 * combined)
            {
                warnings.Add($"the accelerometer onset and the back-extrapolated pulses disagree on first motion by {gap * 1e3:F1} ms; the accelerometer's is used");
                return a;
            }

            double wa = 1 / (a.Sigma * a.Sigma);
            double wp = 1 / (p.Sigma * p.Sigma);
            return new Estimate(((wa * a.Value) + (wp * p.Value)) / (wa + wp), Math.Sqrt(1 / (wa + wp)));
        }

        if (fromAccel is { } onlyAccel)
        {
            return onlyAccel;
        }

        if (fromPulses is { } onlyPulses)
        {
            if (accel != null)
            {
                warnings.Add("the accelerometer shows no clear onset of motion: first motion is back-extrapolated from the pulses");
            }

            return onlyPulses;
        }

        if (pulses != null)
        {
            // Too few pulses for a fit: the start lies before the first edge, by up to the time
            // the second edge took.
            double first = pulses.MidS(0);
            double spread = pulses.Length > 1 ? pulses.MidS(1) - first : 0.5;
            warnings.Add("too few pulses to back-extrapolate first motion: it is placed one pulse interval before the first pulse, with that much uncertainty");
            return new Estimate(first - spread, spread);
        }

        double start = motionHintS ?? accel!.TimeS[0];
        warnings.Add("the accelerometer shows no clear onset of motion: first motion is taken from the box's own mark or the start of the samples");
        return new Estimate(start, 0.05);
    }

    private double? FindStop(double startS, double endOfData)
    {
        bool stoppedEvent = run.Events.Any(e => e.Kind == EventKind.Stopped);
        if (pulses != null)
        {
            double lastHi = pulses.HiS[^1];
            double hold = configuration.StopHoldS > 0 ? 0.9 * configuration.StopHoldS : 1.0;
            if (!stoppedEvent && endOfData - lastHi < hold)
            {
                return null;
            }

            return StopFinder.Find(pulses, mpp, accel?.TimeS, accel is null ? null : accelInput, endOfData);
        }

        // Accelerometer only: at rest when the last samples sit at the resting level, as quiet as at rest.
        ForwardAcceleration a = accel!;
        int from = a.IndexAtOrAfter(a.TimeS[^1] - options.StillAtEndS);
        if (a.TimeS[^1] - startS < options.StillAtEndS + 0.5 || a.Count - from < 8)
        {
            return null;
        }

        double mean = 0;
        for (int i = from; i < a.Count; i++)
        {
            mean += accelInput[i];
        }

        mean /= a.Count - from;
        double variance = 0;
        for (int i = from; i < a.Count; i++)
        {
            variance += (accelInput[i] - mean) * (accelInput[i] - mean);
        }

        double sd = Math.Sqrt(variance / (a.Count - from));
        if (!stoppedEvent && (sd > 1.5 * a.NoiseMps2 || Math.Abs(mean) > 0.1))
        {
            return null;
        }

        // Walk back to where the smoothed acceleration last left the still band.
        int half = Math.Max(1, (int)Math.Round(0.05 / a.PeriodS));
        double band = Math.Max(0.1, 4 * a.NoiseMps2 / Math.Sqrt((2 * half) + 1));
        int k = a.Count - 1;
        while (k > 0 && a.TimeS[k] > startS)
        {
            double sum = 0;
            int lo = Math.Max(0, k - half);
            int hi = Math.Min(a.Count - 1, k + half);
            for (int i = lo; i <= hi; i++)
            {
                sum += accelInput[i];
            }

            if (Math.Abs(sum / (hi - lo + 1)) > band)
            {
                break;
            }

            k--;
        }

        return a.TimeS[Math.Min(k + half, a.Count - 1)];
    }

    /// <summary>The time grid with the accelerometer input integrated over each step.</summary>
    private sealed class StepGrid
    {
        public required double[] TimeS { get; init; }

        public required double[] StepSpeedM { get; init; }

        public required double[] StepDistanceM { get; init; }

        public required bool[] NoInput { get; init; }

        public double StartSpeedM { get; init; }

        public double StartDistanceM { get; init; }
    }

    private StepGrid BuildGrid(double startS, double? stopS, double endOfData)
    {
        double from = startS - options.PreRollS;
        double step = options.GridStepS;
        double end = endOfData;
        if (pulses != null && accel is null)
        {
            end = stopS is { } s ? Math.Max(s, pulses.HiS[^1]) + Math.Clamp(configuration.StopHoldS, 0.5, 3.0) : pulses.HiS[^1];
        }

        end = Math.Max(end, startS + (2 * step));
        int capacity = (int)((end - from) / step) + 8;
        if (accel != null)
        {
            capacity += accel.Count / Math.Max(1, (int)Math.Round(step / accel.PeriodS));
        }

        var grid = new List<double>(capacity);
        double accelEnd = double.NegativeInfinity;
        if (accel != null)
        {
            // Every m-th sample, so that steps are about the grid step long.
            int every = Math.Max(1, (int)Math.Round(step / accel.PeriodS));
            int first = accel.IndexAtOrAfter(from);
            for (int i = first; i < accel.Count; i += every)
            {
                grid.Add(accel.TimeS[i]);
            }

            if (first < accel.Count && grid[^1] < accel.TimeS[^1])
            {
                grid.Add(accel.TimeS[^1]);
            }

            accelEnd = accel.TimeS[^1];
        }

        double t = grid.Count > 0 ? grid[^1] + step : from;
        for (; t <= end + (0.5 * step) || grid.Count < 2 || grid[^1] <= startS; t += step)
        {
            grid.Add(t);
        }

        double[] times = [.. grid];
        int n = times.Length;
        var dv = new double[n];
        var dd = new double[n];
        var noInput = new bool[n];
        double startDv = 0;
        double startDd = 0;
        if (accel != null)
        {
            int index = 0;
            double gap = 2.5 * accel.PeriodS;
            for (int k = 0; k + 1 < n; k++)
            {
                if (times[k] >= accelEnd)
                {
                    noInput[k] = true;
                    continue;
                }

                noInput[k] = Integrate(accel.TimeS, accelInput, times[k], times[k + 1], ref index, gap, out dv[k], out dd[k]) || times[k + 1] > accelEnd;
            }

            int k0 = FusionSmoother.FirstIndexAfter(times, startS);
            if (k0 < n)
            {
                int i0 = 0;
                Integrate(accel.TimeS, accelInput, startS, times[k0], ref i0, gap, out startDv, out startDd);
            }
        }

        return new StepGrid { TimeS = times, StepSpeedM = dv, StepDistanceM = dd, NoInput = noInput, StartSpeedM = startDv, StartDistanceM = startDd };
    }

    /// <summary>Speed and distance gained from the input over [a, b], the input taken as linear
    /// between samples (exact for a piecewise-linear input). Returns true when the samples have a
    /// gap longer than <paramref name="gap"/> there.</summary>
    private static bool Integrate(double[] t, double[] u, double a, double b, ref int index, double gap, out double dv, out double dd)
    {
        while (index + 1 < t.Length && t[index + 1] <= a)
        {
            index++;
        }

        dv = 0;
        dd = 0;
        bool hasGap = false;
        double s0 = a;
        double u0 = ValueAt(t, u, index, a);
        int i = index + 1;
        while (true)
        {
            bool last = i >= t.Length || t[i] >= b;
            double s1 = last ? b : t[i];
            double u1 = last ? ValueAt(t, u, Math.Min(i, t.Length - 1) - 1, b) : u[i];
            double h = s1 - s0;
            if (i < t.Length && i > 0 && t[i] - t[i - 1] > gap)
            {
                hasGap = true;
            }

            dd += (dv * h) + (((2 * u0) + u1) / 6 * h * h);
            dv += 0.5 * (u0 + u1) * h;
            if (last)
            {
                break;
            }

            s0 = s1;
            u0 = u1;
            i++;
        }

        return hasGap;
    }

    private static double ValueAt(double[] t, double[] u, int i, double at)
    {
        if (i < 0 || at <= t[0])
        {
            return u[0];
        }

        if (i + 1 >= t.Length)
        {
            return u[^1];
        }

        double f = (at - t[i]) / (t[i + 1] - t[i]);
        return u[i] + (Math.Clamp(f, 0, 1) * (u[i + 1] - u[i]));
    }

    private List<TimeWindow> FindWheelspin(double startS, double endS, List<TimeWindow> braking)
    {
        if (!options.DetectWheelspin || pulses is null || accel is null || !Staged)
        {
            return [];
        }

        List<TimeWindow> windows = WheelspinDetector.Find(
            pulses, mpp, accel.TimeS, accelInput, startS, endS, braking, options.WheelspinMinExcessMps, options.WheelspinFraction, out double ahead, out double behind, out List<TimeWindow> spinning);
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
    /// from the pulses themselves (their own slip changes S by only that much).</summary>
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
                speed = (pulses.Counts[i + 1] - pulses.Counts[i]) * mpp / Math.Max(pulses.MidS(i + 1) - pulses.MidS(i), 1e-6);
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
        var windows = new List<TimeWindow>();
        if (accel is null || pulses is null || !Staged || options.BrakingDecelMps2 <= 0)
        {
            return windows;
        }

        double[] grid = steps.TimeS;
        double[] dv = steps.StepSpeedM;
        double stop = stopS ?? double.PositiveInfinity;
        int k0 = FusionSmoother.FirstIndexAfter(grid, startS);
        int n = grid.Length;
        double sum = 0;
        double span = 0;
        int lo = k0;
        int hi = k0;
        double speed = steps.StartSpeedM;
        double open = double.NaN;
        double last = double.NaN;
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
            double force = span > 0 ? (sum / span) + (options.RollingResistance * G0) + (options.DragPerMassPerSpeedSquared * speed * speed) : 0;
            if (force < -options.BrakingDecelMps2)
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

    private int FirstPulseAtOrAfter(double t)
    {
        int lo = 0;
        int hi = pulses!.Length;
        while (lo < hi)
        {
            int mid = (lo + hi) >>> 1;
            if (pulses.MidS(mid) >= t)
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

    /// <summary>Variance of the accelerometer's error stepping as each brake window starts: its
    /// scale error times the mean deceleration there, and what pitch compensation leaves.</summary>
    private double[] BrakeStepVariances(StepGrid steps, List<TimeWindow> braking)
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
            double scale = options.AccelScaleSigma * decel;
            result[i] = (scale * scale) + (options.BrakeBiasStepSigmaMps2 * options.BrakeBiasStepSigmaMps2);
        }

        return result;
    }

    private void ReportSlip(FusionResult fused, bool modelled)
    {
        if (!modelled || !fused.SlipKept)
        {
            return;
        }

        // Slip at half a g of drive: worth a word once it passes 0.3 %.
        double atHalfG = fused.Slip.Value * 0.5 * G0;
        if (Math.Abs(atHalfG) > 0.003)
        {
            warnings.Add($"the pulses show the tyre slipping by about {atHalfG * 100:F1} % at half a g of drive (a driven wheel?); distances and speeds are corrected for it");
        }
    }

    private FusionSettings Settings(StepGrid steps, double startS, double? stopS, List<TimeWindow> spin, List<TimeWindow> braking, double[]? slipSignal)
    {
        double[] grid = steps.TimeS;
        bool withAccel = accel != null;
        double inputDensity = 0;
        double thirdMean = 0;
        double thirdSigma;
        if (withAccel)
        {
            ForwardAcceleration a = accel!;
            double noise = options.AccelNoiseMps2 ?? a.MovingNoise(a.IndexAtOrAfter(startS), a.Count);
            inputDensity = (noise * noise * a.PeriodS * a.CorrelationFactor * a.CorrelationFactor) + options.AccelModelNoiseDensity;
            thirdSigma = Math.Sqrt((a.RestLevelSigmaMps2 * a.RestLevelSigmaMps2) + (options.BiasPriorMps2 * options.BiasPriorMps2));
        }
        else
        {
            thirdMean = kinematic is { } k && k.RampS == 0 ? k.AccelMps2 : 0;
            thirdSigma = Math.Max(2.0, kinematic?.AccelMps2 ?? 0);
        }

        double phaseMean = 0.5 * mpp;
        double phaseSigma = mpp / Math.Sqrt(12);
        if (!withAccel && kinematic is { } start)
        {
            // Without an accelerometer nothing but the early pulses' shape speaks to the phase.
            phaseMean = start.PhaseM;
            phaseSigma = Math.Min(start.PhaseSigmaM, phaseSigma);
        }
        double speed = 0;
        double speedSigma = 0;
        if (!Staged && pulses != null)
        {
            // Rolling start: distance 0 at the first observation, speed from the first pulses.
            phaseMean = pulses.Counts[0] * mpp;
            phaseSigma = Math.Max(options.ToothSpacingErrorFraction * mpp, 1e-4);
            int j = Math.Min(pulses.Length - 1, 4);
            speed = j > 0 ? (pulses.Counts[j] - pulses.Counts[0]) * mpp / Math.Max(pulses.MidS(j) - pulses.MidS(0), 1e-3) : 0;
            speedSigma = Math.Max(0.3 * speed, 0.5);
        }

        int stopIndex = int.MaxValue;
        if (stopS is { } s)
        {
            int i = Array.BinarySearch(grid, s);
            stopIndex = i >= 0 ? i : ~i;
        }

        return new FusionSettings
        {
            Mode = withAccel ? FusionMode.Accelerometer : FusionMode.Kinematic,
            GridS = grid,
            StepSpeedM = steps.StepSpeedM,
            StepDistanceM = steps.StepDistanceM,
            NoInput = steps.NoInput,
            StartS = startS,
            StartSpeedM = steps.StartSpeedM,
            StartDistanceM = steps.StartDistanceM,
            InitialSpeedMps = speed,
            InitialSpeedSigma = speedSigma,
            ThirdMean = thirdMean,
            ThirdSigma = thirdSigma,
            PhaseMean = phaseMean,
            PhaseSigma = phaseSigma,
            InputDensity = inputDensity,
            ThirdDensity = !withAccel ? options.JerkDensity : pulses is null ? options.AccelOnlyBiasWanderDensity : options.BiasWanderDensity,
            StopIndex = stopIndex,
            Pulses = pulses,
            MetresPerPulse = mpp,
            ToothSigmaM = options.ToothSpacingErrorFraction * mpp,
            EdgeJitterS = options.EdgeJitterS,
            SpinWindows = [.. spin],

            // Across a spin or slide the wheel may gain or lose any distance: the phase starts afresh.
            SpinPhaseVariance = 1e6,
            BrakeWindows = [.. braking],
            BrakeBiasStepVariance = BrakeStepVariances(steps, braking),
            BrakeThirdDensity = options.BrakeBiasWanderDensity,
            SlipSignal = slipSignal,
            SlipSigma = slipSignal is null ? 0 : options.WheelSlipSigma,
            SlipMinimum = options.WheelSlipMinimum,
        };
    }

    /// <remarks>The σ columns add what the filter cannot see: the pulses' own scale (an undriven
    /// tyre still slips a little under rolling resistance and the torque that spins it up, see
    /// <see cref="ReconstructionOptions.PulseScaleSigma"/>) or, without pulses, the
    /// accelerometer's (<see cref="ReconstructionOptions.AccelScaleSigma"/>), and, on a driven wheel, the part of the
    /// slip the linear slip law misses (<see cref="ReconstructionOptions.SlipModelError"/> of the
    /// correction). Both are systematic, so they grow with distance and speed.</remarks>
    private Trajectory MakeTrajectory(StepGrid steps, double startS, double? stopS, FusionResult fused, double[]? slipSignal)
    {
        double[] grid = steps.TimeS;
        int n = grid.Length;

        // The filter's arrays become the trajectory's (zeros before first motion already).
        double[] distance = fused.DistanceM;
        double[] speed = fused.SpeedMps;
        double[] sd = fused.DistanceSigmaM;
        double[] sv = fused.SpeedSigmaMps;
        var accelOut = new double[n];
        int k0 = FusionSmoother.FirstIndexAfter(grid, startS);
        double stop = stopS ?? double.PositiveInfinity;
        double previous = 0;
        for (int k = k0; k < n; k++)
        {
            bool atRest = grid[k] >= stop;

            // Distance never goes back, and stands still once the car is at rest.
            double d = atRest && k > k0 && grid[k - 1] >= stop ? previous : Math.Max(distance[k], previous);
            previous = d;
            distance[k] = d;
            speed[k] = atRest ? 0 : Math.Max(speed[k], 0);
            double scale = pulses is null ? options.AccelScaleSigma : options.PulseScaleSigma;
            double slipDistance = 0;
            double slipSpeed = 0;
            if (slipSignal != null && fused.SlipKept)
            {
                slipDistance = options.SlipModelError * Math.Abs(fused.Slip.Value) * slipSignal[k];
                double rate = k + 1 < n ? (slipSignal[k + 1] - slipSignal[k]) / (grid[k + 1] - grid[k]) : 0;
                slipSpeed = options.SlipModelError * Math.Abs(fused.Slip.Value) * rate;
            }

            double dSys = (scale * d) + slipDistance;
            double vSys = (scale * speed[k]) + slipSpeed;
            sd[k] = Math.Sqrt((sd[k] * sd[k]) + (dSys * dSys));
            sv[k] = atRest ? 0 : Math.Sqrt((sv[k] * sv[k]) + (vSys * vSys));
            if (atRest)
            {
                accelOut[k] = 0;
            }
            else if (accel != null)
            {
                // Mean input over the steps either side of the grid point, less the bias.
                double before = k > 0 ? steps.StepSpeedM[k - 1] / (grid[k] - grid[k - 1]) : 0;
                double after = k + 1 < n ? steps.StepSpeedM[k] / (grid[k + 1] - grid[k]) : before;
                accelOut[k] = (k > 0 ? 0.5 * (before + after) : after) - fused.Third[k];
            }
            else
            {
                accelOut[k] = fused.Third[k];
            }
        }

        if (accel != null && n > k0)
        {
            // The input is noisy from sample to sample; report a centred mean over about 10 ms.
            double step = (grid[^1] - grid[k0]) / Math.Max(n - 1 - k0, 1);
            int half = Math.Max(1, (int)Math.Round(0.005 / Math.Max(step, 1e-6)));
            var smooth = new double[n];
            double sum = 0;
            int lo = k0;
            int hi = k0 - 1;
            for (int k = k0; k < n; k++)
            {
                int wantLo = Math.Max(k0, k - half);
                int wantHi = Math.Min(n - 1, k + half);
                while (hi < wantHi)
                {
                    hi++;
                    sum += accelOut[hi];
                }

                while (lo < wantLo)
                {
                    sum -= accelOut[lo];
                    lo++;
                }

                smooth[k] = grid[k] >= stop ? 0 : sum / (hi - lo + 1);
            }

            accelOut = smooth;
        }

        return new Trajectory
        {
            TimeS = grid,
            DistanceM = distance,
            SpeedMps = speed,
            AccelMps2 = accelOut,
            DistanceSigmaM = sd,
            SpeedSigmaMps = sv,
        };
    }

    private (Estimate? Time, Estimate? Speed) Rollout(Trajectory trajectory, double startS)
    {
        double[] t = trajectory.TimeS;
        double[] d = trajectory.DistanceM;
        double[] v = trajectory.SpeedMps;
        double[] sd = trajectory.DistanceSigmaM!;
        double[] sv = trajectory.SpeedSigmaMps!;
        int k0 = Math.Max(1, FusionSmoother.FirstIndexAfter(t, startS));
        for (int k = k0; k < t.Length; k++)
        {
            if (d[k] < rolloutM)
            {
                continue;
            }

            double f = d[k] > d[k - 1] ? (rolloutM - d[k - 1]) / (d[k] - d[k - 1]) : 1;
            double time = t[k - 1] + (f * (t[k] - t[k - 1]));
            double speed = v[k - 1] + (f * (v[k] - v[k - 1]));
            double sigmaD = sd[k - 1] + (f * (sd[k] - sd[k - 1]));
            double sigmaV = sv[k - 1] + (f * (sv[k] - sv[k - 1]));
            return (new Estimate(time, sigmaD / Math.Max(speed, 1e-3)), new Estimate(speed, sigmaV));
        }

        return (null, null);
    }

    private void CheckFirmwareRollout(Estimate? ours, Estimate? speed)
    {
        double? firmware = run.FirmwareRolloutS ?? run.Events.FirstOrDefault(e => e.Kind == EventKind.Rollout)?.TimeS;
        if (firmware is not { } fw || ours is not { } o || !Staged)
        {
            return;
        }

        double pulseTime = speed is { } s && s.Value > 0.05 && mpp > 0 ? mpp / s.Value : 0;
        double tolerance = options.FirmwareRolloutToleranceS + (3 * o.Sigma) + pulseTime;
        double gap = fw - o.Value;
        if (Math.Abs(gap) > tolerance)
        {
            warnings.Add($"the box's own rollout mark is {gap * 1e3:F1} ms {(gap > 0 ? "later" : "earlier")} than ours (tolerance {tolerance * 1e3:F1} ms)");
        }
    }

    private void AddModeWarnings(Trajectory trajectory, Estimate firstMotion, double? stopS)
    {
        if (pulses is null && accel != null)
        {
            double[] t = trajectory.TimeS;
            int k = FusionSmoother.FirstIndexAfter(t, firstMotion.Value + 10);
            k = Math.Min(k, t.Length - 1);
            warnings.Add(stopS is null
                ? $"accelerometer only: speed and distance come from integrating acceleration and drift; after {t[k] - firstMotion.Value:F1} s they are uncertain by ±{trajectory.SpeedSigmaMps![k]:F2} m/s and ±{trajectory.DistanceSigmaM![k]:F1} m"
                : $"accelerometer only: speed and distance come from integrating acceleration and drift; the car taken to be at rest at the end pins the drift down, leaving ±{MaxOf(trajectory.SpeedSigmaMps!):F2} m/s at worst");
        }

        if (accel is null && pulses != null && Staged)
        {
            warnings.Add($"no accelerometer: first motion is back-extrapolated from the first pulses (±{firstMotion.Sigma * 1e3:F0} ms)");
        }

        if (stopS is null && pulses != null)
        {
            warnings.Add("the run has no known stop: the speed is not brought to zero at its end");
        }

    }

    private static double MaxOf(double[] values)
    {
        double max = 0;
        foreach (double v in values)
        {
            max = Math.Max(max, v);
        }

        return max;
    }

    private static Estimate MeanBias(double[] grid, double startS, double? stopS, FusionResult fused)
    {
        double sum = 0;
        double sigma = 0;
        int count = 0;
        double stop = stopS ?? double.PositiveInfinity;
        for (int k = FusionSmoother.FirstIndexAfter(grid, startS); k < grid.Length && grid[k] < stop; k++)
        {
            sum += fused.Third[k];
            sigma += fused.ThirdSigma[k];
            count++;
        }

        return count == 0 ? new Estimate(0, 0) : new Estimate(sum / count, sigma / count);
    }

    private static double? Min(double? a, double? b) => a is null ? b : b is null ? a : Math.Min(a.Value, b.Value);
}
