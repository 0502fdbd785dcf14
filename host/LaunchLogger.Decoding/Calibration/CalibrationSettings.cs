using System.Text.Json.Serialization;

namespace LaunchLogger.Decoding.Calibration;

/// <summary>What calibration found out about one car and box, saved in a small JSON settings
/// file (see <see cref="CalibrationFile"/>) that <c>launchlogger report --settings</c> applies.
/// Every value is optional: what is absent is taken from the log.</summary>
/// <remarks>The <c>launchlogger calibrate</c> verbs each set their own fields and keep the rest
/// of an existing file. What <see cref="CalibrationApplier"/> applies to a run, and what not yet,
/// is described there.</remarks>
public sealed record CalibrationSettings
{
    /// <summary>The settings format version this code writes.</summary>
    public const int CurrentVersion = 1;

    /// <summary>Settings format version.</summary>
    public int Version { get; init; } = CurrentVersion;

    /// <summary>Free text: which car, which tyres and pressures, where and when.</summary>
    public string? Notes { get; init; }

    /// <summary>Measured rolling circumference of the distance channel's wheel, m; replaces the
    /// log's configured value.</summary>
    public double? CircumferenceM { get; init; }

    /// <summary>1-σ of <see cref="CircumferenceM"/>, m.</summary>
    public double? CircumferenceSigmaM { get; init; }

    /// <summary>The distance channel's tyre measured unloaded (a tape round the tread at the
    /// pressure you run) or worked out from its size, m, for a car whose rolling circumference is
    /// not measured yet; ignored when <see cref="CircumferenceM"/> is given. It replaces the log's
    /// configured value, and the reconstruction takes the tyre to roll on a little less and to grow
    /// with speed as a typical tyre does (<see cref="TyrePrior"/>), within the uncalibrated σ.</summary>
    public double? StaticCircumferenceM { get; init; }

    /// <summary>Pitch of the box on the car (nose-up positive), degrees, including the forward
    /// axis' bias as an equivalent angle: the resting pitch on level ground. Subtracted from the
    /// resting pitch at staging to give the road's grade.</summary>
    public double? MountingPitchDeg { get; init; }

    /// <summary>1-σ of <see cref="MountingPitchDeg"/>, degrees.</summary>
    public double? MountingPitchSigmaDeg { get; init; }

    /// <summary>Yaw of the box's forward axis from the car's centre line, degrees (positive to
    /// the left).</summary>
    public double? MountingYawDeg { get; init; }

    /// <summary>1-σ of <see cref="MountingYawDeg"/>, degrees.</summary>
    public double? MountingYawSigmaDeg { get; init; }

    /// <summary>Scale factor of the accelerometer's forward axis: it reads this many times the
    /// specific force along it (1.004 reads 0.4 % high), from two rests against gravity
    /// (<c>launchlogger calibrate accelerometer</c>).</summary>
    public double? AccelForwardScale { get; init; }

    /// <summary>1-σ of <see cref="AccelForwardScale"/>.</summary>
    public double? AccelForwardScaleSigma { get; init; }

    /// <summary>Offset of the accelerometer's forward axis, m/s² (what it reads with no force
    /// along it), from the same two rests. Shown, not applied: every run takes its own resting
    /// level at staging, which holds the offset of the day.</summary>
    public double? AccelForwardBiasMps2 { get; init; }

    /// <summary>1-σ of <see cref="AccelForwardBiasMps2"/>, m/s².</summary>
    public double? AccelForwardBiasSigmaMps2 { get; init; }

    /// <summary>How long the brake switch takes to close after the pedal starts to move, s, where
    /// it was measured (a bench rig that logs the pedal's first travel against the switch; see
    /// hardware-notes/calibration.md §6). Without it the delay is taken as unknown over 0–30 ms.</summary>
    public double? BrakeSwitchDelayS { get; init; }

    /// <summary>1-σ of <see cref="BrakeSwitchDelayS"/>, s (the spread over repeated presses and
    /// the rig's own resolution); 1 ms when not given.</summary>
    public double? BrakeSwitchDelaySigmaS { get; init; }

    /// <summary>Which wheel carries the distance pickup: <c>driven</c> or <c>undriven</c>
    /// (<see cref="Reconstruction.PickupWheel"/>); absent, not said. With pulses only it decides
    /// how a standing start's launch slip is taken: moved off the estimate (driven), left out
    /// (undriven) or carried in σ (not said). Nothing in the log says it; the user knows it.</summary>
    public Reconstruction.PickupWheel? PickupWheel { get; init; }

    /// <summary>Relative length of each tooth gap of the distance channel, in pulse order from
    /// a reference tooth (mean 1.0); null when not mapped.</summary>
    /// <remarks>Entry k is the gap that ends at the edge where the box's hardware pulse counter
    /// reaches a value ≡ k (mod pulses per revolution). The counter keeps that relation to the
    /// ring only while the box stays powered and no pulse is lost or doubled.</remarks>
    public IReadOnlyList<double>? ToothSpacing { get; init; }

    /// <summary>1-σ of each entry of <see cref="ToothSpacing"/>.</summary>
    public IReadOnlyList<double>? ToothSpacingSigma { get; init; }

    /// <summary><see cref="MountingPitchDeg"/> in radians, for the grade estimate; null when not
    /// calibrated.</summary>
    [JsonIgnore]
    public double? MountingPitchRad => MountingPitchDeg * (Math.PI / 180);

    /// <summary><see cref="MountingPitchSigmaDeg"/> in radians; null when not given.</summary>
    [JsonIgnore]
    public double? MountingPitchSigmaRad => MountingPitchSigmaDeg * (Math.PI / 180);

    /// <summary><see cref="MountingYawDeg"/> in radians; null when not calibrated.</summary>
    [JsonIgnore]
    public double? MountingYawRad => MountingYawDeg * (Math.PI / 180);
}
