using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Analysis;

/// <summary>The whole host-side flow for one run: reconstruction → figures → braking.</summary>
public static class RunAnalyzer
{
    /// <summary>Analyses one run.</summary>
    /// <exception cref="AnalysisException">The run holds too little to reconstruct (no motion).</exception>
    public static RunAnalysis Analyze(DecodedRun run, AnalysisOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(run);
        options ??= AnalysisOptions.Default;
        ReconstructionOptions reconstructionOptions = options.RolloutM is { } rollout
            ? options.Reconstruction with { RolloutM = rollout }
            : options.Reconstruction;
        reconstructionOptions = reconstructionOptions with { BrakeSlip = options.BrakeSlip };
        if (options.Calibration is { CircumferenceM: > 0 and { } circumference, CircumferenceSigmaM: { } circumferenceSigma })
        {
            // A measured circumference brings its own σ in place of the static value's.
            reconstructionOptions = reconstructionOptions with { CircumferenceSigmaFraction = circumferenceSigma / circumference };
        }
        else if (options.Calibration is { CircumferenceM: null, StaticCircumferenceM: > 0 })
        {
            // A static circumference (applied to the run as its configured one): a loaded tyre
            // rolls on a little less and grows with speed, as a typical tyre does.
            reconstructionOptions = reconstructionOptions with
            {
                RollingOverToldCircumference = TyrePrior.RollingOverStatic,
                TyreGrowthAt30Mps = TyrePrior.GrowthAt30Mps,
            };
        }
        if (options.Calibration is { AccelForwardScale: > 0 and { } accelScale, AccelForwardScaleSigma: { } accelScaleSigma })
        {
            // A calibrated forward axis: its scale is divided out, and the pulses' scale is measured against it.
            reconstructionOptions = reconstructionOptions with { AccelScaleCalibration = new Estimate(accelScale, accelScaleSigma) };
        }

        if (options.Calibration is { PickupWheel: { } pickupWheel })
        {
            // The user said which wheel carries the pickup (pulses only: the launch slip).
            reconstructionOptions = reconstructionOptions with { PickupWheel = pickupWheel };
        }

        if (options.Calibration is { } settings && ToothGaps.From(settings) is { } gaps && gaps.Spacing.Count == run.Configuration.PulsesPerRevolution)
        {
            // A saved map of the ring: the reconstruction turns it to the run and says whether it could.
            reconstructionOptions = reconstructionOptions with { SavedToothGaps = gaps };
        }

        if (options.BrakeSwitchDelayS is null && options.Calibration is { BrakeSwitchDelayS: { } switchDelay } measuredSwitch)
        {
            // A switch delay measured on the bench and saved with the car's settings.
            options = options with { BrakeSwitchDelayS = switchDelay, BrakeSwitchDelaySigmaS = measuredSwitch.BrakeSwitchDelaySigmaS ?? options.BrakeSwitchDelaySigmaS };
        }

        ReconstructedRun reconstruction;
        try
        {
            reconstruction = Reconstructor.Reconstruct(run, reconstructionOptions);
        }
        catch (InvalidOperationException e)
        {
            throw new AnalysisException($"{run.Source}: {e.Message}", e);
        }

        Estimate[] brakeOn = BrakeSwitchOnsets(run, reconstruction, options);
        // The stop is timed on the accelerometer's own samples, on the clock the reconstruction
        // matched them to (a plain-text file's clock slides by its drift: 6 ms after a minute).
        (double[], double[])? rawAccel = run.Accel is { Count: > 0 } accel ? (OnPulseClock(accel.TimeS, reconstruction.AccelClockShiftS), accel.ForwardMps2) : null;
        BrakingResult? braking = BrakingAnalyzer.Analyze(reconstruction.Trajectory, brakeOn, options.StopFromMps, rawAccel, PulsePositionSigma(run, reconstruction, reconstructionOptions), [.. reconstruction.BrakingSlideWindows, .. reconstruction.WheelspinWindows], options.BrakeSlip, reconstruction.BrakeSlipDistanceM, reconstruction.BrakeSlipPerMps2, options.BrakeSwitchDelayS is null ? BrakeSwitchTiming.DelaySpanS : 0);

        // Nothing reached after brake onset is an acceleration figure.
        double? onset = braking?.OnsetS.Value;
        FigureSet figures = FigureCalculator.Compute(reconstruction.Trajectory, reconstruction.FirstMotionS, reconstruction.RolloutM, options.Figures, reconstruction.Staged, onset);
        GradeEstimate? grade = reconstruction.RestingPitchRad is { } pitch && reconstruction.Staged
            ? GradeEstimate.FromRest(pitch, options.Calibration?.MountingPitchDeg * Math.PI / 180, (options.Calibration?.MountingPitchSigmaDeg ?? 0) * Math.PI / 180)
            : null;
        // Level-corrected figures only from a calibrated mounting: an uncalibrated box's pitch is
        // mostly its own tilt and bias, and "correcting" for it would move figures by seconds.
        FigureSet? level = grade is { MountingCalibrated: true } g
            ? FigureCalculator.Compute(LevelCorrection.ToLevel(reconstruction.Trajectory, reconstruction.FirstMotionS.Value, g.AngleRad), reconstruction.FirstMotionS, reconstruction.RolloutM, options.Figures, reconstruction.Staged, onset)
            : null;
        FigureSet? standardAir = options.Weather is { } w ? WeatherCorrection.Apply(figures, w.CorrectionFactor) : null;
        return new RunAnalysis
        {
            Run = run,
            Reconstruction = reconstruction,
            Figures = figures,
            Braking = braking,
            Warnings = run.Warnings.Concat(reconstruction.Warnings).Concat(NotClearlyReachedNotes(figures)).Distinct().ToList(),
            Grade = grade,
            LevelFigures = level,
            StandardAirFigures = standardAir,
        };
    }

    /// <summary>A note for each interval crossed but not clearly passed, so a user sees why it is blank.</summary>
    private static IEnumerable<string> NotClearlyReachedNotes(FigureSet figures) =>
        figures.NotClearlyReached.Select(d => FormattableString.Invariant(
            $"{d.Interval.Label} not timed: the speed went only to {d.TopMps / Units.MpsPerMph:0.0} mph ({d.TopMps / Units.MpsPerKmh:0.0} km/h), within 2σ (σ {d.SigmaMps / Units.MpsPerKmh:0.00} km/h) of the interval's end, so the data cannot show the end speed was reached"));

    /// <summary>The sample times <paramref name="timeS"/> moved by <paramref name="shiftS"/> (a copy), or as they are when it is 0.</summary>
    private static double[] OnPulseClock(double[] timeS, double shiftS) =>
        shiftS == 0 ? timeS : [.. timeS.Select(t => t + shiftS)];

    /// <summary>The pedal's first movement at each closing of the brake switch: the event's time,
    /// less the loop's lag (from the gap the event records, or from the run's brackets) and the
    /// switch's delay (measured, or the prior).</summary>
    private static Estimate[] BrakeSwitchOnsets(DecodedRun run, ReconstructedRun reconstruction, AnalysisOptions options)
    {
        RunEvent[] closings = run.Events.Where(e => e.Kind == EventKind.BrakeOn).ToArray();
        if (closings.Length == 0)
        {
            return [];
        }

        // The run's brackets are gone through only for a closing whose event has no gap (older logs).
        Estimate? loopLag = null;
        return closings.Select(e => BrakeSwitchTiming.Onset(
            e.TimeS,
            e.Values is [> 0 and var gapMicros]
                ? BrakeSwitchTiming.LagOfGap(gapMicros * 1e-6)
                : loopLag ??= BrakeSwitchTiming.LagOfLoop(reconstruction.DistanceChannel == 1 ? run.SecondPulses : run.Pulses),
            options.BrakeSwitchDelayS,
            options.BrakeSwitchDelaySigmaS)).ToArray();
    }

    /// <summary>1-σ of one pulse observation's position near the end of the run, m: the tooth
    /// spacing error, and the top speed times the median bracket width (uniform: /√12).</summary>
    private static double PulsePositionSigma(DecodedRun run, ReconstructedRun reconstruction, ReconstructionOptions options)
    {
        IReadOnlyList<PulseRecord> pulses = reconstruction.DistanceChannel == 1 ? run.SecondPulses : run.Pulses;
        double mpp = reconstruction.DistanceChannel == 1 ? run.Configuration.SecondMetresPerPulse : run.Configuration.MetresPerPulse;
        if (pulses.Count < 3 || !(mpp > 0))
        {
            return 0;
        }

        double[] widths = pulses.Skip(pulses.Count / 2).Select(p => p.WidthS).Order().ToArray();
        double width = widths[widths.Length / 2];
        double speed = reconstruction.Trajectory.SpeedMps.Max();
        double tooth = options.ToothSpacingErrorFraction * mpp;
        double bracket = speed * width / Math.Sqrt(12);
        return Math.Sqrt((tooth * tooth) + (bracket * bracket));
    }
}
