using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Statistics;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Calibration;

/// <summary>A tooth-spacing map from a steady cruise (hardware-notes/calibration.md §4): each
/// tooth interval divided by the mean interval of the revolution around it, averaged per tooth
/// over many revolutions.</summary>
/// <remarks>
/// <para>Detrending: the n intervals of any n consecutive gaps add up to exactly one revolution
/// whatever the spacing, so their mean is the time per nominal pulse at that moment. Taking that
/// window centred on the interval (for even n, the mean of the two windows one gap either side
/// of centre) removes a steady change of speed to first order; what is left grows with the
/// square of the change over one revolution (Taylor expansion of the time per distance). Only
/// stretches where the revolution time changes by at most
/// <see cref="MaxSpeedChangePerRevolution"/> from one revolution to the next are used.</para>
/// <para>Timing: an edge known only to lie in a bracket of width w carries a uniform error of
/// σ = w/√12, so one interval's relative error is w/√6 over the interval. Exact edge times (one
/// clock tick wide) make that negligible; a polled counter's brackets do not, and the map then
/// rests on averaging: the run is refused when the brackets alone would leave more than
/// <see cref="MaxBracketNoisePerTooth"/> per tooth.</para>
/// <para>Numbering: gap k ends at the edge where the hardware counter reaches a value ≡ k
/// (mod n); with the log's origin count this ties the map to the counter, which stays in step
/// with the ring while the box is powered and no pulse is lost or doubled. The two halves of the
/// cruise are mapped separately as a check: if they disagree beyond their noise, the numbering
/// slipped (or the ring moved) and the user is told.</para>
/// </remarks>
public static class ToothSpacingCalibration
{
    /// <summary>Largest change of revolution time from one revolution to the next that still
    /// counts as steady.</summary>
    public const double MaxSpeedChangePerRevolution = 0.05;

    /// <summary>Longest revolution time used, seconds (slower is too close to a stop).</summary>
    public const double MaxRevolutionS = 2.0;

    /// <summary>Fewest steady revolutions for a map.</summary>
    public const int MinimumRevolutions = 20;

    /// <summary>Steady revolutions recommended (calibration.md §4: at least 100).</summary>
    public const int RecommendedRevolutions = 100;

    /// <summary>Fewest steady sightings of every tooth over which a saved map is turned to a run
    /// (<see cref="Align"/>).</summary>
    public const int MinimumAlignmentRevolutions = 3;

    /// <summary>How much lower χ² the best turn of a saved map must reach than the next best.</summary>
    public const double AlignmentMargin = 25;

    /// <summary>Largest per-tooth uncertainty the brackets alone may leave (a quarter of the
    /// 1 % pitch errors a map is for).</summary>
    public const double MaxBracketNoisePerTooth = 0.0025;

    /// <summary>Per-interval bracket noise above which the user is told the map rests on averaging.</summary>
    public const double WideBracketNoise = 0.01;

    /// <summary>Least σ of a half map's gap in the halves' comparison, as a fraction of a pitch.
    /// Exact edges leave each gap known to about 10⁻⁵ of a pitch, below what the speed's change
    /// within a revolution leaves in it (a few 10⁻⁵ on a coarse ring while accelerating, and not
    /// the same in both halves); a slipped numbering moves every gap by the ring's own spread,
    /// 10⁻³ to 10⁻² (a cut or printed ring).</summary>
    public const double HalfMapFloor = 1e-4;

    /// <summary>Maps the tooth spacing of <paramref name="run"/>'s distance channel.</summary>
    /// <param name="run">A run with a steady cruise.</param>
    /// <param name="originCount">The hardware count at the run's origin, or null to number the
    /// gaps by the run's own count.</param>
    /// <exception cref="CalibrationException">Too few steady revolutions, or brackets too wide;
    /// the message says what to do.</exception>
    public static ToothSpacingMap Measure(DecodedRun run, long? originCount)
    {
        ArgumentNullException.ThrowIfNull(run);
        int n = run.Configuration.PulsesPerRevolution;
        if (n < 2)
        {
            throw new CalibrationException($"{run.Source}: a tooth map needs at least 2 pulses per revolution (the log says {n})");
        }

        return Measure(run.Pulses, n, run.Configuration.MetresPerPulse, run.Source, originCount, out string? refusal)
            ?? throw new CalibrationException(refusal!);
    }

    /// <summary>Maps the tooth spacing of one pulse channel, or says why not.</summary>
    /// <param name="pulses">The channel's observations.</param>
    /// <param name="n">Pulses per revolution (at least 2).</param>
    /// <param name="metresPerPulse">Distance per pulse, m (for the mean speed only).</param>
    /// <param name="source">The run's name, for the messages.</param>
    /// <param name="originCount">The hardware count at the run's origin, or null to number the
    /// gaps by the run's own count.</param>
    /// <param name="refusal">Why there is no map: too few steady revolutions, or brackets too wide.</param>
    /// <returns>The map, or null.</returns>
    public static ToothSpacingMap? Measure(IReadOnlyList<PulseRecord> pulses, int n, double metresPerPulse, string source, long? originCount, out string? refusal)
    {
        ArgumentNullException.ThrowIfNull(pulses);
        refusal = null;
        Steady steady = Collect(pulses, n, originCount ?? 0);
        var perTooth = steady.PerTooth;
        var intervals = steady.Intervals;
        var widths = steady.Widths;
        int used = steady.Used;
        double usedTime = steady.UsedTimeS;
        if (used < MinimumRevolutions * n)
        {
            refusal = Invariant($"{source}: only {(double)used / n:0.#} steady revolutions (at least {MinimumRevolutions} needed, {RecommendedRevolutions} or more recommended): hold a light, constant throttle for longer");
            return null;
        }

        double medianBracket = Median(widths);
        double medianInterval = Median(intervals);
        double bracketNoise = medianBracket / Math.Sqrt(6) / medianInterval;
        double revolutions = (double)used / n;
        double bracketNoisePerTooth = bracketNoise / Math.Sqrt(revolutions);
        if (bracketNoisePerTooth > MaxBracketNoisePerTooth)
        {
            refusal = Invariant($"{source}: the edge times are known only to {medianBracket * 1000:0.###} ms brackets, {bracketNoise:P1} of a tooth interval at this speed, which leaves {bracketNoisePerTooth:P2} per tooth after {revolutions:0} revolutions: cruise slower or longer, or log with exact edge times");
            return null;
        }

        var warnings = new List<string>();
        if (bracketNoise > WideBracketNoise)
        {
            warnings.Add(Invariant($"the edge times are known only to {medianBracket * 1000:0.###} ms brackets (a polled counter): each interval is uncertain by {bracketNoise:P1}, and the map rests on averaging {revolutions:0} revolutions"));
        }

        if (revolutions < RecommendedRevolutions)
        {
            warnings.Add(Invariant($"only {revolutions:0} steady revolutions: {RecommendedRevolutions} or more are recommended"));
        }

        var spacing = new double[n];
        var sigma = new double[n];
        for (int k = 0; k < n; k++)
        {
            double[] ratios = perTooth[k].Select(e => e.Ratio).ToArray();
            if (ratios.Length < 3)
            {
                refusal = Invariant($"{source}: tooth {k} was seen in only {ratios.Length} steady intervals; the pulse count may have slipped");
                return null;
            }

            // The scatter can understate the brackets' share when the poll period keeps in step
            // with the teeth (quantisation then repeats instead of averaging out): never claim
            // better than the brackets alone allow.
            Robust mean = Robust.Mean(ratios, 0, ratios.Length);
            spacing[k] = mean.Value;
            sigma[k] = Math.Max(mean.Sigma, bracketNoise / Math.Sqrt(ratios.Length));
        }

        double scale = spacing.Average();
        for (int k = 0; k < n; k++)
        {
            spacing[k] /= scale;
            sigma[k] /= scale;
        }

        bool halvesDisagree = HalvesDisagree(perTooth, n);
        if (halvesDisagree)
        {
            warnings.Add("the first and second halves of the cruise give different maps: a pulse may have been lost or doubled (check the health counters), or the ring moved");
        }

        if (originCount is null)
        {
            warnings.Add("the log does not give the run's starting count: teeth are numbered from this run's own origin");
        }

        return new ToothSpacingMap
        {
            Source = source,
            PulsesPerRevolution = n,
            Spacing = spacing,
            Sigma = sigma,
            IndexedByHardwareCount = originCount is not null,
            Intervals = used,
            MeanSpeedMps = metresPerPulse * used / usedTime,
            MedianBracketS = medianBracket,
            BracketNoiseFraction = bracketNoise,
            HalvesDisagree = halvesDisagree,
            Warnings = warnings,
        };
    }

    /// <summary>Turns a saved map (<see cref="CalibrationSettings.ToothSpacing"/>) to the run's own
    /// numbering: finds r such that the run's gap k (its count ≡ k mod n) is the map's entry
    /// (k + r) mod n, from the run's steady revolutions, or says why it cannot.</summary>
    /// <remarks>
    /// <para>The box's counter keeps step with the ring only while it stays powered, so a map saved
    /// from another session names its teeth from an unknown one. The run's own steady intervals,
    /// each against its revolution (as <see cref="Measure(IReadOnlyList{PulseRecord}, int, double, string, long?, out string?)"/>
    /// takes them), give every tooth's gap with a σ from their scatter (never below the
    /// brackets'); each of the n turns of the map is scored by χ² against them. The best turn is
    /// taken only when it fits (χ² within what its degrees of freedom allow, so a map of another
    /// ring is refused) and the next best is worse by at least <see cref="AlignmentMargin"/> (odds
    /// of e^(margin/2) to one that the turn is not a near tie, well past the n − 1 other turns).
    /// A few revolutions do: the map needs a hundred to know each gap to a tenth of a per cent,
    /// but telling n turns apart needs only the pattern.</para>
    /// </remarks>
    /// <param name="pulses">The run's distance channel.</param>
    /// <param name="spacing">The saved map: relative gap lengths, mean 1.</param>
    /// <param name="sigma">1-σ of each entry.</param>
    /// <param name="refusal">Why the map cannot be turned to this run.</param>
    /// <returns>The turn, or null.</returns>
    public static ToothMapTurn? Align(IReadOnlyList<PulseRecord> pulses, IReadOnlyList<double> spacing, IReadOnlyList<double> sigma, out string? refusal)
    {
        ArgumentNullException.ThrowIfNull(pulses);
        ArgumentNullException.ThrowIfNull(spacing);
        ArgumentNullException.ThrowIfNull(sigma);
        int n = spacing.Count;
        refusal = null;
        if (n < 2 || sigma.Count != n)
        {
            refusal = "the saved map needs a σ for each of at least 2 entries";
            return null;
        }

        Steady steady = Collect(pulses, n, 0);
        int fewest = steady.PerTooth.Min(t => t.Count);
        if (fewest < MinimumAlignmentRevolutions)
        {
            refusal = Invariant($"the run has {fewest} steady revolutions for its least-seen tooth ({MinimumAlignmentRevolutions} needed to tell which tooth is which)");
            return null;
        }

        double bracketNoise = Median(steady.Widths) / Math.Sqrt(6) / Median(steady.Intervals);
        var gap = new double[n];
        var variance = new double[n];
        for (int k = 0; k < n; k++)
        {
            double[] ratios = steady.PerTooth[k].Select(e => e.Ratio).ToArray();
            Robust mean = Robust.Mean(ratios, 0, ratios.Length);
            double floor = bracketNoise / Math.Sqrt(ratios.Length);
            gap[k] = mean.Value;
            variance[k] = Math.Max(mean.Sigma * mean.Sigma, floor * floor);
        }

        double scale = gap.Average();
        var chiSquare = new double[n];
        for (int r = 0; r < n; r++)
        {
            for (int k = 0; k < n; k++)
            {
                int j = (k + r) % n;
                double d = (gap[k] / scale) - spacing[j];
                chiSquare[r] += d * d / ((variance[k] / (scale * scale)) + (sigma[j] * sigma[j]));
            }
        }

        int best = Array.IndexOf(chiSquare, chiSquare.Min());
        double next = Enumerable.Range(0, n).Where(r => r != best).Min(r => chiSquare[r]);
        double allowed = n + (5 * Math.Sqrt(2.0 * n));
        if (chiSquare[best] > allowed)
        {
            refusal = Invariant($"the saved map fits this run's ring at no turn (χ² {chiSquare[best]:0} for {n} teeth, {allowed:0} allowed): it is another ring's, or the ring was refitted");
            return null;
        }

        if (next - chiSquare[best] < AlignmentMargin)
        {
            refusal = Invariant($"the run's {(double)steady.Used / n:0} steady revolutions do not tell which tooth is which (the best turn is ahead of the next by {next - chiSquare[best]:0.#} in χ², {AlignmentMargin:0} needed)");
            return null;
        }

        return new ToothMapTurn(best, (double)steady.Used / n, chiSquare[best], next - chiSquare[best]);
    }

    /// <summary>The steady tooth intervals of one channel, each divided by its revolution's mean
    /// interval and filed under its tooth (gap k ends where origin + count ≡ k mod n).</summary>
    private static Steady Collect(IReadOnlyList<PulseRecord> pulses, int n, long origin)
    {
        var times = new Dictionary<long, double>(pulses.Count);
        var widths = new List<double>(pulses.Count);
        foreach (PulseRecord p in pulses)
        {
            if (p.HiS >= p.LoS && !double.IsNaN(p.LoS))
            {
                times[p.Count] = p.MidS;
                widths.Add(p.WidthS);
            }
        }

        var perTooth = new List<(double Time, double Ratio)>[n];
        for (int k = 0; k < n; k++)
        {
            perTooth[k] = [];
        }

        var intervals = new List<double>();
        double usedTime = 0;
        int used = 0;
        foreach ((long c, double t) in times)
        {
            if (!times.TryGetValue(c - 1, out double previous)
                || !TryRevolution(times, c, n, out double revolutionS)
                || !IsSteady(times, c, n))
            {
                continue;
            }

            double interval = t - previous;
            intervals.Add(interval);
            int k = (int)(((origin + c) % n + n) % n);
            perTooth[k].Add((t, interval * n / revolutionS));
            usedTime += interval;
            used++;
        }

        return new Steady(perTooth, intervals, widths, used, usedTime);
    }

    private sealed record Steady(List<(double Time, double Ratio)>[] PerTooth, List<double> Intervals, List<double> Widths, int Used, double UsedTimeS);

    /// <summary>The time of one revolution centred on the gap that ends at count <paramref name="c"/>.</summary>
    private static bool TryRevolution(Dictionary<long, double> times, long c, int n, out double revolutionS)
    {
        revolutionS = 0;
        if (n % 2 == 1)
        {
            int h = (n - 1) / 2;
            if (!Span(times, c - h - 1, c + h, out revolutionS))
            {
                return false;
            }
        }
        else
        {
            int h = n / 2;
            if (!Span(times, c - h, c + h, out double later) || !Span(times, c - h - 1, c + h - 1, out double earlier))
            {
                return false;
            }

            revolutionS = 0.5 * (later + earlier);
        }

        return revolutionS > 0 && revolutionS <= MaxRevolutionS;
    }

    /// <summary>True when the revolution before edge c and the one after it differ by at most
    /// <see cref="MaxSpeedChangePerRevolution"/>.</summary>
    private static bool IsSteady(Dictionary<long, double> times, long c, int n)
        => Span(times, c - n, c, out double before) && Span(times, c, c + n, out double after)
            && Math.Abs((after / before) - 1) <= MaxSpeedChangePerRevolution;

    private static bool Span(Dictionary<long, double> times, long from, long to, out double seconds)
    {
        seconds = 0;
        if (!times.TryGetValue(from, out double start) || !times.TryGetValue(to, out double end))
        {
            return false;
        }

        seconds = end - start;
        return seconds > 0;
    }

    /// <summary>Maps the halves of the cruise (split at the median time) and compares them:
    /// true when Σ (difference / its σ)² exceeds four times the number of teeth (each half's σ
    /// at least <see cref="HalfMapFloor"/>).</summary>
    private static bool HalvesDisagree(List<(double Time, double Ratio)>[] perTooth, int n)
    {
        double[] allTimes = perTooth.SelectMany(t => t.Select(e => e.Time)).ToArray();
        double split = Median(allTimes);
        double chiSquare = 0;
        int compared = 0;
        for (int k = 0; k < n; k++)
        {
            double[] early = perTooth[k].Where(e => e.Time < split).Select(e => e.Ratio).ToArray();
            double[] late = perTooth[k].Where(e => e.Time >= split).Select(e => e.Ratio).ToArray();
            if (early.Length < 3 || late.Length < 3)
            {
                continue;
            }

            Robust a = Robust.Mean(early, 0, early.Length);
            Robust b = Robust.Mean(late, 0, late.Length);
            double variance = (a.Sigma * a.Sigma) + (b.Sigma * b.Sigma) + (2 * HalfMapFloor * HalfMapFloor);
            if (variance > 0)
            {
                chiSquare += (a.Value - b.Value) * (a.Value - b.Value) / variance;
                compared++;
            }
        }

        return compared > 0 && chiSquare > 4.0 * compared;
    }

    private static double Median(IReadOnlyCollection<double> values)
    {
        double[] sorted = values.ToArray();
        Array.Sort(sorted);
        return sorted.Length == 0 ? 0 : sorted[sorted.Length / 2];
    }
}

/// <summary>How a saved tooth map is turned to a run.</summary>
/// <param name="Shift">The run's gap k is the map's entry (k + Shift) mod n.</param>
/// <param name="Revolutions">Steady revolutions of the run it rests on.</param>
/// <param name="ChiSquare">χ² of the map at that turn against the run's gaps.</param>
/// <param name="Margin">How much higher the next best turn's χ² was.</param>
public sealed record ToothMapTurn(int Shift, double Revolutions, double ChiSquare, double Margin);
