using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;
using static System.FormattableString;

namespace LaunchLogger.Cli.Bench;

/// <summary>One simulated stop of the braking benchmark.</summary>
/// <param name="Index">Position in the benchmark.</param>
/// <param name="Seed">Seed for the noise.</param>
/// <param name="Scenario">The stop on a slope.</param>
/// <param name="Level">The same car and box on level ground, for the mounting calibration.</param>
/// <param name="Summary">The variation in a few words.</param>
public sealed record BrakingCase(int Index, int Seed, Scenario Scenario, Scenario Level, string Summary)
{
    /// <summary>True when the stop is timed from a brake switch.</summary>
    public bool HasSwitch => Scenario.BrakeSwitch.Present;

    /// <summary>Builds the cases: the braking test car from just above 60 mph, on slopes of
    /// −2 % to +2 %, with or without a brake switch (its delay 5–25 ms, drawn apart so that the
    /// other variations stay as they were), 24–100 teeth, both capture paths.</summary>
    public static IReadOnlyList<BrakingCase> Build(int runs, int seed)
    {
        Scenario baseline = BuiltInScenarios.Get("brake-test-60");
        int[] teeth = [24, 36, 48, 60, 80, 100];
        var random = new Random(seed);
        var switchRandom = new Random(unchecked((seed * 104_729) + 3));
        var cases = new List<BrakingCase>(runs);
        for (int i = 0; i < runs; i++)
        {
            double grade = (random.NextDouble() * 4) - 2;
            bool sw = random.NextDouble() < 0.5;
            int toothCount = teeth[random.Next(teeth.Length)];
            bool exact = random.NextDouble() < 0.5;
            double fromMph = 61 + (random.NextDouble() * 6);
            double switchDelayS = 0.005 + (0.02 * switchRandom.NextDouble());
            Scenario level = baseline with
            {
                Name = $"brake-bench-{i}",
                Tyre = baseline.Tyre with { RadiusGrowthAt30Mps = 0 },
                Plan = baseline.Plan with { TargetSpeedMps = fromMph * 0.44704, TargetDistanceM = null, BrakeToStop = true },
                Pickup = baseline.Pickup with { Teeth = toothCount },
                Capture = baseline.Capture with { Kind = exact ? CaptureKind.ExactEdges : CaptureKind.PolledCounter },
                BrakeSwitch = baseline.BrakeSwitch with { Present = sw, DelayS = switchDelayS },
                Environment = baseline.Environment with { GradePercent = 0 },
            };
            Scenario sloped = level with { Environment = level.Environment with { GradePercent = grade } };
            string summary = FormattableString.Invariant($"from {fromMph:0.0} mph, grade {grade:+0.00;-0.00} %, {toothCount} teeth, {(exact ? "edge timestamps" : "polled")}, {(sw ? Invariant($"brake switch {switchDelayS * 1e3:0.0} ms") : "no switch")}");
            cases.Add(new BrakingCase(i, unchecked((seed * 7919) + i), sloped, level, summary));
        }

        return cases;
    }
}

/// <summary>Errors of one stop (estimate − truth): stopping distance (m), onset (s), grade (°).</summary>
public sealed record BrakingOutcome(BrakingCase Case, double? DistanceErrorM, double? OnsetErrorS, double? GradeErrorDeg, double? MfddErrorMps2, string? Failure)
{
    /// <summary>Our stated 1-σ of the stopping distance, m.</summary>
    public double? DistanceSigmaM { get; init; }

    /// <summary>Our stated 1-σ of the onset, s.</summary>
    public double? OnsetSigmaS { get; init; }

    /// <summary>Our stated 1-σ of the grade, °.</summary>
    public double? GradeSigmaDeg { get; init; }

    /// <summary>With a switch whose delay is not told: stopping distance error and σ, m.</summary>
    public (double Error, double Sigma)? UnmeasuredDelayDistanceM { get; init; }

    /// <summary>With a switch whose delay is not told: onset error and σ, s.</summary>
    public (double Error, double Sigma)? UnmeasuredDelayOnsetS { get; init; }
}

/// <summary>Simulates and measures one stop.</summary>
public static class BrakingBenchmark
{
    /// <summary>Runs one case: calibrates the mounting on the level twin (as a user would, on
    /// level ground), then measures the stop on the slope.</summary>
    public static BrakingOutcome Run(BrakingCase c, CancellationToken cancel)
    {
        SimulationResult level = Simulator.Run(c.Level, c.Seed + 1_000_000, cancel);
        SimulationResult sloped = Simulator.Run(c.Scenario, c.Seed, cancel);
        DecodedRun? levelRun = LogReader.Read(level.LogBytes, "level").Runs.FirstOrDefault();
        DecodedRun? run = LogReader.Read(sloped.LogBytes, "sloped").Runs.FirstOrDefault();
        if (levelRun is null || run is null)
        {
            return new BrakingOutcome(c, null, null, null, null, "the box logged no run");
        }

        try
        {
            RunAnalysis calibrationRun = RunAnalyzer.Analyze(levelRun);
            double? mountingDeg = calibrationRun.Reconstruction.RestingPitchRad?.Value * 180 / Math.PI;
            var options = new AnalysisOptions
            {
                Calibration = new CalibrationSettings { MountingPitchDeg = mountingDeg, MountingPitchSigmaDeg = calibrationRun.Reconstruction.RestingPitchRad?.Sigma * 180 / Math.PI },

                // The switch's delay is a property of the box, measured once on the bench.
                BrakeSwitchDelayS = c.Scenario.BrakeSwitch.DelayS,
            };
            RunAnalysis analysis = RunAnalyzer.Analyze(run, options);
            if (analysis.Braking is not { } b)
            {
                return new BrakingOutcome(c, null, null, null, null, "no stop found");
            }

            double? truthOnset = sloped.Events.BrakeOnsetS;

            // The same stop as a user decodes it who never measured the switch: the delay's prior.
            BrakingResult? unmeasured = c.HasSwitch ? RunAnalyzer.Analyze(run, options with { BrakeSwitchDelayS = null }).Braking : null;
            BrakingResult? truthStop = truthOnset is { } t ? BrakingAnalyzer.Analyze(sloped.Truth, [t]) : null;
            double gradeTruthDeg = Math.Atan(c.Scenario.Environment.GradePercent / 100) * 180 / Math.PI;
            return new BrakingOutcome(
                c,
                b.StoppingDistanceM.Value - sloped.Events.StoppingDistanceM,
                b.OnsetS.Value - truthOnset,
                analysis.Grade is { } g ? g.Degrees - gradeTruthDeg : null,
                b.MfddMps2 - truthStop?.MfddMps2,
                null)
            {
                DistanceSigmaM = b.StoppingDistanceM.Sigma,
                OnsetSigmaS = b.OnsetS.Sigma,
                GradeSigmaDeg = analysis.Grade?.SigmaRad * 180 / Math.PI,
                UnmeasuredDelayDistanceM = unmeasured is { } u && sloped.Events.StoppingDistanceM is { } sd ? (u.StoppingDistanceM.Value - sd, u.StoppingDistanceM.Sigma) : null,
                UnmeasuredDelayOnsetS = unmeasured is { } w && truthOnset is { } to ? (w.OnsetS.Value - to, w.OnsetS.Sigma) : null,
            };
        }
        catch (AnalysisException e)
        {
            return new BrakingOutcome(c, null, null, null, null, e.Message);
        }
    }
}
