using System.Globalization;
using System.Text.Json;
using LaunchLogger.Cli.Bench;
using LaunchLogger.Cli.Verbs;

namespace LaunchLogger.Cli.Tests;

/// <summary><c>bench accuracy --seeds</c>: every group judged over the runs of several seeds put
/// together. Each pooled figure is checked against the single-seed benches' own per-run tables
/// (<c>--errors-csv</c>), concatenated and worked again here with nothing of the bench's code.</summary>
public class BenchAccuracyPoolingTests
{
    private const int Runs = 16;
    private static readonly BenchGroup[] Standing = [BenchGroup.GeneratedStanding];

    /// <summary>One row of an error table: figure, |error| in the printed unit, error/σ.</summary>
    private sealed record Row(int Seed, string Figure, double Error, double? Sigma);

    private static List<Row> ReadTable(string path, int seed) =>
        File.ReadAllLines(path).Skip(1).Select(l => l.Split(','))
            .Select(c => new Row(seed, c[2].Trim('"'), double.Parse(c[3], CultureInfo.InvariantCulture), c[4].Length == 0 ? null : double.Parse(c[4], CultureInfo.InvariantCulture)))
            .ToList();

    /// <summary>Nearest rank: the ⌈p·n⌉-th smallest (Hyndman and Fan 1996, definition 1; from memory).</summary>
    private static double NearestRank(IEnumerable<double> values, double p)
    {
        double[] sorted = values.Order().ToArray();
        return sorted[(int)Math.Ceiling(p * sorted.Length) - 1];
    }

    [Fact]
    public void Pooled_figures_goals_and_intervals_are_those_of_the_seeds_runs_put_together()
    {
        using var folder = new TempFolder();
        var rows = new List<Row>();
        foreach (int seed in new[] { 1, 2 })
        {
            string csv = folder.File($"seed{seed}.csv");
            Assert.Equal(ExitCode.Ok, BenchAccuracyCommand.Run(Runs, seed, false, false, new StringWriter(), new StringWriter(), groups: Standing, errorsCsvPath: csv));
            rows.AddRange(ReadTable(csv, seed));
        }

        var output = new StringWriter();
        Assert.Equal(ExitCode.Ok, BenchAccuracyCommand.Run(Runs, 1, false, false, output, new StringWriter(), groups: Standing, json: true, seeds: [1, 2]));

        using JsonDocument document = JsonDocument.Parse(output.ToString());
        Assert.Equal([1, 2], document.RootElement.GetProperty("seeds").EnumerateArray().Select(s => s.GetInt32()));
        JsonElement group = document.RootElement.GetProperty("groups").EnumerateArray().Single();
        Assert.Equal("GeneratedStanding", group.GetProperty("group").GetString());
        Assert.True(rows.Select(r => r.Seed).Distinct().Count() == 2, "both seeds must hold runs of the group, or nothing is pooled");
        foreach (JsonElement f in group.GetProperty("figures").EnumerateArray())
        {
            BenchFigure figure = BenchFigure.All.Single(b => b.Name == f.GetProperty("figure").GetString());
            var mine = rows.Where(r => r.Figure == figure.Name).ToList();
            double[] abs = mine.Select(r => Math.Abs(r.Error) * figure.Scale).ToArray();
            int n = f.GetProperty("n").GetInt32();
            Assert.Equal(mine.Count, n);
            Assert.Equal(NearestRank(abs, 0.95), f.GetProperty("p95").GetDouble(), 9);
            Assert.Equal(NearestRank(abs, 0.5), f.GetProperty("p50").GetDouble(), 9);
            Assert.Equal(abs.Max(), f.GetProperty("max").GetDouble(), 9);
            AssertP95Interval(abs, f.GetProperty("p95_interval"));

            JsonElement two = f.GetProperty("within_2_sigma");
            int covered = mine.Count(r => r.Sigma is { } s && Math.Abs(r.Error) <= 2 * s);
            Assert.Equal(covered, two.GetProperty("covered").GetInt32());

            // Clopper and Pearson (1934), Biometrika 26, 404–413: with all n covered the lower
            // bound solves pⁿ = α/2, with none the upper solves (1 − p)ⁿ = α/2.
            if (covered == n)
            {
                Assert.Equal(100 * Math.Pow(0.025, 1.0 / n), two.GetProperty("interval_low_percent").GetDouble(), 9);
                Assert.Equal(100, two.GetProperty("interval_high_percent").GetDouble(), 9);
            }
            else if (covered == 0)
            {
                Assert.Equal(100 * (1 - Math.Pow(0.025, 1.0 / n)), two.GetProperty("interval_high_percent").GetDouble(), 9);
            }
        }

        foreach (JsonElement goal in group.GetProperty("goals").EnumerateArray())
        {
            string name = goal.GetProperty("goal").GetString()!;
            BenchFigure figure = BenchFigure.All.Single(b => name.StartsWith(b.Name + " p95", StringComparison.Ordinal));
            double Judged(IEnumerable<Row> of) => NearestRank(of.Where(r => r.Figure == figure.Name).Select(r => Math.Abs(r.Error) * figure.Scale), 0.95);
            Assert.Equal(Judged(rows), goal.GetProperty("p95").GetDouble(), 9);
            Assert.Equal(Judged(rows) <= goal.GetProperty("limit").GetDouble(), goal.GetProperty("met").GetBoolean());
            double[] pooled = rows.Where(r => r.Figure == figure.Name).Select(r => Math.Abs(r.Error) * figure.Scale).ToArray();
            JsonElement interval = goal.GetProperty("p95_interval");
            AssertP95Interval(pooled, interval);
            double limit = goal.GetProperty("limit").GetDouble();
            string side = interval.GetProperty("high").ValueKind != JsonValueKind.Null && interval.GetProperty("high").GetDouble() <= limit ? "wholly within"
                : interval.GetProperty("low").ValueKind != JsonValueKind.Null && interval.GetProperty("low").GetDouble() > limit ? "wholly outside" : "goal inside";
            Assert.Equal(side, goal.GetProperty("interval_against_goal").GetString());
            Assert.StartsWith(goal.GetProperty("met").GetBoolean() ? "met" : "NOT met", goal.GetProperty("verdict").GetString(), StringComparison.Ordinal);
            foreach (JsonElement own in goal.GetProperty("per_seed").EnumerateArray())
            {
                int seed = own.GetProperty("seed").GetInt32();
                Assert.Equal(Judged(rows.Where(r => r.Seed == seed)), own.GetProperty("p95").GetDouble(), 9);
            }
        }
    }

    /// <summary>The p95's distribution-free interval from the runs' own |errors|: the order
    /// statistics at the ranks a scan of MathNet.Numerics' binomial CDF (a reference library)
    /// gives (Conover, "Practical Nonparametric Statistics", §3.2, from memory); null where the
    /// runs are too few for a bound.</summary>
    private static void AssertP95Interval(double[] errors, JsonElement interval)
    {
        double[] sorted = errors.Order().ToArray();
        int n = sorted.Length;
        double Cdf(int k) => k >= n ? 1 : MathNet.Numerics.Distributions.Binomial.CDF(0.95, n, k);
        int lower = Enumerable.Range(1, n).Where(r => Cdf(r - 1) <= 0.025).DefaultIfEmpty(0).Max();
        int upper = Enumerable.Range(1, n).Where(s => Cdf(s - 1) >= 0.975).DefaultIfEmpty(n + 1).Min();
        Assert.Equal(lower, interval.GetProperty("low_rank").GetInt32());
        Assert.Equal(upper, interval.GetProperty("high_rank").GetInt32());
        if (lower == 0)
        {
            Assert.Equal(JsonValueKind.Null, interval.GetProperty("low").ValueKind);
        }
        else
        {
            Assert.Equal(sorted[lower - 1], interval.GetProperty("low").GetDouble(), 9);
        }

        if (upper > n)
        {
            Assert.Equal(JsonValueKind.Null, interval.GetProperty("high").ValueKind);
        }
        else
        {
            Assert.Equal(sorted[upper - 1], interval.GetProperty("high").GetDouble(), 9);
        }
    }

    [Fact]
    public void The_pooled_tables_say_so_show_progress_per_seed_and_name_each_run_s_seed()
    {
        using var folder = new TempFolder();
        var output = new StringWriter();
        var progress = new StringWriter();
        string csv = folder.File("pooled.csv");

        Assert.Equal(ExitCode.Ok, BenchAccuracyCommand.Run(Runs, 1, true, false, output, progress, groups: Standing, errorsCsvPath: csv, seeds: [3, 4]));

        string text = output.ToString();
        Assert.Contains("at each of the 2 seeds 3-4, pooled", text);
        Assert.Contains("goals, judged on the 2 seeds' runs pooled:", text);
        Assert.Contains("±2σ 95 % interval  ±3σ 95 % interval", text);
        Assert.Matches(@"rollout mark p95 ≤ 2 ms: [\d.]+ ms over \d+ runs, 95 % interval [\d.]+–(∞|[\d.]+) ms \(ranks? .*\) — (met|NOT met)[,;] (interval wholly within|interval wholly outside|the goal lies inside the interval).*; per seed [\d.]+✗? \(\d+\) / [\d.]+✗? \(\d+\)", text);
        Assert.Contains("| ours p95's 95 % interval", text);
        Assert.Contains("\n  3:", text);
        Assert.Contains("\n  4:", text);
        Assert.Contains("seed 3 (1 of 2", progress.ToString());
        Assert.Contains("seed 4 (2 of 2", progress.ToString());
        string[] table = File.ReadAllLines(csv);
        Assert.Equal(ErrorTable.PooledHeader, table[0]);
        Assert.Equal(["3", "4"], table.Skip(1).Select(l => l.Split(',')[0]).Distinct().Order());
    }

    [Fact]
    public void One_seed_prints_no_pooling()
    {
        var output = new StringWriter();
        Assert.Equal(ExitCode.Ok, BenchAccuracyCommand.Run(8, 2, false, false, output, new StringWriter(), groups: Standing));

        Assert.DoesNotContain("pooled", output.ToString());
        Assert.DoesNotContain("per seed", output.ToString());
        Assert.DoesNotContain("±3σ 95 % interval", output.ToString());
        Assert.DoesNotContain("p95's 95 % interval", output.ToString());
        Assert.DoesNotContain("interval wholly", output.ToString());
        Assert.DoesNotContain("the goal lies inside", output.ToString());
    }

    [Theory]
    [InlineData("both seed options", "give --seed or --seeds, not both", "--seed 2 --seeds 1-4")]
    [InlineData("a backward range", "runs backwards", "--seeds 4-1")]
    [InlineData("not a seed", "not a seed", "--seeds one")]
    [InlineData("a seed twice", "named twice", "--seeds 1,2,1")]
    public async Task Bad_seeds_are_a_usage_error_before_any_decoding(string name, string why, string arguments)
    {
        string[] args = arguments.Split(' ');
        var output = new StringWriter();
        var error = new StringWriter();

        int code = await LaunchLoggerCommand.InvokeAsync(["bench", "accuracy", "--runs", "4", .. args], output, error);

        Assert.True((int)ExitCode.Usage == code, $"{name}: exit {code}: {error}");
        Assert.Contains(why, error.ToString());
        Assert.DoesNotContain("decoded", error.ToString());
        Assert.Equal(string.Empty, output.ToString());
    }
}
