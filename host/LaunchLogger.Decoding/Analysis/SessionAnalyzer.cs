using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Decoding.Analysis;

/// <summary>Analyses every run of a report and judges each against the others.</summary>
public static class SessionAnalyzer
{
    /// <summary>Analyses <paramref name="runs"/>; <paramref name="referenceStops"/> are runs
    /// from a braking reference log whose stops also bound the launches.</summary>
    public static SessionAnalysis Analyze(IEnumerable<DecodedRun> runs, AnalysisOptions? options = null, IEnumerable<DecodedRun>? referenceStops = null, CancellationToken cancel = default)
    {
        options ??= AnalysisOptions.Default;
        var analyses = new List<RunAnalysis>();
        var failures = new List<string>();
        foreach (DecodedRun run in runs)
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

        TractionBound? bound = BestBound(references.Count > 0 ? references : analyses);
        return new SessionAnalysis
        {
            Runs = analyses.Select(a => a.WithVerdict(FigurePlausibility.Apply(RunJudge.Judge(a, a.Grade, bound, options.Limits), a))).ToList(),
            Bound = bound,
            Failures = failures,
        };
    }

    /// <summary>The bound of the stop with the highest mean deceleration (the best grip shown).</summary>
    public static TractionBound? BestBound(IEnumerable<RunAnalysis> analyses)
    {
        RunAnalysis? best = analyses.Where(a => a.Braking is not null).MaxBy(a => a.Braking!.MeanDecelMps2);
        return best?.Braking is { } b
            ? new TractionBound(best.Run.Source, b.MeanDecelMps2, b.TractionBound0To60S, b.TractionBound0To100KmhS)
            : null;
    }
}
