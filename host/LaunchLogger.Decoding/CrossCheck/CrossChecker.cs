using System.Globalization;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Decoding.CrossCheck;

/// <summary>Compares one of our runs with another instrument's record of it: aligns the clocks,
/// times the other record's figures with our definitions and both conventions, and tables both
/// with their difference and whether it lies within the combined uncertainty.</summary>
public static class CrossChecker
{
    /// <summary>Speed noise assumed for a satellite receiver's speed over ground when the user
    /// states none, m/s (1-σ). Common practice: receivers that output 10–20 Hz commonly state
    /// about 0.1 m/s for Doppler speed in open sky.</summary>
    public const double DefaultSpeedSigmaMps = 0.1;

    /// <summary>How far before our first motion to look for the other record's start, s.</summary>
    private const double StartSearchS = 3;

    /// <summary>Runs the comparison.</summary>
    /// <exception cref="Import.InputException">The other record cannot be aligned with the run
    /// or shows no start from rest.</exception>
    public static CrossCheckResult Compare(RunAnalysis ours, SpeedTrace theirs, double speedSigmaMps = DefaultSpeedSigmaMps, FigureRequest? request = null)
    {
        ArgumentNullException.ThrowIfNull(ours);
        ArgumentNullException.ThrowIfNull(theirs);
        request ??= FigureRequest.Standard;
        var trajectory = ours.Reconstruction.Trajectory;
        double fromS = ours.Reconstruction.FirstMotionS.Value;
        double toS = ours.Reconstruction.StopS ?? trajectory.TimeS[^1];
        // Clocks are matched on the drive, not the stop: under braking a wheel may slide or cycle
        // with ABS, and a wheel's speed then is not the car's.
        double alignToS = ours.Braking is { } stop && stop.OnsetS.Value > fromS + 2 ? stop.OnsetS.Value : toS;
        TraceAlignment alignment = TraceAligner.Align(trajectory, fromS, alignToS, theirs);
        (var theirTrajectory, Estimate theirStart) = TraceTrajectory.Build(theirs, alignment, speedSigmaMps, fromS - StartSearchS, toS);
        FigureSet theirFigures = FigureCalculator.Compute(theirTrajectory, theirStart, ours.Figures.RolloutDistanceM, request);
        FigureSet ourFigures = ours.Figures;

        var rows = new List<CrossCheckRow>
        {
            new("first motion (our clock)", "n/a", "s", ourFigures.FirstMotionS.Value, ourFigures.FirstMotionS.Sigma,
                theirStart.Value, Math.Sqrt((theirStart.Sigma * theirStart.Sigma) + (alignment.OffsetSigmaS * alignment.OffsetSigmaS))),
        };
        for (int i = 0; i < Math.Min(ourFigures.SpeedIntervals.Count, theirFigures.SpeedIntervals.Count); i++)
        {
            IntervalFigure a = ourFigures.SpeedIntervals[i];
            IntervalFigure b = theirFigures.SpeedIntervals[i];
            bool standing = a.Interval.IsStanding;
            Add(rows, a.Interval.Label, standing ? "standstill" : "n/a", "s", a.FromStandstillS, a.UncertaintyS, b.FromStandstillS, b.UncertaintyS);
            if (standing)
            {
                Add(rows, a.Interval.Label, "rollout", "s", a.FromRolloutS, a.FromRolloutUncertaintyS, b.FromRolloutS, b.FromRolloutUncertaintyS);
            }
        }

        for (int i = 0; i < Math.Min(ourFigures.DistanceMarks.Count, theirFigures.DistanceMarks.Count); i++)
        {
            MarkFigure a = ourFigures.DistanceMarks[i];
            MarkFigure b = theirFigures.DistanceMarks[i];
            Add(rows, a.Mark.Label, "standstill", "s", a.FromStandstillS, a.UncertaintyS, b.FromStandstillS, b.UncertaintyS);
            Add(rows, a.Mark.Label, "rollout", "s", a.FromRolloutS, a.FromRolloutUncertaintyS, b.FromRolloutS, b.FromRolloutUncertaintyS);
            Add(rows, a.Mark.Label + " trap", "n/a", "m/s", a.TrapSpeedMps, a.TrapSpeedUncertaintyMps, b.TrapSpeedMps, b.TrapSpeedUncertaintyMps);
        }

        double rateHz = 1 / theirs.MedianPeriodS;
        var notes = new List<string>
        {
            string.Create(CultureInfo.InvariantCulture, $"{theirs.Source}: {rateHz:0.#} Hz; its first motion is known only to within one sample period ({1000 / rateHz:0} ms) or the tenth of a second a car can creep below its speed noise, so its standing-start and after-rollout figures carry σ ≥ {Math.Max(500 / rateHz, 50):0} ms."),
        };
        if (!theirs.SpeedMeasured)
        {
            notes.Add("its speeds were differenced from positions, which is noisier than a measured speed; σ assumes the speed noise given.");
        }

        if (theirs.RecordsRejected > 0)
        {
            notes.Add(string.Create(CultureInfo.InvariantCulture, $"{theirs.RecordsRejected} of {theirs.RecordsRead} records were refused (bad checksum, no fix or unreadable) and skipped."));
        }

        return new CrossCheckResult
        {
            Source = theirs.Source,
            SampleRateHz = rateHz,
            SpeedMeasured = theirs.SpeedMeasured,
            RecordsRead = theirs.RecordsRead,
            RecordsRejected = theirs.RecordsRejected,
            SpeedSigmaMps = speedSigmaMps,
            Alignment = alignment,
            TheirTrajectory = theirTrajectory,
            TheirFigures = theirFigures,
            Rows = rows,
            Notes = notes,
        };
    }

    private static void Add(List<CrossCheckRow> rows, string figure, string convention, string unit, double? ours, double? oursSigma, double? theirs, double? theirsSigma)
    {
        if (ours is { } a && theirs is { } b && double.IsFinite(a) && double.IsFinite(b))
        {
            rows.Add(new CrossCheckRow(figure, convention, unit, a, oursSigma ?? 0, b, theirsSigma ?? 0));
        }
    }
}
