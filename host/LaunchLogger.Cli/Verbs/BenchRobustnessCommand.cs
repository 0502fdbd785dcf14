using System.CommandLine;
using System.Globalization;
using LaunchLogger.Cli.Bench;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger bench robustness</c>: seeded mutations of simulated logs through the
/// whole decoder under per-case time and allocation limits.</summary>
public static class BenchRobustnessCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var cases = new Option<int>("--cases") { Description = "Mutated logs to decode.", DefaultValueFactory = _ => 200 };
        var seed = new Option<int>("--seed") { Description = "Seed for the logs and the mutations.", DefaultValueFactory = _ => 1 };
        var command = new Command("robustness", "Decode seeded mutations of simulated logs (flips, cuts, garbage, duplicates, swaps, drops, joined logs, field changes under a good CRC); count crashes, hangs, frames recovered, the largest allocation.") { cases, seed };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(parse.GetValue(cases), parse.GetValue(seed), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error, RobustnessBenchmark.Limits.Default, cancel)));
        return command;
    }

    /// <summary>Runs the benchmark; <see cref="ExitCode.CheckFailed"/> when any case crashed, hung,
    /// went over the allocation limit or lost an undamaged frame.</summary>
    public static ExitCode Run(int cases, int seed, TextWriter output, TextWriter error, RobustnessBenchmark.Limits limits, CancellationToken cancel = default)
    {
        if (cases < 1 || cases > 10_000_000)
        {
            error.WriteLine("launchlogger bench robustness: --cases must be from 1 to 10000000");
            return ExitCode.Usage;
        }

        IReadOnlyList<byte[]> bases = RobustnessBenchmark.BaseLogs(seed);
        bool[] baseHoldsRests = bases.Select(b => LogReader.Read(b, "base.log").BenchRests.Count > 0).ToArray();
        var outcomes = new List<RobustnessBenchmark.Outcome>(Math.Min(cases, 1_000_000));
        var clock = System.Diagnostics.Stopwatch.StartNew();
        for (int i = 0; i < cases; i++)
        {
            if (cancel.IsCancellationRequested)
            {
                // Ctrl+C on a long run: the cases finished so far are still worth reporting.
                error.WriteLine($"bench robustness: cancelled after {i} of {cases} cases; the summary below covers those");
                break;
            }

            outcomes.Add(RobustnessBenchmark.RunCase(bases, seed, i, limits));
            if ((i + 1) % 1000 == 0)
            {
                error.WriteLine(string.Create(CultureInfo.InvariantCulture, $"bench robustness: {i + 1} of {cases} cases ({(i + 1) / clock.Elapsed.TotalSeconds:0.0} cases/s)"));
            }
        }

        if (outcomes.Count == 0)
        {
            return ExitCode.Cancelled;
        }

        CultureInfo inv = CultureInfo.InvariantCulture;
        long undamaged = outcomes.Sum(o => o.Undamaged);
        long recovered = outcomes.Sum(o => o.Recovered);
        int crashes = outcomes.Count(o => o.Crash != null);
        int hangs = outcomes.Count(o => o.Hung);
        int overMemory = outcomes.Count(o => o.AllocatedBytes > limits.AllocatedBytes);
        RobustnessBenchmark.Outcome largest = outcomes.MaxBy(o => o.AllocatedBytes)!;
        RobustnessBenchmark.Outcome slowest = outcomes.MaxBy(o => o.Seconds)!;
        output.WriteLine($"bench robustness: {outcomes.Count} cases, seed {seed}, {bases.Count} logs ({baseHoldsRests.Count(h => h)} with bench rests); limits {limits.PerCase.TotalSeconds:0} s and {limits.AllocatedBytes / 1048576} MB allocated per case");
        output.WriteLine(string.Create(inv, $"  cases                       {outcomes.Count}{(outcomes.Count < cases ? $" of {cases} asked (cancelled)" : "")}, {outcomes.Count / clock.Elapsed.TotalSeconds:0.0} cases/s"));
        output.WriteLine(string.Create(inv, $"  crashes                     {crashes}"));
        output.WriteLine(string.Create(inv, $"  hangs                       {hangs}"));
        output.WriteLine(string.Create(inv, $"  over the allocation limit   {overMemory}"));
        output.WriteLine(string.Create(inv, $"  undamaged frames recovered  {recovered} of {undamaged} ({(undamaged == 0 ? 100 : 100.0 * recovered / undamaged):0.000} %)"));
        int casesWithRests = outcomes.Count(o => baseHoldsRests[o.Base]);
        string restsRead = string.Join(", ", outcomes.SelectMany(o => o.Rests).GroupBy(r => r).OrderBy(g => g.Key, StringComparer.Ordinal).Select(g => $"{g.Count()} {g.Key}"));
        output.WriteLine(string.Create(inv, $"  cases on logs with rests    {casesWithRests}; bench rests reported {outcomes.Sum(o => o.Rests.Count)}{(restsRead.Length > 0 ? $" ({restsRead})" : "")}"));
        output.WriteLine(string.Create(inv, $"  largest allocation          {largest.AllocatedBytes / 1048576.0:0.0} MB (case {largest.Index}, {largest.Kind})"));
        output.WriteLine(string.Create(inv, $"  slowest case                {slowest.Seconds:0.000} s (case {slowest.Index}, {slowest.Kind})"));
        foreach (IGrouping<RobustnessBenchmark.Kind, RobustnessBenchmark.Outcome> kind in outcomes.GroupBy(o => o.Kind).OrderBy(g => g.Key))
        {
            output.WriteLine(string.Create(inv, $"    {kind.Key,-12} {kind.Count(),8} cases, {kind.Count(o => o.Crash != null)} crashes, {kind.Count(o => o.Hung)} hangs, mean {kind.Average(o => o.Seconds) * 1000:0} ms"));
        }

        foreach (RobustnessBenchmark.Outcome crash in outcomes.Where(o => o.Crash != null || o.Hung).Take(20))
        {
            output.WriteLine($"  case {crash.Index} ({crash.Kind}): {(crash.Hung ? "hung" : crash.Crash)}");
        }

        bool ok = crashes == 0 && hangs == 0 && overMemory == 0 && recovered == undamaged;
        return !ok ? ExitCode.CheckFailed : outcomes.Count < cases ? ExitCode.Cancelled : ExitCode.Ok;
    }
}
