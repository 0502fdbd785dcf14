namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>Where the accelerometer says the car began to move.</summary>
/// <param name="TimeS">Onset, seconds.</param>
/// <param name="SigmaS">Its 1 σ, seconds.</param>
/// <param name="Shape">The onset shape that fitted best.</param>
/// <param name="DetectedS">When the smoothed acceleration first clearly rose, seconds.</param>
/// <param name="SmoothStartShare">How likely the rise starts like τ² (with zero slope: the
/// shapes <see cref="OnsetShape.Quadratic"/>, <see cref="OnsetShape.SmoothTakeUp"/> and
/// <see cref="OnsetShape.EvenTakeUp"/>) rather than with a slope or a step, by the shapes'
/// odds exp(−ΔBIC/2), 0–1.</param>
/// <param name="LaggedShare">How likely the rise is a ramp through a lag
/// (<see cref="OnsetShape.LaggedRamp"/>), by the same odds, 0–1: it too starts like τ², but
/// turns straight within a few lags, so the pulses read it as neither a ramp nor a smooth take-up.</param>
/// <param name="LagS">That shape's fitted lag at its onset, s (0 where it had no fit).</param>
/// <param name="LagStatistic">The scanned lag's likelihood-ratio statistic against the plain ramp,
/// 2·ln Λ = (RSS_ramp − RSS_lagged)/σ², each at its own best onset (and the lag at its best).</param>
internal readonly record struct AccelOnset(double TimeS, double SigmaS, OnsetShape Shape, double DetectedS, double SmoothStartShare, double LaggedShare = 0, double LagS = 0, double LagStatistic = 0);

/// <summary>Shapes of the acceleration just after first motion (τ = t − t₀ ≥ 0).</summary>
internal enum OnsetShape
{
    /// <summary>c₁·τ: a linear rise (a torque ramp, a clutch taking up).</summary>
    Ramp,

    /// <summary>c₂·τ²: a smooth rise; never chosen, only counted in the onset's σ
    /// (<see cref="AccelOnsetFit"/>): it is the limit of the shapes below that can bend.</summary>
    Quadratic,

    /// <summary>c₁·τ + c₂·τ²; chosen only where it bends over (c₂ ≤ 0): one that bends up is a τ²
    /// rise seen late (<see cref="AccelOnsetFit"/>) and counts only in the onset's σ.</summary>
    RampQuadratic,

    /// <summary>c₀ + c₁·τ: a jump (a dropped clutch, a released brake).</summary>
    Jump,

    /// <summary>c₂·τ² + c₃·τ³, rising through the window: a smooth take-up (a clutch or a torque
    /// coming in with the jerk itself starting from zero), joined to the rest with zero value and
    /// zero slope (C¹). Any such rise is c₂τ² + c₃τ³ + … near its start (Taylor); the cubic lets it
    /// bend over within the window as a take-up does, where τ² alone rises too steeply and τ + τ²
    /// fits the bend only with its onset moved late.</summary>
    SmoothTakeUp,

    /// <summary>c₂τ² + c₄τ⁴, rising through the window: a take-up whose jerk rises from zero and
    /// bends over symmetrically (a jerk pulse odd about the onset, as a sine's or any smooth
    /// symmetric pulse's is, so its acceleration has no τ³ term: a raised cosine is
    /// (π²/4T²)·τ²·(1 − π²τ²/12T² + …), Taylor). Over a window reaching well up the rise
    /// c₂τ² + c₃τ³ follows such a take-up only with its onset moved late (by about 1 % of the rise
    /// time over its first 60 %, a least-squares fit to the closed form), this one within 0.2 %.</summary>
    EvenTakeUp,

    /// <summary>c·(τ − λ·(1 − e^(−τ/λ))), λ on a grid: a ramp seen through a first-order lag of
    /// time constant λ (a torque ramp through the driveline's or the mount's compliance). It starts
    /// as c·τ²/(2λ) − c·τ³/(6λ²) + c·τ⁴/(24λ³) − … (Taylor) and eases into the straight
    /// c·(τ − λ): a τ² start that turns straight within the window, which neither take-up shape
    /// follows (c₂τ² + c₃τ³ keeps bending, c₂τ² + c₄τ⁴ bends the other way), so both fitted it
    /// with their onsets moved early by 1.5–4.5 ms, outside their σ (the fit alone on the closed
    /// form, ACCURACY-NOTES).</summary>
    LaggedRamp,
}

/// <summary>Finds the onset of acceleration as a change point: zero before t₀, one of the
/// <see cref="OnsetShape"/>s after it (a ramp, a τ², both, a jump, or a smooth take-up
/// c₂τ² + c₃τ³ or c₂τ² + c₄τ⁴, or a ramp through a first-order lag), fitted by least squares over a window that ends where the
/// rise has reached <see cref="WindowHeightShare"/> of its early height, with t₀ on a grid of a quarter sample (a jump's
/// fit is flat between two samples: its t₀ is the best gap's middle). The shape is chosen by the
/// Bayesian information criterion, each shape at its own least residual (a lagged ramp only on strong
/// evidence against the plain ramp, a ramp-plus-quadratic only where it bends over, a τ² alone never; each set aside
/// still widens the σ); where a curved shape is
/// chosen the onset is the shapes' onsets averaged by their odds (a ramp or a jump chosen keeps its
/// own); the σ of t₀ is the half-width of the chosen shape's
/// profile where the residual sum of squares stays within one noise variance of its minimum (a
/// jump's: its gap/√12), widened by the shapes' onsets' spread about that average.</summary>
/// <remarks>Change-point estimation by least squares with a profile over the change time:
/// D. V. Hinkley (1970), "Inference about the change-point in a sequence of random variables",
/// Biometrika 57(1); segmented regression with a continuous join: D. J. Hudson (1966), "Fitting
/// segmented curves whose join points have to be estimated", JASA 61; the information criterion:
/// G. Schwarz (1978), "Estimating the dimension of a model", Ann. Statist. 6(2).</remarks>
internal static class AccelOnsetFit
{
    private const int Shapes = 7;

    /// <summary>A sample this close after a candidate onset counts as before it, seconds. A box that
    /// times its samples evenly in whole microseconds puts the coarse candidates (whole periods from a
    /// sample time) on sample times to within rounding; without the tie a rounding either way decides
    /// which side that sample falls on, and two neighbouring candidates can both miss the split a jump
    /// needs.</summary>
    private const double TieS = 1e-7;

    /// <summary>The fit's window ends where the smoothed rise has reached this share of its height
    /// over the 0.2 s after the crossing. A curved start's onset is pinned by the rise's length
    /// within the window: least squares on a(τ) = c·(t − t₀)² over a rise of length L, sampled at f
    /// in white noise of σ, gives var t₀ = K·σ²/(f·c²·L³) with K = 12 for c·τ² alone, 48 with a
    /// τ⁴ term and 75 with a τ³ term (the inverse Fisher information of the change point, a
    /// regular parameter here since the model's slope in t₀, −2c·τ, is continuous at the join;
    /// derived for this fit). A quarter of the height ended a slow take-up's window within about
    /// 0.3 of its rise, where its σ(t₀) ∝ L^−3/2 was several milliseconds and the shapes could not
    /// be told apart; at 0.6 the window holds most of a take-up's bend and the take-up shapes
    /// still follow it (see <see cref="OnsetShape.EvenTakeUp"/>); a ramp's onset is better pinned
    /// too.</summary>
    private const double WindowHeightShare = 0.6;

    /// <summary>The fit's window ends at most this long after the crossing, s: a take-up of
    /// 0.4 s (the slowest the generator draws; a clutch or a motor's torque ramp builds up within
    /// about 0.3 s, common practice) reaches 0.6 of its height about 0.2 s after it is first seen.</summary>
    private const double WindowAfterCrossS = 0.25;

    /// <summary>The lagged ramp's time constants, s: 10 ms to 160 ms by factors of 2^(1/4) (a lag
    /// shorter than a few samples is a ramp; one longer than the window is a τ²). The grid is fine
    /// enough that a parabola in ln λ through its best three points finds the best lag (between
    /// grid points by √2 the onset moved by 1–2 ms to make up the lag; ACCURACY-NOTES).</summary>
    private static readonly double[] LagsS = [.. Enumerable.Range(0, 17).Select(j => 0.01 * Math.Pow(2, j / 4.0))];

    /// <summary>The lagged ramp is chosen only where its information criterion beats the plain
    /// ramp's by this much: 2·ln B ≥ 6, "strong" evidence on Kass and Raftery's scale (R. E. Kass
    /// and A. E. Raftery 1995, "Bayes factors", JASA 90(430)).</summary>
    private const double StrongEvidence = 6;

    /// <summary>Samples after the crossing that the window must hold for a fit.</summary>
    private const int MinAfterCross = 3;

    /// <summary>How many nonzero changes between samples must share a step to read it as the readings' grid.</summary>
    private const int StepSeen = 3;

    /// <summary>Finds the onset in the readings less the level (forward acceleration minus the resting
    /// level) between samples <paramref name="from"/> and <paramref name="to"/>.</summary>
    /// <param name="t">Sample times.</param>
    /// <param name="reading">Forward readings, m/s².</param>
    /// <param name="level">The resting level subtracted from them, m/s².</param>
    /// <param name="sigma">Per-sample noise, m/s².</param>
    /// <param name="correlation">Widening for correlated noise (1 for white).</param>
    /// <param name="period">Sample period, s.</param>
    /// <param name="from">First sample that may be before the onset.</param>
    /// <param name="to">End of the search (exclusive): the onset lies before it.</param>
    /// <param name="lastRise">True to take the last rise before <paramref name="to"/> (the pulses
    /// say motion has begun by then); false to take the first sustained rise after <paramref name="from"/>.</param>
    public static AccelOnset? Find(double[] t, double[] reading, double level, double sigma, double correlation, double period, int from, int to, bool lastRise)
    {
        var y = new Shifted(reading, level);
        int n = t.Length;
        from = Math.Max(0, from);
        to = Math.Min(n, to);
        if (to - from < 8)
        {
            return null;
        }

        int half = Math.Max(1, (int)Math.Round(0.005 / period));
        int width = (2 * half) + 1;
        int limit = Math.Min(n, to + (int)Math.Round(0.5 / period));
        int baseIndex = Math.Max(0, from - width);
        int top = Math.Min(n, limit + width);
        var prefix = new double[top - baseIndex + 1];
        for (int i = baseIndex; i < top; i++)
        {
            prefix[i - baseIndex + 1] = prefix[i - baseIndex] + y[i];
        }

        double Smoothed(int i)
        {
            int a = Math.Max(baseIndex, i - half);
            int b = Math.Min(top, i + half + 1);
            return (prefix[b - baseIndex] - prefix[a - baseIndex]) / (b - a);
        }

        double threshold = Math.Max(4.5 * sigma * correlation / Math.Sqrt(width), 0.005);
        int cross = lastRise ? LastRise(from, to, limit, threshold, Smoothed) : FirstSustainedRise(from, to, period, threshold, Smoothed);
        if (cross < 0)
        {
            return null;
        }

        double tCross = t[cross];
        int start = Math.Max(from, IndexAtOrAfter(t, tCross - 0.15));

        // The window ends where the rise has reached WindowHeightShare of its height over the next
        // 0.2 s, between 15 ms and WindowAfterCrossS after the crossing: long enough to pin the shape down, short
        // enough to stay on the rise. It holds at least the samples after the crossing that the
        // fit needs (MinAfterCross): at 100 Hz 15 ms is one sample and a half, and a
        // quick rise passes its share by then, which left no onset at all.
        double early = 0;
        for (int i = cross; i < top && t[i] <= tCross + 0.2; i++)
        {
            early = Math.Max(early, Smoothed(i));
        }

        int end = cross;
        while (end + 1 < top && t[end + 1] <= tCross + WindowAfterCrossS && (end - cross < MinAfterCross || t[end] < tCross + 0.015 || Smoothed(end) < WindowHeightShare * early))
        {
            end++;
        }

        if (cross - start < 4 || end - cross < MinAfterCross)
        {
            return null;
        }

        double total = 0;
        for (int i = start; i <= end; i++)
        {
            total += y[i] * y[i];
        }

        // Coarse pass at one sample; the centred mean rises up to half its width before the
        // onset, so the search runs that far beyond the crossing.
        double first = t[start] + (2 * period);
        int coarseCount = (int)((tCross + ((half + 2) * period) - first) / period) + 1;
        if (coarseCount < 3)
        {
            return null;
        }

        var coarse = new double[Shapes][];
        for (int m = 0; m < Shapes; m++)
        {
            coarse[m] = new double[coarseCount];
        }

        var lags = new LagBasis(t, start, end);
        Span<double> reduction = stackalloc double[Shapes];
        for (int c = 0; c < coarseCount; c++)
        {
            Reductions(t, y, start, end, first + (c * period), reduction, lags);
            for (int m = 0; m < Shapes; m++)
            {
                coarse[m][c] = total - reduction[m];
            }
        }

        // A reading is rounded to the sensor's step q, an error spread evenly over ±q/2 with
        // variance q²/12 (the uniform model of quantisation noise: B. Widrow and I. Kollár 2008,
        // "Quantization Noise", Cambridge University Press, ch. 4), so no sample is known better than
        // that however still the rest read: an ideal sensor's rest, read at the variance floor,
        // gave onsets a σ of 0.1–0.2 ms at 1600 Hz for errors of 0.5–2.6 ms (1-mg steps; 17 of 100
        // ramps beyond 2σ, ACCURACY-NOTES).
        double step = Resolution(reading, start, end);
        double noiseVar = Math.Max(sigma * sigma, step * step / 12);
        double logN = Math.Log(Math.Max(end - start + 1, 2));
        int dof = Math.Max(end - start + 1 - 3, 1);
        double leastCoarse = double.MaxValue;
        for (int m = 0; m < Shapes; m++)
        {
            leastCoarse = Math.Min(leastCoarse, coarse[m][ArgMin(coarse[m])]);
        }

        // Residuals beyond the noise (a shape none of ours fits) widen the profile's allowance.
        double scale = Math.Max(1, leastCoarse / (noiseVar * dof));
        double rise = noiseVar * correlation * correlation * scale;

        // Each shape is judged at its own best onset, not at the coarse grid's: a jump's fit is
        // exact anywhere in the right gap between samples, a ramp's only at its own onset, so on
        // whole samples a ramp would lose to the jump that any ramp also is (c₀ = c₁·(t₀ − t_r)).
        var fine = new Fine[Shapes];
        Span<double> bic = stackalloc double[Shapes];
        int bestShape = 0;
        for (int m = 0; m < Shapes; m++)
        {
            fine[m] = FineFit(t, y, start, end, total, first, period, coarse[m], m, rise, lags);
            int parameters = m is (int)OnsetShape.Ramp or (int)OnsetShape.Quadratic ? 2 : 3;
            bic[m] = (fine[m].Sse / noiseVar) + (parameters * logN);
        }

        // The lagged ramp with a lag long beside the window is c·τ²/(2λ) − c·τ³/(6λ²) + … there,
        // the smooth take-up c₂τ² + c₃τ³ again: two shapes saying one thing would count that
        // thing twice in the average. They share one prior weight in the measure that they
        // coincide (a dilution prior: E. I. George 2010, "Dilution priors: compensating for model
        // space redundancy", IMS Collections 6): with δ the part of the fitted lagged ramp that
        // the take-up's two terms cannot follow, in noise variances (the log-likelihood ratio
        // 2·ln(L₁/L₂) the data would show between them were the lagged ramp true), each has prior
        // 1 − e^(−δ/2)/2: ½ where no record could tell them apart, 1 where any would.
        int lagged = (int)OnsetShape.LaggedRamp;
        lags.Reduction(t, y, fine[lagged].TimeS, refine: true, out double lagS);
        if (lagS > 0)
        {
            double shared = 1 - (0.5 * Math.Exp(-0.5 * lags.TakeUpShortfall(t, y, fine[lagged].TimeS, lagS, noiseVar)));
            bic[lagged] -= 2 * Math.Log(shared);
            bic[(int)OnsetShape.SmoothTakeUp] -= 2 * Math.Log(shared);
        }

        // The lagged ramp is chosen or averaged in only on strong evidence against the plain ramp,
        // 2·ln B ≥ 6 (R. E. Kass and A. E. Raftery 1995, "Bayes factors", JASA 90(430)): its lag
        // is scanned over four octaves, and the best of a scan overstates its evidence (R. B.
        // Davies 1987, Biometrika 74(1)), so on a straight ramp a short chance lag wins the
        // criterion on a few records in a hundred and moves the onset early by about the lag.
        // A true lag behind a long ramp mostly has a foot well above the noise.
        // A shape set aside keeps its criterion here, for the σ (below); +∞ where it was not.
        Span<double> asideBic = stackalloc double[Shapes];
        asideBic.Fill(double.PositiveInfinity);
        bool lagBarred = bic[(int)OnsetShape.Ramp] - bic[lagged] < StrongEvidence;
        SetAside(bic, asideBic, lagged, lagBarred);

        // A ramp-plus-quadratic that bends up (c₁, c₂ > 0) is c₂·(τ + h)² − c₂·h², h = c₁/(2c₂):
        // the τ² rise begun h earlier, less a step of c₂h² that lies under the noise wherever the
        // criterion cannot tell the two apart. Its onset is that rise's seen late: on a ramp through
        // a lag it read 17–19 ms late within 1–2 of the lagged ramp's criterion, whose onset was
        // within 3 ms, and the average put the onset halfway (ACCURACY-NOTES). A driveline's
        // compliance starts any torque rise as τ² (the lagged ramp's Taylor series above), so the
        // shapes that start smooth place the onset; the bent-up one, like the barred lag, stays in
        // its σ. One that bends over (c₂ ≤ 0, a ramp easing off) is no τ² seen late and is kept.
        int rq = (int)OnsetShape.RampQuadratic;
        bool convexBarred = RampQuadraticCurvature(t, y, start, end, fine[rq].TimeS) > 0;
        SetAside(bic, asideBic, rq, convexBarred);

        // c₂τ² alone is the limit of the smooth-start shapes that can bend: the smooth take-up at
        // c₃ = 0, the even one at c₄ = 0, the lagged ramp as λ → ∞ (c·τ²/(2λ), c/λ held). It never
        // fits better than the first two and wins the criterion only by its one parameter fewer
        // (ln n, 4–7 here), claiming that the rise keeps growing as τ² up to WindowHeightShare of
        // its height, as no take-up does (a lag straightens, a take-up bends over). On a take-up
        // through a long lag (85–150 ms), the foot below the noise, it fitted the rise with its
        // onset moved 8–15 ms early where the lagged ramp's was within 3–8 ms (the generator's
        // lagged standing starts; ACCURACY-NOTES). Like the shapes above it is set aside from
        // the choice and the mean, and counts in the σ at its own odds.
        SetAside(bic, asideBic, (int)OnsetShape.Quadratic, barred: true);

        for (int m = 1; m < Shapes; m++)
        {
            if (bic[m] < bic[bestShape])
            {
                bestShape = m;
            }
        }

        Fine best = fine[bestShape];

        // The onset is the shapes' onsets averaged by their posterior odds exp(−ΔBIC/2)
        // (Schwarz's approximation; Bayesian model averaging's posterior mean, Hoeting et al. 1999,
        // "Bayesian model averaging: a tutorial", Statist. Sci. 14(4)), and the other shapes widen
        // it by their onsets' second moment about that mean: a shape the data all but rule out
        // moves and adds nothing, one nearly as good pulls the onset halfway and adds its distance.
        // Two shapes of three parameters can fit a smooth take-up almost equally well with onsets
        // milliseconds apart (the ramp-plus-quadratic fitting the rise's straighter later part
        // with its onset late); taking only the better one put the onset wherever the noise tipped it.
        double weightSum = 1;
        double weighted = best.TimeS;
        Span<double> odds = stackalloc double[Shapes];
        for (int m = 0; m < Shapes; m++)
        {
            odds[m] = m == bestShape ? 1 : Math.Exp(-0.5 * (bic[m] - bic[bestShape]));
            if (m != bestShape && odds[m] > 1e-4)
            {
                weightSum += odds[m];
                weighted += odds[m] * fine[m].TimeS;
            }
        }

        // A ramp or a jump chosen is kept where it is (the others still widen it): on such a rise
        // the curved shapes' onsets only add their noise to it.
        bool curved = bestShape == (int)OnsetShape.RampQuadratic || StartsSmooth((OnsetShape)bestShape);
        double mean = curved ? weighted / weightSum : best.TimeS;
        double moment = 0;
        for (int m = 0; m < Shapes; m++)
        {
            if (m == bestShape || odds[m] > 1e-4)
            {
                moment += odds[m] * (fine[m].TimeS - mean) * (fine[m].TimeS - mean);
            }
        }

        // A lagged ramp barred by the gate above still says where the onset may be: the reported
        // onset stays the gate's, but its σ is the root-mean-square distance from it under the
        // mixture of all the shapes with the lag's evidence restored. For weights wₘ (the odds
        // exp(−ΔBIC/2) normalised over the shapes) and onsets tₘ, the mixture's second moment
        // about a reported t̂ is Σ wₘ·(tₘ − t̂)² (the variance about its own mean plus the squared
        // bias of t̂; any probability text), so the lag adds w_lag·(t_lag − t̂)² at its own odds
        // and takes its share of the normalisation from the others. Without it a low peak whose
        // true lag falls short of strong evidence is read as a ramp 10–17 ms late with a σ of a
        // few milliseconds (ACCURACY-NOTES).
        // The bent-up ramp-plus-quadratic set aside above counts the same way.
        // A shape set aside may fit better than the chosen one, its odds above 1: against a noise
        // read near zero (an ideal sensor's rest) by thousands of noise variances, where exp
        // overflows. The weights are taken relative to the largest (the same ratios, in range).
        Span<double> asideLog = stackalloc double[Shapes];
        double topLog = 0;
        for (int m = 0; m < Shapes; m++)
        {
            asideLog[m] = BarredLogOdds(asideBic[m], bic[bestShape]);
            topLog = Math.Max(topLog, asideLog[m]);
        }

        double shownOdds = Math.Exp(-topLog);
        moment *= shownOdds;
        double asideOdds = 0;
        for (int m = 0; m < Shapes; m++)
        {
            double o = Math.Exp(asideLog[m] - topLog);
            if (o > 0)
            {
                asideOdds += o;
                moment += o * (fine[m].TimeS - mean) * (fine[m].TimeS - mean);
            }
        }

        double spreadSquared = moment / ((weightSum * shownOdds) + asideOdds);
        double smoothOdds = 0;
        double allOdds = 0;
        for (int m = 0; m < Shapes; m++)
        {
            allOdds += odds[m];
            smoothOdds += StartsSmooth((OnsetShape)m) && m != (int)OnsetShape.LaggedRamp ? odds[m] : 0;
        }

        // What lies below the noise cannot be seen: the longer the fitted onset stays under the
        // detection level, the more the unseen part of its shape matters.
        double hidden = 0.25 * Math.Max(0, tCross - mean);
        double sigmaT = Math.Sqrt((best.HalfWidthS * best.HalfWidthS) + spreadSquared + (hidden * hidden) + (period * period / 192));
        double lagStatistic = (fine[(int)OnsetShape.Ramp].Sse - fine[lagged].Sse) / noiseVar;
        return new AccelOnset(mean, sigmaT, (OnsetShape)bestShape, tCross, smoothOdds / allOdds, odds[lagged] / allOdds, lagS, lagStatistic);
    }

    /// <summary>The readings' step as samples [<paramref name="from"/>, <paramref name="to"/>] show
    /// it: the greatest common divisor of their nonzero changes from one sample to the next
    /// (Euclid's algorithm, to a part in 10⁷ of the largest change), where at least
    /// <see cref="StepSeen"/> changes show it; 0 where fewer do. Readings that stay on a grid
    /// change by whole steps, however fast they rise; noisy readings off a grid leave a divisor
    /// far below their noise (a floor that does nothing), and a lone jump is no grid.</summary>
    private static double Resolution(double[] reading, int from, int to)
    {
        double step = 0;
        double largest = 0;
        int seen = 0;
        for (int i = from + 1; i <= to; i++)
        {
            largest = Math.Max(largest, Math.Abs(reading[i] - reading[i - 1]));
        }

        double tolerance = 1e-7 * largest;
        for (int i = from + 1; i <= to; i++)
        {
            double change = Math.Abs(reading[i] - reading[i - 1]);
            if (change > tolerance)
            {
                seen++;
                step = step == 0 ? change : Divisor(step, change, tolerance);
            }
        }

        return seen >= StepSeen ? step : 0;
    }

    /// <summary>The greatest common divisor of two positive reals to within
    /// <paramref name="tolerance"/> (Euclid's algorithm on remainders, a remainder within the
    /// tolerance of 0 or of the divisor counting as none).</summary>
    private static double Divisor(double a, double b, double tolerance)
    {
        while (b > tolerance)
        {
            double r = a % b;
            if (r < tolerance || b - r < tolerance)
            {
                return b;
            }

            a = b;
            b = r;
        }

        return a;
    }

    /// <summary>Sets shape <paramref name="m"/> aside from the choice and the mean where
    /// <paramref name="barred"/>: its criterion moves from <paramref name="bic"/> to
    /// <paramref name="asideBic"/>.</summary>
    private static void SetAside(Span<double> bic, Span<double> asideBic, int m, bool barred)
    {
        if (barred)
        {
            asideBic[m] = bic[m];
            bic[m] = double.PositiveInfinity;
        }
    }

    /// <summary>A shape set aside from the choice: the log of its odds exp(−ΔBIC/2) against the
    /// chosen one, −∞ where it was not set aside (its criterion +∞ here) or the data all but rule
    /// it out (odds below 1e-4).</summary>
    private static double BarredLogOdds(double shapeBic, double bestBic)
    {
        double log = -0.5 * (shapeBic - bestBic);
        return log > Math.Log(1e-4) ? log : double.NegativeInfinity;
    }

    /// <summary>The ramp-plus-quadratic's c₂ fitted with its onset at <paramref name="t0"/> (0 where
    /// the window cannot fit it).</summary>
    private static double RampQuadraticCurvature(double[] t, Shifted y, int start, int end, double t0)
    {
        double s2 = 0, s3 = 0, s4 = 0, y1 = 0, y2 = 0;
        for (int i = start; i <= end; i++)
        {
            double tau = t[i] - t0;
            if (tau <= TieS)
            {
                continue;
            }

            double tau2 = tau * tau;
            s2 += tau2;
            s3 += tau2 * tau;
            s4 += tau2 * tau2;
            y1 += y[i] * tau;
            y2 += y[i] * tau2;
        }

        double det = (s2 * s4) - (s3 * s3);
        return det > 0 ? ((s2 * y2) - (s3 * y1)) / det : 0;
    }

    /// <summary>True for the shapes that start with zero value and zero slope (like τ²).</summary>
    private static bool StartsSmooth(OnsetShape shape) => shape is OnsetShape.Quadratic or OnsetShape.SmoothTakeUp or OnsetShape.EvenTakeUp or OnsetShape.LaggedRamp;

    private readonly record struct Fine(double TimeS, double HalfWidthS, double Sse);

    private static Fine FineFit(double[] t, Shifted y, int start, int end, double total, double first, double period, double[] coarse, int shape, double rise, LagBasis lags) =>
        shape == (int)OnsetShape.Jump
            ? JumpInGap(t, y, start, end, total, first, period, coarse, rise)
            : Refine(t, y, start, end, total, first, period, coarse, shape, rise, lags);

    /// <summary>A jump's fit depends only on which samples lie after the onset, so its residual
    /// is flat across each gap between two samples: the onset lies anywhere in the best gap, evenly
    /// (its middle, σ the gap/√12). Gaps whose fit is nearly as good add their share, weighted by
    /// their likelihood exp(−ΔRSS/2) in units of <paramref name="rise"/> (one noise variance).</summary>
    private static Fine JumpInGap(double[] t, Shifted y, int start, int end, double total, double first, double period, double[] coarse, double rise)
    {
        (int lo, int hi) = Stretch(coarse, 2 * rise);
        int kFirst = Math.Max(start + 1, IndexAtOrAfter(t, first + ((lo - 1) * period)));
        int kLast = Math.Min(end, IndexAtOrAfter(t, first + ((hi + 1) * period)) + 1);
        if (kLast < kFirst)
        {
            return Refine(t, y, start, end, total, first, period, coarse, (int)OnsetShape.Jump, rise, null);
        }

        int gaps = kLast - kFirst + 1;
        Span<double> reduction = stackalloc double[Shapes];
        var sse = new double[gaps];
        int best = 0;
        for (int g = 0; g < gaps; g++)
        {
            int k = kFirst + g;
            Reductions(t, y, start, end, 0.5 * (t[k - 1] + t[k]), reduction, null);
            sse[g] = total - reduction[(int)OnsetShape.Jump];
            if (sse[g] < sse[best])
            {
                best = g;
            }
        }

        int kBest = kFirst + best;
        double middle = 0.5 * (t[kBest - 1] + t[kBest]);
        double weightSum = 0;
        double moment = 0;
        for (int g = 0; g < gaps; g++)
        {
            double w = Math.Exp(-0.5 * (sse[g] - sse[best]) / rise);
            int k = kFirst + g;
            double gap = t[k] - t[k - 1];
            double offset = (0.5 * (t[k - 1] + t[k])) - middle;
            weightSum += w;
            moment += w * ((gap * gap / 12) + (offset * offset));
        }

        return new Fine(middle, Math.Sqrt(moment / weightSum), sse[best]);
    }

    /// <summary>The run of coarse candidates within <paramref name="allowance"/> of the minimum.</summary>
    private static (int Lo, int Hi) Stretch(double[] coarse, double allowance)
    {
        int coarseBest = ArgMin(coarse);
        int lo = coarseBest;
        while (lo > 0 && coarse[lo - 1] <= coarse[coarseBest] + allowance)
        {
            lo--;
        }

        int hi = coarseBest;
        while (hi < coarse.Length - 1 && coarse[hi + 1] <= coarse[coarseBest] + allowance)
        {
            hi++;
        }

        return (lo, hi);
    }

    /// <summary>Quarter-sample profile of one shape around its coarse minimum.</summary>
    private static Fine Refine(double[] t, Shifted y, int start, int end, double total, double first, double period, double[] coarse, int shape, double rise, LagBasis? lags)
    {
        (int lo, int hi) = Stretch(coarse, 2 * rise);
        lo = Math.Max(0, lo - 1);
        hi = Math.Min(coarse.Length - 1, hi + 1);
        double step = period / 4;
        double fineFirst = first + (lo * period);
        int candidates = ((hi - lo) * 4) + 1;
        var sse = new double[candidates];
        Span<double> reduction = stackalloc double[Shapes];
        for (int c = 0; c < candidates; c++)
        {
            sse[c] = ShapeSse(t, y, start, end, total, fineFirst + (c * step), shape, lags, reduction);
        }

        int best = ArgMin(sse);
        double limitSse = sse[best] + rise;
        int left = best;
        while (left > 0 && sse[left - 1] <= limitSse)
        {
            left--;
        }

        int right = best;
        while (right < candidates - 1 && sse[right + 1] <= limitSse)
        {
            right++;
        }

        double refined = fineFirst + (best * step);
        if (best > 0 && best < candidates - 1)
        {
            double a = sse[best - 1];
            double b = sse[best];
            double c2 = sse[best + 1];
            double curvature = a - (2 * b) + c2;
            if (curvature > 0)
            {
                refined += step * Math.Clamp(0.5 * (a - c2) / curvature, -0.5, 0.5);
            }
        }

        // The least residual near the grid's best (the profile is smooth there).
        double a0 = fineFirst + (Math.Max(best - 1, 0) * step);
        double b0 = fineFirst + (Math.Min(best + 1, candidates - 1) * step);
        double least = Math.Min(sse[best], LeastSse(t, y, start, end, total, shape, a0, b0, lags));
        return new Fine(refined, 0.5 * (right - left + 1) * step, least);
    }

    /// <summary>The least residual of one shape with its onset in [a, b], by golden-section search
    /// (J. Kiefer, 1953, "Sequential minimax search for a maximum", Proc. AMS 4(3)).</summary>
    private static double LeastSse(double[] t, Shifted y, int start, int end, double total, int shape, double a, double b, LagBasis? lags)
    {
        const double R = 0.6180339887498949;
        Span<double> reduction = stackalloc double[Shapes];
        double c = b - (R * (b - a));
        double d = a + (R * (b - a));
        double fc = Sse(c, reduction);
        double fd = Sse(d, reduction);
        for (int i = 0; i < 24; i++)
        {
            if (fc < fd)
            {
                b = d;
                d = c;
                fd = fc;
                c = b - (R * (b - a));
                fc = Sse(c, reduction);
            }
            else
            {
                a = c;
                c = d;
                fc = fd;
                d = a + (R * (b - a));
                fd = Sse(d, reduction);
            }
        }

        return Math.Min(fc, fd);

        double Sse(double t0, Span<double> r)
        {
            return ShapeSse(t, y, start, end, total, t0, shape, lags, r);
        }
    }

    /// <summary>One shape's residual with the change at <paramref name="t0"/>; the lagged ramp's at
    /// its refined lag, the others' from <see cref="Reductions"/> (without the lagged ramp).</summary>
    private static double ShapeSse(double[] t, Shifted y, int start, int end, double total, double t0, int shape, LagBasis? lags, Span<double> reduction)
    {
        if (shape == (int)OnsetShape.LaggedRamp)
        {
            return total - lags!.Reduction(t, y, t0, refine: true, out _);
        }

        Reductions(t, y, start, end, t0, reduction, null);
        return total - reduction[shape];
    }

    private static int LastRise(int from, int to, int limit, double threshold, Func<int, double> smoothed)
    {
        // Last quiet sample before the end, then the first clear rise after it.
        int quiet = -1;
        for (int i = to - 1; i >= from; i--)
        {
            if (smoothed(i) <= 0.5 * threshold)
            {
                quiet = i;
                break;
            }
        }

        if (quiet < 0)
        {
            return -1;
        }

        for (int i = quiet + 1; i < limit; i++)
        {
            if (smoothed(i) > threshold)
            {
                return i;
            }
        }

        return -1;
    }

    private static int FirstSustainedRise(int from, int to, double period, double threshold, Func<int, double> smoothed)
    {
        int hold = (int)Math.Round(0.03 / period);
        for (int i = from; i < to - hold; i++)
        {
            if (smoothed(i) <= threshold)
            {
                continue;
            }

            bool sustained = true;
            for (int k = i + 1; k <= i + hold; k++)
            {
                if (smoothed(k) <= 0.5 * threshold)
                {
                    sustained = false;
                    break;
                }
            }

            if (sustained)
            {
                return i;
            }
        }

        return -1;
    }

    /// <summary>Sum-of-squares reductions of each shape with the change at <paramref name="t0"/>;
    /// a fit that breaks its shape's sign (falling below zero in the window) counts as no fit. The
    /// lagged ramp's (its best lag on the grid, <see cref="LagBasis"/>) only where <paramref name="lags"/> is given.</summary>
    private static void Reductions(double[] t, Shifted y, int start, int end, double t0, Span<double> reduction, LagBasis? lags)
    {
        double s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, s5 = 0, s6 = 0, s8 = 0, y0 = 0, y1 = 0, y2 = 0, y3 = 0, y4 = 0;
        double tauEnd = 0;
        for (int i = start; i <= end; i++)
        {
            double tau = t[i] - t0;
            if (tau <= TieS)
            {
                continue;
            }

            double tau2 = tau * tau;
            double yi = y[i];
            s0 += 1;
            s1 += tau;
            s2 += tau2;
            s3 += tau2 * tau;
            s4 += tau2 * tau2;
            s5 += tau2 * tau2 * tau;
            s6 += tau2 * tau2 * tau2;
            s8 += tau2 * tau2 * tau2 * tau2;
            y4 += yi * tau2 * tau2;
            y0 += yi;
            y1 += yi * tau;
            y2 += yi * tau2;
            y3 += yi * tau2 * tau;
            tauEnd = tau;
        }

        reduction.Clear();
        if (s0 < 3)
        {
            return;
        }

        reduction[(int)OnsetShape.Ramp] = y1 > 0 ? y1 * y1 / s2 : 0;
        reduction[(int)OnsetShape.Quadratic] = y2 > 0 ? y2 * y2 / s4 : 0;

        double det = (s2 * s4) - (s3 * s3);
        if (det > 0)
        {
            double c1 = ((y1 * s4) - (y2 * s3)) / det;
            double c2 = ((s2 * y2) - (s3 * y1)) / det;
            bool valid = c1 >= 0 && c1 + (c2 * tauEnd) >= 0;
            reduction[(int)OnsetShape.RampQuadratic] = valid
                ? (c1 * y1) + (c2 * y2)
                : Math.Max(reduction[(int)OnsetShape.Ramp], reduction[(int)OnsetShape.Quadratic]);
        }

        det = (s0 * s2) - (s1 * s1);
        if (det > 0)
        {
            double c0 = ((y0 * s2) - (y1 * s1)) / det;
            double c1 = ((s0 * y1) - (s1 * y0)) / det;
            bool valid = c0 >= 0 && c0 + (c1 * tauEnd) >= 0;
            reduction[(int)OnsetShape.Jump] = valid ? (c0 * y0) + (c1 * y1) : reduction[(int)OnsetShape.Ramp];
        }

        // A take-up rises through the window: its slope 2c₂τ + 3c₃τ² stays ≥ 0 up to the window's end.
        det = (s4 * s6) - (s5 * s5);
        if (det > 0)
        {
            double c2 = ((y2 * s6) - (y3 * s5)) / det;
            double c3 = ((s4 * y3) - (s5 * y2)) / det;
            bool valid = c2 >= 0 && (2 * c2) + (3 * c3 * tauEnd) >= 0;
            reduction[(int)OnsetShape.SmoothTakeUp] = valid ? (c2 * y2) + (c3 * y3) : reduction[(int)OnsetShape.Quadratic];
        }

        det = (s4 * s8) - (s6 * s6);
        if (det > 0)
        {
            double c2 = ((y2 * s8) - (y4 * s6)) / det;
            double c4 = ((s4 * y4) - (s6 * y2)) / det;
            bool valid = c2 >= 0 && (2 * c2) + (4 * c4 * tauEnd * tauEnd) >= 0;
            reduction[(int)OnsetShape.EvenTakeUp] = valid ? (c2 * y2) + (c4 * y4) : reduction[(int)OnsetShape.Quadratic];
        }

        if (lags is not null)
        {
            reduction[(int)OnsetShape.LaggedRamp] = lags.Reduction(t, y, t0, refine: false, out _);
        }
    }

    /// <summary>The lagged ramp's basis over one window: e^(−(tᵢ − t_s)/λⱼ) for every sample and
    /// grid lag, computed once, so that a candidate onset t₀ costs one exponential a lag
    /// (e^(−τ/λ) = e^(−(tᵢ − t_s)/λ)·e^((t₀ − t_s)/λ)) rather than one a sample and lag.</summary>
    private sealed class LagBasis
    {
        private readonly int start;
        private readonly int end;
        private readonly double origin;
        private readonly double[][] decay;

        public LagBasis(double[] t, int start, int end)
        {
            this.start = start;
            this.end = end;
            origin = t[start];
            decay = new double[LagsS.Length][];
            for (int j = 0; j < LagsS.Length; j++)
            {
                decay[j] = new double[end - start + 1];
                for (int i = start; i <= end; i++)
                {
                    decay[j][i - start] = Math.Exp(-(t[i] - origin) / LagsS[j]);
                }
            }
        }

        /// <summary>The lagged ramp's reduction (Σy·g)²/Σg² at its best lag, g(τ) = τ − λ·(1 − e^(−τ/λ))
        /// (≥ 0 and rising, so c ≥ 0 is its only condition): the best of <see cref="LagsS"/>; with
        /// <paramref name="refine"/>, then at the vertex of the parabola in ln λ through the best
        /// and its two neighbours, where that is better.</summary>
        public double Reduction(double[] t, Shifted y, double t0, bool refine, out double lagS)
        {
            Span<double> r = stackalloc double[LagsS.Length];
            int bestLag = -1;
            for (int j = 0; j < LagsS.Length; j++)
            {
                double lag = LagsS[j];
                double shift = Math.Exp((t0 - origin) / lag);
                double[] d = decay[j];
                double gg = 0;
                double yg = 0;
                for (int i = start; i <= end; i++)
                {
                    double tau = t[i] - t0;
                    if (tau <= TieS)
                    {
                        continue;
                    }

                    double g = LaggedRamp(tau, lag, d[i - start] * shift);
                    gg += g * g;
                    yg += y[i] * g;
                }

                r[j] = yg > 0 && gg > 0 ? yg * yg / gg : 0;
                if (r[j] > 0 && (bestLag < 0 || r[j] > r[bestLag]))
                {
                    bestLag = j;
                }
            }

            if (bestLag < 0)
            {
                lagS = 0;
                return 0;
            }

            lagS = LagsS[bestLag];
            double best = r[bestLag];
            if (!refine || bestLag == 0 || bestLag == LagsS.Length - 1)
            {
                return best;
            }

            double curvature = r[bestLag - 1] - (2 * best) + r[bestLag + 1];
            if (!(curvature < 0))
            {
                return best;
            }

            double offset = Math.Clamp(0.5 * (r[bestLag - 1] - r[bestLag + 1]) / curvature, -0.5, 0.5);
            double refinedLag = LagsS[bestLag] * Math.Pow(2, offset / 4);
            double refined = ReductionAt(t, y, t0, refinedLag);
            if (refined > best)
            {
                lagS = refinedLag;
                return refined;
            }

            return best;
        }

        /// <summary>How far the smooth take-up's two terms τ² and τ³ fall short of the lagged ramp
        /// c·g(τ) fitted at <paramref name="t0"/> and <paramref name="lag"/>, over the window's
        /// samples after t₀, in noise variances: ‖(I − P)·c·g‖² / σ², P the least-squares
        /// projection on the two (0 where there is nothing to project: the two coincide).</summary>
        public double TakeUpShortfall(double[] t, Shifted y, double t0, double lag, double noiseVar)
        {
            double s4 = 0, s5 = 0, s6 = 0, g2 = 0, g3 = 0, gg = 0, yg = 0;
            for (int i = start; i <= end; i++)
            {
                double tau = t[i] - t0;
                if (tau <= TieS)
                {
                    continue;
                }

                double tau2 = tau * tau;
                double g = LaggedRamp(tau, lag);
                s4 += tau2 * tau2;
                s5 += tau2 * tau2 * tau;
                s6 += tau2 * tau2 * tau2;
                g2 += g * tau2;
                g3 += g * tau2 * tau;
                gg += g * g;
                yg += y[i] * g;
            }

            double det = (s4 * s6) - (s5 * s5);
            if (!(det > 0) || !(gg > 0))
            {
                return 0;
            }

            double a = ((g2 * s6) - (g3 * s5)) / det;
            double b = ((s4 * g3) - (s5 * g2)) / det;
            double c = yg / gg;
            return c * c * Math.Max(0, gg - ((a * g2) + (b * g3))) / noiseVar;
        }

        private double ReductionAt(double[] t, Shifted y, double t0, double lag)
        {
            double gg = 0;
            double yg = 0;
            for (int i = start; i <= end; i++)
            {
                double tau = t[i] - t0;
                if (tau <= TieS)
                {
                    continue;
                }

                double g = LaggedRamp(tau, lag);
                gg += g * g;
                yg += y[i] * g;
            }

            return yg > 0 && gg > 0 ? yg * yg / gg : 0;
        }
    }

    /// <summary>τ − λ·(1 − e^(−τ/λ)) = λ·(x − 1 + e^(−x)), x = τ/λ; its Maclaurin series
    /// λ·x²·(1/2 − x/6 + x²/24) where the difference would lose its digits.</summary>
    internal static double LaggedRamp(double tau, double lag) => LaggedRamp(tau, lag, Math.Exp(-tau / lag));

    /// <summary><see cref="LaggedRamp(double, double)"/> with e^(−τ/λ) given
    /// (<paramref name="decay"/>; <see cref="LagBasis"/> has it from its table).</summary>
    private static double LaggedRamp(double tau, double lag, double decay)
    {
        double x = tau / lag;
        return x < 1e-3 ? lag * x * x * (0.5 - (x / 6) + (x * x / 24)) : tau - (lag * (1 - decay));
    }

    /// <summary>Readings less a level, read as if they were an array.</summary>
    private readonly struct Shifted(double[] values, double level)
    {
        public double this[int i] => values[i] - level;
    }

    /// <summary>Solves [[a00, a01, a02], [a01, a11, a12], [a02, a12, a22]]·x = r by Cramer's rule.</summary>
    internal static bool SolveSymmetric3(double a00, double a01, double a02, double a11, double a12, double a22, double r0, double r1, double r2, out double x0, out double x1, out double x2)
    {
        double c00 = (a11 * a22) - (a12 * a12);
        double c01 = (a02 * a12) - (a01 * a22);
        double c02 = (a01 * a12) - (a02 * a11);
        double det = (a00 * c00) + (a01 * c01) + (a02 * c02);
        if (!(Math.Abs(det) > 1e-300))
        {
            x0 = x1 = x2 = 0;
            return false;
        }

        double c11 = (a00 * a22) - (a02 * a02);
        double c12 = (a01 * a02) - (a00 * a12);
        double c22 = (a00 * a11) - (a01 * a01);
        x0 = ((c00 * r0) + (c01 * r1) + (c02 * r2)) / det;
        x1 = ((c01 * r0) + (c11 * r1) + (c12 * r2)) / det;
        x2 = ((c02 * r0) + (c12 * r1) + (c22 * r2)) / det;
        return true;
    }

    private static int ArgMin(double[] values)
    {
        int best = 0;
        for (int i = 1; i < values.Length; i++)
        {
            if (values[i] < values[best])
            {
                best = i;
            }
        }

        return best;
    }

    private static int IndexAtOrAfter(double[] t, double value)
    {
        int i = Array.BinarySearch(t, value);
        return i >= 0 ? i : ~i;
    }
}
