namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The opening-speed stage: how fast an accelerometer-only record that ends at rest opened,
/// when that is clearly more than a crawl.</summary>
/// <remarks>At rest at the end the speed is zero, so the speed at the first sample is minus the
/// acceleration integrated from there to the stop, taken against the level read at the final rest
/// (whatever level was removed before cancels). Its σ: that level's own σ and the accelerometer's
/// wander (<see cref="ReconstructionOptions.AccelOnlyBiasWanderDensity"/>, a random walk: variance
/// q·T³/3 in speed over T) over the time back to the first sample, and the scale error. Opening
/// moving needs the speed 3 σ clear of a crawl.</remarks>
internal static class AccelOpeningSpeed
{
    /// <summary>Below this speed a record counts as opening at rest, m/s.</summary>
    private const double CrawlMps = 0.3;

    /// <summary>The speed at the first sample, m/s, or null when the record opened at rest, does
    /// not end at rest, or ends too soon after its stop to read the level there (8 samples).</summary>
    public static Estimate? Find(AccelOpeningSpeedInputs input)
    {
        ForwardAcceleration a = input.Accel;
        double[] accelInput = input.InputMps2;
        if (input.StopS is not { } stop)
        {
            return null;
        }

        int s = Math.Max(1, a.IndexAtOrAfter(stop));
        int n = a.Count - s;
        if (n < 8)
        {
            return null;
        }

        double level = 0;
        for (int i = s; i < a.Count; i++)
        {
            level += accelInput[i];
        }

        level /= n;
        double gained = 0;
        for (int i = 1; i < s; i++)
        {
            gained += (0.5 * (accelInput[i - 1] + accelInput[i]) - level) * (a.TimeS[i] - a.TimeS[i - 1]);
        }

        double speed = -gained;
        double span = stop - a.TimeS[0];
        double levelSigma = input.Rest.NoiseMps2 * input.Rest.CorrelationFactor / Math.Sqrt(n);
        ReconstructionOptions options = input.Options;
        double sigma = Math.Sqrt(Square(levelSigma * span) + (options.AccelOnlyBiasWanderDensity * span * span * span / 3) + Square(options.ForwardScaleSigma * speed));
        return speed - (3 * sigma) > CrawlMps ? new Estimate(speed, sigma) : null;
    }

    private static double Square(double x) => x * x;
}
