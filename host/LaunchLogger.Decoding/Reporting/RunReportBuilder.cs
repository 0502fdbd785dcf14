using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Decoding.Reporting;

/// <summary>Turns a run's figures into its report entry.</summary>
public static class RunReportBuilder
{
    /// <summary>Builds the entry for an analysed run.</summary>
    public static RunReport Build(RunAnalysis analysis)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        RunReport report = Build(
            analysis.Run.Configuration.RunNumber,
            analysis.Reconstruction.Method,
            analysis.Run.Configuration.Staged,
            analysis.Figures,
            analysis.Run.FirmwareRolloutS,
            analysis.Warnings);
        return report with { Braking = analysis.Braking is { } b ? Braking(b) : null };
    }

    /// <summary>The report of a stop.</summary>
    public static BrakingReport Braking(BrakingResult b)
    {
        CorrectedStop? nearest = b.CorrectedStops
            .Take(2)
            .Where(c => c.CorrectedDistanceM is not null)
            .OrderBy(c => Math.Abs(c.NominalMps - b.FromMps))
            .FirstOrDefault();
        return new BrakingReport
        {
            FromMps = b.FromMps,
            OnsetS = b.OnsetS.Value,
            OnsetUncertaintyS = b.OnsetS.Sigma,
            OnsetMethod = b.OnsetMethod,
            StoppingDistanceM = b.StoppingDistanceM.Value,
            StoppingDistanceUncertaintyM = b.StoppingDistanceM.Sigma,
            CorrectedDistanceM = nearest?.CorrectedDistanceM,
            CorrectedTo = nearest is null ? null : $"{nearest.Label}: {nearest.Method}",
            CorrectedStops = b.CorrectedStops.Select(c => new CorrectedStopReport(c.Label, c.NominalMps, c.CorrectedDistanceM, c.Method)).ToList(),
            MeanDecelMps2 = b.MeanDecelMps2,
            PeakDecelMps2 = b.PeakDecelMps2,
            MfddMps2 = b.MfddMps2,
            TractionBound060S = b.TractionBound0To60S,
            TractionBound0100KmhS = b.TractionBound0To100KmhS,
        };
    }

    /// <summary>Builds the entry.</summary>
    /// <param name="runNumber">The run's number.</param>
    /// <param name="method">How it was reconstructed.</param>
    /// <param name="staged">Whether it opened from standstill.</param>
    /// <param name="figures">Its figures.</param>
    /// <param name="firmwareRolloutS">The box's own rollout mark, when known.</param>
    /// <param name="warnings">Everything noticed on the way.</param>
    public static RunReport Build(int runNumber, string method, bool staged, FigureSet figures, double? firmwareRolloutS, IEnumerable<string> warnings)
    {
        ArgumentNullException.ThrowIfNull(figures);
        return new RunReport
        {
            Run = runNumber,
            Method = method,
            Staged = staged,
            FirstMotionS = figures.FirstMotionS.Value,
            FirstMotionUncertaintyS = figures.FirstMotionS.Sigma,
            Rollout = new RolloutReport
            {
                DistanceM = figures.RolloutDistanceM,
                TimeS = figures.RolloutTimeS?.Value,
                TimeUncertaintyS = figures.RolloutTimeS?.Sigma,
                AfterFirstMotionS = figures.RolloutTimeS is { } r ? r.Value - figures.FirstMotionS.Value : null,
                SpeedMps = figures.RolloutSpeedMps?.Value,
                SpeedUncertaintyMps = figures.RolloutSpeedMps?.Sigma,
                FirmwareTimeS = firmwareRolloutS,
            },
            SpeedIntervals = figures.SpeedIntervals.Select(f => new SpeedIntervalReport
            {
                Label = f.Interval.Label,
                FromMps = f.Interval.FromMps,
                ToMps = f.Interval.ToMps,
                FromStandstillS = f.FromStandstillS,
                FromRolloutS = f.FromRolloutS,
                UncertaintyS = f.UncertaintyS,
                FromRolloutUncertaintyS = f.FromRolloutUncertaintyS,
            }).ToList(),
            DistanceMarks = figures.DistanceMarks.Select(m => new DistanceMarkReport
            {
                Label = m.Mark.Label,
                DistanceM = m.Mark.DistanceM,
                FromStandstillS = m.FromStandstillS,
                FromRolloutS = m.FromRolloutS,
                UncertaintyS = m.UncertaintyS,
                FromRolloutUncertaintyS = m.FromRolloutUncertaintyS,
                SpeedMps = m.SpeedAtMarkMps,
                TrapSpeedMps = m.TrapSpeedMps,
                TrapSpeedUncertaintyMps = m.TrapSpeedUncertaintyMps,
            }).ToList(),
            PeakAccelMps2 = figures.PeakAccelMps2,
            MeanAccel0To60Mps2 = figures.MeanAccel0To60Mps2,
            MaxSpeedMps = figures.MaxSpeedMps,
            DistanceM = figures.DistanceM,
            Warnings = warnings.ToList(),
        };
    }
}
