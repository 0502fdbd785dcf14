using System.CommandLine;
using System.Globalization;
using LaunchLogger.Cli.Bench;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger bench accuracy</c>: errors against the simulator's truth and the
/// independent generator's truth for our estimator and the naive method, side by side, with σ
/// coverage and the accuracy goals per group.</summary>
public static class BenchAccuracyCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var runs = new Option<int>("--runs") { Description = "Runs in all: half simulated, half from the independent generator.", DefaultValueFactory = _ => 200 };
        var seed = new Option<int>("--seed") { Description = "Seed for the variations and the sensors' noise.", DefaultValueFactory = _ => 1 };
        var list = new Option<bool>("--list") { Description = "Also print every run's errors." };
        var calibrated = new Option<bool>("--calibrated-tyre") { Description = "Take the tyre as calibrated at speed (true rolling circumference told, no growth; the decoder told it with the 0.1 % σ of a roll over a measured 100 m); by default the box is told the static circumference and the tyre grows with speed." };
        var calibratedAccel = new Option<bool>("--calibrated-accel") { Description = "Tell the decoder the accelerometer's forward scale as a calibration against gravity gives it (truth plus a drawn 0.2 % error); the tyre stays as --calibrated-tyre says." };
        var only = new Option<BenchGroup[]>("--group") { Description = "Decode only these groups (the same runs as in the whole benchmark, for working on one group).", AllowMultipleArgumentsPerToken = true };
        var errorsCsv = new Option<FileInfo?>("--errors-csv") { Description = "Also write every run's error, σ and error/σ per figure to this CSV file (for pooling seeds)." };
        var json = new Option<bool>("--json") { Description = "Write the verdict accounting as JSON (per group and over the bench: runs judged, as expected, each level, the unexpected runs' reason codes, the two verdict goals) instead of the tables; with --seeds, each group's pooled figures and goals too." };
        var pickupWheelTold = new Option<bool>("--pickup-wheel-told") { Description = "Tell the decoder which wheel carries each simulated run's pickup (the settings' pickup_wheel: driven, driven_all_wheels or undriven), as a user who knows the car would; by default not said. Only runs with pulses alone change; the generated records that open moving are decoded once more, pulses only on a driven wheel told driven (the group GeneratedRollingPulsesDriven, which --group names without this option to decode them not told)." };

        // Pooling seeds: a block of its own.
        var seeds = new Option<string?>("--seeds") { Description = "Run the bench at each of these seeds (1-4, or 1,3,7) and judge every group's figures, coverage and goals over all their runs pooled, each pooled p95 with its distribution-free 95 % interval and each goal with every seed's own p95 beside it: for the small groups, whose p95 at one seed is one run. Not with --seed." };
        var command = new Command("accuracy", "Errors of our estimator and of the naive method against simulated and generated truth.") { runs, seed, list, calibrated, calibratedAccel, only, errorsCsv, json, seeds, pickupWheelTold };
        command.SetAction((parse, cancel) =>
        {
            IReadOnlyList<int>? pooled = null;
            if (parse.GetValue(seeds) is { } seedsText)
            {
                TextWriter error = parse.InvocationConfiguration.Error;
                if (parse.GetResult(seed) is { Implicit: false })
                {
                    error.WriteLine("launchlogger bench accuracy: give --seed or --seeds, not both");
                    return Task.FromResult((int)ExitCode.Usage);
                }

                pooled = SeedList.Parse(seedsText, out string? problem);
                if (pooled is null)
                {
                    error.WriteLine($"launchlogger bench accuracy: --seeds {seedsText}: {problem}");
                    return Task.FromResult((int)ExitCode.Usage);
                }
            }

            return Task.FromResult((int)Run(parse.GetValue(runs), parse.GetValue(seed), parse.GetValue(list), parse.GetValue(calibrated), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error, cancel, parse.GetValue(only), parse.GetValue(calibratedAccel), parse.GetValue(errorsCsv)?.FullName, parse.GetValue(json), pooled, parse.GetValue(pickupWheelTold)));
        });
        return command;
    }

    /// <summary>Runs the benchmark at <paramref name="seed"/>, or at each of
    /// <paramref name="seeds"/> with every group judged over all their runs pooled.</summary>
    public static ExitCode Run(int runs, int seed, bool list, bool calibratedTyre, TextWriter output, TextWriter error, CancellationToken cancel = default, IReadOnlyCollection<BenchGroup>? groups = null, bool calibratedAccel = false, string? errorsCsvPath = null, bool json = false, IReadOnlyList<int>? seeds = null, bool pickupWheelTold = false)
    {
        if (runs < 2 || runs > 100_000)
        {
            error.WriteLine("launchlogger bench accuracy: --runs must be from 2 to 100000");
            return ExitCode.Usage;
        }

        if (seeds is { Count: 0 })
        {
            error.WriteLine("launchlogger bench accuracy: --seeds names no seed");
            return ExitCode.Usage;
        }

        // Say so before minutes of decoding, not after: the CSV's folder must exist.
        if (errorsCsvPath is not null && Path.GetDirectoryName(Path.GetFullPath(errorsCsvPath)) is { } folder && !Directory.Exists(folder))
        {
            error.WriteLine($"launchlogger bench accuracy: cannot write {errorsCsvPath}: no folder {folder}");
            return ExitCode.BadInput;
        }

        int simulatedRuns = runs / 2;
        bool Wanted(BenchGroup group) => groups == null || groups.Count == 0 || groups.Contains(group);

        // The pulses-only driven copies of the rolling starts are made only when told or named.
        bool Named(BenchGroup group) => groups?.Contains(group) == true;
        bool Shown(BenchGroup group) => Wanted(group) && (group != BenchGroup.GeneratedRollingPulsesDriven || pickupWheelTold || Named(group));
        var started = System.Diagnostics.Stopwatch.StartNew();
        var all = new List<CaseOutcome>();
        int decodedCases = 0;
        try
        {
            IReadOnlyList<int> drawn = seeds ?? [seed];
            for (int k = 0; k < drawn.Count; k++)
            {
                string label = seeds is null ? "bench accuracy" : Text($"bench accuracy: seed {drawn[k]} ({k + 1} of {drawn.Count}, {started.Elapsed.TotalSeconds:0} s so far)");
                (List<CaseOutcome> outcomes, int cases) = Decode(runs, drawn[k], calibratedTyre, calibratedAccel, pickupWheelTold, Wanted, label, error, cancel, Named);
                all.AddRange(seeds is null ? outcomes : outcomes.Select(o => o with { Seed = drawn[k] }));
                decodedCases += cases;
            }
        }
        catch (OperationCanceledException)
        {
            error.WriteLine("bench accuracy: cancelled");
            return ExitCode.Cancelled;
        }

        if (json)
        {
            if (seeds is null)
            {
                WriteJson(all, Enum.GetValues<BenchGroup>().Where(Shown), seed, simulatedRuns, runs - simulatedRuns, output);
            }
            else
            {
                WritePooledJson(all, Enum.GetValues<BenchGroup>().Where(Shown), seeds, simulatedRuns, runs - simulatedRuns, calibratedTyre, output);
            }

            return ExitCode.Ok;
        }

        string tyre = (calibratedTyre ? "tyre taken as calibrated at speed (true rolling circumference told with a 0.1 % σ, no growth)" : "tyre NOT calibrated (static circumference told, and said to be static in the settings; the tyre rolls on 0-2 % less and grows with speed)")
            + (calibratedAccel ? "; accelerometer's forward scale calibrated (told to 0.2 %, drawn errors 1 % σ)" : "; accelerometer's scale NOT calibrated (errors 1 % σ)")
            + (pickupWheelTold ? "; each simulated pickup's wheel told (driven or undriven), and the generated rolling starts' pulses-only copies on a driven wheel told driven" : "");
        string drawnAt = seeds is null ? Text($"seed {seed}") : Text($"at each of the {seeds.Count} seeds {SeedList.Describe(seeds)}, pooled");
        output.WriteLine(Text($"bench accuracy: {simulatedRuns} simulated runs + {runs - simulatedRuns} generated records (their stops from cruise again with a brake switch, their standing starts again with a smooth take-up, every other one again with a lagged take-up), {drawnAt}, {started.Elapsed.TotalSeconds:0} s on {Environment.ProcessorCount} cores; error = estimate − truth; {tyre}"));
        if (seeds is not null)
        {
            output.WriteLine(Text($"pooled: every group's table, coverage and goals are over the runs of all {seeds.Count} seeds together (each seed draws its own cars, sensors and noise); each coverage has its exact 95 % interval, each goal is judged on the pooled p95 with its distribution-free 95 % interval (order statistics bracketed by binomial ranks, Conover §3.2) and whether that interval lies wholly within the goal, wholly outside it or around it, with every seed's own p95 after it (✗ where that seed alone misses the goal)"));
        }

        if (groups is { Count: > 0 })
        {
            output.WriteLine($"only the groups {string.Join(", ", groups)}: {decodedCases} of those runs decoded");
        }

        output.WriteLine("naive = first pulse as the start, speed from pulses counted over a sliding 0.1 s window, crossings interpolated linearly (same figure code)");
        foreach (CaseOutcome failed in all.Where(o => o.Failure != null))
        {
            output.WriteLine($"  run {RunName(failed, seeds)} failed: {failed.Failure} ({failed.Summary})");
        }

        List<CaseOutcome> decoded = all.Where(o => o.Failure == null).ToList();
        foreach (BenchGroup group in Enum.GetValues<BenchGroup>().Where(Shown))
        {
            WriteGroup(group, decoded.Where(o => o.Group == group).ToList(), all.Count(o => o.Group == group && !o.RunsAsExpected), calibratedTyre, output, seeds);
        }

        WholeBench(decoded, output);
        if (list)
        {
            WriteList(all, output, seeds);
        }

        if (errorsCsvPath is not null)
        {
            try
            {
                using var csv = new StreamWriter(errorsCsvPath);
                ErrorTable.Write(all, csv, withSeed: seeds is not null);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                error.WriteLine($"launchlogger bench accuracy: cannot write {errorsCsvPath}: {e.Message}");
                return ExitCode.BadInput;
            }
        }

        return ExitCode.Ok;
    }

    /// <summary>Builds and decodes one seed's bench (the wanted groups' cases only), with progress
    /// on <paramref name="error"/> under <paramref name="label"/>: every run's outcome, and how
    /// many cases were decoded.</summary>
    /// <exception cref="OperationCanceledException">Cancelled.</exception>
    private static (List<CaseOutcome> Outcomes, int Cases) Decode(int runs, int seed, bool calibratedTyre, bool calibratedAccel, bool pickupWheelTold, Func<BenchGroup, bool> wanted, string label, TextWriter error, CancellationToken cancel, Func<BenchGroup, bool>? named = null)
    {
        named ??= _ => false;
        int simulatedRuns = runs / 2;
        IReadOnlyList<AccuracyCase> simulated = AccuracyCase.Build(simulatedRuns, seed, calibratedTyre, calibratedAccel).Where(c => wanted(c.Group))
            .Select(c => pickupWheelTold ? c with { PickupWheelTold = c.PickupWheelKnown } : c).ToList();
        IReadOnlyList<PrescribedBenchCase> generated = PrescribedBenchCase.Build(runs - simulatedRuns, seed, simulatedRuns, calibratedTyre, calibratedAccel, wanted(BenchGroup.GeneratedStandingSmooth), wanted(BenchGroup.GeneratedStandingLagged), pickupWheelTold || named(BenchGroup.GeneratedRollingPulsesDriven), pickupWheelTold).Where(c => wanted(c.Group)).ToList();
        List<CaseOutcome> outcomes = ParallelCases.Run(simulated, AccuracyBenchmark.Run, $"{label}: simulated runs decoded", error, cancel).SelectMany(o => o).ToList();
        outcomes.AddRange(ParallelCases.Run(generated, PrescribedBenchmark.Run, $"{label}: generated records decoded", error, cancel).SelectMany(o => o));
        return (outcomes, simulated.Count + generated.Count);
    }

    /// <summary>A run as the output names it: its index, and its seed when seeds are pooled.</summary>
    private static string RunName(CaseOutcome o, IReadOnlyList<int>? seeds) =>
        seeds is null ? o.Index.ToString(CultureInfo.InvariantCulture) : Text($"{o.Index} of seed {o.Seed}");

    private static string Title(BenchGroup group) => group switch
    {
        BenchGroup.SimulatedAccelUndriven => "Simulated, accelerometer, pickup on an undriven wheel, edges or polled < 0.75 ms",
        BenchGroup.SimulatedAccelUndrivenPoll1Ms => "Simulated, accelerometer, undriven wheel, polled every 0.75-1.5 ms",
        BenchGroup.SimulatedAccelUndrivenPollCoarse => "Simulated, accelerometer, undriven wheel, polled every 1.5-10 ms",
        BenchGroup.SimulatedAccelDriven => "Simulated, accelerometer, pickup on a driven wheel (drive slip, wheelspin)",
        BenchGroup.SimulatedPulsesUndriven => "Simulated, pulses only, undriven wheel (first motion rests on a kinematic model)",
        BenchGroup.SimulatedPulsesDriven => "Simulated, pulses only, driven wheel",
        BenchGroup.GeneratedStanding => "Generated (independent truth), standing starts of many profiles, edges or polled 0.1-1 ms",
        BenchGroup.GeneratedLongIdle => "Generated, 60 s idle before a standing start",
        BenchGroup.GeneratedRolling => "Generated, records that open moving at 5-60 mph",
        BenchGroup.GeneratedCruiseStop => "Generated, steady cruise then a stop (brake rise 0.05-2 s or steady through the stop)",
        BenchGroup.GeneratedCruiseStopSwitch => "Generated, the stops above again as logs with a brake switch (delay 5-25 ms not told; polled loops stall 20 ms)",
        BenchGroup.GeneratedStopAndGo => "Generated, stop-and-go: two standing runs in one record",
        BenchGroup.GeneratedStandingSmooth => "Generated, the standing starts above again with a smooth take-up (raised-cosine rise, same car and sensors)",
        BenchGroup.GeneratedStandingLagged => "Generated, every other standing start above again with a lagged take-up (the ramp through a 0.02-0.15 s lag, same car and sensors)",
        BenchGroup.GeneratedRollingPulsesDriven => "Generated, the records that open moving above again, pulses only, on a driven wheel slipping by a drawn slip law (k 0.0048-0.0156 s²/m)",
        _ => group.ToString(),
    };

    /// <summary>The verdict each group's runs deserve, decided from what was simulated or
    /// generated (any run whose truth stays under 60 mph: doubtful with target_not_reached) (<see cref="AccuracyBenchmark.Expected"/>, <see cref="PrescribedBenchmark.Expected"/>
    /// decide it per run from the truth); a group added later is clean unless it says otherwise.</summary>
    private static string Expectation(BenchGroup group) => group switch
    {
        // A standing start with working sensors and an undriven pickup: nothing to doubt, at any
        // poll period (the σ carries the brackets).
        BenchGroup.SimulatedAccelUndriven or BenchGroup.SimulatedAccelUndrivenPoll1Ms or BenchGroup.SimulatedAccelUndrivenPollCoarse or BenchGroup.SimulatedPulsesUndriven
            => "valid (a standing start, working sensors, undriven pickup)",
        // The pickup wheel sees the drive: a wheel that spun past the tyre's friction peak runs
        // off on its own, which the judge's rule makes doubtful; drive slip short of it is normal.
        BenchGroup.SimulatedAccelDriven or BenchGroup.SimulatedPulsesDriven
            => "valid, or doubtful with wheelspin where the pickup wheel slipped past the tyre's friction peak for over 0.05 s before braking",
        // No standstill: the standing-start figures cannot be supported.
        BenchGroup.GeneratedRolling or BenchGroup.GeneratedCruiseStop or BenchGroup.GeneratedRollingPulsesDriven
            => "invalid with rolling_start alone (the record opens moving)",
        // The same, and a stalled loop's own marks.
        BenchGroup.GeneratedCruiseStopSwitch => "invalid with rolling_start (the record opens moving); a polled loop that stalls may add wide_brackets, accel_overflow",
        // Each run is judged on its own; the judge's rule doubts a run that stops short of 60 mph.
        BenchGroup.GeneratedStopAndGo => "two runs, each valid (two standing starts, working sensors), or doubtful with target_not_reached where the truth stays under 60 mph",
        _ => "valid (a standing start, working sensors, undriven pickup)",
    };

    /// <summary>The figures the truth has where the decoder reported none (a speed it did not
    /// clearly pass, a mark after the acceleration ended): each with how many of the runs that
    /// have it in truth.</summary>
    private static void MissedLine(List<CaseOutcome> runs, TextWriter output)
    {
        var missed = new List<string>();
        for (int m = 0; m < BenchFigure.All.Count; m++)
        {
            int k = runs.Count(o => o.Missed[m]);
            if (k > 0)
            {
                missed.Add(Text($"{BenchFigure.All[m].Name} {k} of {k + runs.Count(o => o.Ours[m] is not null)}"));
            }
        }

        if (missed.Count > 0)
        {
            output.WriteLine($"  not reported where the truth has it: {string.Join("; ", missed)}");
        }
    }

    private static void WriteGroup(BenchGroup group, List<CaseOutcome> runs, int runsSplitWrongly, bool calibratedTyre, TextWriter output, IReadOnlyList<int>? seeds = null)
    {
        output.WriteLine();
        output.WriteLine($"{Title(group)}: {runs.Count} runs");
        if (runs.Count == 0 && runsSplitWrongly == 0)
        {
            return;
        }

        output.WriteLine("  figure                           unit |  ours p50     p95     max |  naive p50     p95     max | naive/ours p95 | ±2σ cover  ±3σ cover |   n" + (seeds is null ? "" : " | ±2σ 95 % interval  ±3σ 95 % interval | ours p95's 95 % interval"));
        var coverageShort = new List<string>();
        for (int m = 0; m < BenchFigure.All.Count; m++)
        {
            BenchFigure figure = BenchFigure.All[m];
            double[] ours = Percentiles.AbsSorted(runs.Select(o => o.Ours[m]), figure.Scale);
            if (ours.Length == 0)
            {
                continue;
            }

            double[] naive = Percentiles.AbsSorted(runs.Select(o => o.Naive[m]), figure.Scale);
            double oursP95 = Percentiles.Of(ours, 0.95);
            double naiveP95 = Percentiles.Of(naive, 0.95);
            double cover2 = Coverage(runs, m, 2);
            double cover3 = Coverage(runs, m, 3);
            NoteCoverageShort(coverageShort, figure.Name, runs, m);

            string intervals = seeds is null ? "" : " | " + CoverageIntervalCell(runs, m, 2) + "  " + CoverageIntervalCell(runs, m, 3) + " | " + P95IntervalCell(ours);
            output.WriteLine(Text($"  {figure.Name,-32} {figure.Unit,4} | {Percentiles.Of(ours, 0.5),8:0.000} {oursP95,7:0.000} {Percentiles.Max(ours),7:0.000} | {Percentiles.Of(naive, 0.5),9:0.000} {naiveP95,7:0.000} {Percentiles.Max(naive),7:0.000} | {(oursP95 > 0 ? naiveP95 / oursP95 : double.NaN),14:0.0} | {cover2,7:0.0} %  {cover3,7:0.0} % | {ours.Length,3}{intervals}"));
        }

        AccelFirstFootLine(runs, output);
        MissedLine(runs, output);
        VerdictTally verdicts = VerdictTally.Of(runs.Select(o => (o.Expected, o.Verdict)));
        output.WriteLine($"  verdicts (expected: {Expectation(group)}): {verdicts.Describe()}");
        output.WriteLine(seeds is null ? "  goals:" : Text($"  goals, judged on the {seeds.Count} seeds' runs pooled:"));
        output.WriteLine(Text($"    truth within ±2σ in ≥ 95 % and ±3σ in ≥ 99 % of runs, every figure: {CoverageVerdict(coverageShort)}"));
        VerdictGoals(verdicts, output);
        switch (group)
        {
            case BenchGroup.GeneratedRolling or BenchGroup.GeneratedRollingPulsesDriven:
                int reported = runs.Count(o => o.StandingFigureOnRollingStart);
                output.WriteLine(Text($"    no standing-start figure reported, ever: {reported} of {runs.Count} runs had one — {(reported == 0 ? "met" : "NOT met")}"));
                break;
            case BenchGroup.GeneratedStopAndGo:
                output.WriteLine(Text($"    every record split into its two runs: {runsSplitWrongly} runs in records split otherwise — {(runsSplitWrongly == 0 ? "met" : "NOT met")}"));
                break;
        }

        foreach (BenchGoal goal in BenchGoal.Of(group, calibratedTyre))
        {
            Goal(runs, goal, output, seeds);
        }

        if (!calibratedTyre && BenchGoal.HasTyreBoundGoals(group))
        {
            output.WriteLine("    0-60 mph, 1/4 mile ET and trap goals apply with a calibrated tyre: run with --calibrated-tyre");
        }
    }

    /// <summary>The exact 95 % interval (<see cref="CoverageInterval"/>) of a figure's coverage at ±kσ, as a table cell.</summary>
    private static string CoverageIntervalCell(List<CaseOutcome> runs, int m, int k)
    {
        (double low, double high) = CoverageInterval.ClopperPearson(Covered(runs, m, k), runs.Count(o => o.Ours[m] is not null));
        return Text($"{100 * low,9:0.0}–{100 * high,5:0.0} %");
    }

    /// <summary>The distribution-free 95 % interval (<see cref="QuantileInterval"/>) of a figure's
    /// pooled |error| p95, as a table cell: ∞ where the runs are too few to bound it from above.</summary>
    private static string P95IntervalCell(double[] sorted)
    {
        QuantileInterval.Bracket b = QuantileInterval.Of(sorted, 0.95);
        return Text($"{BoundText(b.Lower),9}–{BoundText(b.Upper),-8}");
    }

    /// <summary>A bound of an |error| p95's interval: 0 for none below (an |error| is never
    /// less), ∞ for none above.</summary>
    private static string BoundText(double bound) =>
        double.IsNegativeInfinity(bound) ? "0" : double.IsPositiveInfinity(bound) ? "∞" : Text($"{bound:0.000}");

    /// <summary>A verdict must be right both ways: every clean run valid, no flawed run valid.</summary>
    private static void VerdictGoals(VerdictTally t, TextWriter output)
    {
        if (t.Clean > 0)
        {
            output.WriteLine($"    clean runs called valid: {t.CleanCalledValid} of {t.Clean} (goal: all) — {(t.CleanCalledValid == t.Clean ? "met" : "NOT met")}");
        }

        if (t.Flawed > 0)
        {
            output.WriteLine($"    flawed runs called valid: {t.FlawedCalledValid} of {t.Flawed} (goal: 0) — {(t.FlawedCalledValid == 0 ? "met" : "NOT met")}");
        }

        // Counted apart: a run whose top speed passed 60 mph by less than the data resolves
        // (TargetEdge) deserves valid and doubtful alike, so it proves neither goal.
        if (t.EitherWay > 0)
        {
            output.WriteLine(Text($"    runs either verdict fits (true top speed less than {TargetEdge.BandSigmas:0}σ of the run's speed above 60 mph): {t.EitherWay}, {t.EitherWayCalledValid} called valid"));
        }
    }

    /// <summary>One goal's line: the p95 over <paramref name="runs"/> against its limit; pooled,
    /// each seed's own p95 (and its runs) after it.</summary>
    private static void Goal(List<CaseOutcome> runs, BenchGoal goal, TextWriter output, IReadOnlyList<int>? seeds)
    {
        BenchFigure figure = BenchFigure.All[goal.Figure];
        double[] errors = goal.ErrorsOf(runs);
        (double p95, int n) = (Percentiles.Of(errors, 0.95), errors.Length);
        string verdict = n == 0 ? "no runs" : p95 <= goal.Limit ? "met" : "NOT met";

        // Pooled, the p95 has its distribution-free interval beside it, and the verdict says
        // whether the whole interval lies on the verdict's side of the goal.
        string interval = "";
        if (seeds is not null && n > 0)
        {
            QuantileInterval.Bracket bracket = QuantileInterval.Of(errors, 0.95);
            interval = ", " + IntervalText(bracket, figure.Unit);
            verdict = goal.Verdict(p95, bracket);
        }

        // Nearest rank: under 20 runs the p95 is the largest, which lies beyond the true p95 with
        // probability 1 − 0.95ⁿ (54 % at 15 runs; order statistics, distribution-free).
        string largest = n is > 0 and < 20 ? Text($" (the largest of {n}: beyond the true p95 in {100 * (1 - Math.Pow(0.95, n)):0} % of draws)") : "";
        string perSeed = seeds is null ? "" : "; per seed " + string.Join(" / ", seeds.Select(s => goal.P95Of(runs.Where(o => o.Seed == s)) switch
        {
            (_, 0) => "–",
            var (own, ownRuns) => Text($"{own:0.000}{(own > goal.Limit ? "✗" : "")} ({ownRuns})"),
        }));
        output.WriteLine(Text($"    {goal.Text}: {p95:0.000} {figure.Unit} over {n} runs{interval} — {verdict}{largest}{perSeed}"));
    }

    /// <summary>A p95's interval (<see cref="QuantileInterval"/>) as the pooled bench prints it:
    /// its bounds, their ranks among the n runs and the interval's own coverage; a bound the runs
    /// cannot give (too few of them) is said so.</summary>
    private static string IntervalText(QuantileInterval.Bracket b, string unit)
    {
        string lowerRank = b.LowerRank == 0 ? "none" : Text($"{b.LowerRank}");
        string ranks = double.IsPositiveInfinity(b.Upper)
            ? Text($"rank {lowerRank} up; {b.UpperRank - 1} runs bound no p95 from above, {QuantileInterval.RunsForUpperBound(0.95)} would;")
            : Text($"ranks {lowerRank}–{b.UpperRank},");
        return Text($"95 % interval {BoundText(b.Lower)}–{BoundText(b.Upper)} {unit} ({ranks} coverage {100 * b.Coverage:0.0} %)");
    }

    /// <summary>The accelerometer's own distance at the first foot (what the launch-slip allowance
    /// weighs the pulses against): its error and the coverage of the σ stated for it.</summary>
    private static void AccelFirstFootLine(List<CaseOutcome> runs, TextWriter output)
    {
        var checks = runs.Where(o => o.AccelFirstFoot is { Sigma: > 0 }).Select(o => o.AccelFirstFoot!.Value).ToList();
        if (checks.Count == 0)
        {
            return;
        }

        double[] errors = Percentiles.AbsSorted(checks.Select(c => (double?)c.Value), 1000);
        double[] sigmas = checks.Select(c => c.Sigma * 1000).Order().ToArray();
        double cover2 = 100.0 * checks.Count(c => Math.Abs(c.Value) <= 2 * c.Sigma) / checks.Count;
        double cover3 = 100.0 * checks.Count(c => Math.Abs(c.Value) <= 3 * c.Sigma) / checks.Count;
        double meanZ = checks.Average(c => c.Value / c.Sigma);
        double rmsZ = Math.Sqrt(checks.Average(c => c.Value * c.Value / (c.Sigma * c.Sigma)));
        output.WriteLine(Text($"  accelerometer's own distance at 1 ft: |error| p50 {Percentiles.Of(errors, 0.5):0.00} p95 {Percentiles.Of(errors, 0.95):0.00} max {Percentiles.Max(errors):0.00} mm, σ p50 {Percentiles.Of(sigmas, 0.5):0.00} mm; error/σ mean {meanZ:+0.00;-0.00} rms {rmsZ:0.00}; ±2σ {cover2:0.0} %, ±3σ {cover3:0.0} % of {checks.Count}"));
    }

    /// <summary>Each figure's coverage over every run decoded, whatever its group: the σ goal
    /// reads "over the full accuracy bench", and a group of a dozen runs shows one run outside
    /// ±2σ (a draw an honest σ makes one time in twenty) as 92 % — its line above says so, and
    /// this one says whether the figure's σ holds over the bench.</summary>
    private static void WholeBench(List<CaseOutcome> runs, TextWriter output)
    {
        output.WriteLine();
        output.WriteLine($"Whole bench: every decoded run, each figure over the runs that have it: {runs.Count} runs");
        output.WriteLine("  figure                           | ±2σ cover  ±3σ cover |    n | ±2σ 95 % interval | error/σ mean   rms | runs outside ±2σ (groups)");
        var coverageShort = new List<string>();
        for (int m = 0; m < BenchFigure.All.Count; m++)
        {
            int n = runs.Count(o => o.Ours[m] is not null);
            if (n == 0)
            {
                continue;
            }

            double cover2 = Coverage(runs, m, 2);
            double cover3 = Coverage(runs, m, 3);
            NoteCoverageShort(coverageShort, BenchFigure.All[m].Name, runs, m);
            (double low2, double high2) = CoverageInterval.ClopperPearson(Covered(runs, m, 2), n);
            double[] z = runs.Where(o => o.Ours[m] is not null && o.OurSigmas[m] is > 0).Select(o => o.Ours[m]!.Value / o.OurSigmas[m]!.Value).ToArray();

            string outside = string.Join(", ", runs
                .Where(o => o.Ours[m] is { } e && !(o.OurSigmas[m] is { } s && Math.Abs(e) <= 2 * s))
                .GroupBy(o => o.Group)
                .Select(g => $"{g.Count()} {g.Key}"));
            string moments = z.Length == 0 ? "" : Text($"{z.Average(),+12:+0.00;-0.00;0.00} {Math.Sqrt(z.Average(x => x * x)),5:0.00}");
            output.WriteLine(Text($"  {BenchFigure.All[m].Name,-32} | {cover2,7:0.0} %  {cover3,7:0.0} % | {n,4} | {100 * low2,7:0.0}–{100 * high2,5:0.0} %  | {moments,-18} | {(outside.Length == 0 ? "none" : outside)}"));
        }

        output.WriteLine(Text($"  goal: truth within ±2σ in ≥ 95 % and ±3σ in ≥ 99 % of runs over the bench, every figure: {CoverageVerdict(coverageShort)}"));
        VerdictTally verdicts = VerdictTally.Of(runs.Select(o => (o.Expected, o.Verdict)));
        output.WriteLine($"  verdicts: {verdicts.Describe()}");
        VerdictGoals(verdicts, output);
    }

    /// <summary>Adds a figure to <paramref name="shortfalls"/> when its coverage misses the σ goal.</summary>
    private static void NoteCoverageShort(List<string> shortfalls, string figure, List<CaseOutcome> runs, int m)
    {
        double[] z = runs.Where(o => o.Ours[m] is not null && o.OurSigmas[m] is > 0).Select(o => o.Ours[m]!.Value / o.OurSigmas[m]!.Value).ToArray();
        if (CoverageShortfall(figure, runs.Count(o => o.Ours[m] is not null), Covered(runs, m, 2), Covered(runs, m, 3), z) is { } shortfall)
        {
            shortfalls.Add(shortfall);
        }
    }

    /// <summary>A figure's coverage against the σ goal (≥ 95 % within ±2σ and ≥ 99 % within ±3σ):
    /// null when met; else both coverages with, for each one short, the exact 95 % interval
    /// (<see cref="CoverageInterval"/>) and whether the goal lies inside it (too few runs to tell a
    /// short σ from a chance draw) or above it (σ short); then the errors' mean in σ with its
    /// standard error, since a count that "holds" the goal can still come from errors all of one
    /// sign (a bias that σ only just covers).</summary>
    internal static string? CoverageShortfall(string figure, int total, int covered2, int covered3, IReadOnlyList<double>? errorsOverSigma = null)
    {
        double cover2 = total > 0 ? 100.0 * covered2 / total : double.NaN;
        double cover3 = total > 0 ? 100.0 * covered3 / total : double.NaN;
        if (cover2 >= 95 && cover3 >= 99)
        {
            return null;
        }

        var why = new List<string>();
        foreach ((int k, double goal, int covered) in new[] { (2, 95.0, covered2), (3, 99.0, covered3) })
        {
            if (total > 0 && 100.0 * covered / total < goal)
            {
                (double low, double high) = CoverageInterval.ClopperPearson(covered, total);
                why.Add(Text($"{covered} of {total} within ±{k}σ, 95 % interval {100 * low:0.0}–{100 * high:0.0} %: {(100 * high >= goal ? "holds" : "below")} {goal:0} %"));
            }
        }

        if (errorsOverSigma is { Count: > 1 } z)
        {
            double mean = z.Average();
            double spread = Math.Sqrt(z.Sum(x => (x - mean) * (x - mean)) / (z.Count - 1));
            why.Add(Text($"error/σ mean {mean:+0.00;-0.00;0.00} ± {spread / Math.Sqrt(z.Count):0.00}"));
        }

        return Text($"{figure} {cover2:0.0} % / {cover3:0.0} %{(why.Count > 0 ? " (" + string.Join("; ", why) + ")" : "")}");
    }

    /// <summary>The σ goal's verdict: met, or NOT met with the figures short.</summary>
    private static string CoverageVerdict(List<string> shortfalls) =>
        shortfalls.Count == 0 ? "met" : "NOT met (" + string.Join("; ", shortfalls) + ")";

    /// <summary>Percentage of runs with a figure and a σ whose error is within ±k·σ.</summary>
    private static double Coverage(List<CaseOutcome> runs, int m, double k)
    {
        int total = runs.Count(o => o.Ours[m] is not null);
        return total > 0 ? 100.0 * Covered(runs, m, k) / total : double.NaN;
    }

    /// <summary>How many runs have a figure and a σ whose error is within ±k·σ.</summary>
    private static int Covered(List<CaseOutcome> runs, int m, double k) =>
        runs.Count(o => o.Ours[m] is { } e && o.OurSigmas[m] is { } s && Math.Abs(e) <= k * s);

    private static void WriteList(List<CaseOutcome> all, TextWriter output, IReadOnlyList<int>? seeds)
    {
        output.WriteLine();
        output.WriteLine("Per run (ours / naive; ms, trap speed in m/s, stopping distance in m; ours beyond ±2σ shows its error in σ and the figure):" + (seeds is null ? "" : " each run as seed:index"));
        foreach (CaseOutcome o in all)
        {
            var cells = new List<string>();
            for (int m = 0; m < BenchFigure.All.Count; m++)
            {
                if (o.Ours[m] is null && o.Naive[m] is null)
                {
                    continue;
                }

                double scale = BenchFigure.All[m].Scale;
                string miss = o.Ours[m] is { } e && o.OurSigmas[m] is { } sd && sd > 0 && Math.Abs(e / sd) > 2 ? Text($"({e / sd:+0.0;-0.0}σ {BenchFigure.All[m].Name})") : "";
                cells.Add(Text($"{o.Ours[m] * scale:+0.00;-0.00;0}{miss}/{o.Naive[m] * scale:+0.0;-0.0;0}"));
            }

            if (o.AccelFirstFoot is { Sigma: > 0 } foot)
            {
                cells.Add(Text($"acc 1 ft {foot.Value * 1000:+0.0;-0.0} mm ({foot.Value / foot.Sigma:+0.0;-0.0}σ)"));
            }

            string run = seeds is null ? Text($"{o.Index,4}") : Text($"{o.Seed}:{o.Index,-4}");
            output.WriteLine($"  {run} {VerdictCell(o)} {string.Join("  ", cells)}  {o.Summary}{(o.Failure is null ? "" : " FAILED: " + o.Failure)}");
        }
    }

    /// <summary>The verdict accounting as JSON: per group and over the bench, with the runs that
    /// failed to decode counted apart.</summary>
    private static void WriteJson(List<CaseOutcome> all, IEnumerable<BenchGroup> groups, int seed, int simulated, int generated, TextWriter output)
    {
        List<CaseOutcome> decoded = all.Where(o => o.Failure == null).ToList();
        var document = new
        {
            seed,
            simulated_runs = simulated,
            generated_records = generated,
            failed = all.Count(o => o.Failure != null),
            groups = groups.Select(g => new { group = g.ToString(), expected = Expectation(g), verdicts = TallyJson(decoded.Where(o => o.Group == g).ToList()) }),
            whole_bench = TallyJson(decoded),
        };
        output.WriteLine(System.Text.Json.JsonSerializer.Serialize(document, JsonOptions));
    }

    private static readonly System.Text.Json.JsonSerializerOptions JsonOptions = new() { WriteIndented = true, Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping };

    /// <summary>A verdict tally as the JSON documents write it.</summary>
    private static object TallyJson(List<CaseOutcome> runs)
    {
        VerdictTally t = VerdictTally.Of(runs.Select(o => (o.Expected, o.Verdict)));
        return new
        {
            judged = t.Judged,
            as_expected = t.AsExpected,
            valid = t.ByLevel[(int)Decoding.Verdicts.VerdictLevel.Valid],
            doubtful = t.ByLevel[(int)Decoding.Verdicts.VerdictLevel.Doubtful],
            invalid = t.ByLevel[(int)Decoding.Verdicts.VerdictLevel.Invalid],
            clean = t.Clean,
            clean_called_valid = t.CleanCalledValid,
            flawed = t.Flawed,
            flawed_called_valid = t.FlawedCalledValid,
            either_way = t.EitherWay,
            either_way_called_valid = t.EitherWayCalledValid,
            not_as_expected = t.Unexpected.Select(u => new { level = VerdictTally.Name(u.Level), runs = u.Runs, codes = u.Codes.ToDictionary(c => c.Code, c => c.Count) }),
        };
    }

    /// <summary>The pooled bench as JSON: per group, every figure's pooled |error| p50, p95 and
    /// max (the figure's unit), its coverage at ±2σ and ±3σ with the exact 95 % intervals, and n;
    /// each goal judged on the pooled p95 with every seed's own; the verdict accounting.</summary>
    private static void WritePooledJson(List<CaseOutcome> all, IEnumerable<BenchGroup> groups, IReadOnlyList<int> seeds, int simulated, int generated, bool calibratedTyre, TextWriter output)
    {
        List<CaseOutcome> decoded = all.Where(o => o.Failure == null).ToList();
        object CoverageJson(List<CaseOutcome> runs, int m, int k)
        {
            int n = runs.Count(o => o.Ours[m] is not null);
            int covered = Covered(runs, m, k);
            (double low, double high) = CoverageInterval.ClopperPearson(covered, n);
            return new { covered, percent = 100.0 * covered / n, interval_low_percent = 100 * low, interval_high_percent = 100 * high };
        }

        object GroupJson(BenchGroup g)
        {
            List<CaseOutcome> runs = decoded.Where(o => o.Group == g).ToList();
            var figures = new List<object>();
            for (int m = 0; m < BenchFigure.All.Count; m++)
            {
                BenchFigure figure = BenchFigure.All[m];
                double[] ours = Percentiles.AbsSorted(runs.Select(o => o.Ours[m]), figure.Scale);
                if (ours.Length > 0)
                {
                    figures.Add(new { figure = figure.Name, unit = figure.Unit, n = ours.Length, p50 = Percentiles.Of(ours, 0.5), p95 = Percentiles.Of(ours, 0.95), p95_interval = P95IntervalJson(QuantileInterval.Of(ours, 0.95)), max = Percentiles.Max(ours), within_2_sigma = CoverageJson(runs, m, 2), within_3_sigma = CoverageJson(runs, m, 3) });
                }
            }

            var goals = BenchGoal.Of(g, calibratedTyre).Select(goal =>
            {
                double[] errors = goal.ErrorsOf(runs);
                (double pooled, int pooledRuns) = (Percentiles.Of(errors, 0.95), errors.Length);
                QuantileInterval.Bracket? bracket = pooledRuns > 0 ? QuantileInterval.Of(errors, 0.95) : null;
                return new
                {
                    goal = goal.Text,
                    limit = goal.Limit,
                    unit = BenchFigure.All[goal.Figure].Unit,
                    runs = pooledRuns,
                    p95 = pooledRuns > 0 ? pooled : (double?)null,
                    met = pooledRuns > 0 ? pooled <= goal.Limit : (bool?)null,
                    p95_interval = bracket is null ? null : P95IntervalJson(bracket),
                    verdict = bracket is null ? null : goal.Verdict(pooled, bracket),
                    interval_against_goal = bracket?.Against(goal.Limit) switch
                    {
                        QuantileInterval.GoalSide.WhollyWithin => "wholly within",
                        QuantileInterval.GoalSide.WhollyOutside => "wholly outside",
                        QuantileInterval.GoalSide.GoalInside => "goal inside",
                        _ => null,
                    },
                    per_seed = seeds.Select(s =>
                    {
                        (double own, int ownRuns) = goal.P95Of(runs.Where(o => o.Seed == s));
                        return new { seed = s, runs = ownRuns, p95 = ownRuns > 0 ? own : (double?)null, met = ownRuns > 0 ? own <= goal.Limit : (bool?)null };
                    }).ToList(),
                };
            }).ToList();
            return new { group = g.ToString(), expected = Expectation(g), runs = runs.Count, figures, goals, verdicts = TallyJson(runs) };
        }

        var document = new
        {
            seeds,
            simulated_runs_per_seed = simulated,
            generated_records_per_seed = generated,
            failed = all.Count(o => o.Failure != null),
            groups = groups.Select(GroupJson).ToList(),
            whole_bench = TallyJson(decoded),
        };
        output.WriteLine(System.Text.Json.JsonSerializer.Serialize(document, JsonOptions));
    }

    /// <summary>A p95's interval (<see cref="QuantileInterval"/>) as the pooled JSON writes it:
    /// a bound the runs cannot give is null (its rank 0 or n + 1).</summary>
    private static object P95IntervalJson(QuantileInterval.Bracket b) => new
    {
        low = double.IsNegativeInfinity(b.Lower) ? (double?)null : b.Lower,
        high = double.IsPositiveInfinity(b.Upper) ? (double?)null : b.Upper,
        low_rank = b.LowerRank,
        high_rank = b.UpperRank,
        coverage = b.Coverage,
        confidence = QuantileInterval.Confidence,
    };

    /// <summary>The run's verdict with its reason codes, and "(expected …)" when it deserved another.</summary>
    private static string VerdictCell(CaseOutcome o)
    {
        if (o.Verdict is not { } v)
        {
            return "[no verdict]";
        }

        string codes = v.Reasons.Count == 0 ? "" : ": " + string.Join(",", v.Reasons.Select(r => r.Code));
        string expected = o.Expected is { } e && !e.Matches(v)
            ? $" (expected {VerdictTally.Name(e.Level)}{(e.Codes.Count == 0 ? "" : ": " + string.Join(",", e.Codes))})"
            : "";
        return $"[{VerdictTally.Name(v.Level)}{codes}{expected}]";
    }

    private static string Text(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);
}
