using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>One run after reconstruction: the car's trajectory from just before first motion to
/// the end of the run, first motion and the rollout mark with their uncertainties, and what the
/// reconstruction had to assume or noticed on the way.</summary>
/// <remarks>Times are on the input's own axis. <see cref="Trajectory"/> distances start at 0 at
/// <see cref="FirstMotionS"/>; its σ columns are conditional on that time (figures timed from
/// standstill add <see cref="FirstMotionS"/>'s σ themselves).</remarks>
public sealed class ReconstructedRun
{
    /// <summary>The input.</summary>
    public required DecodedRun Source { get; init; }

    /// <summary>Distance, speed and acceleration with 1-σ columns.</summary>
    public required Trajectory Trajectory { get; init; }

    /// <summary>First motion, seconds on the input's axis, with its 1 σ.</summary>
    public required Estimate FirstMotionS { get; init; }

    /// <summary>When the distance from standstill reached <see cref="RolloutM"/>, seconds, with
    /// its 1 σ; null when the run never got that far.</summary>
    public Estimate? RolloutTimeS { get; init; }

    /// <summary>Speed at the rollout mark, m/s, with its 1 σ; null with <see cref="RolloutTimeS"/>.</summary>
    public Estimate? RolloutSpeedMps { get; init; }

    /// <summary>The rollout distance used, metres.</summary>
    public required double RolloutM { get; init; }

    /// <summary>How the run was reconstructed: one of the <see cref="ReconstructionMethod"/> names.</summary>
    public required string Method { get; init; }

    /// <summary>What the reader should know about this reconstruction, one sentence each.</summary>
    public required IReadOnlyList<string> Warnings { get; init; }

    /// <summary>Forward accelerometer bias left after removing the resting level, averaged over
    /// the moving part of the run, m/s²; null without an accelerometer.</summary>
    public Estimate? AccelBiasMps2 { get; init; }

    /// <summary>The resting pitch used to remove gravity from the forward axis, radians (nose
    /// up positive); null without an accelerometer.</summary>
    public Estimate? RestingPitchRad { get; init; }

    /// <summary>The forward axis' resting reading removed as gravity leakage, m/s²; null without
    /// an accelerometer.</summary>
    public Estimate? RestingForwardMps2 { get; init; }

    /// <summary>Distance from standstill at which the pulse count first reached 1, metres (the
    /// pickup's unknown starting phase, estimated); null without pulses.</summary>
    public Estimate? FirstPulseDistanceM { get; init; }

    /// <summary>When the car came to rest at the end, seconds; null when the run has no known stop.</summary>
    public double? StopS { get; init; }

    /// <summary>The pickup wheel's longitudinal slip per m/s² of drive (slip ratio ÷ drive force
    /// per unit mass), s²/m, as the fusion estimated it: about 0.002–0.008 on a driven wheel; 0
    /// (σ 0) when too small to tell from no slip, as on an undriven wheel. Null when not
    /// estimated (no accelerometer or no pulses).</summary>
    public Estimate? WheelSlipPerMps2 { get; init; }

    /// <summary>True when the distance's wheel is taken as one that passes drive: not told
    /// undriven (<see cref="ReconstructionOptions.PickupWheel"/>) and its slip coefficient found
    /// above an undriven wheel's, whether or not the filter kept it (where
    /// <see cref="WheelSlipPerMps2"/> reads 0, σ 0); a wheel told driven needs the same evidence. Only such a wheel has a grip peak for a slip
    /// swing to cross (<see cref="SlipSwing"/>). False without an accelerometer and pulses.</summary>
    public bool DrivenWheel { get; init; }

    /// <summary>The pickup wheel's slip under braking per m/s² of deceleration, 1/(g0·C), s²/m,
    /// as the fusion estimated it from the pulses against the accelerometer (prior: the tyres'
    /// stiffness range). Null when not modelled (no accelerometer or no pulses, or told that the
    /// wheel does not slip). The stop takes it where its σ is well under the prior's
    /// (<see cref="Braking.BrakingAnalyzer.MeasuredSlipShare"/>), with a model allowance
    /// (<see cref="Braking.BrakingAnalyzer.MeasuredSlipModelShare"/>).</summary>
    public Estimate? BrakeSlipPerMps2 { get; init; }

    /// <summary>What the fusion added to the pulses' distance for the braked wheel's slip,
    /// <see cref="BrakeSlipPerMps2"/> × ∫ v·max(−a, 0) dt, m, on the trajectory's grid: the
    /// trajectory less this is the distance the pulses gave. Null when not modelled.</summary>
    public double[]? BrakeSlipDistanceM { get; init; }

    /// <summary>True when a rest was seen before the motion, so that standing-start figures exist:
    /// the box was staged and the first pulses do not show the car already moving. False for a
    /// record that opens moving (a box armed while rolling, a restart mid-drive, a plain-text
    /// input cut from a drive).</summary>
    public bool Staged { get; init; } = true;

    /// <summary>Speed at the first pulse observation, m/s, with its σ, when the record opened
    /// moving; null for a staged run.</summary>
    public Estimate? StartSpeedMps { get; init; }

    /// <summary>The pulses' scale measured from the launch against a calibrated accelerometer:
    /// rolling over told distance per pulse with its 1 σ, already applied to distance and speed;
    /// null when not measured (no accelerometer calibration, no standing start with both sensors,
    /// a driven wheel that slips, or too few pulses).</summary>
    public Estimate? RollingScale { get; init; }

    /// <summary>How far the accelerometer's samples were moved onto the pulses' clock, s (added to
    /// the run's own sample times, which stay as read): the match over the launch of a plain-text
    /// file's samples, whose clock runs apart from the pulses'; 0 when not matched (a log's samples
    /// carry the box's clock).</summary>
    public double AccelClockShiftS { get; init; }

    /// <summary>The pulse channel used for distance: 0, or 1 when the second channel turned less
    /// under drive (the undriven wheel).</summary>
    public int DistanceChannel { get; init; }

    /// <summary>The accelerometer's own distance from first motion where it first reaches one
    /// foot, at a time on the run's clock, with the σ the launch-slip allowance gives it (bias and
    /// scale); null without an accelerometer or a standstill. A check on that σ against a truth.</summary>
    public AccelDistanceCheck? AccelOnlyFirstFoot { get; init; }

    /// <summary>Stretches where the pulses ran ahead of the accelerometer (wheelspin) and were
    /// not trusted for distance.</summary>
    public IReadOnlyList<TimeWindow> WheelspinWindows { get; init; } = [];

    /// <summary>The part of <see cref="WheelspinWindows"/> the verdict counts: where the pulses ran
    /// ahead by more than a tyre slips at its grip peak, beyond their σ
    /// (<see cref="WheelspinDetector.BeyondPeak"/>), or fell behind; a lead within the peak's slip
    /// sets the pulses aside for distance but is no spin.</summary>
    public IReadOnlyList<TimeWindow> SpinPastPeakWindows { get; init; } = [];

    /// <summary>Whether the driven wheel's slip swung to and fro through the launch
    /// (<see cref="SlipSwingTest"/>); null where it was not looked for.</summary>
    public SlipSwing? SlipSwing { get; init; }

    /// <summary>Stretches near standstill where the pulses counted more than the accelerometer's
    /// distance by more than a tyre slips at its grip peak (spin at the launch,
    /// <see cref="WheelspinDetector.FindAtLaunch"/>). The pulses there were kept: this weighs on
    /// the verdict, not on the figures.</summary>
    public IReadOnlyList<TimeWindow> LaunchSpinWindows { get; init; } = [];

    /// <summary>Stretches of the launch where, with pulses alone, the wheel's speed ran up or fell
    /// back faster than a car can move it with its tyre at or below its grip peak
    /// (<see cref="PulseSpinBound"/>). The pulses there were kept: this weighs on the verdict,
    /// not on the figures.</summary>
    public IReadOnlyList<TimeWindow> PulseSpinWindows { get; init; } = [];

    /// <summary>Stretches of firm braking where the pickup wheel slid behind the car (as under
    /// ABS) and the accelerometer carried distance and speed instead.</summary>
    public IReadOnlyList<TimeWindow> BrakingSlideWindows { get; init; } = [];
}

/// <summary>The accelerometer's own distance at one moment of the launch.</summary>
/// <param name="TimeS">When, seconds on the run's clock.</param>
/// <param name="DistanceM">Its distance from first motion, m.</param>
/// <param name="SigmaM">Its stated 1 σ, m.</param>
public sealed record AccelDistanceCheck(double TimeS, double DistanceM, double SigmaM);
