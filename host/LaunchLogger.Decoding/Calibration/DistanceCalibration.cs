using LaunchLogger.Decoding.Runs;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Calibration;

/// <summary>Rolling circumference from a measured roll: the car rolls from a standstill on a
/// start line to a standstill on an end line a taped distance away, and the pulses counted in
/// between give circumference = distance × pulses per revolution / counted pulses (common
/// practice; hardware-notes/calibration.md §1).</summary>
/// <remarks>
/// <para>Counting: the car's position within one pulse pitch is unknown at the start and at the
/// end, each uniformly over one pitch, so the count differs from the distance in pulses by the
/// difference of two such positions: within ±1 pulse, 1-σ = 1/√6 pulse (two uniform errors of
/// 1/√12 each). Repeats average this down; when their scatter is larger than counting explains
/// (a wavy path, a misread line, a slipping tyre), the scatter's standard error is used instead.</para>
/// <para>Tape: the user's stated 1-σ of the distance between the lines, line-up included; it is
/// common to all repeats over the same marks, so it does not average down.</para>
/// </remarks>
public static class DistanceCalibration
{
    /// <summary>1-σ of the count, pulses: the difference of two positions each uniform over one pitch.</summary>
    public static readonly double CountingSigmaPulses = 1 / Math.Sqrt(6);

    /// <summary>Repeats that disagree by more than this fraction get a warning (calibration.md §1: about 0.1 %).</summary>
    public const double RepeatAgreementFraction = 0.001;

    /// <summary>Counts the pulses of one roll.</summary>
    /// <param name="runs">One run, or consecutive runs of one power-up whose counts join up
    /// (the car stopped short and crept on), in log order.</param>
    /// <param name="origins">The log's origin counts; needed to join several runs.</param>
    /// <exception cref="CalibrationException">The runs cannot give a count between two standstills; the message says why.</exception>
    public static RollMeasurement CountRoll(IReadOnlyList<DecodedRun> runs, RunOrigins origins)
    {
        ArgumentNullException.ThrowIfNull(runs);
        ArgumentNullException.ThrowIfNull(origins);
        if (runs.Count == 0)
        {
            throw new ArgumentException("at least one run is needed", nameof(runs));
        }

        DecodedRun first = runs[0];
        DecodedRun last = runs[^1];
        string source = runs.Count == 1 ? first.Source : Invariant($"{first.Source} to run {last.Configuration.RunNumber}");
        var warnings = new List<string>();
        if (!first.Configuration.Staged)
        {
            throw new CalibrationException($"{first.Source}: the run opened while rolling, so its count does not start at a standstill; stage the car on the start line");
        }

        if (!last.Complete)
        {
            throw new CalibrationException($"{last.Source}: the run has no summary (cut off before the car stood still), so its count may be short");
        }

        int ppr = first.Configuration.PulsesPerRevolution;
        double configured = first.Configuration.CircumferenceM;
        if (ppr < 1)
        {
            throw new CalibrationException($"{first.Source}: the log does not say how many pulses make a revolution");
        }

        foreach (DecodedRun run in runs)
        {
            if (run.Configuration.PulsesPerRevolution != ppr || run.Configuration.CircumferenceM != configured)
            {
                throw new CalibrationException($"{run.Source}: the box's pulses per revolution or circumference changed between the runs of one roll");
            }

            if (run.Health.TryGetValue(HealthCounterNames.CountsWentBackwards, out long backwards) && backwards > 0)
            {
                warnings.Add(Invariant($"{run.Source}: the pulse count went backwards {backwards} time(s): check the pickup's wiring"));
            }
        }

        long pulses = runs.Count == 1 ? LastCount(first) : JoinedCount(runs, origins);
        if (pulses < 1)
        {
            throw new CalibrationException($"{source}: no pulses were counted; the car did not roll, or the pickup is not connected");
        }

        if (pulses < 10 * ppr)
        {
            warnings.Add(Invariant($"{source}: only {pulses} pulses ({(double)pulses / ppr:0.#} revolutions): roll further for a useful calibration"));
        }

        return new RollMeasurement(source, pulses, ppr, configured) { Warnings = warnings };
    }

    /// <summary>The circumference from one or more rolls over the same taped distance.</summary>
    /// <param name="rolls">The rolls; all with the same pulses per revolution.</param>
    /// <param name="distanceM">The taped distance, m.</param>
    /// <param name="tapeSigmaM">1-σ of the taped distance, line-up included, m.</param>
    /// <exception cref="ArgumentException">No rolls, a distance that is not positive, or a
    /// negative tape uncertainty.</exception>
    /// <exception cref="CalibrationException">The rolls do not fit together.</exception>
    public static CircumferenceCalibration Compute(IReadOnlyList<RollMeasurement> rolls, double distanceM, double tapeSigmaM)
    {
        ArgumentNullException.ThrowIfNull(rolls);
        if (rolls.Count == 0)
        {
            throw new ArgumentException("at least one roll is needed", nameof(rolls));
        }

        if (!(distanceM > 0) || double.IsInfinity(distanceM))
        {
            throw new ArgumentException("the distance must be positive", nameof(distanceM));
        }

        if (!(tapeSigmaM >= 0) || double.IsInfinity(tapeSigmaM))
        {
            throw new ArgumentException("the tape uncertainty must not be negative", nameof(tapeSigmaM));
        }

        int ppr = rolls[0].PulsesPerRevolution;
        if (rolls.Any(r => r.PulsesPerRevolution != ppr))
        {
            throw new CalibrationException("the rolls were made with different pulses per revolution; calibrate each configuration on its own");
        }

        int k = rolls.Count;
        double mean = rolls.Average(r => (double)r.Pulses);
        double countingSigma = CountingSigmaPulses / Math.Sqrt(k);
        double repeatSigma = countingSigma;
        double spread = 0;
        if (k > 1)
        {
            double variance = rolls.Sum(r => (r.Pulses - mean) * (r.Pulses - mean)) / (k - 1);
            repeatSigma = Math.Max(countingSigma, Math.Sqrt(variance / k));
            spread = (rolls.Max(r => r.Pulses) - rolls.Min(r => r.Pulses)) / mean;
        }

        double circumference = distanceM * ppr / mean;
        double countingPart = circumference * repeatSigma / mean;
        double tapePart = circumference * tapeSigmaM / distanceM;
        var warnings = rolls.SelectMany(r => r.Warnings).ToList();
        if (spread > RepeatAgreementFraction)
        {
            warnings.Add(Invariant($"the rolls disagree by {spread:P2} (more than about 0.1 %): look for a wavy path, a misread line or a slipping tyre"));
        }

        double configured = rolls[0].ConfiguredCircumferenceM;
        if (configured > 0 && Math.Abs((circumference / configured) - 1) > 0.2)
        {
            warnings.Add(Invariant($"the measured circumference is {((circumference / configured) - 1):P0} off the configured one: check --metres and the pulses per revolution"));
        }

        return new CircumferenceCalibration
        {
            DistanceM = distanceM,
            TapeSigmaM = tapeSigmaM,
            Rolls = rolls,
            MeanPulses = mean,
            PulsesPerRevolution = ppr,
            CircumferenceM = circumference,
            SigmaM = Math.Sqrt((countingPart * countingPart) + (tapePart * tapePart)),
            CountingSigmaM = countingPart,
            TapeSigmaPartM = tapePart,
            SpreadFraction = spread,
            ConfiguredCircumferenceM = configured,
            Warnings = warnings,
        };
    }

    private static long LastCount(DecodedRun run) => run.Pulses.Count == 0 ? 0 : run.Pulses.Max(p => p.Count);

    /// <summary>Pulses from the first run's origin to the last run's final count, on the box's
    /// hardware counter, which runs on across runs while the box stays powered.</summary>
    private static long JoinedCount(IReadOnlyList<DecodedRun> runs, RunOrigins origins)
    {
        long? firstOrigin = origins.OriginOf(runs[0]);
        long previousEnd = long.MinValue;
        long end = 0;
        for (int i = 0; i < runs.Count; i++)
        {
            DecodedRun run = runs[i];
            long? origin = origins.OriginOf(run);
            if (origin is null || firstOrigin is null)
            {
                throw new CalibrationException($"{run.Source}: the log does not give this run's starting count, so the runs cannot be joined into one roll");
            }

            if (i > 0 && (run.Configuration.RunNumber != runs[i - 1].Configuration.RunNumber + 1 || origin.Value < previousEnd))
            {
                throw new CalibrationException($"{run.Source}: does not follow on from the run before it in the same power-up, so the runs cannot be joined into one roll");
            }

            end = origin.Value + LastCount(run);
            previousEnd = end;
        }

        return end - firstOrigin!.Value;
    }
}
