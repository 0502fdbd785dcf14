namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>How a record opens: at rest, or already moving at some speed.</summary>
/// <param name="Moving">True when the first pulses cannot have come from a standstill just before them.</param>
/// <param name="SpeedMps">Speed at the first pulse observation, m/s, with its σ.</param>
/// <param name="AccelMps2">Acceleration there, m/s², with its σ.</param>
/// <param name="LongestRestReachM">The farthest a car starting from rest at that acceleration
/// could have gone before reaching that speed, as the test allowed, m.</param>
internal readonly record struct StartMotion(bool Moving, Estimate SpeedMps, Estimate AccelMps2, double LongestRestReachM)
{
    /// <summary>Observations the start fit needs at least.</summary>
    public const int MinimumObservations = 5;

    /// <summary>The start fit covers at least this long after the first observation, s.</summary>
    private const double FitSpanS = 0.2;

    /// <summary>A car at rest reaches its first count within this many pulse pitches (the count
    /// may open part-way through a pitch, and a wide first bracket may hold two); doubled below as
    /// a margin for launches whose acceleration swings.</summary>
    private const int RestReachPitches = 2;

    /// <summary>Acceleration floor for the test, m/s²: a car creeping off slower than this is
    /// indistinguishable from one rolling at a steady crawl.</summary>
    private const double SlowestLaunchMps2 = 0.5;

    /// <summary>Below this the speed at the first pulse says nothing, m/s.</summary>
    private const double CrawlMps = 0.3;

    /// <summary>Decides from the first pulses whether the record opens moving.</summary>
    /// <remarks>
    /// A car that starts from rest covers at most a pulse pitch or two before its first count, so
    /// at the first count it has at most v = √(2·a·d), with a its acceleration there and d that
    /// reach (kinematics: v² = 2·a·d from rest at constant acceleration; a rising acceleration
    /// gives less). A quadratic through the first pulses (at least
    /// <see cref="MinimumObservations"/>, over at least 0.2 s) gives v and a with their σ. The record
    /// opens moving when v, less 3 σ, is above a crawl and above √(2·(a + 3σ)·2d): at a steady
    /// cruise a is near zero and any real speed is too fast for a standstill just before; a launch
    /// from rest stays below the bound by a factor of at least √2.
    /// </remarks>
    public static StartMotion? Estimate(PulseChannel pulses, double mpp, double noiseM)
    {
        if (pulses.Length < MinimumObservations || mpp <= 0)
        {
            return null;
        }

        int last = MinimumObservations - 1;
        while (last + 1 < pulses.Length && last < 40 && pulses.MidS(last) < pulses.MidS(0) + FitSpanS)
        {
            last++;
        }

        if (PulseQuadratic.Fit(pulses, mpp, 0, last, 0, noiseM) is not { } fit)
        {
            return null;
        }

        double reach = 2 * RestReachPitches * mpp;
        double accelHigh = Math.Max(fit.AccelMps2 + (3 * fit.AccelSigmaMps2), SlowestLaunchMps2);
        double speedLow = fit.SpeedMps - (3 * fit.SpeedSigmaMps);
        bool moving = speedLow > CrawlMps && speedLow > Math.Sqrt(2 * accelHigh * reach);
        return new StartMotion(
            moving,
            new Estimate(Math.Max(fit.SpeedMps, 0), fit.SpeedSigmaMps),
            new Estimate(fit.AccelMps2, fit.AccelSigmaMps2),
            reach);
    }
}
