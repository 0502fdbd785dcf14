using System.Globalization;

namespace LaunchLogger.Decoding.Runs;

/// <summary>Splits a record that holds several runs — the car stops, rests and sets off again —
/// into one <see cref="DecodedRun"/> per run, so that each is reconstructed and judged on its own.</summary>
/// <remarks>
/// <para>A rest between runs is a stretch of at least <see cref="RestGapS"/> without a pulse (the
/// box's own rule for closing a run: <c>LoggerSettings.StopHoldMicros</c>, 2 s by default; a log's
/// runs already end that way, so the box's runs are never split again). Each piece keeps its half
/// of the rest: the first run's stop needs rest after it, the next run's first motion needs rest
/// before it. Pulse counts of a later piece are counted from the rest before it; accelerometer
/// samples and events go to the piece their time falls in.</para>
/// <para>A piece with too little motion (a stray pulse while parked: fewer than
/// <see cref="MinPulses"/> pulses or under <see cref="MinMotionM"/>) is no run and stays with its
/// neighbour. Records without pulses (accelerometer only) are cut in the middle of each rest
/// <see cref="AccelRestFinder"/> finds (a quiet stretch where the speed, integrated back from the
/// rest the record ends in, is near zero).</para>
/// </remarks>
public static class RecordSplitter
{
    /// <summary>Time without a pulse that separates two runs, s.</summary>
    public const double RestGapS = 2.0;

    /// <summary>Fewest pulses a run holds.</summary>
    public const int MinPulses = 4;

    /// <summary>Least distance a run covers, m.</summary>
    public const double MinMotionM = 2.0;

    /// <summary>The runs in <paramref name="record"/>: the record itself when it holds one.</summary>
    public static IReadOnlyList<DecodedRun> Split(DecodedRun record)
    {
        ArgumentNullException.ThrowIfNull(record);
        if (record.Pulses.Count == 0 && record.Accel is { } accel)
        {
            return SplitByAccelerometer(record, AccelRestFinder.Cuts(accel));
        }

        IReadOnlyList<int> starts = RunStarts(record);
        if (starts.Count <= 1)
        {
            return [record];
        }

        IReadOnlyList<PulseRecord> pulses = record.Pulses;
        var pieces = new List<DecodedRun>(starts.Count);
        double from = double.NegativeInfinity;
        for (int k = 0; k < starts.Count; k++)
        {
            int first = starts[k];
            int end = k + 1 < starts.Count ? starts[k + 1] : pulses.Count;
            double to = k + 1 < starts.Count ? 0.5 * (pulses[end - 1].HiS + pulses[end].LoS) : double.PositiveInfinity;
            long origin = first > 0 ? pulses[first - 1].Count : 0;
            pieces.Add(Piece(record, k, starts.Count, from, to, first, end, origin));
            from = to;
        }

        return pieces;
    }

    /// <summary>A record without pulses cut at <paramref name="cuts"/> (see <see cref="AccelRestFinder"/>).</summary>
    private static IReadOnlyList<DecodedRun> SplitByAccelerometer(DecodedRun record, IReadOnlyList<double> cuts)
    {
        if (cuts.Count == 0)
        {
            return [record];
        }

        var pieces = new List<DecodedRun>(cuts.Count + 1);
        double from = double.NegativeInfinity;
        for (int k = 0; k <= cuts.Count; k++)
        {
            double to = k < cuts.Count ? cuts[k] : double.PositiveInfinity;
            pieces.Add(Piece(record, k, cuts.Count + 1, from, to, 0, 0, 0));
            from = to;
        }

        return pieces;
    }

    /// <summary>Index of the first pulse of each run.</summary>
    private static List<int> RunStarts(DecodedRun record)
    {
        IReadOnlyList<PulseRecord> pulses = record.Pulses;
        double gap = Math.Max(RestGapS, record.Configuration.StopHoldS);
        double metresPerPulse = record.Configuration.MetresPerPulse;
        var starts = new List<int> { 0 };
        for (int i = 1; i < pulses.Count; i++)
        {
            if (pulses[i].LoS - pulses[i - 1].HiS >= gap)
            {
                starts.Add(i);
            }
        }

        // Merge pieces with too little motion into the piece before (or, for the first, after).
        for (int k = 0; k < starts.Count && starts.Count > 1;)
        {
            int first = starts[k];
            int end = k + 1 < starts.Count ? starts[k + 1] : pulses.Count;
            long moved = pulses[end - 1].Count - (first > 0 ? pulses[first - 1].Count : pulses[first].Count - 1);
            if (end - first < MinPulses || moved * metresPerPulse < MinMotionM)
            {
                starts.RemoveAt(k == 0 ? 1 : k);
                continue;
            }

            k++;
        }

        return starts;
    }

    private static DecodedRun Piece(DecodedRun record, int k, int count, double fromS, double toS, int firstPulse, int endPulse, long origin)
    {
        var pulses = new List<PulseRecord>(endPulse - firstPulse);
        for (int i = firstPulse; i < endPulse; i++)
        {
            PulseRecord p = record.Pulses[i];
            pulses.Add(p with { Count = p.Count - origin });
        }

        var second = new List<PulseRecord>();
        long secondOrigin = -1;
        foreach (PulseRecord p in record.SecondPulses)
        {
            if (p.HiS <= fromS)
            {
                continue;
            }

            if (p.HiS > toS)
            {
                break;
            }

            if (secondOrigin < 0)
            {
                secondOrigin = SecondOrigin(record.SecondPulses, fromS);
            }

            second.Add(p with { Count = p.Count - secondOrigin });
        }

        bool Inside(double t) => t > fromS && t <= toS;
        double opened = k == 0 ? record.Configuration.OpenedS : fromS;
        return new DecodedRun
        {
            Source = string.Create(CultureInfo.InvariantCulture, $"{record.Source}, run {k + 1} of {count}"),
            Configuration = record.Configuration with { OpenedS = opened, RunNumber = record.Configuration.RunNumber + k },
            Pulses = pulses,
            SecondPulses = second,
            Accel = record.Accel is { } accel ? Slice(accel, fromS, toS) : null,
            Events = record.Events.Where(e => Inside(e.TimeS)).ToList(),
            RestGravityMilliG = k == 0 ? record.RestGravityMilliG : null,
            FirmwareMotionS = record.FirmwareMotionS is { } m && Inside(m) ? m : null,
            FirmwareRolloutS = record.FirmwareRolloutS is { } r && Inside(r) ? r : null,
            Health = k == 0 ? record.Health : new Dictionary<string, long>(),
            FramesLost = k == 0 ? record.FramesLost : 0,
            Complete = record.Complete,
            Warnings = record.Warnings,
        };
    }

    /// <summary>The second channel's count at <paramref name="atS"/> (the last count reached by then).</summary>
    private static long SecondOrigin(IReadOnlyList<PulseRecord> pulses, double atS)
    {
        long origin = 0;
        foreach (PulseRecord p in pulses)
        {
            if (p.HiS > atS)
            {
                break;
            }

            origin = p.Count;
        }

        return origin;
    }

    private static AccelSeries? Slice(AccelSeries accel, double fromS, double toS)
    {
        int lo = LowerBound(accel.TimeS, fromS);
        int hi = LowerBound(accel.TimeS, toS);
        if (hi <= lo)
        {
            return null;
        }

        return new AccelSeries
        {
            TimeS = accel.TimeS[lo..hi],
            ForwardMps2 = accel.ForwardMps2[lo..hi],
            LateralMps2 = accel.LateralMps2[lo..hi],
            VerticalMps2 = accel.VerticalMps2[lo..hi],
            HasAllAxes = accel.HasAllAxes,
            SamplePeriodS = accel.SamplePeriodS,
            SamplePeriodUncertaintyS = accel.SamplePeriodUncertaintyS,
            SampleIndex = accel.SampleIndex?[lo..hi],
            ClockOriginS = accel.ClockOriginS ?? accel.TimeS[0],
            Axes = accel.Axes,
        };
    }

    /// <summary>First index whose time is above <paramref name="t"/> (samples at or before it go to the earlier piece).</summary>
    private static int LowerBound(double[] times, double t)
    {
        if (double.IsNegativeInfinity(t))
        {
            return 0;
        }

        if (double.IsPositiveInfinity(t))
        {
            return times.Length;
        }

        int i = Array.BinarySearch(times, t);
        if (i < 0)
        {
            return ~i;
        }

        while (i < times.Length && times[i] <= t)
        {
            i++;
        }

        return i;
    }
}
