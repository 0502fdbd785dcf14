using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Braking;

/// <summary>When the pedal began to move, from the time the box read its brake switch closed.</summary>
/// <remarks>
/// Two things stand between the pedal's first movement and the reading, both late, never early:
/// the switch's own delay (free travel before a brake-light switch closes) and the loop that reads
/// the switch once a pass, so a reading means "closed somewhere since the pass before". Each is
/// taken as a distribution with its mean subtracted and its spread in σ.
/// </remarks>
public static class BrakeSwitchTiming
{
    /// <summary>Shortest time from the pedal's first movement to the switch closing, s.</summary>
    public const double DelayLowS = 0;

    /// <summary>Longest such time, s: a brake-light switch closes after a few millimetres of
    /// free travel, which a firm application covers in some 0–30 ms (common practice, from memory;
    /// not a measured figure). Unmeasured, the delay is taken as uniform between the two.</summary>
    public const double DelayHighS = 0.030;

    /// <summary>The loop's usual step where the log says nothing about it, s
    /// (hardware-notes/loop-timing.md: about 1 ms on the ESP32).</summary>
    public const double DefaultLoopStepS = 0.001;

    /// <summary>The loop's stall while a frame is written, s (hardware-notes/loop-timing.md).</summary>
    public const double DefaultStallS = 0.020;

    /// <summary>Stalls per second of the loop (hardware-notes/loop-timing.md: about one).</summary>
    public const double DefaultStallsPerS = 1;

    /// <summary>Brackets narrower than this are edge timestamps, which tell nothing of the loop, s.</summary>
    public const double EdgeBracketS = 50e-6;

    /// <summary>Observations further apart than this are not used for the loop's gaps, s.</summary>
    public const double MovingSpanS = 0.1;

    /// <summary>Width of the unmeasured switch delay's uniform prior, s.</summary>
    public const double DelaySpanS = DelayHighS - DelayLowS;

    /// <summary>The unmeasured switch delay: mean and 1-σ of the uniform prior, s.</summary>
    public static Estimate DelayPrior { get; } = new((DelayLowS + DelayHighS) / 2, DelaySpanS / Math.Sqrt(12));

    /// <summary>Lag of a reading taken at the end of a known gap: the change is uniform over it.</summary>
    public static Estimate LagOfGap(double gapS) => new(gapS / 2, gapS / Math.Sqrt(12));

    /// <summary>Lag of a reading when the gap before it is not recorded (logs written before the
    /// gap field): a change at a random moment falls into a loop gap of width w with a chance
    /// proportional to w, and then lags it by a uniform share of w. The gaps come from the polled
    /// pulse brackets (each a loop gap); the time between observations outside their brackets is
    /// given to gaps of the median width, over the stretches where observations come at least every
    /// <see cref="MovingSpanS"/> (a stall while standing leaves no bracket). Without polled brackets the loop of
    /// hardware-notes/loop-timing.md is taken.</summary>
    public static Estimate LagOfLoop(IReadOnlyList<PulseRecord> pulses)
    {
        ArgumentNullException.ThrowIfNull(pulses);
        double[] widths = pulses.Select(p => p.WidthS).Where(w => w > 0).Order().ToArray();
        if (widths.Length < 3 || widths[widths.Length / 2] < EdgeBracketS)
        {
            return DefaultLoopLag();
        }

        double median = widths[widths.Length / 2];
        double time = 0, first = 0, second = 0;
        for (int i = 1; i < pulses.Count; i++)
        {
            double span = pulses[i].HiS - pulses[i - 1].HiS;
            if (span > MovingSpanS)
            {
                continue; // standing or crawling: the stalls there left no bracket
            }

            if (!(span > 0))
            {
                continue; // a bracket ending no later than the one before (damaged data) spans no time
            }

            double w = Math.Clamp(pulses[i].WidthS, 0, span);
            double rest = span - w;
            time += w + rest;
            first += (w * w / 2) + (rest * median / 2);
            second += (w * w * w / 3) + (rest * median * median / 3);
        }

        return time > 0 ? Moments(first / time, second / time) : LagOfGap(median);
    }

    /// <summary>The pedal's first movement: the reading, less the loop's lag and the switch's
    /// delay (measured: <paramref name="delayS"/> ± <paramref name="delaySigmaS"/>; null: the prior).</summary>
    public static Estimate Onset(double readS, Estimate lag, double? delayS = null, double delaySigmaS = 0)
    {
        Estimate delay = delayS is { } d ? new Estimate(d, delaySigmaS) : DelayPrior;
        return new Estimate(readS - lag.Value - delay.Value, Math.Sqrt((lag.Sigma * lag.Sigma) + (delay.Sigma * delay.Sigma)));
    }

    /// <summary>The default loop: steps of <see cref="DefaultLoopStepS"/>, and a stall of
    /// <see cref="DefaultStallS"/> <see cref="DefaultStallsPerS"/> times a second.</summary>
    private static Estimate DefaultLoopLag()
    {
        double stallShare = DefaultStallS * DefaultStallsPerS;
        double step = DefaultLoopStepS, stall = DefaultStallS;
        return Moments(
            ((1 - stallShare) * step / 2) + (stallShare * stall / 2),
            ((1 - stallShare) * step * step / 3) + (stallShare * stall * stall / 3));
    }

    private static Estimate Moments(double mean, double meanSquare) => new(mean, Math.Sqrt(Math.Max(meanSquare - (mean * mean), 0)));
}
