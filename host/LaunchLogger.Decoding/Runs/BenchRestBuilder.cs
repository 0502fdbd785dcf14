using LaunchLogger.Decoding.Reading;
using LaunchLogger.Firmware.Wire;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Runs;

/// <summary>Collects one bench rest's samples between its two frames (a rest is short: 20 s at
/// 1 kHz is 120 KB), and builds the <see cref="BenchRestRecord"/>.</summary>
internal sealed class BenchRestBuilder
{
    private readonly BenchRestBody opening;
    private readonly string source;
    private readonly List<long> index = [];
    private readonly List<short> xyz = [];
    private readonly List<string> warnings = [];

    public BenchRestBuilder(BenchRestBody opening, string source)
    {
        this.opening = opening;
        this.source = source;
    }

    /// <summary>Frames missing or damaged inside the rest.</summary>
    public long FramesLost { get; set; }

    /// <summary>Adds an acceleration frame's samples.</summary>
    public void Add(in AccelerationBody body)
    {
        for (int i = 0; i < body.Count; i++)
        {
            index.Add(body.FirstIndex + i);
            xyz.Add(body.MilliG(i, 0));
            xyz.Add(body.MilliG(i, 1));
            xyz.Add(body.MilliG(i, 2));
        }
    }

    /// <summary>Notes something the reader saw.</summary>
    public void Warn(string warning) => warnings.Add(warning);

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
