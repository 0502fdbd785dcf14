using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Prescribed;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Cli.Bench;

/// <summary>Runs the generator's records through the decoder (as CSV files or as logs written
/// by the firmware core) and compares every run with the generator's exact truth.</summary>
public static class PrescribedBenchmark
{
    /// <summary>Generates, decodes and compares one case; one outcome per run of the record.</summary>
    public static IReadOnlyList<CaseOutcome> Run(PrescribedBenchCase c, CancellationToken cancel)
    {
        cancel.ThrowIfCancellationRequested();
        PrescribedRecord record = c.Spec.Generate();
        SessionAnalysis session;
        try
        {
            session = Analyze(c, record, cancel);
        }
        catch (Exception e) when (e is AnalysisException or InvalidOperationException or InputException)
        {
            return [CaseOutcome.Failed(c.Index, c.Summary, c.Group, e.Message)];
        }

        if (session.Runs.Count == 0)
        {
            return [CaseOutcome.Failed(c.Index, c.Summary, c.Group, "no run found")];
        }

        bool asExpected = session.Runs.Count == record.Truth.Count;
        var outcomes = new List<CaseOutcome>(record.Truth.Count);
        var taken = new HashSet<RunAnalysis>();
        foreach (TruthRun truth in record.Truth)
        {
            RunAnalysis? ours = Match(session.Runs, truth);
            if (ours is null || !taken.Add(ours))
            {
                outcomes.Add(CaseOutcome.Failed(c.Index, c.Summary, c.Group, $"the decoder found {session.Runs.Count} run(s) where the record has {record.Truth.Count}; a run starting at {truth.Marks.StartS:0.000} s has none of its own") with { RunsAsExpected = false });
                continue;
            }

            var outcome = CaseOutcome.Compare(
                c.Index,
                c.Summary,
                c.Group,
                FigureReading.FromTruth(truth, c.Spec.Accel?.GradeRad ?? 0),
                FigureReading.FromFigures(ours.Figures, ours.Braking, ours.Grade, ours.Reconstruction.Staged),
                FigureReading.FromFigures(AccuracyBenchmark.NaiveFigures(ours.Run)));
            outcomes.Add(outcome with
            {
                StandingFigureOnRollingStart = !truth.Standing && FigureReading.HasStandingFigure(ours.Figures),
                RunsAsExpected = asExpected,
                Verdict = ours.Verdict,
                Expected = Expected(c, truth, TargetEdge.TopSpeedSigmaMps(ours)),
            });
        }

        return outcomes;
    }

    /// <summary>The verdict a generated run deserves, from the generator's truth: every record
    /// has working sensors and an undriven pickup, so a standing start (after any idle, or either
    /// run of a stop-and-go record) is clean; a run that opens moving (a rolling start, cruise then
    /// a stop) has no standstill for its standing-start figures, which the judge's rule makes
    /// invalid with <c>rolling_start</c>; a standing run that never reaches 60 mph is doubtful with
    /// <c>target_not_reached</c>, as the judge's rule says. A polled loop made to stall 20 ms (<see cref="BenchGroup.GeneratedCruiseStopSwitch"/>) may carry
    /// <c>wide_brackets</c> (brackets a stall wide) and <c>accel_overflow</c> (the accelerometer's
    /// FIFO unread through the stall). A standing run whose true top speed passed 60 mph by less
    /// than the data resolves (the decoder's σ of its top speed, <paramref name="topSpeedSigmaMps"/>;
    /// <see cref="TargetEdge"/>) may carry <c>target_not_reached</c> or not.</summary>
    public static ExpectedVerdict Expected(PrescribedBenchCase c, TruthRun truth, double? topSpeedSigmaMps = null)
    {
        ArgumentNullException.ThrowIfNull(c);
        ArgumentNullException.ThrowIfNull(truth);
        ExpectedVerdict expected = truth.Standing ? ExpectedVerdict.Clean("standing start, sane sensors") : ExpectedVerdict.RollingStart("opens moving");
        if (truth.Standing && truth.Interval(TruthSpeedSpan.Mph(0, 60))?.FromStandstillS is null)
        {
            expected = expected.And(LaunchLogger.Decoding.Verdicts.VerdictLevel.Doubtful, ExpectedVerdict.TargetNotReachedCode, "60 mph not reached");
        }
        else if (truth.Standing && TargetEdge.EitherVerdict(truth.PeakSpeedMps, topSpeedSigmaMps))
        {
            expected = expected.AtTargetEdge(truth.PeakSpeedMps, topSpeedSigmaMps!.Value);
        }

        return c.Group == BenchGroup.GeneratedCruiseStopSwitch && c.Spec.Polled is not null
            ? expected.Allowing("the loop stalls 20 ms", "wide_brackets", "accel_overflow")
            : expected;
    }

    /// <summary>Decodes <paramref name="record"/> (<paramref name="c"/>'s) as the benchmark does:
    /// as a log or as CSV files, with the case's calibrations.</summary>
    public static SessionAnalysis Analyze(PrescribedBenchCase c, PrescribedRecord record, CancellationToken cancel)
    {
        ArgumentNullException.ThrowIfNull(c);
        ArgumentNullException.ThrowIfNull(record);
        AnalysisOptions? options = AccelScaleDraw.Options(c.AccelCalibration, c.TyreCalibration, c.StaticTyreM, c.PickupWheelTold);
        return c.AsLog ? SessionAnalyzer.Analyze(LogReader.Read(record.ToLog(), c.Spec.Shape.Name).Runs, options, cancel: cancel) : AnalyzeFiles(record, options, cancel);
    }

    private static SessionAnalysis AnalyzeFiles(PrescribedRecord record, AnalysisOptions? options, CancellationToken cancel)
    {
        string folder = Path.Combine(Path.GetTempPath(), "launchlogger-bench-" + Guid.NewGuid().ToString("N"));
        try
        {
            (string pulses, string? accel) = record.WriteFiles(folder);
            DecodedRun run = TextRunImporter.Import(new TextImportRequest
            {
                EdgesPath = record.IsPolled ? null : pulses,
                CountsPath = record.IsPolled ? pulses : null,
                AccelPath = accel,
                Scale = new PulseScale(record.StatedMetresPerPulse, record.Spec.Pickup.Teeth, record.Spec.Pickup.Tyre.StatedCircumferenceM),
            });
            return SessionAnalyzer.Analyze([run], options, cancel: cancel);
        }
        finally
        {
            Directory.Delete(folder, true);
        }
    }

    /// <summary>The decoded run that holds the middle of the truth run's motion; the only run
    /// when there is one and none does; else null.</summary>
    private static RunAnalysis? Match(IReadOnlyList<RunAnalysis> runs, TruthRun truth)
    {
        double start = truth.Marks.StartS;
        double end = truth.Marks.StandstillS ?? start + 1;
        double middle = 0.5 * (start + end);
        return runs.FirstOrDefault(r => r.Run.Pulses.Count > 0 && r.Run.Pulses[0].LoS <= middle && r.Run.Pulses[^1].HiS >= middle)
            ?? (runs.Count == 1 ? runs[0] : null);
    }
}
