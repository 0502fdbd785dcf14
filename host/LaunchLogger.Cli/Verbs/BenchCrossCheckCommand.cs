using System.CommandLine;
using System.Globalization;
using LaunchLogger.Cli.Bench;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.CrossCheck;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Prescribed;
using LaunchLogger.Prescribed.Output;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Sensors;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger bench crosscheck</c>: does the cross-check's "within the combined
/// uncertainty" mean what it says? Many drives, each recorded by the box (our log, tyres not
/// calibrated at speed) and by a satellite receiver writing NMEA 0183 from the drive's true
/// motion on its own clock; per figure, how often the difference lies within ±2 and ±3 combined
/// σ, and how well the clock offset is recovered. With <c>--truth generator</c> the drives come
/// from the independent generator instead (prescribed standing starts written as a log by the
/// firmware core, the receiver's NMEA 0183 written from the same exact trajectory), so that
/// neither side's truth shares the simulator's vehicle model.</summary>
public static class BenchCrossCheckCommand
{
    /// <summary>Coverage the ±2 σ claim promises (a normal error lies within ±2 σ 95.4 % of the time).</summary>
    public const double CoverageGoal = 0.95;

    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var runs = new Option<int>("--runs") { Description = "Drives simulated (every built-in car in turn, 10 and 20 Hz receivers).", DefaultValueFactory = _ => 60 };
        var seed = new Option<int>("--seed") { Description = "Seed for the drives, the receivers' noise and their clocks.", DefaultValueFactory = _ => 1 };
        var truth = new Option<string>("--truth")
        {
            Description = "Where the drives and their true motion come from: simulator (the vehicle simulator's built-in cars) or generator (prescribed standing starts of the independent generator).",
            DefaultValueFactory = _ => Simulated,
        };
        truth.AcceptOnlyFromAmong(Simulated, Generated);
        var command = new Command("crosscheck", "Coverage of the cross-check's combined uncertainty over many drives.") { runs, seed, truth };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(parse.GetValue(runs), parse.GetValue(seed), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error, cancel, parse.GetValue(truth) == Generated)));
        return command;
    }

    private const string Simulated = "simulator";
    private const string Generated = "generator";

    /// <summary>Runs the benchmark: <paramref name="runs"/> drives from <paramref name="seed"/>, the
    /// table to <paramref name="output"/>, problems to <paramref name="error"/>; with
    /// <paramref name="generated"/> the independent generator's drives instead of the simulator's.
    /// <paramref name="cancel"/> stops it between drives.</summary>
    public static ExitCode Run(int runs, int seed, TextWriter output, TextWriter error, CancellationToken cancel = default, bool generated = false)
    {
        if (runs < 1 || runs > 10_000)
        {
            error.WriteLine("launchlogger bench crosscheck: --runs must be from 1 to 10000");
            return ExitCode.Usage;
        }

        IReadOnlyList<Scenario> scenarios = BuiltInScenarios.Scenarios;
        List<Case> cases = Enumerable.Range(0, runs).Select(i =>
        {
            // Not HashCode.Combine: its seed changes with every process, so the drives would too.
            var random = new Random(unchecked((seed * 1_000_003) + i));
            return new Case(i, scenarios[i % scenarios.Count], seed + i, i / scenarios.Count % 2 == 0 ? 10 : 20, 1000 + (random.NextDouble() * 80_000), generated);
        }).ToList();

        List<Outcome> outcomes;
        try
        {
            outcomes = ParallelCases.Run(cases, Measure, "bench crosscheck: drives compared", error, cancel);
        }
        catch (OperationCanceledException)
        {
            error.WriteLine("bench crosscheck: cancelled");
            return ExitCode.Cancelled;
        }

        CultureInfo inv = CultureInfo.InvariantCulture;
        output.WriteLine(generated
            ? string.Create(inv, $"bench crosscheck: {runs} drives of the independent generator, seed {seed}; standing starts written by the firmware core (8–100 teeth, calibrated tyre, 100–1600 Hz accelerometer); receiver speed noise 0.05 m/s, position noise 0.5 m")
            : string.Create(inv, $"bench crosscheck: {runs} drives, seed {seed}; the box's tyre not calibrated at speed; receiver speed noise 0.05 m/s, position noise 0.5 m"));
        foreach (Outcome failed in outcomes.Where(o => o.Failure is not null))
        {
            output.WriteLine($"  drive {failed.Case.Index} ({failed.Case.Name}, {failed.Case.RateHz} Hz) not compared: {failed.Failure}");
        }

        List<Outcome> ok = outcomes.Where(o => o.Failure is null).ToList();
        if (ok.Count == 0)
        {
            output.WriteLine("no drive could be compared");
            return ExitCode.CheckFailed;
        }

        double[] offsetError = Percentiles.AbsSorted(ok.Select(o => (double?)o.OffsetErrorS), 1000);
        double offsetCoverage = ok.Count(o => Math.Abs(o.OffsetErrorS) <= 2 * o.OffsetSigmaS) / (double)ok.Count;
        output.WriteLine(string.Create(inv, $"clock offset: |error| p50 {Percentiles.Of(offsetError, 0.5):0.00} ms, p95 {Percentiles.Of(offsetError, 0.95):0.00} ms, max {Percentiles.Max(offsetError):0.00} ms (goal ≤ 5 ms); within ±2σ {offsetCoverage:P1}"));
        output.WriteLine();
        output.WriteLine($"{"figure",-30} {"convention",-10} {"n",4} {"±2σc",7} {"±3σc",7} {"p95 |diff|/σc",14}");
        bool met = Percentiles.Of(offsetError, 0.95) <= 5;
        foreach (var group in ok.SelectMany(o => o.Rows).GroupBy(r => (r.Figure, r.Convention)).OrderBy(g => g.Key.Figure, StringComparer.Ordinal).ThenBy(g => g.Key.Convention, StringComparer.Ordinal))
        {
            CrossCheckRow[] rows = [.. group];
            double within2 = rows.Count(r => Math.Abs(r.Difference) <= 2 * r.CombinedSigma) / (double)rows.Length;
            double within3 = rows.Count(r => Math.Abs(r.Difference) <= 3 * r.CombinedSigma) / (double)rows.Length;
            double[] z = Percentiles.AbsSorted(rows.Select(r => (double?)(r.Difference / r.CombinedSigma)));
            met &= within2 >= CoverageGoal;
            output.WriteLine(string.Create(inv, $"{group.Key.Figure,-30} {group.Key.Convention,-10} {rows.Length,4} {within2,7:P1} {within3,7:P1} {Percentiles.Of(z, 0.95),14:0.00}"));
        }

        output.WriteLine();
        output.WriteLine(met ? $"goals met (offset p95 ≤ 5 ms; every figure within ±2σc in ≥ {CoverageGoal:P0} of drives)" : "goals NOT met");
        return met ? ExitCode.Ok : ExitCode.CheckFailed;
    }

    private static Outcome Measure(Case c, CancellationToken cancel)
    {
        if (c.Generated)
        {
            return MeasureGenerated(c);
        }

        try
        {
            SimulationResult drive = Simulator.Run(c.Scenario, c.Seed, cancel);
            DecodedRun run = LogReader.Read(drive.LogBytes, "drive.log").Runs[0];
            RunAnalysis ours = RunAnalyzer.Analyze(run);
            var receiver = new SatelliteReceiver { RateHz = c.RateHz, ClockAheadS = c.ClockAheadS };
            SpeedTrace theirs = NmeaTraceReader.Read(new StringReader(receiver.WriteNmea(drive.Truth, c.Seed)), "receiver.nmea");
            CrossCheckResult result = CrossChecker.Compare(ours, theirs, receiver.SpeedNoiseMps);
            return new Outcome(c, result.Rows, result.Alignment.OffsetS + c.ClockAheadS, result.Alignment.OffsetSigmaS, null);
        }
        catch (Exception e) when (e is not OperationCanceledException)
        {
            return new Outcome(c, [], double.NaN, double.NaN, e.Message);
        }
    }

    /// <summary>A generated standing start: the pickup (8–100 teeth, on an undriven wheel that lags
    /// as it is spun up), the accelerometer's rate
    /// (100–1600 Hz) and the launch's shape drawn from the drive's seed, the receiver's NMEA 0183
    /// written from the same exact trajectory.</summary>
    private static Outcome MeasureGenerated(Case c)
    {
        try
        {
            var spec = new PrescribedRecordSpec
            {
                Shape = PrescribedShapes.StandingStart(new Random(c.Seed)),
                Pickup = new WheelPickup(new[] { 8, 12, 24, 48, 60, 100 }[c.Index % 6], TyreModel.Calibrated(1.9 + (0.02 * (c.Seed % 10))), SpinUp: SpinUpLag.Draw(new Random(c.Seed ^ 0x5917), 1.9 + (0.02 * (c.Seed % 10)))),
                Accel = new AccelSensor { RateHz = new[] { 100, 200, 400, 800, 1600 }[c.Index % 5], NoiseMicroGPerRootHz = 150 },
                Seed = c.Seed,
            };
            PrescribedRecord record = spec.Generate();
            RunAnalysis ours = RunAnalyzer.Analyze(LogReader.Read(record.ToLog(), "generated.log").Runs[0]);
            var receiver = new NmeaTrace { RateHz = c.RateHz, ClockAheadS = c.ClockAheadS };
            SpeedTrace theirs = NmeaTraceReader.Read(new StringReader(receiver.Write(spec.Shape.Profile, c.Seed)), "receiver.nmea");
            CrossCheckResult result = CrossChecker.Compare(ours, theirs, receiver.SpeedNoiseMps);
            return new Outcome(c, result.Rows, result.Alignment.OffsetS + c.ClockAheadS, result.Alignment.OffsetSigmaS, null);
        }
        catch (Exception e) when (e is not OperationCanceledException)
        {
            return new Outcome(c, [], double.NaN, double.NaN, e.Message);
        }
    }

    private sealed record Case(int Index, Scenario Scenario, int Seed, int RateHz, double ClockAheadS, bool Generated)
    {
        public string Name => Generated ? $"generated standing start, seed {Seed}" : Scenario.Name;
    }

    private sealed record Outcome(Case Case, IReadOnlyList<CrossCheckRow> Rows, double OffsetErrorS, double OffsetSigmaS, string? Failure);
}
