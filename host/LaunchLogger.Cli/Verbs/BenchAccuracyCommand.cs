using System.CommandLine;
using System.Globalization;
using LaunchLogger.Cli.Bench;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger bench accuracy</c>: errors against the simulator's truth for our
/// estimator and the naive method, side by side, with the accuracy goals.</summary>
public static class BenchAccuracyCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var runs = new Option<int>("--runs") { Description = "Simulated runs.", DefaultValueFactory = _ => 200 };
        var seed = new Option<int>("--seed") { Description = "Seed for the variations and the sensors' noise.", DefaultValueFactory = _ => 1 };
        var list = new Option<bool>("--list") { Description = "Also print every run's errors." };
        var command = new Command("accuracy", "Errors of our estimator and of the naive method against simulated truth.") { runs, seed, list };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(parse.GetValue(runs), parse.GetValue(seed), parse.GetValue(list), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error, cancel)));
        return command;
    }

    /// <summary>Runs the benchmark.</summary>
    public static ExitCode Run(int runs, int seed, bool list, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        if (runs < 1 || runs > 100_000)
        {
            error.WriteLine("launchlogger bench accuracy: --runs must be from 1 to 100000");
            return ExitCode.Usage;
        }

        IReadOnlyList<AccuracyCase> cases = AccuracyCase.Build(runs, seed);
        List<CaseOutcome> all;
        try
        {
            all = ParallelCases.Run(cases, AccuracyBenchmark.Run, "bench accuracy: runs simulated and decoded", error, cancel);
        }
        catch (OperationCanceledException)
        {
            error.WriteLine("bench accuracy: cancelled");
            return ExitCode.Cancelled;
        }

        output.WriteLine($"bench accuracy: {runs} simulated runs, seed {seed}; error = estimate − truth; tyre taken as calibrated");
        foreach (CaseOutcome failed in all.Where(o => o.Failure != null))
        {
            output.WriteLine($"  run {failed.Case.Index} failed: {failed.Failure} ({failed.Case.Summary})");
        }

        List<CaseOutcome> decoded = all.Where(o => o.Failure == null).ToList();
        WriteGroup("With accelerometer, pickup on an undriven wheel", decoded.Where(o => o.Case.HasAccelerometer && !o.Case.DrivenPickup).ToList(), withGoals: true, output);
        WriteGroup("With accelerometer, pickup on a driven wheel (drive slip, wheelspin)", decoded.Where(o => o.Case.HasAccelerometer && o.Case.DrivenPickup).ToList(), withGoals: true, output);
        WriteGroup("Pulses only, undriven wheel (first motion rests on a kinematic model)", decoded.Where(o => !o.Case.HasAccelerometer && !o.Case.DrivenPickup).ToList(), withGoals: false, output);
        WriteGroup("Pulses only, driven wheel", decoded.Where(o => !o.Case.HasAccelerometer && o.Case.DrivenPickup).ToList(), withGoals: false, output);
        if (list)
        {
            WriteList(all, output);
        }

        return ExitCode.Ok;
    }

    private static void WriteGroup(string title, List<CaseOutcome> group, bool withGoals, TextWriter output)
    {
        output.WriteLine();
        output.WriteLine($"{title}: {group.Count} runs");
        if (group.Count == 0)
        {
            return;
        }

        output.WriteLine("  figure                      unit |   ours p50    p95    max |  naive p50    p95    max | naive/ours p95 | within ±2σ");
        for (int m = 0; m < AccuracyBenchmark.Metrics.Count; m++)
        {
            Metric metric = AccuracyBenchmark.Metrics[m];
            double[] ours = Percentiles.AbsSorted(group.Select(o => o.Ours[m]), metric.Scale);
            double[] naive = Percentiles.AbsSorted(group.Select(o => o.Naive[m]), metric.Scale);
            int covered = group.Count(o => o.Ours[m] is { } e && o.OurSigmas[m] is { } s && Math.Abs(e) <= 2 * s);
            int withSigma = group.Count(o => o.Ours[m] is not null && o.OurSigmas[m] is not null);
            double oursP95 = Percentiles.Of(ours, 0.95);
            double naiveP95 = Percentiles.Of(naive, 0.95);
            output.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"  {metric.Name,-27} {metric.Unit,4} | {Percentiles.Of(ours, 0.5),9:0.000} {oursP95,6:0.000} {Percentiles.Max(ours),6:0.000} | {Percentiles.Of(naive, 0.5),9:0.000} {naiveP95,6:0.000} {Percentiles.Max(naive),6:0.000} | {(oursP95 > 0 ? naiveP95 / oursP95 : double.NaN),14:0.0} | {(withSigma > 0 ? 100.0 * covered / withSigma : double.NaN),8:0.0} %"));
        }

        if (withGoals)
        {
            output.WriteLine();
            output.WriteLine("  goals (with accelerometer):");
            Goal(group, 0, 5, "first motion p95 ≤ 5 ms and ≥ 10× better than naive", tenfold: true, output);
            Goal(group, 2, 5, "0-60 mph from standstill p95 ≤ 5 ms and ≥ 10× better than naive", tenfold: true, output);
            Goal(group, 1, 2, "rollout mark p95 ≤ 2 ms", tenfold: false, output);
            Goal(group, 4, 5, "1/4 mile elapsed time p95 ≤ 5 ms", tenfold: false, output);
            Goal(group, 5, 0.05, "1/4 mile trap speed p95 ≤ 0.05 m/s", tenfold: false, output);
        }
        else
        {
            int m = 0;
            int covered = group.Count(o => o.Ours[m] is { } e && o.OurSigmas[m] is { } s && Math.Abs(e) <= 2 * s);
            int total = group.Count(o => o.Ours[m] is not null);
            double pct = total > 0 ? 100.0 * covered / total : double.NaN;
            output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  goal: truth within ±2σ of first motion in ≥ 95 % of runs: {pct:0.0} % — {(pct >= 95 ? "met" : "NOT met")}"));
        }
    }

    private static void Goal(List<CaseOutcome> group, int m, double limit, string text, bool tenfold, TextWriter output)
    {
        Metric metric = AccuracyBenchmark.Metrics[m];
        double oursP95 = Percentiles.Of(Percentiles.AbsSorted(group.Select(o => o.Ours[m]), metric.Scale), 0.95);
        double naiveP95 = Percentiles.Of(Percentiles.AbsSorted(group.Select(o => o.Naive[m]), metric.Scale), 0.95);
        bool met = oursP95 <= limit && (!tenfold || naiveP95 >= 10 * oursP95);
        string ratio = tenfold ? string.Create(CultureInfo.InvariantCulture, $", naive {naiveP95 / oursP95:0.0}×") : "";
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"    {text}: {oursP95:0.000} {metric.Unit}{ratio} — {(met ? "met" : "NOT met")}"));
    }

    private static void WriteList(List<CaseOutcome> all, TextWriter output)
    {
        output.WriteLine();
        output.WriteLine("Per run (ours / naive; ms, trap speed in m/s):");
        foreach (CaseOutcome o in all)
        {
            var cells = new List<string>();
            for (int m = 0; m < AccuracyBenchmark.Metrics.Count; m++)
            {
                double scale = AccuracyBenchmark.Metrics[m].Scale;
                cells.Add(string.Create(CultureInfo.InvariantCulture, $"{o.Ours[m] * scale:+0.00;-0.00;0}/{o.Naive[m] * scale:+0.0;-0.0;0}"));
            }

            output.WriteLine($"  {o.Case.Index,4} {string.Join("  ", cells)}  {o.Case.Summary}{(o.Failure is null ? "" : " FAILED: " + o.Failure)}");
        }
    }
}
