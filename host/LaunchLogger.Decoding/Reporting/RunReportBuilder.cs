using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Decoding.Reporting;

/// <summary>Turns a run's figures into its report entry.</summary>
public static class RunReportBuilder
{
    /// <summary>Builds the entry for an analysed run at position <paramref name="index"/> (1-based).</summary>
    public static RunReport Build(RunAnalysis analysis, int index = 1)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        RunReport report = Build(
            analysis.Run.Configuration.RunNumber,
            analysis.Reconstruction.Method,
            analysis.Reconstruction.Staged,
            analysis.Figures,
            analysis.Run.FirmwareRolloutS,
            analysis.Warnings);
        var corrections = new List<CorrectedFiguresReport>();
        if (analysis.LevelFigures is { } level)
        {
            corrections.Add(Corrected("level", LevelCorrection.Method, level));
        }

        if (analysis.StandardAirFigures is { } air)
        {
            corrections.Add(Corrected("standard_air", WeatherCorrection.Method, air));
        }

        return report with
        {
            Index = index,
            Source = analysis.Run.Source,
            Braking = analysis.Braking is { } b
                ? Braking(b) with { GripLimit = GripLimit.Assess(analysis, namedByUser: false) is { } e ? new GripLimitReport(e.Basis, e.Text) : null }
                : null,
            Verdict = analysis.Verdict is { } v ? Verdict(v) : null,
            Grade = analysis.Grade is { } g ? new GradeReport { Percent = g.Percent, UncertaintyPercent = Math.Tan(g.SigmaRad) * 100, MountingCalibrated = g.MountingCalibrated } : null,
            Corrections = corrections,
            Box = Box(analysis.Run.Configuration, analysis.Warnings),
        };
    }

    /// <summary>The report of the box's configuration; <paramref name="notes"/> are the run's
    /// notes, of which those of the calibration settings (prefixed "calibration:") are kept.</summary>
    public static BoxReport Box(LaunchLogger.Decoding.Runs.RunConfiguration configuration, IEnumerable<string> notes)
    {
        ArgumentNullException.ThrowIfNull(configuration);
        return new BoxReport
        {
            FirmwareVersion = configuration.FirmwareVersion,
            LogFormatVersion = configuration.FormatVersion,
            PulsesPerRevolution = configuration.PulsesPerRevolution,
            CircumferenceM = configuration.CircumferenceM,
            MetresPerPulse = configuration.MetresPerPulse,
            SecondChannel = configuration.HasSecondChannel,
            AccelRateHz = configuration.HasAccelerometer ? configuration.AccelNominalRateHz : null,
            AccelFullScaleMps2 = configuration.HasAccelerometer ? configuration.AccelFullScaleMps2 : null,
            RolloutM = configuration.RolloutM,
            Calibration = notes.Where(n => n.StartsWith("calibration:", StringComparison.Ordinal)).ToList(),
        };
    }

    /// <summary>The report of a whole session.</summary>
    public static ReportDocument Document(SessionAnalysis session, string toolVersion, string source, ReaderReport? reader, Weather? weather, IReadOnlyList<(int A, int B)> pairs)
    {
        ArgumentNullException.ThrowIfNull(session);
        return Document(session.Runs.Select((a, i) => Build(a, i + 1)).ToList(), i => session.Runs[i].Figures, session.Bound, toolVersion, source, reader, weather, pairs);
    }

    /// <summary>The report of a session analysed one run at a time, whose runs kept their
    /// entries (<see cref="Build(RunAnalysis, int)"/>); each entry gets its final verdict.</summary>
    public static ReportDocument Document(StreamedSession<RunReport> session, string toolVersion, string source, ReaderReport? reader, Weather? weather, IReadOnlyList<(int A, int B)> pairs)
    {
        ArgumentNullException.ThrowIfNull(session);
        return Document(session.Runs.Select(r => r.Kept with { Verdict = Verdict(r.Verdict) }).ToList(), i => session.Runs[i].Figures, session.Bound, toolVersion, source, reader, weather, pairs);
    }

    private static ReportDocument Document(List<RunReport> runs, Func<int, FigureSet> figuresAt, TractionBound? bound, string toolVersion, string source, ReaderReport? reader, Weather? weather, IReadOnlyList<(int A, int B)> pairs)
    {
        return new ReportDocument
        {
            ToolVersion = toolVersion,
            Source = source,
            Reader = reader,
            Runs = runs,
            TractionBound = bound is { } b ? new TractionBoundReport
            {
                Source = b.Source,
                MeanDecelMps2 = b.MeanDecelMps2,
                Bound060S = b.Bound0To60S,
                Bound0100KmhS = b.Bound0To100KmhS,
                Basis = b.Basis,
                Why = b.Why,
                Caveats = TractionBound.Caveats,
            } : null,
            Weather = weather is null ? null : new WeatherReport
            {
                TemperatureC = weather.TemperatureC,
                PressureHpa = weather.PressureHPa,
                RelativeHumidityPct = weather.RelativeHumidityPct,
                DensityKgPerM3 = weather.DensityKgPerM3,
                DensityAltitudeM = weather.DensityAltitudeM,
                CorrectionFactor = weather.CorrectionFactor,
                Method = WeatherCorrection.Method,
            },
            Pairs = pairs.Select(p =>
            {
                FigureSet mean = PairAverage.Mean(figuresAt(p.A - 1), figuresAt(p.B - 1));
                return new PairReport { Runs = [p.A, p.B], Method = PairAverage.Method, SpeedIntervals = Intervals(mean), DistanceMarks = Marks(mean) };
            }).ToList(),
        };
    }

    /// <summary>The report of a verdict.</summary>
    public static VerdictReport Verdict(Verdict verdict) => new()
    {
        Level = LevelName(verdict.Level),
        Reasons = verdict.Reasons.Select(r => new VerdictReasonReport(LevelName(r.Level), r.Code, r.Text)).ToList(),
    };

    private static string LevelName(VerdictLevel level) => level.ToString().ToLowerInvariant();

    private static CorrectedFiguresReport Corrected(string kind, string method, FigureSet figures) => new()
    {
        Kind = kind,
        Method = method,
        SpeedIntervals = Intervals(figures),
        DistanceMarks = Marks(figures),
    };

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
            // A run that opened moving left no standstill: its start is where the data begins, not a first motion.
            FirstMotionS = staged ? figures.FirstMotionS.Value : null,
            FirstMotionUncertaintyS = staged ? figures.FirstMotionS.Sigma : null,
            Rollout = new RolloutReport
            {
                DistanceM = figures.RolloutDistanceM,
                TimeS = figures.RolloutTimeS?.Value,
                TimeUncertaintyS = figures.RolloutTimeS?.Sigma,
                AfterFirstMotionS = figures.RolloutAfterFirstMotionS?.Value,
                AfterFirstMotionUncertaintyS = figures.RolloutAfterFirstMotionS?.Sigma,
                SpeedMps = figures.RolloutSpeedMps?.Value,
                SpeedUncertaintyMps = figures.RolloutSpeedMps?.Sigma,
                FirmwareTimeS = firmwareRolloutS,
            },
            SpeedIntervals = Intervals(figures),
            DistanceMarks = Marks(figures),
            PeakAccelMps2 = figures.PeakAccelMps2,
            MeanAccel0To60Mps2 = figures.MeanAccel0To60Mps2,
            MaxSpeedMps = figures.MaxSpeedMps,
            DistanceM = figures.DistanceM,
            Warnings = warnings.ToList(),
        };
    }

    private static List<SpeedIntervalReport> Intervals(FigureSet figures) => figures.SpeedIntervals.Select(f => new SpeedIntervalReport
    {
        Label = f.Interval.Label,
        FromMps = f.Interval.FromMps,
        ToMps = f.Interval.ToMps,
        FromStandstillS = f.FromStandstillS,
        FromRolloutS = f.FromRolloutS,
        UncertaintyS = f.UncertaintyS,
        FromRolloutUncertaintyS = f.FromRolloutUncertaintyS,
    }).ToList();

    private static List<DistanceMarkReport> Marks(FigureSet figures) => figures.DistanceMarks.Select(m => new DistanceMarkReport
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
    }).ToList();
}
