namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>What the stop search reads: the pulses, the accelerometer's input, whether the box
/// logged a stop, and how long it holds still before it does.</summary>
internal sealed class RunStopInputs
{
    /// <summary>The distance channel, or null without pulses.</summary>
    public PulseChannel? Pulses { get; init; }

    /// <summary>Distance per pulse of <see cref="Pulses"/>, m.</summary>
    public double MetresPerPulse { get; init; }

    /// <summary>The accelerometer's sample instants, s, or null without an accelerometer.</summary>
    public double[]? AccelTimeS { get; init; }

    /// <summary>The forward input at each of <see cref="AccelTimeS"/> less its resting level, m/s².</summary>
    public double[] AccelInputMps2 { get; init; } = [];

    /// <summary>The input's noise at rest (1 σ of a sample), m/s².</summary>
    public double AccelNoiseMps2 { get; init; }

    /// <summary>The accelerometer's sample period, s.</summary>
    public double AccelPeriodS { get; init; }

    /// <summary>True when the box logged that the car stopped.</summary>
    public bool StoppedEvent { get; init; }

    /// <summary>How long the box holds still before it ends a run, s (0 when not told).</summary>
    public double StopHoldS { get; init; }

    /// <summary>Accelerometer only: how long the last samples must rest at the resting level, s.</summary>
    public double StillAtEndS { get; init; } = 1.0;
}

/// <summary>The phases stage's stop: whether the record ends at rest, and when the car came to
/// rest. With pulses the last pulse's motion tells it (<see cref="StopFinder"/>); without, the
/// accelerometer's last samples resting at the resting level, then back to where the smoothed
/// acceleration last left the still band, and the step where the deceleration ended placed within
/// that window.</summary>
internal static class RunStop
{
    /// <summary>The time the car came to rest after <paramref name="startS"/>, s, or null when
    /// the record does not end at rest.</summary>
    /// <param name="input">What the search reads.</param>
    /// <param name="startS">First motion, s.</param>
    /// <param name="endOfData">End of the data, s.</param>
    public static double? Find(RunStopInputs input, double startS, double endOfData)
    {
        PulseChannel? pulses = input.Pulses;
        double mpp = input.MetresPerPulse;
        bool stoppedEvent = input.StoppedEvent;
        if (pulses != null)
        {
            double lastHi = pulses.HiS[^1];
            double hold = input.StopHoldS > 0 ? 0.9 * input.StopHoldS : 1.0;
            if (!stoppedEvent && endOfData - lastHi < hold && !StopFinder.EndsAtRest(pulses, mpp))
            {
                return null;
            }

            return StopFinder.Find(pulses, mpp, input.AccelTimeS, input.AccelTimeS is null ? null : input.AccelInputMps2, endOfData);
        }

        // Accelerometer only: at rest when the last samples sit at the resting level, as quiet as at rest.
        double[] time = input.AccelTimeS!;
        double[] accelInput = input.AccelInputMps2;
        int count = time.Length;
        double noise = input.AccelNoiseMps2;
        int from = IndexAtOrAfter(time, time[^1] - input.StillAtEndS);
        if (time[^1] - startS < input.StillAtEndS + 0.5 || count - from < 8)
        {
            return null;
        }

        double mean = 0;
        for (int i = from; i < count; i++)
        {
            mean += accelInput[i];
        }

        mean /= count - from;
        double variance = 0;
        for (int i = from; i < count; i++)
        {
            variance += (accelInput[i] - mean) * (accelInput[i] - mean);
        }

        double sd = Math.Sqrt(variance / (count - from));
        if (!stoppedEvent && (sd > 1.5 * noise || Math.Abs(mean) > 0.1))
        {
            return null;
        }

        // Walk back to where the smoothed acceleration last left the still band.
        int half = Math.Max(1, (int)Math.Round(0.05 / input.AccelPeriodS));
        double band = Math.Max(0.1, 4 * noise / Math.Sqrt((2 * half) + 1));
        int k = count - 1;
        while (k > 0 && time[k] > startS)
        {
            double sum = 0;
            int lo = Math.Max(0, k - half);
            int hi = Math.Min(count - 1, k + half);
            for (int i = lo; i <= hi; i++)
            {
                sum += accelInput[i];
            }

            if (Math.Abs(sum / (hi - lo + 1)) > band)
            {
                break;
            }

            k--;
        }

        return StepEnd(time, accelInput, k, half, band, input.AccelPeriodS);
    }

    /// <summary>Where a stop's deceleration ends, s. The window centred on
    /// <paramref name="k"/> is the last to leave the still band, so its first sample is still
    /// stopping and the samples after its last rest: the step lies between them. A sharp stop
    /// held a steady deceleration a until the car rested, so the speed the window's samples still
    /// take off (their sum times the period), over a measured on the window's width of samples
    /// before it, is how long the car moved past the window's first sample: n samples' worth puts
    /// the step between the n-th and the (n+1)-th, and the stop is placed mid-way, within half a
    /// period of a clean step. The window's last sample when no steady deceleration precedes it
    /// (a stop that fades out), never before the window's first.</summary>
    private static double StepEnd(double[] time, double[] accelInput, int k, int half, double band, double periodS)
    {
        int count = time.Length;
        int lo = Math.Max(0, k - half);
        int hi = Math.Min(count - 1, k + half);
        int before = Math.Max(0, lo - ((2 * half) + 1));
        double taken = 0;
        for (int i = lo; i <= hi; i++)
        {
            taken += accelInput[i];
        }

        double steady = 0;
        for (int i = before; i < lo; i++)
        {
            steady += accelInput[i];
        }

        if (lo - before <= half || Math.Sign(steady) != Math.Sign(taken))
        {
            return time[hi];
        }

        steady /= lo - before;
        if (Math.Abs(steady) <= band)
        {
            return time[hi];
        }

        double samples = taken / steady;
        return Math.Clamp(time[lo] + ((samples - 0.5) * periodS), time[lo], time[hi]);
    }

    /// <summary>Index of the first of <paramref name="time"/> at or after <paramref name="t"/>.</summary>
    private static int IndexAtOrAfter(double[] time, double t)
    {
        int i = Array.BinarySearch(time, t);
        return i >= 0 ? i : ~i;
    }
}
