using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Braking;

/// <summary>The brake switch's reading turned into the pedal's first movement: each lag's mean
/// and σ against a uniform distribution's closed form, and against a seeded Monte Carlo of
/// switch closings at random moments read by a loop with the same gaps.</summary>
public class BrakeSwitchTimingTests
{
    [Fact]
    public void A_known_gap_is_a_uniform_lag()
    {
        // Uniform on (0, w]: mean w/2, σ w/√12 (textbook).
        Estimate lag = BrakeSwitchTiming.LagOfGap(0.020);
        Assert.Equal(0.010, lag.Value, 12);
        Assert.Equal(0.020 / Math.Sqrt(12), lag.Sigma, 12);
    }

    [Fact]
    public void The_unmeasured_delay_is_the_uniform_prior_over_0_to_30_ms()
    {
        Assert.Equal(0.015, BrakeSwitchTiming.DelayPrior.Value, 12);
        Assert.Equal(0.030 / Math.Sqrt(12), BrakeSwitchTiming.DelayPrior.Sigma, 12);

        // The onset subtracts both means and adds both variances; a measured delay replaces the prior.
        Estimate onset = BrakeSwitchTiming.Onset(10.0, new Estimate(0.0005, 0.0003));
        Assert.Equal(10.0 - 0.0005 - 0.015, onset.Value, 12);
        Assert.Equal(Math.Sqrt((0.0003 * 0.0003) + (0.03 * 0.03 / 12)), onset.Sigma, 12);
        Estimate measured = BrakeSwitchTiming.Onset(10.0, new Estimate(0.0005, 0.0003), 0.012, 0.001);
        Assert.Equal(10.0 - 0.0125, measured.Value, 12);
        Assert.Equal(Math.Sqrt((0.0003 * 0.0003) + 1e-6), measured.Sigma, 12);
    }

    [Theory]
    [InlineData(0.001, 0.02, 1.0, 0.0015)]
    [InlineData(0.0005, 0.02, 2.0, 0.0008)]
    [InlineData(0.004, 0.005, 0.5, 0.003)]
    [InlineData(0.001, 0, 0, 0.003)] // no stalls, two passes in three without a pulse: the lag of
                                     // the unbracketed time decides σ
    public void The_loop_lag_from_pulse_brackets_matches_closings_at_random_moments(double stepS, double stallS, double stallsPerS, double pulsePeriodS)
    {
        // A loop of seeded steps (±25 %) and stalls, a pickup pulsing every pulsePeriodS: the
        // brackets are what a polled counter records. The lag of a switch closing at a uniformly
        // random moment is the time to the next pass.
        var random = new Random(11);
        var passes = new List<double> { 0 };
        while (passes[^1] < 60)
        {
            double step = stepS * (0.75 + (0.5 * random.NextDouble()));
            passes.Add(passes[^1] + step + (random.NextDouble() < stallsPerS * stepS ? stallS : 0));
        }

        var pulses = new List<PulseRecord>();
        long count = 0;
        double nextPulse = pulsePeriodS * random.NextDouble();
        for (int i = 1; i < passes.Count; i++)
        {
            long before = count;
            while (nextPulse <= passes[i])
            {
                count++;
                nextPulse += pulsePeriodS;
            }

            if (count > before)
            {
                pulses.Add(new PulseRecord(count, passes[i - 1], passes[i]));
            }
        }

        double sum = 0, sumSquares = 0;
        const int Closings = 200_000;
        for (int k = 0; k < Closings; k++)
        {
            double t = 60 * random.NextDouble();
            int next = passes.BinarySearch(t);
            double lag = passes[next >= 0 ? next : ~next] - t;
            sum += lag;
            sumSquares += lag * lag;
        }

        double mean = sum / Closings;
        double sigma = Math.Sqrt((sumSquares / Closings) - (mean * mean));
        Estimate estimate = BrakeSwitchTiming.LagOfLoop(pulses);
        Assert.Equal(mean, estimate.Value, 0.1 * mean);
        Assert.Equal(sigma, estimate.Sigma, 0.1 * sigma);
    }

    [Fact]
    public void Edge_timestamps_say_nothing_of_the_loop_so_its_noted_timing_is_taken()
    {
        // Brackets of 1 µs: the loop of hardware-notes/loop-timing.md, 1 ms steps and a 20 ms
        // stall a second — 2 % of the time in stalls: mean 0.98·0.5 + 0.02·10 = 0.69 ms,
        // mean square 0.98·(1/3) + 0.02·(400/3) ms².
        var edges = Enumerable.Range(1, 100).Select(k => new PulseRecord(k, (k * 0.002) - 1e-6, k * 0.002)).ToList();
        Estimate lag = BrakeSwitchTiming.LagOfLoop(edges);
        double meanMs = (0.98 * 0.5) + (0.02 * 10);
        double squareMs = (0.98 / 3) + (0.02 * 400 / 3);
        Assert.Equal(meanMs * 1e-3, lag.Value, 1e-9);
        Assert.Equal(Math.Sqrt(squareMs - (meanMs * meanMs)) * 1e-3, lag.Sigma, 1e-9);
    }

    [Fact]
    public void A_standing_stretch_leaves_the_loop_lag_as_the_moving_stretch_gives_it()
    {
        // Moving: brackets back to back, 0.5 and 2.5 ms in turn, for 3 s. Standing: a pulse every
        // 0.5 s for 5 s (each bracket 1 ms), where stalls leave no bracket. The stall-free pulses
        // at rest must not pull the lag towards their own widths.
        var moving = new List<PulseRecord>();
        double t = 0;
        for (int k = 1; t < 3; k++)
        {
            double width = k % 2 == 0 ? 0.0025 : 0.0005;
            moving.Add(new PulseRecord(k, t, t + width));
            t += width;
        }

        var both = new List<PulseRecord>(moving);
        for (int k = 1; k <= 10; k++)
        {
            double hi = t + (0.5 * k);
            both.Add(new PulseRecord(moving.Count + k, hi - 0.001, hi));
        }

        Estimate alone = BrakeSwitchTiming.LagOfLoop(moving);
        Estimate withRest = BrakeSwitchTiming.LagOfLoop(both);
        Assert.Equal(alone.Value, withRest.Value, 1e-12);
        Assert.Equal(alone.Sigma, withRest.Sigma, 1e-12);
    }

    [Fact]
    public void A_bracket_ending_before_the_one_before_it_is_passed_over_not_thrown_on()
    {
        // Damaged data: a last observation whose bracket ends 5 ms before the one before it
        // (counts still rise). It spans no time, so the lag is the one the rest give; it threw
        // ("0 cannot be greater than -0.005") before.
        var moving = Enumerable.Range(1, 200).Select(k => new PulseRecord(k, (k * 0.01) - 0.001, k * 0.01)).ToList();
        var damaged = new List<PulseRecord>(moving) { new(201, 1.994, 1.995) };

        Estimate alone = BrakeSwitchTiming.LagOfLoop(moving);
        Estimate withBackStep = BrakeSwitchTiming.LagOfLoop(damaged);
        Assert.Equal(alone.Value, withBackStep.Value, 1e-12);
        Assert.Equal(alone.Sigma, withBackStep.Sigma, 1e-12);
    }

    [Fact]
    public void Pulses_too_far_apart_to_show_the_loop_give_the_lag_of_their_median_bracket()
    {
        // A crawl: a pulse every 0.2 s in a 2 ms bracket. No stretch counts as moving, so the
        // median bracket stands for the loop's gap: uniform on it, 1 ms ± 2/√12 ms.
        var crawl = Enumerable.Range(1, 20).Select(k => new PulseRecord(k, (k * 0.2) - 0.002, k * 0.2)).ToList();
        Estimate lag = BrakeSwitchTiming.LagOfLoop(crawl);
        Assert.Equal(0.001, lag.Value, 1e-12);
        Assert.Equal(0.002 / Math.Sqrt(12), lag.Sigma, 1e-12);
    }
}
