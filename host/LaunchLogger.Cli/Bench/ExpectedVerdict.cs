using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Cli.Bench;

/// <summary>The verdict a bench run deserves, decided from the case's own truth (what was
/// simulated or generated), never from the decoder.</summary>
/// <param name="Level">The level it should get.</param>
/// <param name="Codes">The reason codes it should carry, and the only ones: none for a clean run.</param>
/// <param name="Why">Why, in a few words, for the bench's output.</param>
public sealed record ExpectedVerdict(VerdictLevel Level, IReadOnlyList<string> Codes, string Why)
{
    /// <summary>The reason code of a record that opens moving (<see cref="RunJudge"/>).</summary>
    public const string RollingStartCode = "rolling_start";

    /// <summary>The reason code of a pickup wheel that ran off on its own (<see cref="RunJudge"/>).</summary>
    public const string WheelspinCode = "wheelspin";

    /// <summary>The reason code of a standing run that never reached 60 mph (<see cref="RunJudge"/>).</summary>
    public const string TargetNotReachedCode = "target_not_reached";

    /// <summary>Codes the run may carry besides <see cref="Codes"/>, at any level: faults the
    /// case injected on purpose whose effect the truth does not say (a stalled loop's wide
    /// brackets, an accelerometer FIFO that may overflow during the stall).</summary>
    public IReadOnlyList<string> Allowed { get; init; } = [];

    /// <summary>A clean run: nothing the data cannot support, so valid with no reason at all (an
    /// injected fault's allowed codes aside), and not <see cref="EitherWay"/>.</summary>
    public bool IsClean => Level == VerdictLevel.Valid && Codes.Count == 0 && !AtEdge;

    /// <summary>A run whose top speed is within what the data resolves of 60 mph
    /// (<see cref="TargetEdge"/>): valid is right, and so is doubtful with
    /// <c>target_not_reached</c>. Neither clean nor flawed: it is counted apart. Only that edge makes
    /// a run either-way; another allowed code (a stalled loop's) leaves a valid run clean.</summary>
    public bool EitherWay => Level == VerdictLevel.Valid && Codes.Count == 0 && AtEdge;

    private bool AtEdge => Allowed.Contains(TargetNotReachedCode);

    /// <summary>This expectation and one more reason the run deserves.</summary>
    public ExpectedVerdict And(VerdictLevel level, string code, string why) =>
        new((VerdictLevel)Math.Max((int)Level, (int)level), [.. Codes, code], IsClean ? why : $"{Why}; {why}") { Allowed = Allowed };

    /// <summary>This expectation, allowing <paramref name="codes"/> besides.</summary>
    public ExpectedVerdict Allowing(string why, params string[] codes) => this with { Allowed = [.. Allowed, .. codes], Why = $"{Why}; may carry {string.Join(", ", codes)}: {why}" };

    /// <summary>This expectation for a run whose true top speed <paramref name="truthTopMps"/>
    /// passed 60 mph by less than the data resolves (<paramref name="sigmaMps"/>, <see cref="TargetEdge"/>):
    /// <c>target_not_reached</c> may come or not.</summary>
    public ExpectedVerdict AtTargetEdge(double truthTopMps, double sigmaMps) => Allowing(
        FormattableString.Invariant($"top speed {truthTopMps / Decoding.Metrics.Units.MpsPerMph:0.00} mph, within {TargetEdge.BandSigmas:0}σ ({sigmaMps / Decoding.Metrics.Units.MpsPerMph:0.00} mph) above 60 mph"),
        TargetNotReachedCode);

    /// <summary>A standing start with sane sensors: valid.</summary>
    public static ExpectedVerdict Clean(string why) => new(VerdictLevel.Valid, [], why);

    /// <summary>A record that opens moving: its standing-start figures have no standstill, so the
    /// judge's rule makes it invalid with <c>rolling_start</c>, and nothing else.</summary>
    public static ExpectedVerdict RollingStart(string why) => new(VerdictLevel.Invalid, [RollingStartCode], why);

    /// <summary>A pickup on a driven wheel that really spun (slip past the tyre's friction peak):
    /// the judge's rule makes it doubtful with <c>wheelspin</c>, and nothing else.</summary>
    public static ExpectedVerdict Wheelspin(string why) => new(VerdictLevel.Doubtful, [WheelspinCode], why);

    /// <summary>True when <paramref name="verdict"/> carries every expected code and no other
    /// but the allowed ones, at this level (or an allowed reason's, when worse).</summary>
    public bool Matches(Verdict verdict)
    {
        ArgumentNullException.ThrowIfNull(verdict);
        VerdictLevel level = verdict.Reasons.Where(r => Allowed.Contains(r.Code, StringComparer.Ordinal))
            .Select(r => r.Level).Append(Level).Max();
        return verdict.Level == level && !MissingCodes(verdict).Any() && !UnexpectedCodes(verdict).Any();
    }

    /// <summary>The reason codes of <paramref name="verdict"/> this expectation neither asks for
    /// nor allows (all of them for a clean run).</summary>
    public IEnumerable<string> UnexpectedCodes(Verdict verdict)
    {
        ArgumentNullException.ThrowIfNull(verdict);
        return verdict.Reasons.Select(r => r.Code).Where(c => !Codes.Contains(c, StringComparer.Ordinal) && !Allowed.Contains(c, StringComparer.Ordinal));
    }

    /// <summary>The expected codes <paramref name="verdict"/> lacks.</summary>
    public IEnumerable<string> MissingCodes(Verdict verdict)
    {
        ArgumentNullException.ThrowIfNull(verdict);
        return Codes.Where(c => !verdict.Reasons.Any(r => r.Code == c));
    }
}
