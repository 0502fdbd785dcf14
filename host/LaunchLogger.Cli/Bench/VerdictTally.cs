using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Cli.Bench;

/// <summary>How a set of bench runs was judged against what each deserved
/// (<see cref="ExpectedVerdict"/>): how many as expected, each level's count, and for the runs
/// judged otherwise the reason codes that made the difference, counted.</summary>
public sealed record VerdictTally
{
    /// <summary>Runs with both an expectation and a verdict.</summary>
    public int Judged { get; init; }

    /// <summary>Of those, judged as expected (level and reason codes).</summary>
    public int AsExpected { get; init; }

    /// <summary>Runs per verdict level, in <see cref="VerdictLevel"/> order.</summary>
    public IReadOnlyList<int> ByLevel { get; init; } = new int[3];

    /// <summary>Clean runs (expected valid).</summary>
    public int Clean { get; init; }

    /// <summary>Clean runs called valid.</summary>
    public int CleanCalledValid { get; init; }

    /// <summary>Flawed runs (expected doubtful or invalid).</summary>
    public int Flawed { get; init; }

    /// <summary>Flawed runs called valid: the verdict's worst error.</summary>
    public int FlawedCalledValid { get; init; }

    /// <summary>Runs either verdict fits (<see cref="ExpectedVerdict.EitherWay"/>): neither clean nor flawed.</summary>
    public int EitherWay { get; init; }

    /// <summary>Of those, called valid.</summary>
    public int EitherWayCalledValid { get; init; }

    /// <summary>For runs judged otherwise than expected: per verdict level they got, the reason
    /// codes the expectation does not hold ("code" ×n) and the expected codes missing
    /// ("no code" ×n), most frequent first.</summary>
    public IReadOnlyList<(VerdictLevel Level, int Runs, IReadOnlyList<(string Code, int Count)> Codes)> Unexpected { get; init; } = [];

    /// <summary>Tallies <paramref name="runs"/>; a run without an expectation or a verdict (one
    /// that failed to decode) is left out.</summary>
    public static VerdictTally Of(IEnumerable<(ExpectedVerdict? Expected, Verdict? Actual)> runs)
    {
        ArgumentNullException.ThrowIfNull(runs);
        var judged = runs.Where(r => r.Expected is not null && r.Actual is not null).Select(r => (Expected: r.Expected!, Actual: r.Actual!)).ToList();
        var byLevel = new int[3];
        foreach (var r in judged)
        {
            byLevel[(int)r.Actual.Level]++;
        }

        var unexpected = judged.Where(r => !r.Expected.Matches(r.Actual))
            .GroupBy(r => r.Actual.Level)
            .OrderByDescending(g => g.Key)
            .Select(g => (g.Key, g.Count(), (IReadOnlyList<(string, int)>)g
                .SelectMany(r => r.Expected.UnexpectedCodes(r.Actual).Concat(r.Expected.MissingCodes(r.Actual).Select(c => "no " + c)))
                .GroupBy(c => c, StringComparer.Ordinal)
                .OrderByDescending(c => c.Count()).ThenBy(c => c.Key, StringComparer.Ordinal)
                .Select(c => (c.Key, c.Count()))
                .ToList()))
            .ToList();

        return new VerdictTally
        {
            Judged = judged.Count,
            AsExpected = judged.Count(r => r.Expected.Matches(r.Actual)),
            ByLevel = byLevel,
            Clean = judged.Count(r => r.Expected.IsClean),
            CleanCalledValid = judged.Count(r => r.Expected.IsClean && r.Actual.Level == VerdictLevel.Valid),
            Flawed = judged.Count(r => !r.Expected.IsClean && !r.Expected.EitherWay),
            FlawedCalledValid = judged.Count(r => !r.Expected.IsClean && !r.Expected.EitherWay && r.Actual.Level == VerdictLevel.Valid),
            EitherWay = judged.Count(r => r.Expected.EitherWay),
            EitherWayCalledValid = judged.Count(r => r.Expected.EitherWay && r.Actual.Level == VerdictLevel.Valid),
            Unexpected = unexpected,
        };
    }

    /// <summary>One line: "as expected 78 of 80 (valid 78, doubtful 2, invalid 0); not as
    /// expected: doubtful 2: rollout_marks_disagree ×2".</summary>
    public string Describe()
    {
        string levels = string.Join(", ", Enum.GetValues<VerdictLevel>().Select(l => $"{Name(l)} {ByLevel[(int)l]}"));
        string line = $"as expected {AsExpected} of {Judged} ({levels})";
        if (Unexpected.Count == 0)
        {
            return line;
        }

        return line + "; not as expected: " + string.Join("; ", Unexpected.Select(u =>
            $"{Name(u.Level)} {u.Runs}{(u.Codes.Count == 0 ? "" : ": " + string.Join(", ", u.Codes.Select(c => $"{c.Code} ×{c.Count}")))}"));
    }

    /// <summary>The level as reports print it.</summary>
    public static string Name(VerdictLevel level) => level.ToString().ToLowerInvariant();
}
