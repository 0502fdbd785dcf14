namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>First motion as the early pulses imply it.</summary>
/// <param name="TimeS">Back-extrapolated start, seconds.</param>
/// <param name="SigmaS">Its 1 σ, seconds, covering every onset ramp the pulses cannot rule out.</param>
/// <param name="AccelMps2">Plateau acceleration of the best fit, m/s².</param>
/// <param name="RampS">Ramp length of the best fit, seconds.</param>
/// <param name="PhaseM">Pulse phase φ (count N at distance N·m − φ), metres, middle of the plausible range.</param>
/// <param name="PhaseSigmaM">Its σ, metres.</param>
internal readonly record struct KinematicStart(double TimeS, double SigmaS, double AccelMps2, double RampS, double PhaseM, double PhaseSigmaM);

/// <summary>How the early acceleration of <see cref="KinematicStartFit"/>'s family takes up.</summary>
internal enum KinematicTakeUp
{
    /// <summary>A linear ramp of length T up to a plateau A: a(τ) = A·min(τ/T, 1).</summary>
    Ramp,

    /// <summary>A raised cosine of length T up to a plateau A: a(τ) = A·(1 − cos(πτ/T))/2 for
    /// τ ≤ T, then A (a take-up whose jerk starts from zero, so it begins like τ²).</summary>
    RaisedCosine,

    /// <summary>The ramp of <see cref="Ramp"/> seen through a first-order lag of a given time
    /// constant λ (λ·a′ + a = A·min(τ/T, 1)): it begins like τ² and after a few λ moves as the ramp
    /// started λ later, so the ramps put t₀ late by about λ on it.</summary>
    LaggedRamp,
}

/// <summary>Back-extrapolates the first pulse observations to zero distance.</summary>
/// <remarks>
/// <para>The early acceleration is modelled as a ramp of length T up to a plateau A:
/// a(τ) = A·min(τ/T, 1), τ = t − t₀, so d(τ) = A·τ³/(6T) on the ramp and
/// A·((τ − T/2)²/2 + T²/24) after it (kinematics, any textbook: constant jerk, then constant
/// acceleration). T = 0 is a jump to constant acceleration. The count N is reached at
/// d = N·m − φ with the pickup's phase φ unknown and uniform over one pulse (prior mean m/2,
/// σ m/√12). For each T on a grid and each trial t₀ the model is linear in (A, φ) and solved by
/// weighted least squares; t₀ is the minimum of the profile.</para>
/// <para>After the ramp the motion looks exactly like constant acceleration from t₀ + T/2, so
/// pulses that all come after the ramp cannot tell a long ramp from a late jump. The answer
/// averages over T (uniform prior up to 0.3 s, about the longest a clutch or motor takes to
/// build up drive; common practice), each ramp weighted by its likelihood
/// exp(−Δχ²/(2·K)), χ² scaled by the reduced χ² when the fit is worse than its noise and the
/// likelihood tempered by K = <see cref="RampLikelihoodTemper"/> (a power likelihood, for a model
/// known to be wrong; from memory: the tempered or "safe" Bayesian updates of the statistics
/// literature); its σ combines the spread of the start times so weighted with the profile widths
/// (Δχ² = 1) of the fits.</para>
/// <para>The pulses cannot tell a ramp from a smooth take-up, yet the two put t₀ apart: after
/// the rise a raised cosine of length T moves as a ramp of length T' = T·√(24·(1/8 − 1/π²))
/// ≈ 0.754·T starting (T − T')/2 ≈ 0.123·T later (equal plateau, speed and distance after both
/// rises: d = A·((τ − T/2)²/2 + T²·(1/8 − 1/π²)) against A·((τ − T'/2)²/2 + T'²/24); integrated
/// here), and while the pulses still come within the rise, later still. So the family is chosen
/// by the caller (<see cref="KinematicTakeUp"/>): the accelerometer, where there is one, sees how
/// the rise begins. A raised cosine's lengths run to 0.4 s, a ramp-equivalent 0.3 s.</para>
/// <para>Only the pulses of the first 0.15 s (at least five) are fitted: real launches overshoot
/// and dip as the tyres and driveline wind up, which no monotone ramp follows for long. That,
/// and any other shape the family misses, is covered by a model-error term of a fifth of the
/// extrapolation (first pulse − start), sized on simulated launches with a wound-up driveline
/// so that the truth falls within ±2 σ.</para>
/// </remarks>
internal static class KinematicStartFit
{
    private const double FitLengthS = 0.15;
    private const double RampStepS = 0.01;
    private const double LongestRampS = 0.3;

    /// <summary>The longest raised-cosine take-up, s: the one whose ramp-equivalent length
    /// (0.754·T, see the remarks) is <see cref="LongestRampS"/>.</summary>
    private const double LongestRaisedCosineS = 0.4;

    /// <summary>K: how many units of χ² between two ramp lengths count as one. On five or so
    /// pulses a launch's departures from a ramp — a wound-up driveline, tyres breaking away and
    /// hunting under traction control — move χ² between ramp lengths by several units with no
    /// ramp nearer the truth: a simulated wheelspin launch's dip at 0.12 s favoured the longest
    /// ramp by Δχ² 9.4 (error −85 ms at σ 38 ms), and such launches put first motion beyond 2σ
    /// in 6 of 75 undriven pulses-only runs (3 beyond 3σ). Sized so that Δχ² ≈ 10 counts as one
    /// unit: on those runs 10 left none beyond 2σ (3: one), and the generator's standing starts,
    /// whose ramps are in the family, lost little (p50 31 → 37 ms, p95 105 → 106 ms).</summary>
    private const double RampLikelihoodTemper = 10;

    /// <summary>Fits the start with the <paramref name="takeUp"/> family (the ramps by default;
    /// <paramref name="lagS"/> is the lag's time constant, s, for <see cref="KinematicTakeUp.LaggedRamp"/>).</summary>
    public static KinematicStart? Fit(PulseChannel pulses, double mpp, double toothSigma, double jitterS, double earliestS, KinematicTakeUp takeUp = KinematicTakeUp.Ramp, double lagS = 0)
    {
        if (pulses.Length < 3 || mpp <= 0)
        {
            return null;
        }

        double firstS = pulses.MidS(0);

        // A car reaching its first edge (at most count·m out) at no less than 0.3 m/s² on average
        // takes at most √(2·count·m / 0.3); four gaps to the second edge bound it from the other side.
        double reach = Math.Sqrt(2 * pulses.Counts[0] * mpp / 0.3);
        double span = pulses.Length > 1 ? 4 * (pulses.MidS(1) - firstS) : reach;
        earliestS = Math.Max(earliestS, firstS - Math.Min(3.0, Math.Max(reach, span)));

        int count = 0;
        while (count < pulses.Length && count < 40 && (count < 5 || pulses.MidS(count) <= firstS + FitLengthS))
        {
            count++;
        }

        Data data = Prepare(pulses, count, mpp, toothSigma, jitterS, takeUp, lagS);
        var fits = new List<Profile>();
        double longest = takeUp == KinematicTakeUp.Ramp ? LongestRampS : LongestRaisedCosineS;
        for (double ramp = 0; ramp <= longest + 1e-9; ramp += RampStepS)
        {
            if (ProfileFit(data, mpp, ramp, earliestS, firstS) is { } fit)
            {
                fits.Add(fit);
            }
        }

        if (fits.Count == 0)
        {
            return null;
        }

        // Average over the ramp length (uniform prior on the grid), each weighted by its likelihood.
        Profile best = fits.MinBy(f => f.Chi2);
        int dof = Math.Max(1, count + 1 - 3);
        double scale = Math.Max(1, best.Chi2 / dof);
        double total = 0, t0Sum = 0, phiSum = 0;
        foreach (Profile f in fits)
        {
            double w = Math.Exp(-(f.Chi2 - best.Chi2) / (2 * scale * RampLikelihoodTemper));
            total += w;
            t0Sum += w * f.T0;
            phiSum += w * f.Phi;
        }

        double mean = t0Sum / total;
        double phiMean = phiSum / total;
        double t0Var = 0, phiVar = 0, statVar = 0, phiStatVar = 0;
        foreach (Profile f in fits)
        {
            double w = Math.Exp(-(f.Chi2 - best.Chi2) / (2 * scale * RampLikelihoodTemper)) / total;
            t0Var += w * (f.T0 - mean) * (f.T0 - mean);
            phiVar += w * (f.Phi - phiMean) * (f.Phi - phiMean);
            statVar += w * f.Sigma * f.Sigma * scale;
            phiStatVar += w * f.PhiSigma * f.PhiSigma * scale;
        }

        double lead = firstS - mean;
        double sigma = Math.Sqrt(t0Var + statVar + (0.2 * lead * 0.2 * lead));
        return new KinematicStart(mean, sigma, best.A, best.Ramp, phiMean, Math.Sqrt(phiVar + phiStatVar));
    }

    private sealed record Data(double[] T, double[] Y, double[] W, KinematicTakeUp TakeUp, double LagS);

    private readonly record struct Profile(double Ramp, double T0, double Sigma, double Chi2, double A, double Phi, double PhiSigma);

    private static Data Prepare(PulseChannel pulses, int count, double mpp, double toothSigma, double jitterS, KinematicTakeUp takeUp, double lagS)
    {
        var t = new double[count];
        var y = new double[count];
        var w = new double[count];
        for (int i = 0; i < count; i++)
        {
            t[i] = pulses.MidS(i);
            y[i] = pulses.Counts[i] * mpp;
        }

        for (int i = 0; i < count; i++)
        {
            int a = Math.Max(0, i - 1);
            int b = Math.Min(count - 1, i + 1);
            double speed = b > a && t[b] > t[a] ? (y[b] - y[a]) / (t[b] - t[a]) : 0;
            double width = pulses.HiS[i] - pulses.LoS[i];
            double variance = (toothSigma * toothSigma) + (speed * speed * ((width * width / 12) + (jitterS * jitterS))) + 1e-12;
            w[i] = 1 / variance;
        }

        return new Data(t, y, w, takeUp, lagS);
    }

    /// <summary>Profile over t₀ for one ramp length.</summary>
    private static Profile? ProfileFit(Data data, double mpp, double ramp, double earliest, double firstS)
    {
        double latest = firstS - 1e-5;
        if (latest <= earliest)
        {
            return null;
        }

        double coarse = Math.Max(0.001, (latest - earliest) / 120);
        int steps = (int)((latest - earliest) / coarse) + 1;
        double bestChi = double.PositiveInfinity;
        double bestT = double.NaN;
        for (int s = 0; s <= steps; s++)
        {
            double t0 = Math.Min(latest, earliest + (s * coarse));
            if (Solve(data, mpp, ramp, t0, out double chi, out _, out _, out _) && chi < bestChi)
            {
                bestChi = chi;
                bestT = t0;
            }
        }

        if (double.IsNaN(bestT))
        {
            return null;
        }

        double fine = coarse / 20;
        double from = Math.Max(earliest, bestT - coarse);
        double to = Math.Min(latest, bestT + coarse);
        for (double t0 = from; t0 <= to; t0 += fine)
        {
            if (Solve(data, mpp, ramp, t0, out double chi, out _, out _, out _) && chi < bestChi)
            {
                bestChi = chi;
                bestT = t0;
            }
        }

        Solve(data, mpp, ramp, bestT, out _, out double a, out double phi, out double phiSigma);
        int dof = Math.Max(1, data.T.Length + 1 - 3);
        double limit = bestChi + Math.Max(1, bestChi / dof);

        // Walk out from the minimum to where χ² has risen by one (scaled) unit.
        double Edge(double direction)
        {
            double stepS = fine;
            double t = bestT;
            for (int i = 0; i < 400; i++)
            {
                double next = t + (direction * stepS);
                if (next < earliest || next > latest)
                {
                    return Math.Abs(t - bestT);
                }

                if (!Solve(data, mpp, ramp, next, out double chi, out _, out _, out _) || chi > limit)
                {
                    return Math.Abs(next - bestT);
                }

                t = next;
                stepS = Math.Min(stepS * 1.25, 0.005);
            }

            return Math.Abs(t - bestT);
        }

        double sigma = 0.5 * (Edge(-1) + Edge(1)) / Math.Sqrt(Math.Max(1, bestChi / dof));
        return new Profile(ramp, bestT, sigma, bestChi, a, phi, phiSigma);
    }

    /// <summary>Distance covered τ after the start under the family's take-up of length T to a
    /// unit plateau.</summary>
    internal static double UnitDistance(double tau, double ramp, KinematicTakeUp takeUp, double lagS = 0) => takeUp switch
    {
        KinematicTakeUp.RaisedCosine => RaisedCosineDistance(tau, ramp),
        KinematicTakeUp.LaggedRamp when lagS > 0 => LaggedRampDistance(tau, ramp, lagS),
        _ => RampDistance(tau, ramp),
    };

    /// <summary>Distance covered τ after the start when a(τ) follows the unit ramp min(τ/T, 1)
    /// through a first-order lag λ from rest (λ·a′ + a = min(τ/T, 1), a(0) = 0). On the ramp
    /// a = (τ − λ·(1 − e^(−τ/λ)))/T (the lag's response to a ramp, any linear-systems text), twice
    /// integrated from rest P(τ)/T with
    /// <code>
    /// P(u) = u³/6 − λu²/2 + λ²u − λ³·(1 − e^(−u/λ)) = λ³·(x³/6 − x²/2 + x − 1 + e^(−x)), x = u/λ
    /// </code>
    /// and, the ramp being a unit slope less the same slope from T on (superposition),
    /// d(τ) = (P(τ) − P(τ − T))/T; for T = 0 (a step through the lag) its limit P′(τ). Near the
    /// start P loses its digits to cancellation (it is λ³·x⁴/24 there): below x = 0.1 its Maclaurin
    /// series is used instead.</summary>
    private static double LaggedRampDistance(double tau, double ramp, double lag)
    {
        if (tau <= 0)
        {
            return 0;
        }

        if (ramp <= 0)
        {
            return LagStep(tau, lag);
        }

        return (LagRamp(tau, lag) - LagRamp(tau - ramp, lag)) / ramp;
    }

    /// <summary>P(u) of <see cref="LaggedRampDistance"/>: a unit-slope ramp's distance through the lag.</summary>
    private static double LagRamp(double u, double lag)
    {
        if (u <= 0)
        {
            return 0;
        }

        double x = u / lag;
        double cube = lag * lag * lag;
        if (x < 0.1)
        {
            // e^(−x) − 1 + x − x²/2 + x³/6 = x⁴/24 − x⁵/120 + x⁶/720 − x⁷/5040 + …
            return cube * x * x * x * x * ((1.0 / 24) - (x / 120) + (x * x / 720) - (x * x * x / 5040));
        }

        return cube * ((x * x * x / 6) - (x * x / 2) + x - 1 + Math.Exp(-x));
    }

    /// <summary>P′(u): a unit step's distance through the lag, λ²·(x²/2 − x + 1 − e^(−x)).</summary>
    private static double LagStep(double u, double lag)
    {
        double x = u / lag;
        double square = lag * lag;
        if (x < 0.1)
        {
            // x²/2 − x + 1 − e^(−x) = x³/6 − x⁴/24 + x⁵/120 − x⁶/720 + …
            return square * x * x * x * ((1.0 / 6) - (x / 24) + (x * x / 120) - (x * x * x / 720));
        }

        return square * ((x * x / 2) - x + 1 - Math.Exp(-x));
    }

    /// <summary>Distance covered τ after the start under a(τ) = (1 − cos(πτ/T))/2 up to T, then 1:
    /// <code>
    /// d(τ) = τ²/4 − (T²/2π²)·(1 − cos(πτ/T))      τ ≤ T
    /// d(τ) = (τ − T/2)²/2 + T²·(1/8 − 1/π²)       τ > T
    /// </code>
    /// (twice integrated; the two agree at τ = T, T²/4 − T²/π²). Near the start the first form
    /// loses digits to cancellation (it is π²τ⁴/48T² there): below πτ/T = 0.1 its Maclaurin series
    /// is used instead.</summary>
    private static double RaisedCosineDistance(double tau, double ramp)
    {
        if (tau <= 0)
        {
            return 0;
        }

        if (tau > ramp)
        {
            double shifted = tau - (0.5 * ramp);
            return (0.5 * shifted * shifted) + (ramp * ramp * (0.125 - (1 / (Math.PI * Math.PI))));
        }

        double u = Math.PI * tau / ramp;
        if (u < 0.1)
        {
            // (T²/2π²)·(u²/2 − 1 + cos u) = (T²/2π²)·(u⁴/24 − u⁶/720 + u⁸/40320 − …)
            double u2 = u * u;
            return ramp * ramp / (2 * Math.PI * Math.PI) * u2 * u2 * ((1.0 / 24) - (u2 / 720) + (u2 * u2 / 40320));
        }

        return (0.25 * tau * tau) - (ramp * ramp / (2 * Math.PI * Math.PI) * (1 - Math.Cos(u)));
    }

    /// <summary>Distance covered τ after the start under a(τ) = min(τ/T, 1) (unit plateau).</summary>
    private static double RampDistance(double tau, double ramp)
    {
        if (tau <= 0)
        {
            return 0;
        }

        if (tau <= ramp)
        {
            return tau * tau * tau / (6 * ramp);
        }

        double shifted = tau - (0.5 * ramp);
        return (0.5 * shifted * shifted) + (ramp * ramp / 24);
    }

    /// <summary>Weighted least squares of count·m = φ + A·D(τ) at fixed t₀ and ramp with the
    /// phase prior; false when t₀ is not before every observation or A would be negative.</summary>
    private static bool Solve(Data data, double mpp, double ramp, double t0, out double chi2, out double a, out double phi, out double phiSigma)
    {
        chi2 = double.PositiveInfinity;
        a = phi = phiSigma = 0;
        double phiMean = 0.5 * mpp;
        double phiVar = mpp * mpp / 12;
        double s00 = 1 / phiVar, s01 = 0, s11 = 0;
        double r0 = phiMean / phiVar, r1 = 0;
        double[] t = data.T;
        for (int i = 0; i < t.Length; i++)
        {
            double tau = t[i] - t0;
            if (tau <= 0)
            {
                return false;
            }

            double w = data.W[i];
            double c = UnitDistance(tau, ramp, data.TakeUp, data.LagS);
            s00 += w;
            s01 += w * c;
            s11 += w * c * c;
            r0 += w * data.Y[i];
            r1 += w * c * data.Y[i];
        }

        double det = (s00 * s11) - (s01 * s01);
        if (!(det > 0))
        {
            return false;
        }

        phi = ((r0 * s11) - (s01 * r1)) / det;
        a = ((s00 * r1) - (s01 * r0)) / det;
        if (a < 0)
        {
            return false;
        }

        phiSigma = Math.Sqrt(s11 / det);
        chi2 = (phi - phiMean) * (phi - phiMean) / phiVar;
        for (int i = 0; i < t.Length; i++)
        {
            double e = data.Y[i] - (phi + (a * UnitDistance(t[i] - t0, ramp, data.TakeUp, data.LagS)));
            chi2 += data.W[i] * e * e;
        }

        return true;
    }
}
