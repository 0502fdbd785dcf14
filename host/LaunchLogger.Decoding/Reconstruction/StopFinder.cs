namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>When the car came to rest after its last pulse. The next edge never came, so the car
/// covered less than one pulse pitch after the last one: with the speed and deceleration of the
/// last pulses (or the accelerometer), it stopped within v/|a|, and within 2·m/v at most (the
/// distance covered braking uniformly from v to rest is v·t/2; kinematics, any textbook).</summary>
/// <remarks>Under firm braking the pulses cannot be trusted to the end: a braked wheel turns
/// slower than the car moves, and below the ABS's working speed it may lock and stop pulsing well
/// before the car does. The accelerometer then marks the stop itself: the deceleration falls to
/// nothing within a sample or two when the car comes to rest.</remarks>
internal static class StopFinder
{
    /// <summary>Deceleration that counts as firm braking for the step search, m/s².</summary>
    private const double FirmDecelMps2 = 2.0;

    /// <summary>Span either side of a candidate step, seconds, where the accelerometer gives at
    /// least <see cref="StepSamples"/> samples in it.</summary>
    private const double StepSpanS = 0.02;

    /// <summary>Samples wanted on each side of a candidate step.</summary>
    private const int StepSamples = 3;

    /// <summary>The time the car came to rest, seconds.</summary>
    /// <param name="pulses">Observations; at least one.</param>
    /// <param name="mpp">Metres per pulse.</param>
    /// <param name="accelT">Accelerometer sample times, or null.</param>
    /// <param name="accelInput">Forward acceleration minus its resting level at those times, or null.</param>
    /// <param name="endS">End of the data, seconds; the answer is never later.</param>
    public static double Find(PulseChannel pulses, double mpp, double[]? accelT, double[]? accelInput, double endS)
    {
        int last = pulses.Length - 1;
        double tLast = pulses.MidS(last);
        EndMotion(pulses, mpp, out double speed, out double decel);
        double bound = speed > 1e-3 ? 2 * mpp / speed : 1.0;
        double stop;
        if (accelT != null && accelInput != null && DecelerationStep(accelT, accelInput, tLast, endS) is { } step)
        {
            stop = step;
        }
        else if (accelT != null && accelInput != null && speed > 1e-3)
        {
            // Integrate the accelerometer forward from the last pulse until the speed is all but
            // gone (a few cm/s: sampling and offset errors leave a residue that would otherwise
            // linger) or the car would have reached the next edge.
            int i = Array.BinarySearch(accelT, tLast);
            i = i >= 0 ? i : ~i;
            double v = speed;
            double covered = 0;
            double t = tLast;
            stop = tLast + Math.Min(bound, 1.0);
            double rest = Math.Max(0.02, 0.05 * speed);
            for (; i < accelT.Length && accelT[i] < tLast + 3; i++)
            {
                double dt = accelT[i] - t;
                double vNext = v + (accelInput[i] * dt);
                if (vNext <= rest)
                {
                    stop = t + ((v - rest) / Math.Max(v - vNext, 1e-12) * dt);
                    break;
                }

                covered += 0.5 * (v + vNext) * dt;
                if (covered >= mpp)
                {
                    stop = accelT[i];
                    break;
                }

                v = vNext;
                t = accelT[i];
            }
        }
        else if (decel > 0.05 && speed > 1e-3)
        {
            stop = tLast + Math.Min(speed / decel, bound);
        }
        else
        {
            stop = tLast + Math.Min(0.5 * bound, 1.0);
        }

        return Math.Min(stop, Math.Max(endS, tLast));
    }

    /// <summary>The first time after <paramref name="fromS"/> (and within 3 s of it) where a firm
    /// deceleration steps down to near nothing: the mean input over the span before (<see
    /// cref="StepSpanS"/>, or <see cref="StepSamples"/> and a half sample periods where that is
    /// longer: a 100 Hz accelerometer has but two samples in 20 ms) is below
    /// −<see cref="FirmDecelMps2"/>, and the mean over the span after has risen by more than 70 %
    /// of it. The step lies between the last sample still braking and the first at rest; it is
    /// placed mid-way. Null when the car was not braking firmly at the last pulse.</summary>
    public static double? DecelerationStep(double[] t, double[] input, double fromS, double endS)
    {
        int i = Array.BinarySearch(t, fromS);
        i = i >= 0 ? i : ~i;
        if (i >= t.Length || t.Length < 2)
        {
            return null;
        }

        double span = Math.Max(StepSpanS, (StepSamples + 0.5) * (t[^1] - t[0]) / (t.Length - 1));

        // Running sums over [lo, i) and [i, hi).
        int lo = i;
        double before = 0;
        while (lo > 0 && t[lo - 1] >= t[i] - span)
        {
            lo--;
            before += input[lo];
        }

        if (i - lo < StepSamples || before / (i - lo) > -FirmDecelMps2)
        {
            return null;
        }

        int hi = i;
        double after = 0;
        double limit = Math.Min(fromS + 3, endS);
        double found = double.NaN;
        double best = 0;
        for (; i < t.Length && t[i] <= limit; i++)
        {
            if (!double.IsNaN(found) && t[i] > found + span)
            {
                break;
            }

            while (hi < t.Length && t[hi] < t[i] + span)
            {
                after += input[hi];
                hi++;
            }

            while (lo < i && t[lo] < t[i] - span)
            {
                before -= input[lo];
                lo++;
            }

            int nb = i - lo;
            int na = hi - i;
            if (nb >= StepSamples && na >= StepSamples)
            {
                double mb = before / nb;
                double ma = after / na;
                // The first place the rise passes 70 % of the level before it; then the sharpest
                // contrast within a span after that, the step lying between sample i − 1 and i.
                if (mb < -FirmDecelMps2 && ma - mb > 0.7 * -mb && ma - mb > best)
                {
                    best = ma - mb;
                    found = 0.5 * (t[i - 1] + t[i]);
                }
            }

            before += input[i];
            after -= input[i];
        }

        return double.IsNaN(found) ? null : found;
    }

    /// <summary>Variance of the speed the car lost over the sample gap it came to rest in, (m/s)².
    /// The accelerometer samples at points: a deceleration D that ends between the last sample
    /// still braking and the first at rest, T apart, took off D·τ, τ the time braked within the
    /// gap, which the samples do not tell — uniform on [0, D·T], variance (D·T)²/12 (the uniform
    /// distribution's, any probability text) — while the input taken as linear between the
    /// samples takes off D·T/2 whatever τ. Where the car is then held at rest the difference, up
    /// to D·T/2 (0.1 m/s at 2 g and 100 Hz), is this variance's to take, not the speed's history
    /// (nor the braked wheel's slip fitted to it). 0 when the sample before
    /// <paramref name="stopS"/> is not decelerating.</summary>
    /// <param name="t">Accelerometer sample times, s.</param>
    /// <param name="input">Forward input at those times less its resting level, m/s².</param>
    /// <param name="stopS">When the car came to rest, s.</param>
    public static double StopGapSpeedVariance(double[] t, double[] input, double stopS)
    {
        int i = Array.BinarySearch(t, stopS);
        i = i >= 0 ? i : ~i;
        if (i <= 0 || i >= t.Length)
        {
            return 0;
        }

        double lost = Math.Max(-input[i - 1], 0) * (t[i] - t[i - 1]);
        return lost * lost / 12;
    }

    /// <summary>True when the last pulses show the car braking to rest: at their speed and
    /// deceleration it would stop within two pulse pitches (v²/(2·d), kinematics), so the next
    /// edges would never have come. Lets a record without a hold after its last pulse (a
    /// plain-text input, a log cut short) keep its stop.</summary>
    public static bool EndsAtRest(PulseChannel pulses, double mpp)
    {
        EndMotion(pulses, mpp, out double speed, out double decel);
        return decel > 0.05 && speed * speed / (2 * decel) <= 2 * mpp;
    }

    /// <summary>Speed and deceleration at the last pulse from a quadratic through the pulses of
    /// its last 0.3 s (at least three, at most eight).</summary>
    public static void EndMotion(PulseChannel pulses, double mpp, out double speed, out double decel)
    {
        int last = pulses.Length - 1;
        double tLast = pulses.MidS(last);
        int first = last;
        while (first > 0 && last - first < 7 && (last - first < 2 || pulses.MidS(first - 1) >= tLast - 0.3))
        {
            first--;
        }

        speed = 0;
        decel = 0;
        int count = last - first + 1;
        if (count < 2)
        {
            return;
        }

        if (count == 2)
        {
            speed = (pulses.Counts[last] - pulses.Counts[first]) * mpp / Math.Max(tLast - pulses.MidS(first), 1e-6);
            return;
        }

        if (PulseQuadratic.Fit(pulses, mpp, first, last, last, 0) is { } fit)
        {
            speed = Math.Max(fit.SpeedMps, 0);
            decel = Math.Max(-fit.AccelMps2, 0);
        }
    }
}
