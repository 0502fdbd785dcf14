using LaunchLogger.Cli.Bench;
using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Cli.Tests.Bench;

/// <summary>A verdict must be right both ways, over a fixed set of the bench's generated records
/// (seeded): each run is judged as its truth says it deserves (<see cref="PrescribedBenchmark.Expected"/>:
/// the generator's truth, not the decoder, says whether a run opens moving or reaches 60 mph), so
/// every clean standing start is valid and no run that opens moving is.</summary>
public class BenchVerdictPropertyTests
{
    [Theory]
    [InlineData(5)]
    [InlineData(11)]
    public void Generated_records_are_judged_as_their_truth_deserves(int seed)
    {
        // 10 records: standing starts, an idle, rolling starts, stops from cruise, a stop-and-go;
        // the stops again with a brake switch.
        IReadOnlyList<PrescribedBenchCase> cases = PrescribedBenchCase.Build(10, seed, 0, calibratedTyre: false, smoothLaunches: false);
        List<CaseOutcome> outcomes = cases.SelectMany(c => PrescribedBenchmark.Run(c, CancellationToken.None)).ToList();

        Assert.All(outcomes, o => Assert.Null(o.Failure));
        Assert.Contains(outcomes, o => o.Expected!.IsClean);
        Assert.Contains(outcomes, o => !o.Expected!.IsClean);
        Assert.All(outcomes, o => Assert.True(o.Expected!.Matches(o.Verdict!), $"run {o.Index} ({o.Summary}): expected {o.Expected!.Level} [{string.Join(",", o.Expected.Codes)}], got {o.Verdict!.Level}: {string.Join("; ", o.Verdict.Reasons.Select(r => r.Code + ": " + r.Text))}"));
        Assert.All(outcomes.Where(o => o.Expected!.IsClean), o => Assert.Equal(VerdictLevel.Valid, o.Verdict!.Level));
    }
}
