using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Decoding.Analysis;

/// <summary>Analyses every run of a report and judges each against the others.</summary>
/// <remarks>The only verdict that depends on other runs is the braking bound, and all it needs
/// of a run is that run's own candidate bound (<see cref="GripLimit.Candidate"/>) and its
/// figures. <see cref="AnalyzeEach{T}"/> therefore takes runs one at a time and keeps of each
/// only what the caller asks for, its reasons and its figures, so that a season's log is
/// reported in the memory of its largest run; <see cref="Analyze"/> keeps every analysis.</remarks>
public static class SessionAnalyzer
{
    /// <summary>Analyses <paramref name="runs"/>; <paramref name="referenceStops"/> are runs
    /// from a braking reference log whose stops the user names as made at the grip limit; they
    /// bound the launches together with any stop among <paramref name="runs"/> that shows the limit.</summary>
    public static SessionAnalysis Analyze(IEnumerable<DecodedRun> runs, AnalysisOptions? options = null, IEnumerable<DecodedRun>? referenceStops = null, CancellationToken cancel = default)
    {
        StreamedSession<RunAnalysis> session = AnalyzeEach(runs, (analysis, _) => analysis, options, referenceStops, cancel);
        return new SessionAnalysis
        {
            Runs = session.Runs.Select(r => r.Kept.WithVerdict(r.Verdict)).ToList(),
            Bound = session.Bound,
            Failures = session.Failures,
        };
    }

    /// <summary>As <see cref="Analyze"/>, one run at a time: each run is analysed, judged on its
    /// own and passed to <paramref name="keep"/>, then let go; the session's braking bound is
    /// applied to the verdicts at the end.</summary>
    /// <typeparam name="T">What is kept of each run (e.g. its report entry).</typeparam>
    /// <param name="runs">The runs, read lazily (e.g. <see cref="LogReader.ReadFileRuns"/>).</param>
    /// <param name="keep">Given each analysis (its verdict without the session's bound) and its
    /// 1-based position; what it returns is kept. It must not keep the analysis itself when
    /// memory matters.</param>
    /// <param name="options">Analysis settings.</param>
    /// <param name="referenceStops">Runs of a braking reference log (see <see cref="Analyze"/>).</param>
    /// <param name="cancel">Stops between runs.</param>
    public static StreamedSession<T> AnalyzeEach<T>(IEnumerable<DecodedRun> runs, Func<RunAnalysis, int, T> keep, AnalysisOptions? options = null, IEnumerable<DecodedRun>? referenceStops = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(runs);
        ArgumentNullException.ThrowIfNull(keep);
        options ??= AnalysisOptions.Default;
        var pending = new List<Pending<T>>();
        var candidates = new List<TractionBound?>();
        var failures = new List<string>();
        // A record holding several runs (stop, rest, relaunch) is judged run by run.
        foreach (DecodedRun run in runs.SelectMany(RecordSplitter.Split))
        {
            cancel.ThrowIfCancellationRequested();
            RunAnalysis analysis;
            try
            {
                analysis = RunAnalyzer.Analyze(run, options);
            }
            catch (AnalysisException e)
            {
                failures.Add(e.Message);
                continue;
            }

            // Only a stop at the grip limit bounds the launches: one the user named, or one that
            // shows the limit in its data. A gentle stop shows what the driver asked for, not the grip.
            List<VerdictReason> own = RunJudge.OwnReasons(analysis, analysis.Grade, options.Limits);
            VerdictReason? impossible = FigurePlausibility.Check(analysis);
            Verdict alone = FigurePlausibility.Apply(RunJudge.Finish(own, analysis.Figures, null), impossible);
            candidates.Add(GripLimit.Candidate(analysis, namedByUser: false, options.Limits));
            pending.Add(new Pending<T>(keep(analysis.WithVerdict(alone), pending.Count + 1), analysis.Figures, own, impossible));
        }

        var references = new List<TractionBound?>();
        foreach (DecodedRun run in referenceStops ?? [])
        {
            cancel.ThrowIfCancellationRequested();
            try
            {
                references.Add(GripLimit.Candidate(RunAnalyzer.Analyze(run, options), namedByUser: true, options.Limits));
            }
            catch (AnalysisException e)
            {
                failures.Add($"braking reference: {e.Message}");
            }
        }

        TractionBound? bound = GripLimit.Best(references.Concat(candidates));
        return new StreamedSession<T>
        {
            Runs = pending.Select(p => new StreamedRun<T>(p.Kept, p.Figures, FigurePlausibility.Apply(RunJudge.Finish(p.Own, p.Figures, bound), p.Impossible))).ToList(),
            Bound = bound,
            Failures = failures,
        };
    }

    private sealed record Pending<T>(T Kept, FigureSet Figures, List<VerdictReason> Own, VerdictReason? Impossible);
}

/// <summary>A session analysed one run at a time (<see cref="SessionAnalyzer.AnalyzeEach{T}"/>).</summary>
/// <typeparam name="T">What was kept of each run.</typeparam>
public sealed class StreamedSession<T>
{
    /// <summary>The runs analysed, in input order, with their final verdicts.</summary>
    public required IReadOnlyList<StreamedRun<T>> Runs { get; init; }

    /// <summary>The braking bound applied, when any run (or the reference) ended with a stop at the grip limit.</summary>
    public TractionBound? Bound { get; init; }

    /// <summary>Runs that could not be analysed, one line each.</summary>
    public required IReadOnlyList<string> Failures { get; init; }
}

/// <summary>What is kept of one run of a streamed session.</summary>
/// <param name="Kept">What the caller kept.</param>
/// <param name="Figures">Its figures (small: for pairs and the bound).</param>
/// <param name="Verdict">Its final verdict, the session's braking bound applied.</param>
public sealed record StreamedRun<T>(T Kept, FigureSet Figures, Verdict Verdict);
