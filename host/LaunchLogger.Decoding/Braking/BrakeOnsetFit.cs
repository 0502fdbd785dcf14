namespace LaunchLogger.Decoding.Braking;

/// <summary>Brake onset from the deceleration alone, by fitting a ramp model over the onset.</summary>
/// <remarks>
/// <para>The deceleration y = −a is modelled as a level, a linear rise of length T, and a plateau:
/// <code>
/// y(t) = b                      t &lt; t₀
/// y(t) = b + P·(t − t₀)/T       t₀ ≤ t &lt; t₀ + T
/// y(t) = b + P                  t ≥ t₀ + T
/// </code>
/// (T = 0 is a step; a rise that lasts the whole stop has no plateau samples.) For given
/// (t₀, T) the model is linear in (b, P), solved by least squares from running sums; for each
/// t₀ the best T is found by a geometric scan (5 ms to the window's end) refined by golden
/// section, and t₀ is the minimum of that profile over every sample time, refined between
/// its neighbours. Fitting the level and the rise together is what a
/// baseline window before the rise cannot do: a slow rise has no clean "before" to average,
/// and its early part would be taken as level, moving the onset late (segmented regression /
/// change-point estimation; e.g. Hinkley, "Inference about the intersection in two-phase
/// regression", Biometrika 56, 1969).</para>
/// <para>σ of t₀: from the profile of the residual sum of squares over t₀ (minimised over
/// T, b, P for each t₀), the half-width where it rises by one noise variance (Δχ² = 1), the noise
/// variance taken from the best fit's residuals; at least a sample period over √12; combined
/// with a model-error term for rises that are not linear, <see cref="ModelErrorPerRise"/> of the
/// rise fitted and <see cref="ModelErrorS"/>. A rise of <see cref="LocalRiseS"/> or more is then
/// fitted again over its foot (the level and its first <see cref="LocalShare"/>, <see cref="Local"/>),
/// where a shape that bends the rise moves the onset (1/4)² as far, and its model error is scaled
/// alike.</para>
/// <para>The window starts at most <see cref="LookBackS"/> before the deceleration first reaches
/// half its full value, and after the last sample of drive before that (smoothed acceleration
/// more than <see cref="DriveMps2"/> above its level at the foot of the rise); it ends at most <see cref="PlateauS"/> after,
/// and before standstill.</para>
/// </remarks>
internal static class BrakeOnsetFit
{
    /// <summary>Longest rise the fit looks for, plus the level before it, s (brake rise times of
    /// 0.05–2 s cover a panic stop to a gentle one; common practice).</summary>
    public const double LookBackS = 3.0;

    /// <summary>How much of the stop after the half-way point the fit sees, s.</summary>
    public const double PlateauS = 3.0;

    /// <summary>The foot of the rise: deceleration under this fraction of the full one.</summary>
    public const double FootFraction = 0.05;

    /// <summary>Smoothed acceleration above this is drive, not coasting, m/s².</summary>
    public const double DriveMps2 = 0.5;

    /// <summary>Before the half-way point the rise is where the deceleration stays above this
    /// fraction of the full one; a swing past half must come before it.</summary>
    public const double RiseFloorFraction = 0.2;

    /// <summary>The deceleration must stay past half its full value this long for the rise to
    /// count, s: brake rises hold for the rest of the stop, a smoother's swing at a lift-off
    /// lasts some 50–100 ms.</summary>
    public const double SustainS = 0.2;

    /// <summary>The slip's step is fitted only with at least this much level before the onset, s:
    /// with none, the level, the step and the ramp's start cannot be told apart (a window opened
    /// just after a smoother's swing, as the pulses' step makes one, had onsets 60–115 ms early).</summary>
    public const double StepLevelS = 0.1;

    /// <summary>Onset σ for the shape of a real rise, per second of rise.</summary>
    public const double ModelErrorPerRise = 0.01;

    /// <summary>A fitted rise at least this long is fitted again over its foot alone (<see cref="Local"/>), s.</summary>
    public const double LocalRiseS = 0.5;

    /// <summary>The share of a slow rise the foot's fit sees past the onset.</summary>
    public const double LocalShare = 0.25;

    /// <summary>The foot's fit is kept only where its statistical σ is at most this share of the
    /// stretch of rise it sees (a heuristic: beyond it the profile is no parabola).</summary>
    public const double LocalResolvedShare = 0.05;

    /// <summary>The foot's fit is kept while it lies within this many combined σ of the whole one.</summary>
    public const double LocalAgreementSigmas = 3;

    /// <summary>Onset σ for the shape of a real rise, whatever its length, s.</summary>
    public const double ModelErrorS = 0.004;

    /// <summary>The foot of the rise: deceleration under this, m/s², or the fraction
    /// <see cref="FootFraction"/> of the full one if less.</summary>
    public const double FootMps2 = 0.25;

    /// <summary>Fits the onset on samples (t, a) of the stop that ends at <paramref name="standstillS"/>.</summary>
    /// <param name="t">Sample times, s, increasing.</param>
    /// <param name="a">Forward acceleration, m/s² (any constant offset is fitted as the level).</param>
    /// <param name="placeT">Times of an acceleration free of offsets (the reconstructed
    /// trajectory's) that places the window; <paramref name="t"/> when null.</param>
    /// <param name="placeA">That acceleration, m/s².</param>
    /// <param name="fromS">Earliest time the window may open (the run's start or first motion).</param>
    /// <param name="peakS">Time of the highest speed before the stop.</param>
    /// <param name="standstillS">When the car came to rest.</param>
    /// <param name="riseS">The fitted rise length T, s (NaN without a fit).</param>
    /// <returns>The onset and its σ, or null when the samples are too few or show no rise.</returns>
    /// <param name="slipStepS">Above 0 when the samples are a braked wheel's, not the car's
    /// (pulses alone): the wheel's tyre slips by κ·D as the deceleration D builds, so over a rise
    /// of P in T the wheel slows faster than the car by Q = v·κ·P/T, and its deceleration steps up
    /// at the onset and down at the rise's end. The model then has that step over the rise, its
    /// height Q fitted with b and P between 0 and this value (the most v·κ can be, s) times P/T
    /// (<see cref="RunningSums.Rss"/>); a plain ramp fitted to it starts early.</param>
    public static Estimate? Fit(double[] t, double[] a, double[]? placeT, double[]? placeA, double fromS, double peakS, double standstillS, out double riseS, double slipStepS = 0)
    {
        riseS = double.NaN;
        int n = t.Length;
        if (n < 10 || t[^1] <= t[0])
        {
            return null;
        }

        double period = (t[^1] - t[0]) / (n - 1);
        if (Window(placeT ?? t, placeA ?? a, fromS, peakS, standstillS) is not { } window)
        {
            return null;
        }

        int lo = Index(t, window.FromS);
        int mid = Index(t, window.MidS);
        int hi = Index(t, window.ToS);
        if (hi - lo < 8 || mid <= lo)
        {
            return null;
        }

        if (Profile(t, a, lo, mid, hi, period, slipStepS) is not { } whole)
        {
            return null;
        }

        // A real rise is not quite linear (brake pressure builds like a lag): a model-error term
        // of a share of the rise is added to the statistical width.
        riseS = whole.RiseS;
        double model = (ModelErrorPerRise * whole.RiseS) + ModelErrorS;
        var fitted = new Estimate(whole.OnsetS, Math.Sqrt((whole.StatisticalS * whole.StatisticalS) + (model * model)));
        return slipStepS > 0 || whole.RiseS < LocalRiseS ? fitted : Local(t, a, lo, period, whole, fitted) ?? fitted;
    }

    /// <summary>A slow rise is fitted again over its foot alone: the level before it and the first
    /// <see cref="LocalShare"/> of the rise. What makes a real rise's shape differ from a straight
    /// one, a slope that changes along it, moves a straight line's foot by a share of the stretch
    /// fitted that grows with its square (a line fitted over w of a rise whose slope changes by κ
    /// over its length T: its foot moves by κ·w²/(6·T), the least squares of a quadratic by a
    /// line), so over a quarter of the rise the same shape moves it a sixteenth as far. The model
    /// error <see cref="ModelErrorPerRise"/> of the whole rise is scaled alike, (w / T)²; the
    /// statistical width is the local fit's own (fewer samples, less of the rise). Kept only
    /// where it agrees with the whole fit to <see cref="LocalAgreementSigmas"/> of their σ.</summary>
    private static Estimate? Local(double[] t, double[] a, int lo, double period, ProfileFit whole, Estimate fitted)
    {
        double stretch = LocalShare * whole.RiseS;
        int hi = Index(t, whole.OnsetS + stretch);
        int last = Index(t, whole.OnsetS + (0.5 * stretch));
        if (hi - last < 8 || last <= lo || Profile(t, a, lo, last, hi, period, 0, rampToEnd: true) is not { } local)
        {
            return null;
        }

        // Over a short noisy stretch the profile is no parabola: its Δχ² = 1 width then falls
        // short of the scatter (1 m/s² of noise at 200 Hz on a 1-s rise: 30 of 40 seeds within
        // 3σ). The foot's fit is taken only where it resolves the onset to a small share of the
        // stretch it sees, as the generator's accelerometers do (100–300 µg/√Hz).
        double seen = t[hi - 1] - local.OnsetS;
        if (!(local.StatisticalS <= LocalResolvedShare * seen))
        {
            return null;
        }

        double share = seen / whole.RiseS;
        double model = (ModelErrorPerRise * whole.RiseS * share * share) + ModelErrorS;
        var estimate = new Estimate(local.OnsetS, Math.Sqrt((local.StatisticalS * local.StatisticalS) + (model * model)));
        double gap = Math.Abs(estimate.Value - fitted.Value);
        return gap <= LocalAgreementSigmas * Math.Sqrt((estimate.Sigma * estimate.Sigma) + (fitted.Sigma * fitted.Sigma)) ? estimate : null;
    }

    /// <summary>The onset that fits best over samples [lo, hi), searched over sample times up to
    /// <paramref name="mid"/>: its time, the statistical half-width of its profile (Δχ² = 1, at
    /// least a sample period over √12) and the rise length fitted with it; null without a fit.
    /// <paramref name="rampToEnd"/>: the rise runs to the window's end (a window that ends
    /// within the rise), no plateau and no rise length fitted.</summary>
    private static ProfileFit? Profile(double[] t, double[] a, int lo, int mid, int hi, double period, double slipStepS, bool rampToEnd = false)
    {
        var sums = new RunningSums(t, a, lo, hi, slipStepS) { RampToEnd = rampToEnd };
        double end = t[hi - 1];
        int count = hi - lo;

        // Profile over t₀: every sample time up to mid (the half-way point), each with its best rise.
        int bestIndex = -1;
        double bestRss = double.PositiveInfinity;
        for (int i = lo; i <= mid; i++)
        {
            double rss = sums.BestRamp(t[i], end).Rss;
            if (rss < bestRss)
            {
                (bestRss, bestIndex) = (rss, i);
            }
        }

        if (bestIndex < 0 || double.IsInfinity(bestRss))
        {
            return null;
        }

        // Golden-section search between the neighbouring samples.
        double left = t[Math.Max(bestIndex - 1, lo)];
        double right = t[Math.Min(bestIndex + 1, mid)];
        double onset = GoldenMinimum(x => sums.BestRamp(x, end).Rss, left, right, 1e-7);
        double minimum = Math.Min(sums.BestRamp(onset, end).Rss, bestRss);
        if (minimum == bestRss && sums.BestRamp(onset, end).Rss > bestRss)
        {
            onset = t[bestIndex];
        }

        // σ: the half-width of the profile where it rises by one noise variance (Δχ² = 1).
        double variance = minimum / Math.Max(count - 4, 1);
        double limit = minimum + Math.Max(variance, 1e-30);
        double step = period / 8;
        double below = onset, above = onset;
        for (int k = 0; k < 4000 && below > t[lo] && sums.BestRamp(below, end).Rss < limit; k++)
        {
            below -= step;
        }

        for (int k = 0; k < 4000 && above < end && sums.BestRamp(above, end).Rss < limit; k++)
        {
            above += step;
        }

        return new ProfileFit(onset, Math.Max(0.5 * (above - below), period / Math.Sqrt(12)), sums.BestRamp(onset, end).RampS);
    }

    /// <summary>One profile's best onset, its statistical σ and the rise fitted with it, s.</summary>
    private readonly record struct ProfileFit(double OnsetS, double StatisticalS, double RiseS);

    /// <summary>Minimum of a unimodal <paramref name="f"/> on [a, b] by golden-section search.</summary>
    private static double GoldenMinimum(Func<double, double> f, double a, double b, double tolerance)
    {
        double r = (Math.Sqrt(5) - 1) / 2;
        double c = b - (r * (b - a));
        double d = a + (r * (b - a));
        double fc = f(c), fd = f(d);
        for (int k = 0; k < 200 && b - a > tolerance; k++)
        {
            if (fc < fd)
            {
                (b, d, fd) = (d, c, fc);
                c = b - (r * (b - a));
                fc = f(c);
            }
            else
            {
                (a, c, fc) = (c, d, fd);
                d = a + (r * (b - a));
                fd = f(d);
            }
        }

        return 0.5 * (a + b);
    }

    /// <summary>Where to fit: from the level before the rise (at most <see cref="LookBackS"/>
    /// before the half-way point, after any drive) to at most <see cref="PlateauS"/> after it,
    /// before standstill. Null when there is no firm deceleration.</summary>
    private static (double FromS, double MidS, double ToS)? Window(double[] t, double[] a, double fromS, double peakS, double standstillS)
    {
        int n = t.Length;
        double period = (t[^1] - t[0]) / Math.Max(n - 1, 1);
        int half = Math.Max(1, (int)Math.Round(0.025 / Math.Max(period, 1e-6)));
        int stop = Index(t, standstillS - Math.Max(0.02, 2 * period));
        int peak = Index(t, peakS);
        if (stop - peak < 8)
        {
            return null;
        }

        // The full deceleration: a robust high value over the stop (90th percentile).
        double[] sorted = new double[stop - peak];
        for (int i = peak; i < stop; i++)
        {
            sorted[i - peak] = -a[i];
        }

        Array.Sort(sorted);
        double full = sorted[(int)(0.9 * (sorted.Length - 1))];
        if (!(full > 0.5))
        {
            return null;
        }

        // Smoothed deceleration: the half-way point, the foot of the rise, the last drive before it.
        double[] smooth = MovingMean(a, half);
        int mid = HalfWay(t, smooth, peak, stop, 0.5 * full);

        // Walk back to the foot of the rise, then on while the acceleration stays within
        // DriveMps2 of the level there: a lift-off from drive ends the window, so that only the
        // level before the brakes (coast, cruise) is fitted.
        int lo = Math.Max(Index(t, Math.Max(t[mid] - LookBackS, fromS)), 0);
        int foot = mid;
        double footDecel = Math.Min(FootFraction * full, FootMps2);
        while (foot > lo && -smooth[foot] > footDecel)
        {
            foot--;
        }

        for (int i = foot; i > lo; i--)
        {
            if (smooth[i] > smooth[foot] + DriveMps2)
            {
                lo = Math.Min(i + half, foot);
                break;
            }
        }

        // A swing past half the deceleration before the rise is no level either: open after it.
        // The rise itself runs back from the half-way point while the deceleration stays above
        // RiseFloorFraction of its full value; noise about the half-way point of a slow rise,
        // which crosses half more than once, is no swing.
        int rise = mid - 1;
        while (rise > lo && -smooth[rise] > RiseFloorFraction * full)
        {
            rise--;
        }

        for (int i = rise; i > lo; i--)
        {
            if (-smooth[i] >= 0.5 * full)
            {
                lo = Math.Min(i + half + 1, mid - 1);
                break;
            }
        }

        int hi = Math.Min(stop, Index(t, t[mid] + PlateauS));
        return mid > lo && hi > mid ? (t[lo], t[mid], t[hi]) : null;
    }

    /// <summary>The first sample from which the smoothed deceleration stays at
    /// <paramref name="half"/> or more for <see cref="SustainS"/> (or a quarter of the stop, if
    /// shorter): a brief swing past it (a smoother's at a lift-off, a bump) is no brake rise.
    /// When no stretch holds that long, the first one; <paramref name="stop"/> when there is none.</summary>
    private static int HalfWay(double[] t, double[] smooth, int peak, int stop, double half)
    {
        double sustain = Math.Min(SustainS, 0.25 * (t[stop] - t[peak]));
        int from = -1, first = -1;
        for (int i = peak; i < stop; i++)
        {
            if (-smooth[i] < half)
            {
                from = -1;
            }
            else if (from < 0)
            {
                from = i;
                first = first < 0 ? i : first;
            }

            if (from >= 0 && t[i] - t[from] >= sustain)
            {
                return from;
            }
        }

        // No stretch held (a pumped pedal: presses shorter than SustainS with releases between):
        // the first press is the brakes coming on.
        return first >= 0 ? first : stop;
    }

    private static int Index(double[] t, double at)
    {
        int i = Array.BinarySearch(t, at);
        i = i >= 0 ? i : ~i;
        return Math.Clamp(i, 0, t.Length - 1);
    }

    private static double[] MovingMean(double[] a, int half)
    {
        var result = new double[a.Length];
        double sum = 0;
        int lo = 0, hi = -1;
        for (int i = 0; i < a.Length; i++)
        {
            while (hi < Math.Min(a.Length - 1, i + half))
            {
                sum += a[++hi];
            }

            while (lo < i - half)
            {
                sum -= a[lo++];
            }

            result[i] = sum / (hi - lo + 1);
        }

        return result;
    }

    /// <summary>Prefix sums of 1, t, t², y, t·y, y² over samples [lo, hi), y = −a, so the least
    /// squares of the ramp model for any (t₀, T) costs two binary searches.</summary>
    private sealed class RunningSums
    {
        private readonly double[] t;
        private readonly int lo;
        private readonly int hi;
        private readonly double[] s1, st, stt, sy, sty;
        private readonly double syy;
        private readonly double origin;
        private readonly double slipStepS;

        /// <summary>True: every rise runs to the window's end (<see cref="BestRamp"/> fits no length).</summary>
        public bool RampToEnd { get; init; }

        public RunningSums(double[] t, double[] a, int lo, int hi, double slipStepS)
        {
            this.slipStepS = slipStepS;
            this.t = t;
            this.lo = lo;
            this.hi = hi;
            origin = t[lo];
            int m = hi - lo;
            s1 = new double[m + 1];
            st = new double[m + 1];
            stt = new double[m + 1];
            sy = new double[m + 1];
            sty = new double[m + 1];
            for (int i = 0; i < m; i++)
            {
                double x = t[lo + i] - origin;
                double y = -a[lo + i];
                s1[i + 1] = s1[i] + 1;
                st[i + 1] = st[i] + x;
                stt[i + 1] = stt[i] + (x * x);
                sy[i + 1] = sy[i] + y;
                sty[i + 1] = sty[i] + (x * y);
                syy += y * y;
            }
        }

        /// <summary>Residual sum of squares of the best (b, P) for onset <paramref name="t0"/> and
        /// rise <paramref name="ramp"/>; with the slip's step, of the best (b, P, Q), Q the
        /// height of a step over the rise (y = b + P·r + Q·[t₀ ≤ t &lt; t₀ + T]), 0 ≤ Q ≤ λ·P with
        /// λ = slipStepS / T.</summary>
        public double Rss(double t0, double ramp)
        {
            int m = hi - lo;
            int ia = Split(t0);
            int ib = ramp > 0 ? Math.Max(Split(t0 + ramp), ia) : ia;
            double x0 = t0 - origin;

            // Σr, Σr², Σr·y with r = 0 before, (x − x0)/T on the ramp, 1 after.
            double nRamp = s1[ib] - s1[ia];
            double sr = m - ib, srr = m - ib, sry = sy[m] - sy[ib];
            double rampOnly = 0, ry = 0;
            if (nRamp > 0)
            {
                double rt = st[ib] - st[ia];
                double rtt = stt[ib] - stt[ia];
                ry = sy[ib] - sy[ia];
                double rty = sty[ib] - sty[ia];
                rampOnly = (rt - (x0 * nRamp)) / ramp;
                sr += rampOnly;
                srr += (rtt - (2 * x0 * rt) + (x0 * x0 * nRamp)) / (ramp * ramp);
                sry += (rty - (x0 * ry)) / ramp;
            }

            // Normal equations for y = b + P·r.
            double n = m;
            double syAll = sy[m];
            double det = (n * srr) - (sr * sr);
            if (!(det > 1e-12 * n * n))
            {
                return double.PositiveInfinity;
            }

            double b = ((srr * syAll) - (sr * sry)) / det;
            double p = ((n * sry) - (sr * syAll)) / det;
            double rss = p > 0 ? syy - (b * syAll) - (p * sry) : double.PositiveInfinity;
            if (slipStepS > 0 && nRamp >= 2 && x0 >= StepLevelS && WithStep(n, sr, srr, nRamp, rampOnly, syAll, sry, ry, slipStepS / ramp) is { } stepped)
            {
                rss = Math.Min(rss, stepped);
            }

            return rss;
        }

        /// <summary>RSS of y = b + P·r + Q·box by the 3×3 normal equations (Cramer's rule), box
        /// the indicator of the rise (Σbox = Σbox² = its sample count, Σbox·r = Σr over it); null
        /// unless P > 0 and Q ≥ 0 (a negative Q is no slip: the ramp alone is then the constrained
        /// best). A Q above λ·P is held there: y = b + P·(r + λ·box), two unknowns.</summary>
        private double? WithStep(double n, double sr, double srr, double nb, double sbr, double sy1, double sry, double sby, double lambda)
        {
            // | n   sr   nb  | |b|   |sy1|
            // | sr  srr  sbr | |P| = |sry|
            // | nb  sbr  nb  | |Q|   |sby|
            double det = (n * ((srr * nb) - (sbr * sbr))) - (sr * ((sr * nb) - (sbr * nb))) + (nb * ((sr * sbr) - (srr * nb)));
            if (!(Math.Abs(det) > 1e-12 * n * n * nb))
            {
                return null;
            }

            double b = ((sy1 * ((srr * nb) - (sbr * sbr))) - (sr * ((sry * nb) - (sbr * sby))) + (nb * ((sry * sbr) - (srr * sby)))) / det;
            double p = ((n * ((sry * nb) - (sbr * sby))) - (sy1 * ((sr * nb) - (sbr * nb))) + (nb * ((sr * sby) - (sry * nb)))) / det;
            double q = ((n * ((srr * sby) - (sbr * sry))) - (sr * ((sr * sby) - (sry * nb))) + (sy1 * ((sr * sbr) - (srr * nb)))) / det;
            if (!(p > 0) || q < 0)
            {
                return null;
            }

            if (q <= lambda * p)
            {
                return syy - (b * sy1) - (p * sry) - (q * sby);
            }

            double su = sr + (lambda * nb);
            double suu = srr + (2 * lambda * sbr) + (lambda * lambda * nb);
            double suy = sry + (lambda * sby);
            double det2 = (n * suu) - (su * su);
            if (!(det2 > 1e-12 * n * n))
            {
                return null;
            }

            double b2 = ((suu * sy1) - (su * suy)) / det2;
            double p2 = ((n * suy) - (su * sy1)) / det2;
            return p2 > 0 ? syy - (b2 * sy1) - (p2 * suy) : null;
        }

        /// <summary>The rise length that fits best for onset <paramref name="t0"/>: a geometric
        /// scan from 5 ms (and a step, T = 0) up to the window's end, refined by golden section.</summary>
        public (double Rss, double RampS) BestRamp(double t0, double end)
        {
            double longest = end - t0;
            if (longest <= 0)
            {
                return (double.PositiveInfinity, 0);
            }

            if (RampToEnd)
            {
                return (Rss(t0, longest), longest);
            }

            double bestRss = Rss(t0, 0);
            double best = 0, before = 0, after = 0.005;
            double previous = 0;
            for (double ramp = 0.005; ; ramp *= 1.15)
            {
                double r = Math.Min(ramp, longest);
                double rss = Rss(t0, r);
                if (rss < bestRss)
                {
                    (bestRss, best, before) = (rss, r, previous);
                    after = Math.Min(r * 1.15, longest);
                }

                previous = r;
                if (r >= longest)
                {
                    break;
                }
            }

            if (best > 0)
            {
                double refined = GoldenMinimum(x => Rss(t0, x), before, after, 1e-6 * Math.Max(best, 1e-3));
                double rss = Rss(t0, refined);
                if (rss < bestRss)
                {
                    (bestRss, best) = (rss, refined);
                }
            }

            return (bestRss, best);
        }

        /// <summary>Offset (from lo) of the first sample at or after <paramref name="time"/>.</summary>
        private int Split(double time)
        {
            int i = Array.BinarySearch(t, lo, hi - lo, time);
            i = i >= 0 ? i : ~i;
            return i - lo;
        }
    }
}
