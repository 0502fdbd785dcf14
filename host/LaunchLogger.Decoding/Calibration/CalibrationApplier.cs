using LaunchLogger.Decoding.Runs;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Calibration;

/// <summary>Applies calibration settings to a decoded run before reconstruction: a pure
/// transformation that returns a new run and leaves the input as it was.</summary>
/// <remarks>
/// <para>Applied: the rolling circumference, which replaces the configured one and with it the
/// distance per pulse of the distance channel (the second channel, on another wheel, keeps its
/// own), or else a static circumference, which does the same and which <see cref="Analysis.RunAnalyzer"/>
/// then reads as a static one (<see cref="TyrePrior"/>). A note in the run's warnings says what changed.</para>
/// <para>Applied by <see cref="Analysis.RunAnalyzer"/> through the reconstruction's options, not
/// here: the accelerometer's forward scale (<see cref="CalibrationSettings.AccelForwardScale"/>),
/// which divides the forward input and lets a standing start measure the pulses' scale; and the
/// brake switch's measured delay (<see cref="CalibrationSettings.BrakeSwitchDelayS"/>), which
/// times each stop's onset from the switch alone; and which wheel carries the pickup
/// (<see cref="CalibrationSettings.PickupWheel"/>), which decides a pulses-only launch's slip.</para>
/// <para>Not applied here: the mounting pitch, which the grade estimate subtracts from the
/// resting pitch (<see cref="CalibrationSettings.MountingPitchRad"/>), and the yaw. The
/// tooth-spacing map goes to the reconstruction (<see cref="ToothGaps"/>), which turns it to the
/// run's ring and places each edge by it; here only a map of another pickup (its length not the
/// run's pulses per revolution) is noted. The box's own first-motion and rollout marks stay as
/// the box logged them, with its configured circumference.</para>
/// </remarks>
public static class CalibrationApplier
{
    /// <summary>The run with <paramref name="settings"/> applied; the same instance when the
    /// settings hold nothing that applies to runs.</summary>
    public static DecodedRun Apply(DecodedRun run, CalibrationSettings settings)
    {
        ArgumentNullException.ThrowIfNull(run);
        ArgumentNullException.ThrowIfNull(settings);
        RunConfiguration configuration = run.Configuration;
        var notes = new List<string>();
        bool rolled = settings.CircumferenceM is not null;
        if ((settings.CircumferenceM ?? settings.StaticCircumferenceM) is { } circumference)
        {
            if (configuration.PulsesPerRevolution > 0)
            {
                double old = configuration.CircumferenceM;
                string change = old > 0 ? Invariant($" ({(circumference / old) - 1:+0.00%;-0.00%;0.00%})") : "";
                notes.Add(rolled
                    ? Invariant($"calibration: rolling circumference {circumference:0.00000} m from the settings replaces the configured {old:0.00000} m{change}")
                    : Invariant($"calibration: static circumference {circumference:0.00000} m from the settings replaces the configured {old:0.00000} m{change}; the tyre is taken to roll on {(1 - TyrePrior.RollingOverStatic) * 100:0.#} % less ± {new Reconstruction.ReconstructionOptions().CircumferenceSigmaFraction * 100:0.#} % and to grow by {TyrePrior.GrowthAt30Mps * 100:0.##} % at 30 m/s (measure it by rolling: hardware-notes/calibration.md §1)"));
                configuration = configuration with
                {
                    CircumferenceM = circumference,
                    MetresPerPulse = circumference / configuration.PulsesPerRevolution,
                };
            }
            else
            {
                notes.Add("calibration: the settings' circumference was not applied: the input does not say how many pulses make a revolution (give --pulses-per-rev)");
            }
        }

        if (settings.ToothSpacing is { } map && map.Count != configuration.PulsesPerRevolution)
        {
            notes.Add(Invariant($"calibration: the settings' tooth-spacing map has {map.Count} entries but the run has {configuration.PulsesPerRevolution} pulses per revolution; it does not belong to this pickup and is not applied"));
        }

        if (notes.Count == 0)
        {
            return run;
        }

        // A copy of everything else: a property added to the run later is carried over too.
        return run with { Configuration = configuration, Warnings = [.. run.Warnings, .. notes] };
    }
}
