using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>One reconstruction, step by step; see <see cref="Reconstructor"/>.</summary>
internal sealed partial class ReconstructionPass
{
    private readonly DecodedRun run;
    private readonly ReconstructionOptions options;
    private readonly RunConfiguration configuration;
    private readonly List<string> warnings = [];
    private readonly double rolloutM;
    private double mpp;
    private readonly PulseChannel? pulses;
    private readonly int channel;
    private readonly string? channelNote;
    private ForwardAcceleration? accel;
    private AccelRest? accelRest;
    private readonly double? motionHintS;
    private readonly StartMotion? opening;
    private bool staged;
    private Estimate? accelOpeningSpeed;

    private double[] accelInput = [];
    private double pitchRad;
    private double pitchSigmaRad;
    private AccelOnset? onset;
    private double? accelClockOffsetSigmaS;
    private double accelClockShiftS;
    private KinematicStart? kinematic;
    private double circumferenceSigma;
    private RollingScale? rollingScale;
    private double growthSigma;
    private double growthCorrelation;
    private double[]? pulseGrowthM;
    private double finalRestFromS = double.PositiveInfinity;
    private readonly double[]? toothOffsets;

    public ReconstructionPass(DecodedRun run, ReconstructionOptions options)
    {
        this.run = run;
        this.options = options;
        configuration = run.Configuration;
        rolloutM = options.RolloutM ?? (configuration.RolloutM > 0 ? configuration.RolloutM : 0.3048);
        DistanceChannel distance = ChannelSetup.Choose(run, options);
        (pulses, mpp, channel, channelNote, toothOffsets) = (distance.Pulses, distance.MetresPerPulse, distance.Index, distance.ChoiceNote, distance.ToothOffsets);
        warnings.AddRange(distance.Warnings);
        accel = options.UseAccelerometer ? ForwardAcceleration.From(run.Accel) : null;
        motionHintS = run.FirmwareMotionS ?? run.Events.FirstOrDefault(e => e.Kind == EventKind.Motion)?.TimeS;

        // Motion at the record's start is estimated, never assumed: the box's staged flag says
        // only that it once saw rest, not that the record holds it.
        opening = pulses is null ? null : StartMotion.Estimate(pulses, mpp, distance.StartNoiseM);
        staged = configuration.Staged && opening is not { Moving: true };
    }

    /// <summary>True when a rest was seen before the motion (the box was staged and the first
    /// pulses do not show the car already moving).</summary>
    private bool Staged => staged;

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
                Staged = Staged,
            };
        }

        string method = pulses is null ? ReconstructionMethod.AccelerometerOnly
            : accel is null ? ReconstructionMethod.PulsesOnly
            : ReconstructionMethod.PulsesAndAccelerometer;

        if (accel != null)
        {
            PreparedAccel prepared = AccelSetup.Prepare(new AccelSetupInputs
            {
                Accel = accel,
                Pulses = pulses,
                MetresPerPulse = mpp,
                MotionHintS = motionHintS,
                Staged = Staged,
                Opening = opening,
                StoppedEvent = run.Events.Any(e => e.Kind == EventKind.Stopped),
                RestGravityMilliG = run.RestGravityMilliG,
                ForwardAxis = configuration.ForwardAxis,
                ForwardAxisReversed = configuration.ForwardAxisReversed,
                Options = options,
            });
            warnings.AddRange(prepared.Warnings);
            (accelRest, onset, pitchRad, pitchSigmaRad, accelInput, finalRestFromS) = (prepared.Rest, prepared.Onset, prepared.PitchRad, prepared.PitchSigmaRad, prepared.InputMps2, prepared.FinalRestFromS);
            if (pulses != null && Staged && onset is { } o && AccelClockAlignment.Align(new AccelClockInputs
            {
                Accel = accel,
                Rest = prepared.Rest,
                InputMps2 = accelInput,
                PitchRad = pitchRad,
                Onset = o,
                Pulses = pulses,
                MetresPerPulse = mpp,
                PriorOffsetSigmaS = TimeAxisOffsetSigma(o.TimeS),
                Options = options,
            }) is { } matched)
            {
                (accel, onset, accelClockShiftS, accelClockOffsetSigmaS) = (matched.Accel, matched.Onset, matched.ShiftS, matched.OffsetSigmaS);
                warnings.Add(matched.Note);
            }

            if (pulses is null && staged && AccelOpeningSpeed.Find(new AccelOpeningSpeedInputs
            {
                Accel = accel,
                Rest = prepared.Rest,
                InputMps2 = accelInput,
                StopS = FindStop(accel.TimeS[0], accel.TimeS[^1]),
                Options = options,
            }) is { } v0)
            {
                staged = false;
                accelOpeningSpeed = v0;
                onset = null;
            }
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
        WheelWindows windows = WheelWindowFinder.Find(new WheelWindowInputs
        {
            Steps = steps,
            Pulses = pulses,
            MetresPerPulse = mpp,
            AccelTimeS = accel?.TimeS,
            AccelInputMps2 = accelInput,
            Staged = Staged,
            StartS = firstMotion.Value,
            StopS = stopS,
            EndS = stopS ?? endOfData,
            StartSpeedMps = Staged ? 0 : opening?.SpeedMps.Value ?? accelOpeningSpeed?.Value ?? 0,
            Options = options,
        });
        List<TimeWindow> braking = windows.Slides;
        double brakeSlide = windows.LargestBehindFraction;
        int warningsBeforeSpin = warnings.Count;
        List<TimeWindow> spin = windows.Spin;
        List<TimeWindow> spinPastPeak = windows.PastPeak;
        warnings.AddRange(windows.SpinWarnings);
        int spinWarnings = windows.SpinWarnings.Count;
        if (channelNote != null)
        {
            warnings.Add(channelNote);
        }

        double[]? slipSignal = windows.DriveSlipSignal;
        FusionResult fused = FusionSmoother.Run(Settings(steps, firstMotion.Value, stopS, spin, windows, slipSignal));
        if (pulses != null && accel != null && Staged
            && (fused.Outliers > 0.25 * pulses.Length || (fused.SlipKept && Math.Abs(fused.Slip.Value) * 0.5 * Units.StandardGravity > 0.15)))
        {
            // The wheel slips too much, too unevenly, for the slip model: let the accelerometer
            // carry the distance while there is drive, and the pulses only where there is none.
            // The spin and slide notes of the first pass measured against a baseline the spin itself set.
            warnings.RemoveRange(warningsBeforeSpin, spinWarnings);
            warnings.Add("the pulses run far ahead of the accelerometer for much of the run (sustained wheelspin on a driven wheel?): distance under drive comes from the accelerometer, the pulses are used only while coasting and braking");
            spin = new DriveForceWindows(steps, options).DriveWindows(firstMotion.Value, stopS);
            // Slip beyond the slip model for much of the run counts against the run as a whole.
            spinPastPeak = spin;
            slipSignal = null;
            fused = FusionSmoother.Run(Settings(steps, firstMotion.Value, stopS, spin, windows, slipSignal));
        }

        if (pulses != null && options.TyreGrowthAt30Mps != 0)
        {
            // The tread's typical growth with speed, told for a static circumference: the distance
            // per pulse follows it at the first pass's speeds.
            pulseGrowthM = RollingScaleMeasure.GrowthDistances(pulses, mpp, steps.TimeS, fused.SpeedMps, options.TyreGrowthAt30Mps);
            fused = FusionSmoother.Run(Settings(steps, firstMotion.Value, stopS, spin, windows, slipSignal));
        }

        circumferenceSigma = options.CircumferenceSigmaFraction;
        growthSigma = options.TyreGrowthSigmaAt30Mps;
        RollingScaleMeasurement? scaled = RollingScaleMeasure.Measure(new RollingScaleInputs
        {
            Steps = steps,
            StartS = firstMotion.Value,
            StopS = stopS,
            Spin = spin,
            Slides = braking,
            Pulses = pulses,
            MetresPerPulse = mpp,
            Staged = Staged,
            Opening = opening,
            AccelEndS = accel?.TimeS[^1],
            AccelRestLevelSigmaMps2 = accelRest?.LevelSigmaMps2 ?? 0,
            InputDensity = accel is null ? 0 : accel.InputDensity(accelRest!, firstMotion.Value, options),
            FinalRestFromS = finalRestFromS,
            SlipKept = fused.SlipKept,
            SlipToldApart = SlipToldApart(fused),
            FirstPassSpeedMps = fused.SpeedMps,
            Options = options,
        });
        if (scaled is not null)
        {
            // The distance per pulse rescaled, σ the fit's in place of the prior's.
            rollingScale = scaled.ScaleMeasured ? scaled.Fit : rollingScale;
            mpp = scaled.MetresPerPulse;
            circumferenceSigma = scaled.CircumferenceSigma;
            if (scaled.Growth is { } growth)
            {
                (growthSigma, growthCorrelation, pulseGrowthM) = (growth.Sigma, growth.ScaleCorrelation, growth.PulseGrowthM);
            }

            warnings.Add(scaled.Note);
            fused = FusionSmoother.Run(Settings(steps, firstMotion.Value, stopS, spin, windows, slipSignal));
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

        Trajectory trajectory = MakeTrajectory(steps, firstMotion.Value, stopS, spin, fused, slipSignal);
        (Estimate? rolloutTime, Estimate? rolloutSpeed) = EventFinder.Rollout(trajectory, firstMotion.Value, rolloutM);
        warnings.AddRange(EventFinder.ModeWarnings(trajectory, firstMotion, stopS, pulses != null, accel != null, Staged));

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
            RestingForwardMps2 = accelRest is { } level ? new Estimate(level.LevelMps2, level.LevelSigmaMps2) : null,
            FirstPulseDistanceM = pulses is null || !Staged ? null : new Estimate(mpp - fused.PhaseM.Value, fused.PhaseM.Sigma),
            StopS = stopS,
            AccelOnlyFirstFoot = AccelFirstFoot(steps, firstMotion.Value),
            AccelClockShiftS = accelClockShiftS,
            WheelspinWindows = spin,
            LaunchSpinWindows = windows.LaunchSpin,
            PulseSpinWindows = windows.PulseSpin,
            SpinPastPeakWindows = spinPastPeak,
            SlipSwing = windows.Swing,
            BrakingSlideWindows = braking,
            WheelSlipPerMps2 = slipSignal is null ? null : fused.SlipKept ? fused.Slip : new Estimate(0, 0),
            DrivenWheel = slipSignal is not null && TakenAsDriven(fused),
            BrakeSlipPerMps2 = windows.BrakeSlipSignal is null ? null : fused.BrakeSlip,
            BrakeSlipDistanceM = SlipDistanceWherePulsesCount(grid, windows.BrakeSlipSignal, fused.BrakeSlip.Value, [.. spin, .. braking]),
            DistanceChannel = channel,
            Staged = Staged,
            StartSpeedMps = Staged ? null : opening is { } s ? new Estimate(s.SpeedMps.Value * MeasuredScale, s.SpeedMps.Sigma * MeasuredScale) : accelOpeningSpeed,
            RollingScale = rollingScale is { } measured
                ? new Estimate(measured.Scale.Value * options.RollingOverToldCircumference, measured.Scale.Sigma * options.RollingOverToldCircumference)
                : null,
        };
    }

    /// <summary>The measured rolling over told scale, 1 until measured.</summary>
    private double MeasuredScale => rollingScale?.Scale.Value ?? 1;

    /// <summary>k_b·S_b accumulated only where the pulses were used: inside a spin or slide the
    /// pulses were set aside and the phase started afresh after it, so nothing was added there.</summary>
    private static double[]? SlipDistanceWherePulsesCount(double[] grid, double[]? signal, double coefficient, List<TimeWindow> setAside)
    {
        if (signal is null)
        {
            return null;
        }

        var result = new double[grid.Length];
        for (int k = 1; k < grid.Length; k++)
        {
            double mid = 0.5 * (grid[k - 1] + grid[k]);
            bool aside = setAside.Any(w => w.Contains(mid));
            result[k] = result[k - 1] + (aside ? 0 : coefficient * (signal[k] - signal[k - 1]));
        }

        return result;
    }
}
