using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Decoding.Analysis;

/// <summary>Analyses every run of a report and judges each against the others.</summary>
public static class SessionAnalyzer
{
    /// <summary>Analyses <paramref name="runs"/>; <paramref name="referenceStops"/> are runs
    /// from a braking reference log whose stops the user names as made at the grip limit; they
    /// bound the launches together with any stop among <paramref name="runs"/> that shows the limit.</summary>
    public static SessionAnalysis Analyze(IEnumerable<DecodedRun> runs, AnalysisOptions? options = null, IEnumerable<DecodedRun>? referenceStops = null, CancellationToken cancel = default)
    {
        options ??= AnalysisOptions.Default;
        var analyses = new List<RunAnalysis>();
        var failures = new List<string>();
        // A record holding several runs (stop, rest, relaunch) is judged run by run.
        foreach (DecodedRun run in runs.SelectMany(RecordSplitter.Split))
        {
            cancel.ThrowIfCancellationRequested();
            try
            {
                analyses.Add(RunAnalyzer.Analyze(run, options));
            }
            catch (AnalysisException e)
            {
                failures.Add(e.Message);
            }
        }

        var references = new List<RunAnalysis>();
        foreach (DecodedRun run in referenceStops ?? [])
        {
            try
            {
                references.Add(RunAnalyzer.Analyze(run, options));
            }
            catch (AnalysisException e)
            {
                failures.Add($"braking reference: {e.Message}");
            }
        }

        // Only a stop at the grip limit bounds the launches: one the user named, or one that shows
        // the limit in its data. A gentle stop shows what the driver asked for, not the grip.
        TractionBound? bound = GripLimit.BestBound(analyses, references, options.Limits);
        return new SessionAnalysis
        {
            Runs = analyses.Select(a => a.WithVerdict(FigurePlausibility.Apply(RunJudge.Judge(a, a.Grade, bound, options.Limits), a))).ToList(),
            Bound = bound,
            Failures = failures,
        };
    }
}
