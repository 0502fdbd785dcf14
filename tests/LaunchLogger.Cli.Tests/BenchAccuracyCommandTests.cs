using LaunchLogger.Cli.Verbs;

namespace LaunchLogger.Cli.Tests;

/// <summary><c>bench accuracy</c> runs simulated and generated records and prints every group
/// with its coverage columns and goals (its figures are for people; nothing here is timed).</summary>
public class BenchAccuracyCommandTests
{
    [Fact]
    public void A_small_bench_prints_coverage_columns_and_goals_for_simulated_and_generated_runs()
    {
        var output = new StringWriter();
        var error = new StringWriter();
        ExitCode code = BenchAccuracyCommand.Run(4, 2, list: true, calibratedTyre: false, output, error);

        string text = output.ToString();
        Assert.Equal(ExitCode.Ok, code);
        Assert.Contains("2 simulated runs + 2 generated records", text);
        Assert.Contains("tyre NOT calibrated", text);
        Assert.Contains("±2σ cover  ±3σ cover", text);
        Assert.Contains("Generated (independent truth), standing starts", text);
        Assert.Contains("Generated, records that open moving", text);
        Assert.Contains("truth within ±2σ in ≥ 95 % and ±3σ in ≥ 99 % of runs", text);
        Assert.Contains("pulses counted over a sliding 0.1 s window", text);
    }

    [Fact]
    public void The_whole_bench_block_counts_each_figure_over_every_group()
    {
        // The block's n for a figure is the sum of the groups' n above it: 8 runs, seed 2, hold
        // several groups (simulated and generated), so a block that counted one group would differ.
        var output = new StringWriter();
        Assert.Equal(ExitCode.Ok, BenchAccuracyCommand.Run(8, 2, list: false, calibratedTyre: false, output, new StringWriter()));
        string[] lines = output.ToString().Split('\n');
        int whole = Array.FindIndex(lines, l => l.StartsWith("Whole bench:", StringComparison.Ordinal));
        Assert.True(whole > 0, "no whole-bench block");
        string firstMotion = lines.Skip(whole).First(l => l.TrimStart().StartsWith("first motion", StringComparison.Ordinal));
        int wholeN = int.Parse(firstMotion.Split('|')[2].Trim(), System.Globalization.CultureInfo.InvariantCulture);
        int groupsN = lines.Take(whole)
            .Where(l => l.TrimStart().StartsWith("first motion ", StringComparison.Ordinal) && l.Count(c => c == '|') == 5)
            .Sum(l => int.Parse(l.Split('|')[5].Trim(), System.Globalization.CultureInfo.InvariantCulture));
        Assert.True(groupsN > 0);
        Assert.Equal(groupsN, wholeN);
        Assert.True(lines.Take(whole).Count(l => l.TrimStart().StartsWith("first motion ", StringComparison.Ordinal) && l.Count(c => c == '|') == 5) > 1, "one group only: the sum proves nothing");
        Assert.Contains(lines.Skip(whole), l => l.Contains("over the bench, every figure:", StringComparison.Ordinal));
    }

    [Fact]
    public void A_calibrated_tyre_is_said_and_its_goals_judged()
    {
        var output = new StringWriter();
        ExitCode code = BenchAccuracyCommand.Run(2, 3, list: false, calibratedTyre: true, output, new StringWriter());

        Assert.Equal(ExitCode.Ok, code);
        Assert.Contains("tyre taken as calibrated at speed", output.ToString());
        Assert.DoesNotContain("run with --calibrated-tyre", output.ToString());
    }

    [Fact]
    public void A_calibrated_tyre_is_told_to_the_decoder_with_a_measurement_s_sigma_as_a_user_s_settings_would()
    {
        // Told only as a value, the decoder would keep its 1 % prior for a static circumference and
        // let a run's own fit (0.5 % or so) replace an exact tyre.
        var simulated = LaunchLogger.Cli.Bench.AccuracyCase.Build(6, 1, calibratedTyre: true);
        var generated = LaunchLogger.Cli.Bench.PrescribedBenchCase.Build(6, 1, 6, calibratedTyre: true);
        foreach (LaunchLogger.Decoding.Estimate? told in simulated.Select(c => c.TyreCalibration).Concat(generated.Select(c => c.TyreCalibration)))
        {
            Assert.NotNull(told);
            var settings = LaunchLogger.Cli.Bench.AccelScaleDraw.Options(null, told)!.Calibration!;
            Assert.Equal(0.001, settings.CircumferenceSigmaM!.Value / settings.CircumferenceM!.Value, 12);
        }

        Assert.All(simulated, c => Assert.Equal(c.Scenario.Box.ConfiguredCircumferenceM, c.TyreCalibration!.Value.Value));
        Assert.All(generated, c => Assert.Equal(c.Spec.Pickup.Tyre.StatedCircumferenceM, c.TyreCalibration!.Value.Value));
        Assert.All(LaunchLogger.Cli.Bench.AccuracyCase.Build(6, 1, calibratedTyre: false), c => Assert.Null(c.TyreCalibration));
        Assert.Null(LaunchLogger.Cli.Bench.AccelScaleDraw.Options(null, null));
    }

    [Fact]
    public void Naming_a_group_decodes_and_prints_only_that_group()
    {
        var output = new StringWriter();
        ExitCode code = BenchAccuracyCommand.Run(8, 2, list: true, calibratedTyre: true, output, new StringWriter(), groups: [LaunchLogger.Cli.Bench.BenchGroup.GeneratedStanding]);

        string text = output.ToString();
        Assert.Equal(ExitCode.Ok, code);
        Assert.Contains("only the groups GeneratedStanding", text);
        Assert.Contains("Generated (independent truth), standing starts", text);
        Assert.DoesNotContain("Generated, records that open moving", text);
        Assert.DoesNotContain("Simulated, accelerometer", text);
    }

    /// <summary>Under 20 runs the nearest-rank p95 is the largest run, and the largest of n draws
    /// lies beyond the true 95th percentile with probability 1 − 0.95ⁿ (order statistics: all n
    /// below it with probability 0.95ⁿ; David and Nagaraja, Order Statistics, from memory). A goal
    /// line over a small group must say so.</summary>
    [Fact]
    public void A_goal_over_fewer_than_twenty_runs_says_its_p95_is_the_largest_run()
    {
        var output = new StringWriter();
        Assert.Equal(ExitCode.Ok, BenchAccuracyCommand.Run(8, 2, list: true, calibratedTyre: false, output, new StringWriter(), groups: [LaunchLogger.Cli.Bench.BenchGroup.GeneratedStanding]));
        string text = output.ToString();

        var goal = System.Text.RegularExpressions.Regex.Match(text, @"first motion p95 ≤ 5 ms: ([\d.]+) ms over (\d+) runs — (?:met|NOT met) \(the largest of (\d+): beyond the true p95 in (\d+) % of draws\)");
        Assert.True(goal.Success, text);
        int n = int.Parse(goal.Groups[2].Value, System.Globalization.CultureInfo.InvariantCulture);
        Assert.Equal(n, int.Parse(goal.Groups[3].Value, System.Globalization.CultureInfo.InvariantCulture));
        Assert.Equal(Math.Round(100 * (1 - Math.Pow(0.95, n))), double.Parse(goal.Groups[4].Value, System.Globalization.CultureInfo.InvariantCulture));

        // The per-run list's first cell after the run's index and its [verdict] is its first-motion
        // error (ms): the p95 is its largest.
        double largest = text[text.IndexOf("Per run", StringComparison.Ordinal)..].Split('\n').Skip(1)
            .Select(l => System.Text.RegularExpressions.Regex.Replace(l.Trim(), @"^\d+\s+(\[[^\]]*\]\s+)?", string.Empty)).Where(l => l.Length > 0)
            .Max(l => Math.Abs(double.Parse(l.Split(' ', 2)[0].Split('/')[0].Split('(')[0], System.Globalization.CultureInfo.InvariantCulture)));
        Assert.Equal(largest, double.Parse(goal.Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture), 2);
    }

    [Fact]
    public void The_json_verdict_accounting_adds_up_per_group_and_over_the_bench()
    {
        var output = new StringWriter();
        ExitCode code = BenchAccuracyCommand.Run(16, 2, list: false, calibratedTyre: false, output, new StringWriter(), groups: [LaunchLogger.Cli.Bench.BenchGroup.GeneratedStanding, LaunchLogger.Cli.Bench.BenchGroup.GeneratedRolling], json: true);

        Assert.Equal(ExitCode.Ok, code);
        using var document = System.Text.Json.JsonDocument.Parse(output.ToString());
        System.Text.Json.JsonElement root = document.RootElement;
        Assert.Equal(2, root.GetProperty("groups").GetArrayLength());
        int judged = 0;
        foreach (System.Text.Json.JsonElement g in root.GetProperty("groups").EnumerateArray())
        {
            System.Text.Json.JsonElement v = g.GetProperty("verdicts");
            int n = v.GetProperty("judged").GetInt32();
            judged += n;
            // Every run judged has one level, and is clean, flawed or one either verdict fits (at
            // 60 mph's edge), as expected or not.
            Assert.Equal(n, v.GetProperty("valid").GetInt32() + v.GetProperty("doubtful").GetInt32() + v.GetProperty("invalid").GetInt32());
            Assert.Equal(n, v.GetProperty("clean").GetInt32() + v.GetProperty("flawed").GetInt32() + v.GetProperty("either_way").GetInt32());
            Assert.Equal(n, v.GetProperty("as_expected").GetInt32() + v.GetProperty("not_as_expected").EnumerateArray().Sum(u => u.GetProperty("runs").GetInt32()));
        }

        Assert.True(judged > 0);
        Assert.Equal(judged, root.GetProperty("whole_bench").GetProperty("judged").GetInt32());
        // Records that open moving are flawed by their truth: the rolling group has no clean run.
        System.Text.Json.JsonElement rolling = root.GetProperty("groups").EnumerateArray().Single(g => g.GetProperty("group").GetString() == "GeneratedRolling").GetProperty("verdicts");
        Assert.Equal(0, rolling.GetProperty("clean").GetInt32());
        Assert.Equal(rolling.GetProperty("judged").GetInt32(), rolling.GetProperty("flawed").GetInt32());
    }

    [Fact]
    public void Every_figure_the_report_prints_with_a_sigma_has_a_coverage_line()
    {
        // The report prints first motion, the rollout mark after first motion and its speed, the
        // grade at staging, every standard interval (standing ones under both conventions), every
        // mark under both conventions with its trap speed, and the stop: each with a ±.
        var figures = LaunchLogger.Cli.Bench.BenchFigure.All;
        var standard = LaunchLogger.Decoding.Metrics.FigureRequest.Standard;
        int expected = 4 + 2 // first motion, rollout after first motion and its speed, grade; the stop
            + standard.SpeedIntervals.Sum(i => i.IsStanding ? 2 : 1)
            + standard.DistanceMarks.Sum(m => m.TrapLengthM is null ? 2 : 3)
            + 1; // the rollout mark on the input's clock (the JSON's time_s)
        Assert.Equal(expected, figures.Count);
        Assert.Equal(figures.Count, figures.Select(f => f.Name).Distinct().Count());

        var output = new StringWriter();
        Assert.Equal(ExitCode.Ok, BenchAccuracyCommand.Run(8, 1, list: false, calibratedTyre: false, output, new StringWriter(), groups: [LaunchLogger.Cli.Bench.BenchGroup.GeneratedStanding]));
        string text = output.ToString();
        foreach (string name in new[] { "rollout after first motion", "speed at rollout", "grade at staging", "0-30 mph after rollout", "50-70 mph", "60 ft after rollout", "660 ft (1/8 mile) trap speed", "400 m after rollout" })
        {
            Assert.Contains(name, text);
        }
    }

    [Fact]
    public void Fewer_than_two_runs_is_a_usage_error()
    {
        var error = new StringWriter();
        Assert.Equal(ExitCode.Usage, BenchAccuracyCommand.Run(1, 1, false, false, new StringWriter(), error));
        Assert.Contains("--runs", error.ToString());
    }

    [Fact]
    public void An_errors_csv_in_a_missing_folder_is_refused_before_any_decoding()
    {
        string missing = Path.Combine(Path.GetTempPath(), "launchlogger-no-such-folder-" + Guid.NewGuid().ToString("N"), "errors.csv");
        var output = new StringWriter();
        var error = new StringWriter();
        Assert.Equal(ExitCode.BadInput, BenchAccuracyCommand.Run(4, 1, false, false, output, error, errorsCsvPath: missing));
        Assert.Contains("cannot write", error.ToString());
        Assert.Equal(string.Empty, output.ToString());
        Assert.False(File.Exists(missing));
    }
}
