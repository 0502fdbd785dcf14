using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.CrossCheck;

/// <summary>Another instrument's speed trace turned into a <see cref="Trajectory"/> on our clock,
/// with the first motion and the uncertainties its sample rate allows, so that our one figure code
/// times its figures by our definitions.</summary>
/// <remarks>
/// <para>First motion: the car is at rest until the first of three samples in a row at or above
/// the rest threshold (three times the speed noise, at least 0.2 m/s). The start lies no later
/// than where a line through the first moving samples below 8 m/s meets zero (a launch's speed
/// bends upward at first), and no earlier than the last sample that reads at rest (not above the
/// speed noise) or, when earlier, where a line through the square roots of those speeds meets
/// zero: while the acceleration still rises from zero at a steady rate the speed grows with the
/// square of the time, so the car may have crept below the noise well before the last sample
/// that reads at rest (a 0.3 g launch building over 0.4 s takes 0.12 s to reach 0.05 m/s), and
/// that line finds such a start. Launches between a step of acceleration (speed linear in time)
/// and a steady rise (speed quadratic) start between the two lines. The estimate is the
/// interval's middle and its σ half the interval (at least one sample period and 0.1 s wide), so
/// ±2σ spans the interval and as much again on each side: a 10 Hz trace cannot see a 1-ft
/// rollout, and its standing-start figures say so.</para>
/// <para>Distance: the trapezoid rule on the speeds from first motion (speed 0 there). σ of the
/// distance: the first motion's σ times the speed, with the speed noise integrated as a random
/// walk. σ of the speed: the stated noise with the linear-interpolation error between samples,
/// |v[i+1] − 2v[i] + v[i−1]|/8, added in quadrature.</para>
/// </remarks>
public static class TraceTrajectory
{
    private const double MinimumRestMps = 0.2;
    private const double LineFitCeilingMps = 8;

    /// <summary>The least width given to the start's interval, s: a clutch start can creep for a
    /// tenth of a second below a receiver's speed noise (common practice).</summary>
    private const double MinimumStartWindowS = 0.1;

    /// <summary>Builds the trajectory of the run that starts near <paramref name="searchFromS"/>.</summary>
    /// <param name="theirs">The trace.</param>
    /// <param name="alignment">The clock offset onto our axis.</param>
    /// <param name="speedSigmaMps">The trace's speed noise (1-σ), m/s.</param>
    /// <param name="searchFromS">Where to look for the run's start, our clock (a few seconds
    /// before our first motion).</param>
    /// <param name="toS">End of the run, our clock.</param>
    /// <returns>The trajectory and the first motion on our clock.</returns>
    /// <exception cref="InputException">The trace shows no start from rest in the window.</exception>
    public static (Trajectory Trajectory, Estimate FirstMotionS) Build(SpeedTrace theirs, TraceAlignment alignment, double speedSigmaMps, double searchFromS, double toS)
    {
        ArgumentNullException.ThrowIfNull(theirs);
        ArgumentNullException.ThrowIfNull(alignment);
        double[] t = theirs.TimeS.Select(x => x + alignment.OffsetS).ToArray();
        double[] v = theirs.SpeedMps;
        double rest = Math.Max(MinimumRestMps, 3 * speedSigmaMps);
        int first = FirstMoving(t, v, rest, searchFromS, toS);
        if (first <= 0 || v[first - 1] >= rest)
        {
            throw new InputException(theirs.Source, 0, "the other record shows no start from rest before the run (it opens moving, or has a gap there)");
        }

        // The start lies after the last sample that reads at rest (within the noise) and before
        // the line through the first moving samples meets zero (a launch's speed bends upward
        // at first, so the line meets zero late), and before the first moving sample. The
        // estimate is the middle and σ half the interval (at least one sample period and 0.1 s wide):
        // ±2σ spans it and as much again on each side, for a creep hidden in the noise.
        int restIndex = first - 1;
        while (restIndex > 0 && v[restIndex] > speedSigmaMps && t[first] - t[restIndex - 1] < 1)
        {
            restIndex--;
        }

        double restS = t[restIndex];
        double movingS = t[first];
        (double lineS, double lineSigmaS) = BackExtrapolate(t, v, first, x => x);
        double latestS = Math.Clamp(lineS, restS, movingS);
        (double rootS, _) = BackExtrapolate(t, v, first, Math.Sqrt);
        double earliestS = Math.Clamp(rootS, t[first] - 1, restS);
        double t0 = (earliestS + latestS) / 2;
        double width = Math.Max(Math.Max(latestS - earliestS, t[first] - t[first - 1]), MinimumStartWindowS);
        double t0Sigma = Math.Sqrt((lineSigmaS * lineSigmaS) + (width * width / 4));

        int last = first;
        while (last + 1 < t.Length && t[last + 1] <= toS)
        {
            last++;
        }

        int n = last - first + 2;
        var time = new double[n];
        var speed = new double[n];
        var distance = new double[n];
        var accel = new double[n];
        var speedSigma = new double[n];
        var distanceSigma = new double[n];
        time[0] = t0;
        for (int k = 1; k < n; k++)
        {
            int i = first + k - 1;
            time[k] = t[i];
            speed[k] = v[i];
            distance[k] = distance[k - 1] + (0.5 * (speed[k] + speed[k - 1]) * (time[k] - time[k - 1]));
        }

        for (int k = 0; k < n; k++)
        {
            int a = Math.Max(0, k - 1);
            int b = Math.Min(n - 1, k + 1);
            accel[k] = b > a ? (speed[b] - speed[a]) / (time[b] - time[a]) : 0;
            double curvature = k > 0 && k < n - 1 ? Math.Abs(speed[k + 1] - (2 * speed[k]) + speed[k - 1]) / 8 : 0;
            speedSigma[k] = Math.Sqrt((speedSigmaMps * speedSigmaMps) + (curvature * curvature));
            double walk = speedSigmaMps * (time[k] - t0) / Math.Sqrt(Math.Max(1, k));
            distanceSigma[k] = Math.Sqrt(Math.Pow(speed[k] * t0Sigma, 2) + (walk * walk));
        }

        var trajectory = new Trajectory
        {
            TimeS = time,
            SpeedMps = speed,
            DistanceM = distance,
            AccelMps2 = accel,
            SpeedSigmaMps = speedSigma,
            DistanceSigmaM = distanceSigma,
        };
        return (trajectory, new Estimate(t0, t0Sigma));
    }

    private static int FirstMoving(double[] t, double[] v, double rest, double fromS, double toS)
    {
        for (int i = 0; i + 2 < t.Length; i++)
        {
            if (t[i] < fromS || t[i] > toS)
            {
                continue;
            }

            if (v[i] >= rest && v[i + 1] >= rest && v[i + 2] >= rest)
            {
                return i;
            }
        }

        return -1;
    }

    /// <summary>Where a line through <paramref name="transform"/> of the first moving speeds (up
    /// to five, below 8 m/s) meets zero, with its σ from the fit's residuals.</summary>
    private static (double TimeS, double SigmaS) BackExtrapolate(double[] t, double[] speeds, int first, Func<double, double> transform)
    {
        double[] v = speeds.Select(transform).ToArray();
        int end = first;
        while (end + 1 < t.Length && speeds[end + 1] < LineFitCeilingMps && end - first < 4)
        {
            end++;
        }

        int n = end - first + 1;
        if (n < 2)
        {
            return (t[first], 0);
        }

        double mt = 0;
        double mv = 0;
        for (int i = first; i <= end; i++)
        {
            mt += t[i];
            mv += v[i];
        }

        mt /= n;
        mv /= n;
        double stt = 0;
        double stv = 0;
        for (int i = first; i <= end; i++)
        {
            stt += (t[i] - mt) * (t[i] - mt);
            stv += (t[i] - mt) * (v[i] - mv);
        }

        double slope = stv / stt;
        if (!(slope > 0))
        {
            return (t[first], 0);
        }

        double zero = mt - (mv / slope);
        double rss = 0;
        for (int i = first; i <= end; i++)
        {
            double r = v[i] - (mv + (slope * (t[i] - mt)));
            rss += r * r;
        }

        // σ of the zero crossing from the fit's residuals (delta method on intercept and slope).
        double s2 = n > 2 ? rss / (n - 2) : 0;
        double sigma = Math.Sqrt(s2 * ((1.0 / n) + ((zero - mt) * (zero - mt) / stt))) / slope;
        return (zero, sigma);
    }
}
