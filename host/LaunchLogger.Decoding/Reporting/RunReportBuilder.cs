using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Decoding.Reporting;

/// <summary>Turns a run's figures into its report entry.</summary>
public static class RunReportBuilder
{
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
