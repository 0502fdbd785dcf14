using MathNet.Numerics.Distributions;

namespace LaunchLogger.Prescribed.Sensors;

/// <summary>How a capture that timestamps each edge (an interrupt or the kernel's line events)
/// sees the exact pulse times: late by a latency plus jitter, never early, on a clock of finite
/// resolution, and strictly increasing.</summary>
/// <param name="LatencyS">Mean delay, s.</param>
/// <param name="JitterS">1-σ of the delay around its mean, s (the delay is never negative).</param>
/// <param name="ResolutionS">Timestamp resolution, s (1 µs on the box); 0 keeps exact times.</param>
public sealed record EdgeTiming(double LatencyS = 0, double JitterS = 0, double ResolutionS = 1e-6)
{
    /// <summary>Exact timestamps.</summary>
    public static EdgeTiming Exact { get; } = new(0, 0, 0);

    /// <summary>The observed times of <paramref name="edgesS"/>.</summary>
    public double[] Observe(IReadOnlyList<double> edgesS, Random random)
    {
        ArgumentNullException.ThrowIfNull(edgesS);
        ArgumentNullException.ThrowIfNull(random);
        var observed = new double[edgesS.Count];
        for (int i = 0; i < observed.Length; i++)
        {
            double delay = Math.Max(0, LatencyS + (JitterS > 0 ? Normal.Sample(random, 0, JitterS) : 0));
            double t = edgesS[i] + delay;
            if (ResolutionS > 0)
            {
                // Rounded to the 1e-9 first so that an exact tick is not pushed to the next one.
                t = Math.Ceiling(Math.Round(t / ResolutionS, 9)) * ResolutionS;
            }

            if (i > 0 && t <= observed[i - 1])
            {
                t = observed[i - 1] + (ResolutionS > 0 ? ResolutionS : 1e-9);
            }

            observed[i] = t;
        }

        return observed;
    }
}
