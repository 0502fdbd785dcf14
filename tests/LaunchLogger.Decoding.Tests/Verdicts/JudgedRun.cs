using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Tests.Metrics;

namespace LaunchLogger.Decoding.Tests.Verdicts;

/// <summary>Analysed runs built by hand for the judge: a clean launch at constant acceleration
/// (kinematics: v = a·t, d = a·t²/2), with one thing at a time made wrong by the caller. No
/// reconstruction runs, so every rule is exercised in milliseconds.</summary>
internal static class JudgedRun
{
    /// <summary>Acceleration of the clean launch, m/s²: 60 mph (26.8224 m/s) at 6.7056 s.</summary>
    public const double AccelMps2 = 4.0;

    /// <summary>First motion on the input's clock, s.</summary>
    public const double FirstMotionS = 1.0;

    /// <summary>Metres per pulse of the clean run's 48-tooth pickup on a 1.885 m tyre.</summary>
    public const double MetresPerPulse = 0.03927;

    /// <summary>A clean, complete, staged launch to <paramref name="topSpeedMps"/> with pulses
    /// and accelerometer, nothing in its health counters, and the box's rollout mark equal to ours.</summary>
    public static RunAnalysis Clean(
        double topSpeedMps = 40,
        Func<DecodedRun, DecodedRun>? run = null,
        Func<ReconstructedRun, ReconstructedRun>? reconstruction = null,
        BrakingResult? braking = null)
    {
        double endS = FirstMotionS + (topSpeedMps / AccelMps2);
        Trajectory trajectory = ClosedFormTrajectory.ConstantAcceleration(AccelMps2, FirstMotionS, endS, stepS: 0.001, sigmaDistanceM: 0.002, sigmaSpeedMps: 0.01);
        var firstMotion = new Estimate(FirstMotionS, 0.0005);
        FigureSet figures = FigureCalculator.Compute(trajectory, firstMotion);
        DecodedRun decoded = new()
        {
            Source = "judged.log run 1",
            Configuration = new RunConfiguration { Staged = true, MetresPerPulse = MetresPerPulse, PulsesPerRevolution = 48, CircumferenceM = 48 * MetresPerPulse, HasAccelerometer = true },
            Pulses = Enumerable.Range(1, 1000).Select(i => new PulseRecord(i, FirstMotionS + (i * 0.01), FirstMotionS + (i * 0.01) + 0.0002)).ToArray(),
            Complete = true,
            FirmwareRolloutS = figures.RolloutTimeS!.Value.Value,
        };
        decoded = run?.Invoke(decoded) ?? decoded;
        ReconstructedRun rec = new()
        {
            Source = decoded,
            Trajectory = trajectory,
            FirstMotionS = firstMotion,
            RolloutTimeS = figures.RolloutTimeS,
            RolloutSpeedMps = figures.RolloutSpeedMps,
            RolloutM = Units.RolloutM,
            Method = ReconstructionMethod.PulsesAndAccelerometer,
            Warnings = [],
        };
        rec = reconstruction?.Invoke(rec) ?? rec;
        return new RunAnalysis { Run = decoded, Reconstruction = rec, Figures = figures, Warnings = [], Braking = braking };
    }

    /// <summary>A copy of <paramref name="run"/> with other health counters.</summary>
    public static DecodedRun WithHealth(DecodedRun run, string name, long value) => Copy(run, health: new Dictionary<string, long> { [name] = value });

    /// <summary>A copy of <paramref name="run"/> with some properties changed (the class has init-only properties).</summary>
    public static DecodedRun Copy(DecodedRun run, RunConfiguration? configuration = null, IReadOnlyDictionary<string, long>? health = null, bool? complete = null, long? framesLost = null, double? firmwareRolloutS = null, IReadOnlyList<PulseRecord>? pulses = null, string? source = null) => new()
    {
        Source = source ?? run.Source,
        Configuration = configuration ?? run.Configuration,
        Pulses = pulses ?? run.Pulses,
        SecondPulses = run.SecondPulses,
        Accel = run.Accel,
        Events = run.Events,
        FirmwareMotionS = run.FirmwareMotionS,
        FirmwareRolloutS = firmwareRolloutS ?? run.FirmwareRolloutS,
        Health = health ?? run.Health,
        FramesLost = framesLost ?? run.FramesLost,
        Complete = complete ?? run.Complete,
        Warnings = run.Warnings,
    };

    /// <summary>A copy of <paramref name="rec"/> with some properties changed.</summary>
    public static ReconstructedRun Copy(ReconstructedRun rec, string? method = null, IReadOnlyList<TimeWindow>? wheelspin = null, IReadOnlyList<TimeWindow>? slides = null, int? distanceChannel = null, bool? staged = null) => new()
    {
        Source = rec.Source,
        Trajectory = rec.Trajectory,
        FirstMotionS = rec.FirstMotionS,
        RolloutTimeS = rec.RolloutTimeS,
        RolloutSpeedMps = rec.RolloutSpeedMps,
        RolloutM = rec.RolloutM,
        Method = method ?? rec.Method,
        Warnings = rec.Warnings,
        DistanceChannel = distanceChannel ?? rec.DistanceChannel,
        Staged = staged ?? rec.Staged,
        StartSpeedMps = rec.StartSpeedMps,
        WheelspinWindows = wheelspin ?? rec.WheelspinWindows,
        SpinPastPeakWindows = wheelspin ?? rec.SpinPastPeakWindows,
        BrakingSlideWindows = slides ?? rec.BrakingSlideWindows,
    };

    /// <summary>A stop from <paramref name="fromMps"/> at mean deceleration <paramref name="meanDecel"/>
    /// between <paramref name="onsetS"/> and standstill; the bounds are t = v/a (kinematics).</summary>
    public static BrakingResult Stop(double meanDecel, double? mfdd, double peak, double onsetS = 20, double fromMps = 30) => new()
    {
        FromMps = fromMps,
        OnsetS = new Estimate(onsetS, 0.001),
        OnsetMethod = "brake switch",
        StandstillS = onsetS + (fromMps / meanDecel),
        StoppingDistanceM = new Estimate(fromMps * fromMps / (2 * meanDecel), 0.1),
        MeanDecelMps2 = meanDecel,
        PeakDecelMps2 = peak,
        MfddMps2 = mfdd,
        CorrectedStops = [],
        TractionBound0To60S = 26.8224 / meanDecel,
        TractionBound0To100KmhS = (100 / 3.6) / meanDecel,
    };
}
