using LaunchLogger.Decoding.Reading;
using LaunchLogger.Firmware.Wire;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Runs;

/// <summary>Collects one bench rest's samples between its two frames (a rest is short: 20 s at
/// 1 kHz is 120 KB), and builds the <see cref="BenchRestRecord"/>.</summary>
/// <remarks>A damaged or hostile log may follow a rest's opening with any number of acceleration
/// frames and no end: at most the samples of the rest's set length (no more than the box allows,
/// 600 s) at its rate (no more than <see cref="InputLimits.MaxAccelRateHz"/>), with a tenth to
/// spare, are kept; the rest are counted and said.</remarks>
internal sealed class BenchRestBuilder
{
    /// <summary>The longest rest the box records (LoggerSettings.BenchRestMicros' range), seconds.</summary>
    private const double LongestRestS = 600;

    private readonly BenchRestBody opening;
    private readonly string source;
    private readonly List<long> index = [];
    private readonly List<short> xyz = [];
    private readonly List<string> warnings = [];
    private readonly long capacity;
    private long beyond;

    public BenchRestBuilder(BenchRestBody opening, string source)
    {
        this.opening = opening;
        this.source = source;
        double lengthS = Math.Clamp(LogUnits.Seconds(opening.LengthMicros), 0, LongestRestS);
        double rateHz = Math.Clamp(opening.AccelOutputDataRateMilliHz / 1000.0, 0, InputLimits.MaxAccelRateHz);
        capacity = (long)(lengthS * rateHz * 1.1) + 1024;
    }

    /// <summary>Frames missing or damaged inside the rest.</summary>
    public long FramesLost { get; set; }

    /// <summary>Adds an acceleration frame's samples.</summary>
    public void Add(in AccelerationBody body)
    {
        for (int i = 0; i < body.Count; i++)
        {
            if (index.Count >= capacity)
            {
                beyond += body.Count - i;
                return;
            }

            index.Add(body.FirstIndex + i);
            xyz.Add(body.MilliG(i, 0));
            xyz.Add(body.MilliG(i, 1));
            xyz.Add(body.MilliG(i, 2));
        }
    }

    /// <summary>The rest, ended by <paramref name="end"/>, or unfinished (null) for
    /// <paramref name="why"/>.</summary>
    public BenchRestRecord Build(BenchRestEndBody? end, string? why)
    {
        if (end is null)
        {
            warnings.Add(why ?? "its end frame is missing");
        }
        else if (end.SamplesWritten != index.Count)
        {
            warnings.Add(Invariant($"the box wrote {end.SamplesWritten} samples, {index.Count} were read"));
        }

        if (beyond > 0)
        {
            warnings.Add(Invariant($"{beyond} samples beyond the rest's set length ({opening.LengthMicros / 1e6:0.#} s) left out"));
        }

        if (FramesLost > 0)
        {
            warnings.Add(Invariant($"{FramesLost} frame(s) lost or damaged inside the rest"));
        }

        if (end is { SamplesLost: > 0 })
        {
            warnings.Add(Invariant($"the accelerometer's FIFO overflowed: about {end.SamplesLost} samples lost"));
        }

        return new BenchRestRecord
        {
            Source = Invariant($"{source} rest {opening.RestNumber}"),
            Number = opening.RestNumber,
            OpenedS = LogUnits.Seconds(opening.OpenedMicros),
            LengthS = LogUnits.Seconds(opening.LengthMicros),
            EndedS = end is null ? null : LogUnits.Seconds(end.EndedMicros),
            Outcome = end is null ? BenchRestOutcome.Unfinished : end.Outcome switch
            {
                LogFormat.BenchRestComplete => BenchRestOutcome.Complete,
                LogFormat.BenchRestSpoiledByPulse => BenchRestOutcome.SpoiledByPulse,
                _ => BenchRestOutcome.CutShort,
            },
            RateHz = opening.AccelOutputDataRateMilliHz / 1000.0,
            ForwardAxis = opening.ForwardAxis,
            ForwardAxisReversed = opening.ForwardAxisReversed,
            SampleIndex = [.. index],
            XyzMilliG = [.. xyz],
            SamplesLost = end?.SamplesLost ?? 0,
            FramesLost = FramesLost,
            Warnings = warnings.ToList(),
        };
    }
}
