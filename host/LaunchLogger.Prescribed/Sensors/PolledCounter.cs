using MathNet.Numerics.Distributions;

namespace LaunchLogger.Prescribed.Sensors;

/// <summary>A loop that polls a hardware pulse counter: every period (with jitter, and now and
/// then a stall, as when the loop also writes a frame or collects garbage) it reads the count.</summary>
/// <param name="PeriodS">Nominal loop period, s (0.1–10 ms in practice).</param>
/// <param name="JitterFraction">1-σ of each period as a fraction of the period (the period is
/// kept between a fifth and five times nominal).</param>
/// <param name="StallsPerSecond">How often the loop stalls.</param>
/// <param name="StallS">How long a stall lasts, s.</param>
public sealed record PolledCounter(double PeriodS, double JitterFraction = 0, double StallsPerSecond = 0, double StallS = 0)
{
    /// <summary>The poll times from 0 to <paramref name="endS"/>.</summary>
    public double[] PollTimes(double endS, Random random)
    {
        ArgumentNullException.ThrowIfNull(random);
        if (!(PeriodS > 0))
        {
            throw new ArgumentOutOfRangeException(nameof(PeriodS), PeriodS, "the poll period is positive");
        }

        var polls = new List<double>((int)Math.Min(10_000_000, (endS / PeriodS) + 2));
        double t = 0;
        while (t <= endS)
        {
            polls.Add(t);
            double period = PeriodS;
            if (JitterFraction > 0)
            {
                period = Math.Clamp(PeriodS * (1 + Normal.Sample(random, 0, JitterFraction)), PeriodS / 5, PeriodS * 5);
            }

            if (StallsPerSecond > 0 && random.NextDouble() < StallsPerSecond * PeriodS)
            {
                period += StallS;
            }

            t += period;
        }

        return [.. polls];
    }

    /// <summary>What the loop reads from a counter that counts <paramref name="edgesS"/>: two
    /// readings at the start (so that a reader can tell the counter's origin), then one bracket
    /// per poll at which the count changed, from the previous poll to this one.</summary>
    public IReadOnlyList<CountBracket> Read(IReadOnlyList<double> edgesS, double endS, Random random, long origin = 0)
    {
        ArgumentNullException.ThrowIfNull(edgesS);
        double[] polls = PollTimes(endS, random);
        var rows = new List<CountBracket>();
        int seen = 0;
        long last = -1;
        for (int i = 0; i < polls.Length; i++)
        {
            double p = polls[i];
            while (seen < edgesS.Count && edgesS[seen] <= p)
            {
                seen++;
            }

            long count = origin + seen;
            if (i < 2 || count != last)
            {
                rows.Add(new CountBracket(i == 0 ? p : polls[i - 1], p, count));
            }

            last = count;
        }

        return rows;
    }
}
