using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Reporting;

/// <summary>A bench rest as the report lists it: not a run (no figures, no verdict), only what it
/// holds, for <c>launchlogger calibrate accelerometer</c>.</summary>
public sealed record BenchRestReport
{
    /// <summary>The log and the rest's number.</summary>
    public required string Source { get; init; }

    /// <summary>The rest's number in its power-up (what <c>--rest</c> counts is the order in the log).</summary>
    public required long Rest { get; init; }

    /// <summary>When it opened, s on the box's clock.</summary>
    public required double OpenedS { get; init; }

    /// <summary>How long it recorded, s; null when its end is missing.</summary>
    public double? DurationS { get; init; }

    /// <summary>How long the box was set to record it, s (its own frame, LOG-FORMAT.md 0x09).</summary>
    public required double LengthS { get; init; }

    /// <summary>"complete", "spoiled_by_pulse" (the car moved: no rest), "cut_short" (the box shut
    /// down) or "unfinished" (its end is missing).</summary>
    public required string Outcome { get; init; }

    /// <summary>Accelerometer samples in it.</summary>
    public required int Samples { get; init; }

    /// <summary>Samples the box presumed lost to its sensor's overflows during the rest.</summary>
    public required long SamplesLost { get; init; }

    /// <summary>Frames of the rest missing (by their sequence numbers) or damaged.</summary>
    public required long FramesLost { get; init; }

    /// <summary>The plain mean of the forward axis' readings, m/s² (about +g with the axis up, −g
    /// down); null without samples.</summary>
    public double? ForwardMeanMps2 { get; init; }

    /// <summary>What the reader noticed.</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];

    /// <summary>The report's entry for <paramref name="rest"/>.</summary>
    public static BenchRestReport From(BenchRestRecord rest)
    {
        ArgumentNullException.ThrowIfNull(rest);
        (_, double[] forward) = rest.Forward();
        return new BenchRestReport
        {
            Source = rest.Source,
            Rest = rest.Number,
            OpenedS = rest.OpenedS,
            DurationS = rest.EndedS - rest.OpenedS,
            LengthS = rest.LengthS,
            Outcome = rest.Outcome switch
            {
                BenchRestOutcome.Complete => "complete",
                BenchRestOutcome.SpoiledByPulse => "spoiled_by_pulse",
                BenchRestOutcome.CutShort => "cut_short",
                _ => "unfinished",
            },
            Samples = rest.Count,
            SamplesLost = rest.SamplesLost,
            FramesLost = rest.FramesLost,
            ForwardMeanMps2 = forward.Length == 0 ? null : forward.Average(),
            Warnings = rest.Warnings,
        };
    }
}
