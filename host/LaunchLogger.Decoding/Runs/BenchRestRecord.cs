namespace LaunchLogger.Decoding.Runs;

/// <summary>How a bench rest ended (LOG-FORMAT.md, frame 0x0A).</summary>
public enum BenchRestOutcome
{
    /// <summary>Recorded for its whole set length.</summary>
    Complete,

    /// <summary>A wheel pulse came during it: the car moved, so it is no rest.</summary>
    SpoiledByPulse,

    /// <summary>The box shut down before the set length.</summary>
    CutShort,

    /// <summary>Its end frame is missing: the log ends, the box restarted, or a run followed.</summary>
    Unfinished,
}

/// <summary>A bench rest as the log holds it: the box standing still, its accelerometer recorded
/// outside any run for the calibration against gravity (LOG-FORMAT.md, frames 0x09 and 0x0A).
/// Not a run: no pulses, no figures.</summary>
public sealed class BenchRestRecord
{
    /// <summary>Where it came from: the log's name and the rest's number.</summary>
    public required string Source { get; init; }

    /// <summary>The rest's number since power-up (from 1).</summary>
    public required long Number { get; init; }

    /// <summary>When it opened (the mark button's release), seconds of the box's clock.</summary>
    public required double OpenedS { get; init; }

    /// <summary>The set length, seconds.</summary>
    public required double LengthS { get; init; }

    /// <summary>When it ended, seconds; null when its end frame is missing.</summary>
    public double? EndedS { get; init; }

    /// <summary>How it ended.</summary>
    public required BenchRestOutcome Outcome { get; init; }

    /// <summary>The accelerometer's nominal output data rate, Hz.</summary>
    public required double RateHz { get; init; }

    /// <summary>The sensor axis that points forward in the car (0 = x, 1 = y, 2 = z).</summary>
    public required int ForwardAxis { get; init; }

    /// <summary>True when that axis points backward in the car.</summary>
    public required bool ForwardAxisReversed { get; init; }

    /// <summary>Each sample's index in the sensor's own count, in log order.</summary>
    public required long[] SampleIndex { get; init; }

    /// <summary>The samples: x, y, z per sample, milli-g, sensor axes.</summary>
    public required short[] XyzMilliG { get; init; }

    /// <summary>Samples the box presumed lost to FIFO overflows during the rest.</summary>
    public long SamplesLost { get; init; }

    /// <summary>Frames of the rest missing by their sequence numbers, or damaged.</summary>
    public long FramesLost { get; init; }

    /// <summary>What the reader noticed: damage, a missing end, samples fewer than written.</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];

    /// <summary>Samples in the rest.</summary>
    public int Count => SampleIndex.Length;

    /// <summary>The forward axis' readings (the car's forward, as in a run: the configured
    /// sign applied), m/s², and their times from the first sample by the sensor's index and
    /// nominal rate, seconds (a rest needs no finer clock).</summary>
    public (double[] TimeS, double[] ForwardMps2) Forward()
    {
        var time = new double[Count];
        var forward = new double[Count];
        int sign = ForwardAxisReversed ? -1 : 1;
        for (int i = 0; i < Count; i++)
        {
            time[i] = (SampleIndex[i] - SampleIndex[0]) / RateHz;
            forward[i] = sign * LogUnits.Mps2(XyzMilliG[(i * 3) + ForwardAxis]);
        }

        return (time, forward);
    }
}
