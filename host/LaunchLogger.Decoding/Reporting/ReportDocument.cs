using System.Text.Json.Serialization;

namespace LaunchLogger.Decoding.Reporting;

// The stable JSON document `launchlogger report --json` writes. Documented in
// host/LaunchLogger.Decoding/Reporting/REPORT-JSON.md; names are snake_case, units SI (s, m, m/s,
// m/s²). Add fields freely; never rename or remove one without raising Version.

/// <summary>The whole report: one entry per run.</summary>
public sealed record ReportDocument
{
    /// <summary>Identifies the document kind.</summary>
    public string Format { get; init; } = "launchlogger-report";

    /// <summary>Document version; raised when a field changes meaning or goes away.</summary>
    public int Version { get; init; } = 1;

    /// <summary>The tool version that wrote it.</summary>
    public required string ToolVersion { get; init; }

    /// <summary>The input(s) read.</summary>
    public required string Source { get; init; }

    /// <summary>Reader statistics for log inputs (null for plain-text inputs).</summary>
    public ReaderReport? Reader { get; init; }

    /// <summary>Runs in input order.</summary>
    public required IReadOnlyList<RunReport> Runs { get; init; }

    /// <summary>The braking bound every launch was held against; null when no stop was seen.</summary>
    public TractionBoundReport? TractionBound { get; init; }

    /// <summary>The weather given, and what follows from it; null when none was given.</summary>
    public WeatherReport? Weather { get; init; }

    /// <summary>Runs paired in opposite directions, and their means.</summary>
    public IReadOnlyList<PairReport> Pairs { get; init; } = [];

    /// <summary>The logs' bench rests (no runs: listed, never analysed), in input order.</summary>
    public IReadOnlyList<BenchRestReport> BenchRests { get; init; } = [];
}

/// <summary>The best 0–60 mph the braking grip shown would allow.</summary>
public sealed record TractionBoundReport
{
    /// <summary>Which stop (log and run).</summary>
    public required string Source { get; init; }

    /// <summary>That stop's mean deceleration, m/s².</summary>
    public required double MeanDecelMps2 { get; init; }

    /// <summary>The bound on 0–60 mph, s.</summary>
    [JsonPropertyName("bound_0_60_s")]
    public required double Bound060S { get; init; }

    /// <summary>The bound on 0–100 km/h, s.</summary>
    [JsonPropertyName("bound_0_100_kmh_s")]
    public required double Bound0100KmhS { get; init; }

    /// <summary>Why that stop counts as one at the grip limit: <c>named_reference</c>,
    /// <c>wheel_slide</c> or <c>deceleration_plateau</c>.</summary>
    public required string Basis { get; init; }

    /// <summary>The same, in words.</summary>
    public required string Why { get; init; }

    /// <summary>What the bound does not account for.</summary>
    public required string Caveats { get; init; }
}

/// <summary>Why a stop counts as one at the grip limit.</summary>
/// <param name="Basis"><c>named_reference</c>, <c>wheel_slide</c> or <c>deceleration_plateau</c>.</param>
/// <param name="Why">The same, in words.</param>
public sealed record GripLimitReport(string Basis, string Why);

/// <summary>The weather and its consequences.</summary>
public sealed record WeatherReport
{
    /// <summary>Air temperature, °C.</summary>
    public required double TemperatureC { get; init; }

    /// <summary>Station pressure, hPa.</summary>
    public required double PressureHpa { get; init; }

    /// <summary>Relative humidity, %.</summary>
    public required double RelativeHumidityPct { get; init; }

    /// <summary>Humid-air density, kg/m³.</summary>
    public required double DensityKgPerM3 { get; init; }

    /// <summary>Density altitude (ISA), m.</summary>
    public required double DensityAltitudeM { get; init; }

    /// <summary>SAE J1349 correction factor.</summary>
    public required double CorrectionFactor { get; init; }

    /// <summary>How figures were corrected.</summary>
    public required string Method { get; init; }
}

/// <summary>Two runs in opposite directions and their mean figures.</summary>
public sealed record PairReport
{
    /// <summary>The two runs' indexes in this report.</summary>
    public required IReadOnlyList<int> Runs { get; init; }

    /// <summary>How they were combined.</summary>
    public required string Method { get; init; }

    /// <summary>Mean speed intervals.</summary>
    public required IReadOnlyList<SpeedIntervalReport> SpeedIntervals { get; init; }

    /// <summary>Mean distance marks.</summary>
    public required IReadOnlyList<DistanceMarkReport> DistanceMarks { get; init; }
}

/// <summary>A run's figures after a correction.</summary>
public sealed record CorrectedFiguresReport
{
    /// <summary>"level" (grade removed) or "standard_air" (weather removed).</summary>
    public required string Kind { get; init; }

    /// <summary>How, in words.</summary>
    public required string Method { get; init; }

    /// <summary>Corrected speed intervals.</summary>
    public required IReadOnlyList<SpeedIntervalReport> SpeedIntervals { get; init; }

    /// <summary>Corrected distance marks.</summary>
    public required IReadOnlyList<DistanceMarkReport> DistanceMarks { get; init; }
}

/// <summary>A run's verdict.</summary>
public sealed record VerdictReport
{
    /// <summary>"valid", "doubtful" or "invalid".</summary>
    public required string Level { get; init; }

    /// <summary>Why, worst first.</summary>
    public required IReadOnlyList<VerdictReasonReport> Reasons { get; init; }
}

/// <summary>One reason behind a verdict.</summary>
/// <param name="Level">"doubtful" or "invalid".</param>
/// <param name="Code">Stable snake_case name, e.g. "wheelspin".</param>
/// <param name="Text">For people.</param>
public sealed record VerdictReasonReport(string Level, string Code, string Text);

/// <summary>The road's grade at staging.</summary>
public sealed record GradeReport
{
    /// <summary>Grade, %, uphill positive.</summary>
    public required double Percent { get; init; }

    /// <summary>1-σ, %.</summary>
    public required double UncertaintyPercent { get; init; }

    /// <summary>True when the box's mounting pitch was calibrated.</summary>
    public required bool MountingCalibrated { get; init; }
}

/// <summary>What the frame reader met, summed over every log read.</summary>
/// <param name="Bytes">Bytes read.</param>
/// <param name="Frames">Whole frames that passed their CRC.</param>
/// <param name="CrcErrors">Frames whose CRC did not match.</param>
/// <param name="MalformedFrames">Frames too long, too short or badly stuffed.</param>
/// <param name="BytesSkipped">Bytes thrown away while resynchronising.</param>
/// <param name="TruncatedBytes">Bytes of an unfinished frame at the end (a log cut off).</param>
/// <param name="FramesLost">Frames missing by their sequence numbers.</param>
/// <param name="Restarts">Times the box restarted within a log.</param>
/// <param name="UnknownFrames">Frames of a type this reader does not know (skipped).</param>
/// <param name="CorruptBodies">Frames that passed their CRC but whose body did not parse.</param>
public sealed record ReaderReport(
    long Bytes,
    long Frames,
    long CrcErrors,
    long MalformedFrames,
    long BytesSkipped,
    long TruncatedBytes,
    long FramesLost,
    long Restarts,
    long UnknownFrames,
    long CorruptBodies)
{
    /// <summary>True when anything was damaged or lost.</summary>
    public bool HasDamage => CrcErrors + MalformedFrames + TruncatedBytes + FramesLost + CorruptBodies + BytesSkipped > 0;

    /// <summary>The report of one reader's counters.</summary>
    public static ReaderReport From(LaunchLogger.Decoding.Reading.ReaderStats s) =>
        new(s.Bytes, s.Frames, s.CrcErrors, s.MalformedFrames, s.BytesSkipped, s.TruncatedBytes, s.FramesLost, s.Restarts, s.UnknownFrameTypes, s.CorruptBodies);

    /// <summary>Adds two reports (null counts as nothing).</summary>
    public static ReaderReport? Sum(ReaderReport? a, ReaderReport? b) => a is null ? b : b is null ? a : new(
        a.Bytes + b.Bytes,
        a.Frames + b.Frames,
        a.CrcErrors + b.CrcErrors,
        a.MalformedFrames + b.MalformedFrames,
        a.BytesSkipped + b.BytesSkipped,
        a.TruncatedBytes + b.TruncatedBytes,
        a.FramesLost + b.FramesLost,
        a.Restarts + b.Restarts,
        a.UnknownFrames + b.UnknownFrames,
        a.CorruptBodies + b.CorruptBodies);
}

/// <summary>One run's figures under both conventions.</summary>
public sealed record RunReport
{
    /// <summary>Position in this report, 1-based (what --pair refers to).</summary>
    public int Index { get; init; }

    /// <summary>The log or file the run came from.</summary>
    public string Source { get; init; } = "";

    /// <summary>Run number (1-based, as the box numbered it).</summary>
    public required int Run { get; init; }

    /// <summary>Whether the figures can be quoted, and why not.</summary>
    public VerdictReport? Verdict { get; init; }

    /// <summary>How the motion was reconstructed: "pulses and accelerometer", "pulses only", "accelerometer only".</summary>
    public required string Method { get; init; }

    /// <summary>True when the run opened from standstill after staging.</summary>
    public required bool Staged { get; init; }

    /// <summary>First motion on the input's own time axis, s; null when the run opened moving
    /// (there was no standstill to leave).</summary>
    public required double? FirstMotionS { get; init; }

    /// <summary>1-σ of <see cref="FirstMotionS"/>, s; null with it.</summary>
    public required double? FirstMotionUncertaintyS { get; init; }

    /// <summary>The rollout mark.</summary>
    public required RolloutReport Rollout { get; init; }

    /// <summary>Timed speed intervals.</summary>
    public required IReadOnlyList<SpeedIntervalReport> SpeedIntervals { get; init; }

    /// <summary>Timed distance marks.</summary>
    public required IReadOnlyList<DistanceMarkReport> DistanceMarks { get; init; }

    /// <summary>Highest longitudinal acceleration after first motion, m/s².</summary>
    public required double PeakAccelMps2 { get; init; }

    /// <summary>Mean acceleration 0–60 mph, m/s²; null when 60 mph was not reached.</summary>
    [JsonPropertyName("mean_accel_0_60_mps2")]
    public double? MeanAccel0To60Mps2 { get; init; }

    /// <summary>Highest speed, m/s.</summary>
    public required double MaxSpeedMps { get; init; }

    /// <summary>Distance from standstill to the end of the run, m.</summary>
    public required double DistanceM { get; init; }

    /// <summary>The stop at the end of the run; null when the run does not end with one.</summary>
    public BrakingReport? Braking { get; init; }

    /// <summary>The road's grade at staging; null without an accelerometer.</summary>
    public GradeReport? Grade { get; init; }

    /// <summary>The figures corrected to level ground and to standard air, where known.</summary>
    public IReadOnlyList<CorrectedFiguresReport> Corrections { get; init; } = [];

    /// <summary>The box and its sensors as configured for this run, and the calibration applied;
    /// null in documents written before this field existed.</summary>
    public BoxReport? Box { get; init; }

    /// <summary>Everything the reader, importer and reconstruction noticed.</summary>
    public required IReadOnlyList<string> Warnings { get; init; }
}

/// <summary>A stop to standstill.</summary>
public sealed record BrakingReport
{
    /// <summary>Speed at brake onset, m/s.</summary>
    public required double FromMps { get; init; }

    /// <summary>Brake onset on the input's time axis, s.</summary>
    public required double OnsetS { get; init; }

    /// <summary>1-σ of <see cref="OnsetS"/>, s.</summary>
    public required double OnsetUncertaintyS { get; init; }

    /// <summary>"brake switch", "brake switch and deceleration" or "deceleration onset".</summary>
    public required string OnsetMethod { get; init; }

    /// <summary>Distance from onset to standstill, m.</summary>
    public required double StoppingDistanceM { get; init; }

    /// <summary>1-σ of <see cref="StoppingDistanceM"/>, m.</summary>
    public required double StoppingDistanceUncertaintyM { get; init; }

    /// <summary>The stopping distance corrected to the nearer of 60 mph and 100 km/h, m; null
    /// when the onset speed is not within 10 % of either.</summary>
    public double? CorrectedDistanceM { get; init; }

    /// <summary>Which nominal speed <see cref="CorrectedDistanceM"/> is for, and how.</summary>
    public string? CorrectedTo { get; init; }

    /// <summary>Every nominal-speed correction.</summary>
    public required IReadOnlyList<CorrectedStopReport> CorrectedStops { get; init; }

    /// <summary>from_mps² / (2 · stopping distance), m/s².</summary>
    public required double MeanDecelMps2 { get; init; }

    /// <summary>Highest deceleration, m/s².</summary>
    public required double PeakDecelMps2 { get; init; }

    /// <summary>Mean fully developed deceleration (UN R13 / R13-H), m/s².</summary>
    public double? MfddMps2 { get; init; }

    /// <summary>Why this stop was at the grip limit; null when nothing shows it was (a stop short
    /// of the limit is reported but bounds no launch).</summary>
    public GripLimitReport? GripLimit { get; init; }

    /// <summary>Best 0–60 mph the braking grip would allow, s.</summary>
    [JsonPropertyName("traction_bound_0_60_s")]
    public required double TractionBound060S { get; init; }

    /// <summary>Best 0–100 km/h the braking grip would allow, s.</summary>
    [JsonPropertyName("traction_bound_0_100_kmh_s")]
    public required double TractionBound0100KmhS { get; init; }
}

/// <summary>A stopping distance corrected to a nominal initial speed.</summary>
/// <param name="Label">E.g. "60-0 mph".</param>
/// <param name="NominalMps">Nominal initial speed, m/s.</param>
/// <param name="CorrectedDistanceM">Corrected distance, m; null when not corrected.</param>
/// <param name="Method">How, or why not.</param>
public sealed record CorrectedStopReport(string Label, double NominalMps, double? CorrectedDistanceM, string Method);

/// <summary>The rollout mark: where the car has moved the rollout distance.</summary>
public sealed record RolloutReport
{
    /// <summary>The rollout distance, m.</summary>
    public required double DistanceM { get; init; }

    /// <summary>When it was reached on the input's time axis, s; null when never.</summary>
    public double? TimeS { get; init; }

    /// <summary>1-σ of <see cref="TimeS"/>, s.</summary>
    public double? TimeUncertaintyS { get; init; }

    /// <summary>Time from first motion to the mark, s.</summary>
    public double? AfterFirstMotionS { get; init; }

    /// <summary>1-σ of <see cref="AfterFirstMotionS"/>, s: the mark's and first motion's σ
    /// combined, as for every figure from standstill.</summary>
    public double? AfterFirstMotionUncertaintyS { get; init; }

    /// <summary>Speed at the mark, m/s.</summary>
    public double? SpeedMps { get; init; }

    /// <summary>1-σ of <see cref="SpeedMps"/>, m/s.</summary>
    public double? SpeedUncertaintyMps { get; init; }

    /// <summary>The box's own mark, s, when the log has one.</summary>
    public double? FirmwareTimeS { get; init; }
}

/// <summary>One speed interval.</summary>
public sealed record SpeedIntervalReport
{
    /// <summary>E.g. "0-60 mph".</summary>
    public required string Label { get; init; }

    /// <summary>Start speed, m/s.</summary>
    public required double FromMps { get; init; }

    /// <summary>End speed, m/s.</summary>
    public required double ToMps { get; init; }

    /// <summary>Duration timed from standstill (or from the start speed), s.</summary>
    public double? FromStandstillS { get; init; }

    /// <summary>Duration timed from the rollout mark, s (same as from standstill for rolling intervals).</summary>
    public double? FromRolloutS { get; init; }

    /// <summary>1-σ of <see cref="FromStandstillS"/>, s.</summary>
    public double? UncertaintyS { get; init; }

    /// <summary>1-σ of <see cref="FromRolloutS"/>, s.</summary>
    public double? FromRolloutUncertaintyS { get; init; }
}

/// <summary>One distance mark.</summary>
public sealed record DistanceMarkReport
{
    /// <summary>E.g. "60 ft".</summary>
    public required string Label { get; init; }

    /// <summary>Distance from the standstill position, m.</summary>
    public required double DistanceM { get; init; }

    /// <summary>Elapsed time from standstill, s.</summary>
    public double? FromStandstillS { get; init; }

    /// <summary>Elapsed time from the rollout mark, s.</summary>
    public double? FromRolloutS { get; init; }

    /// <summary>1-σ of <see cref="FromStandstillS"/>, s.</summary>
    public double? UncertaintyS { get; init; }

    /// <summary>1-σ of <see cref="FromRolloutS"/>, s.</summary>
    public double? FromRolloutUncertaintyS { get; init; }

    /// <summary>Speed at the mark, m/s.</summary>
    public double? SpeedMps { get; init; }

    /// <summary>Trap speed over the 66 ft before the mark, m/s; null where the mark has no trap.</summary>
    [JsonIgnore(Condition = JsonIgnoreCondition.Never)]
    public double? TrapSpeedMps { get; init; }

    /// <summary>1-σ of <see cref="TrapSpeedMps"/>, m/s.</summary>
    public double? TrapSpeedUncertaintyMps { get; init; }
}

/// <summary>The box that recorded a run: its firmware, its sensors as configured (after any
/// calibration settings were applied), and what calibration changed.</summary>
public sealed record BoxReport
{
    /// <summary>Firmware version, "major.minor.patch"; empty for plain-text inputs.</summary>
    public required string FirmwareVersion { get; init; }

    /// <summary>Log format version; 0 for plain-text inputs.</summary>
    public required int LogFormatVersion { get; init; }

    /// <summary>Pulses per wheel revolution of the distance channel; 0 when not known.</summary>
    public required int PulsesPerRevolution { get; init; }

    /// <summary>Rolling circumference of the distance channel's wheel, m (0 when not known).</summary>
    public required double CircumferenceM { get; init; }

    /// <summary>Distance per pulse of the distance channel, m.</summary>
    public required double MetresPerPulse { get; init; }

    /// <summary>True when a second pulse channel was recorded.</summary>
    public required bool SecondChannel { get; init; }

    /// <summary>Nominal accelerometer output rate, Hz; null without an accelerometer.</summary>
    public double? AccelRateHz { get; init; }

    /// <summary>Accelerometer full scale, m/s²; null without an accelerometer.</summary>
    public double? AccelFullScaleMps2 { get; init; }

    /// <summary>The rollout distance the box used, m.</summary>
    public required double RolloutM { get; init; }

    /// <summary>What the calibration settings changed, in words (empty: none applied).</summary>
    public required IReadOnlyList<string> Calibration { get; init; }
}
