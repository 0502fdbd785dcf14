using MathNet.Numerics.LinearAlgebra;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>What <see cref="RollingScaleFit.Fit"/> found: the rolling distance per pulse over the
/// one told, and how much of the launch it read.</summary>
/// <param name="Scale">Rolling over told distance per pulse, against the accelerometer's own
/// scale, with its 1 σ (the accelerometer's scale is left to <see cref="RollingScaleMeasure.CombineScales"/>).</param>
/// <param name="Checkpoints">Pulse observations compared.</param>
/// <param name="WindowEndS">Time of the last one, seconds.</param>
/// <param name="ResidualRatio">χ² of the residuals over their degrees of freedom (σ was widened
/// by its square root when above 1).</param>
internal readonly record struct RollingScale(Estimate Scale, int Checkpoints, double WindowEndS, double ResidualRatio)
{
    /// <summary>Speed equations at rest after a stop (0 for a launch).</summary>
    public int RestEquations { get; init; }

    /// <summary>The tyre's growth at 30 m/s, a fraction, with its 1 σ.</summary>
    public Estimate Growth { get; init; }

    /// <summary>Correlation of the scale's and the growth's errors.</summary>
    public double ScaleGrowthCorrelation { get; init; }
}

/// <summary>A window that opens moving (<see cref="RollingScaleFit"/>) and may end at rest.</summary>
/// <param name="InitialSpeedMps">Speed at the window's first grid point, with its prior σ (wide), m/s.</param>
/// <param name="RestS">Times at rest after the stop where the speed is zero (sorted; empty
/// when the record does not end at rest), seconds.</param>
/// <param name="BrakeSpanS">How long the brakes acted before that rest, seconds.</param>
/// <param name="BrakeStepSigmaMps2">σ of the accelerometer's error stepping while braking, m/s².</param>
internal readonly record struct MovingWindow(Estimate InitialSpeedMps, double[] RestS, double BrakeSpanS, double BrakeStepSigmaMps2);

/// <summary>The pulses' scale (the tyre's rolling circumference over the one the box was told)
/// measured from a standing start against the accelerometer's scale: the
/// distance the accelerometer gives over the launch against the pulses counted, with the bias,
/// the pulse ring's phase and the tyre's growth with speed fitted beside it.</summary>
/// <remarks>
/// <para>From a rest at τ = 0 (a little before first motion) the input u = a + b + w (the
/// accelerometer's forward reading, resting level removed, divided by its calibrated scale when it has one; b
/// what is left of the bias, w noise) integrates twice to A(τ) = x(τ) + ½·b·τ² + e(τ). The count
/// N of pulses is reached at x = ρ·N·m − φ (m the distance per pulse told, ρ the unknown scale, φ
/// the ring's phase at rest), and a tyre that grows by G·(v / 30 m/s)² adds G·Γ(τ),
/// Γ = ∫ (v / 30)²·v dτ. So each pulse observation is one linear equation
/// <code>
/// A(τⱼ) = ρ·(Nⱼ·m) − φ + b·(½·τⱼ²) + G·Γ(τⱼ) + eⱼ + pⱼ
/// </code>
/// in θ = [ρ, φ, b, G], solved as a Bayesian linear regression with Gaussian priors
/// (posterior information Λ = Σ₀⁻¹ + Hᵀ·R⁻¹·H, mean Λ⁻¹·(Σ₀⁻¹·θ₀ + Hᵀ·R⁻¹·y); any text on
/// linear estimation, e.g. Bar-Shalom, Li, Kirubarajan (2001), §3.4). The errors are correlated:
/// white input noise of density q integrated twice gives Cov(e(s), e(t)) = q·(s²·t/2 − s³/6) for
/// s ≤ t, and a bias wandering as a random walk of density r gives r·(c²·s³/3 + c·s⁴/2 + s⁵/5)/4,
/// c = t − s (both by integrating the white noise's kernels, (t − u) and (t − u)²/2, over
/// the common span). The pulse's own error pⱼ is its bracket (v²·w²/12 plus edge jitter) and the
/// tooth's place on the ring, independent from pulse to pulse.</para>
/// <para>The accelerometer's scale is known only to its calibration's or its data sheet's σ: A
/// and with it ρ move by that fraction, so the fit reads ρ·(1 + s), its prior both scales' (the
/// caller draws the tyre's own from it). A bias that stays constant reads like a scale error when the
/// acceleration does too (½·b·τ² against ½·a·τ²): σ stays near b/a unless the acceleration
/// changes over the launch, as it does as speed builds.</para>
/// </remarks>
internal static class RollingScaleFit
{
    /// <summary>Pulse observations compared at most (evenly spread over the window).</summary>
    private const int MaxCheckpoints = 48;

    /// <summary>Fewest pulse observations worth a fit.</summary>
    private const int MinCheckpoints = 8;

    /// <summary>Speed at which the growth term is G, m/s (<see cref="ReconstructionOptions.TyreGrowthSigmaAt30Mps"/>).</summary>
    internal const double GrowthReferenceMps = 30;

    /// <summary>The fit, or null when the launch holds too few pulses before the window closes.</summary>
    /// <param name="gridS">Grid times; the first is at rest (moving: at the opening speed).</param>
    /// <param name="stepSpeedM">Input speed gained over each step, m/s.</param>
    /// <param name="stepDistanceM">Input distance gained over each step beyond v·Δt, m.</param>
    /// <param name="noInput">Steps the accelerometer does not cover.</param>
    /// <param name="pulses">The distance channel.</param>
    /// <param name="metresPerPulse">Distance per pulse told, m.</param>
    /// <param name="startS">First motion, seconds.</param>
    /// <param name="endS">The pulses are read up to here at the latest (braking, wheelspin, the
    /// stop), seconds; a window that ends at rest integrates on to its speed equations.</param>
    /// <param name="noise">The error and prior sizes.</param>
    /// <param name="moving">A window that opens moving and may end at rest; null: from rest at
    /// <c>gridS[0]</c>, as a launch.</param>
    /// <remarks>
    /// <para>Opening at an unknown speed v₀, the accelerometer's double integral from the window's
    /// first grid point is A(τ) = x(τ) − v₀·τ + ½·b·τ² + e(τ): v₀ is one more parameter (its
    /// prior wide, from the first pulses at the told scale), and the distance at the first pulse
    /// read, c, takes the phase's place (counts are taken from that pulse on). A steady speed then
    /// says nothing of ρ (ρ·N·m against v₀·τ); the CHANGE of speed the accelerometer sees
    /// against the pulses' does, and a stretch at steady speed measures the bias b.</para>
    /// <para>A window that ends at rest adds speed equations: the input integrated once,
    /// V(τ) = v(τ) − v₀ + b·τ + e_v(τ), is −v₀ + b·τ + e_v at rest, so the speed at the window's
    /// opening (hence ρ, against the pulses there) comes from the acceleration integrated down
    /// to the rest, without the braked wheel's pulses. e_v's covariances follow from the same
    /// kernels, a speed at t integrating the white noise with weight 1 and the random walk with
    /// (t − u) (<see cref="ErrorCovariance"/>). The accelerometer's error may step while braking
    /// (body pitch left after compensation): σ_δ over the braking's span, shared by every speed
    /// equation.</para>
    /// </remarks>
    public static RollingScale? Fit(
        double[] gridS, double[] stepSpeedM, double[] stepDistanceM, bool[]? noInput, PulseChannel pulses, double metresPerPulse, double startS, double endS, RollingScaleNoise noise, MovingWindow? moving = null)
    {
        ArgumentNullException.ThrowIfNull(gridS);
        ArgumentNullException.ThrowIfNull(pulses);
        int n = gridS.Length;
        if (n < 3 || metresPerPulse <= 0)
        {
            return null;
        }

        double v0 = moving?.InitialSpeedMps.Value ?? 0;
        double[] restAt = moving?.RestS ?? [];
        double integrateTo = restAt.Length > 0 ? Math.Max(endS, restAt[^1]) : endS;

        // Speed V, distance A and growth integral Γ of the input at the grid points, from rest
        // (or, moving, from the speed guessed at grid[0], for Γ) at grid[0].
        // A gap in the samples (a polled loop stalled past the accelerometer's FIFO) is bridged by
        // the input taken as linear across it, its error counted (Gaps); where the input ends
        // for good, so does the integral.
        var speed = new double[n];
        var distance = new double[n];
        var growth = new double[n];
        var gaps = new List<(double MidS, double Variance)>();
        int lastInput = n - 2;
        while (lastInput >= 0 && noInput != null && noInput[lastInput])
        {
            lastInput--;
        }

        int last = 0;
        double gapFrom = double.NaN;
        for (int k = 0; k + 1 < n; k++)
        {
            if (k > lastInput || gridS[k + 1] > integrateTo || v0 + speed[k] > noise.TopSpeedMps)
            {
                break;
            }

            bool gap = noInput != null && noInput[k];
            if (gap && double.IsNaN(gapFrom))
            {
                gapFrom = gridS[k];
            }
            else if (!gap && !double.IsNaN(gapFrom))
            {
                gaps.Add(Gap(gapFrom, gridS[k], gridS[0], noise.GapJerkDensity));
                gapFrom = double.NaN;
            }

            double dt = gridS[k + 1] - gridS[k];
            speed[k + 1] = speed[k] + stepSpeedM[k];
            distance[k + 1] = distance[k] + (speed[k] * dt) + stepDistanceM[k];
            double v = v0 + (0.5 * (speed[k] + speed[k + 1]));
            growth[k + 1] = growth[k] + (Square(v / GrowthReferenceMps) * v * dt);
            last = k + 1;
        }

        if (!double.IsNaN(gapFrom) && gridS[last] > gapFrom)
        {
            // The integral ended inside a gap: what it bridged so far counts too.
            gaps.Add(Gap(gapFrom, gridS[last], gridS[0], noise.GapJerkDensity));
        }

        double windowEnd = Math.Min(Math.Min(gridS[last], endS), startS + noise.WindowS);
        var candidates = new List<int>();
        for (int i = 0; i < pulses.Length; i++)
        {
            double mid = pulses.MidS(i);
            if (mid > startS && mid <= windowEnd)
            {
                candidates.Add(i);
            }
        }

        if (candidates.Count < MinCheckpoints)
        {
            return null;
        }

        int rests = 0;
        while (rests < restAt.Length && restAt[rests] <= gridS[last])
        {
            rests++;
        }

        int count = Math.Min(MaxCheckpoints, candidates.Count);
        int rows = count + rests;
        int columns = moving is null ? 4 : 5;
        var h = Matrix<double>.Build.Dense(rows, columns);
        var y = Vector<double>.Build.Dense(rows);
        var tau = new double[rows];
        var isSpeed = new bool[rows];
        var ownVariance = new double[rows];
        double t0 = gridS[0];
        long firstCount = moving is null ? 0 : pulses.Counts[candidates[0]];
        for (int j = 0; j < count; j++)
        {
            int i = candidates[(int)Math.Round((double)j * (candidates.Count - 1) / Math.Max(count - 1, 1))];
            double t = pulses.MidS(i);
            int k = GridIndex(gridS, t, last);
            double dt = gridS[k + 1] - gridS[k];
            double delta = t - gridS[k];
            double rate = stepSpeedM[k] / dt;
            double v = v0 + speed[k] + (rate * delta);
            y[j] = distance[k] + (speed[k] * delta) + (0.5 * rate * delta * delta);
            tau[j] = t - t0;
            h[j, 0] = (pulses.Counts[i] - firstCount) * metresPerPulse;
            h[j, 1] = moving is null ? -1 : 1;
            h[j, 2] = 0.5 * tau[j] * tau[j];
            h[j, 3] = growth[k] + (Square(v / GrowthReferenceMps) * v * delta);
            if (moving is not null)
            {
                h[j, 4] = -tau[j];
            }

            double w = pulses.HiS[i] - pulses.LoS[i];
            ownVariance[j] = Square(noise.ToothSigmaM) + (v * v * ((w * w / 12) + Square(noise.EdgeJitterS)));
        }

        for (int j = count; j < rows; j++)
        {
            double t = restAt[j - count];
            int k = GridIndex(gridS, t, last);
            y[j] = speed[k] + (stepSpeedM[k] * (t - gridS[k]) / (gridS[k + 1] - gridS[k]));
            tau[j] = t - t0;
            isSpeed[j] = true;
            h[j, 2] = tau[j];
            h[j, 4] = -1;
        }

        var r = Matrix<double>.Build.Dense(rows, rows);
        double brakeStep = moving is { } m ? Square(m.BrakeStepSigmaMps2 * m.BrakeSpanS) : 0;
        for (int a = 0; a < rows; a++)
        {
            for (int b = 0; b <= a; b++)
            {
                double e = ErrorCovariance(tau[a], isSpeed[a], tau[b], isSpeed[b], noise.InputDensity, noise.BiasWanderDensity)
                    + GapCovariance(gaps, tau[a], isSpeed[a], tau[b], isSpeed[b])
                    + (isSpeed[a] && isSpeed[b] ? brakeStep : 0);
                r[a, b] = e;
                r[b, a] = e;
            }

            r[a, a] += ownVariance[a] + 1e-12;
        }

        var prior = Vector<double>.Build.DenseOfArray(moving is { } open
            ? [1, open.InitialSpeedMps.Value * (pulses.MidS(candidates[0]) - t0), 0, noise.Growth, open.InitialSpeedMps.Value]
            : [1, 0.5 * metresPerPulse, 0, noise.Growth]);
        var priorInformation = Matrix<double>.Build.DenseOfDiagonalArray(moving is { } wide
            ?
            [
                1 / Square(noise.CircumferenceSigma),
                1 / Square(Math.Max(wide.InitialSpeedMps.Sigma * (pulses.MidS(candidates[0]) - t0), metresPerPulse)),
                1 / Square(Math.Max(noise.BiasSigmaMps2, 1e-6)),
                1 / Square(Math.Max(noise.GrowthSigma, 1e-6)),
                1 / Square(Math.Max(wide.InitialSpeedMps.Sigma, 1e-3)),
            ]
            :
            [
                1 / Square(noise.CircumferenceSigma),
                12 / Square(metresPerPulse),
                1 / Square(Math.Max(noise.BiasSigmaMps2, 1e-6)),
                1 / Square(Math.Max(noise.GrowthSigma, 1e-6)),
            ]);
        var chol = r.Cholesky();
        Matrix<double> rh = chol.Solve(h);
        Vector<double> ry = chol.Solve(y);
        Matrix<double> information = priorInformation + (h.TransposeThisAndMultiply(rh));
        Vector<double> theta = information.Solve((priorInformation * prior) + h.TransposeThisAndMultiply(ry));
        Matrix<double> covariance = information.Inverse();

        // Residuals against their own covariance: a launch the model misses (slip, a bump) widens σ.
        Vector<double> residual = y - (h * theta);
        double chi2 = residual.DotProduct(chol.Solve(residual));
        double ratio = chi2 / Math.Max(rows - columns, 1);
        double widen = Math.Max(1, ratio);
        double scale = theta[0];
        double sigma = Math.Sqrt(covariance[0, 0] * widen);
        double growthSigma = Math.Sqrt(covariance[3, 3] * widen);
        return new RollingScale(new Estimate(scale, sigma), count, pulses.MidS(candidates[^1]), ratio)
        {
            RestEquations = rests,
            Growth = new Estimate(theta[3], growthSigma),
            ScaleGrowthCorrelation = sigma > 0 && growthSigma > 0 ? Math.Clamp(covariance[0, 3] * widen / (sigma * growthSigma), -1, 1) : 0,
        };
    }

    /// <summary>Covariance of the input's integration errors at two times, each a distance (the
    /// input integrated twice from τ = 0) or a speed (once).</summary>
    /// <remarks>White noise of density q enters a distance at s with the kernel (s − u) and a
    /// speed at t with 1; a random walk of density r (a wandering bias) with (s − u)²/2 and
    /// (t − u). Each covariance is the density times the integral of the two kernels' product
    /// over the common span [0, min]; with m the earlier time and c the gap:
    /// distance–distance q·(m²·(m + c)/2 − m³/6) and r·(c²·m³/3 + c·m⁴/2 + m⁵/5)/4;
    /// speed–speed q·m and r·(m³/3 + c·m²/2); a speed at t and a distance at s,
    /// q·s²/2 and r·(s⁴/8 + c·s³/6) when s ≤ t, q·(s·t − t²/2) and r·(t⁴/8 + c·t³/3 + c²·t²/4)
    /// when t &lt; s.</remarks>
    internal static double ErrorCovariance(double tauA, bool speedA, double tauB, bool speedB, double inputDensity, double wanderDensity)
    {
        double m = Math.Min(tauA, tauB);
        double c = Math.Abs(tauA - tauB);
        if (!speedA && !speedB)
        {
            return (inputDensity * ((m * m * (m + c) / 2) - (m * m * m / 6)))
                + (wanderDensity * ((c * c * m * m * m / 3) + (c * m * m * m * m / 2) + (m * m * m * m * m / 5)) / 4);
        }

        if (speedA && speedB)
        {
            return (inputDensity * m) + (wanderDensity * ((m * m * m / 3) + (c * m * m / 2)));
        }

        double t = speedA ? tauA : tauB;
        double s = speedA ? tauB : tauA;
        return s <= t
            ? (inputDensity * s * s / 2) + (wanderDensity * ((s * s * s * s / 8) + (c * s * s * s / 6)))
            : (inputDensity * ((s * t) - (t * t / 2))) + (wanderDensity * ((t * t * t * t / 8) + (c * t * t * t / 3) + (c * c * t * t / 4)));
    }

    /// <summary>A gap in the samples from <paramref name="fromS"/> to <paramref name="toS"/>: where
    /// it lies (τ of its middle) and the variance of the speed the line across it misses.</summary>
    /// <remarks>Over a gap of length Δ the input is taken as the line between the samples on
    /// either side. With the acceleration a random walk of density j (white jerk,
    /// <see cref="RollingScaleNoise.GapJerkDensity"/>), what it does between them is that line
    /// plus a Brownian bridge, whose integral over the gap has variance j·Δ³/12 (the integral of
    /// a Brownian bridge: ∫∫ (min(s,t) − s·t/Δ) ds dt over [0, Δ]² = Δ³/12; from memory, checked
    /// by a Monte Carlo in <c>RollingScaleFitTests</c>). That speed step enters every
    /// later speed with weight 1 and every later distance with the time since the gap.</remarks>
    internal static (double MidS, double Variance) Gap(double fromS, double toS, double originS, double jerkDensity)
    {
        double length = toS - fromS;
        return ((0.5 * (fromS + toS)) - originS, jerkDensity * length * length * length / 12);
    }

    /// <summary>Covariance the gaps add to two observations (a distance or a speed at τ): the
    /// speed each gap missed, counted where the gap lies before both.</summary>
    internal static double GapCovariance(List<(double MidS, double Variance)> gaps, double tauA, bool speedA, double tauB, bool speedB)
    {
        double sum = 0;
        foreach ((double mid, double variance) in gaps)
        {
            if (mid < tauA && mid < tauB)
            {
                sum += variance * (speedA ? 1 : tauA - mid) * (speedB ? 1 : tauB - mid);
            }
        }

        return sum;
    }

    private static int GridIndex(double[] gridS, double t, int last)
    {
        int found = Array.BinarySearch(gridS, t);
        return Math.Clamp(found >= 0 ? found : ~found - 1, 0, last - 1);
    }

    private static double Square(double x) => x * x;
}

/// <summary>The error and prior sizes <see cref="RollingScaleFit"/> works with.</summary>
internal readonly record struct RollingScaleNoise
{
    /// <summary>White noise density of the input, m²/s³.</summary>
    public required double InputDensity { get; init; }

    /// <summary>Random-walk density of the input's error over the launch, m²/s⁵.</summary>
    public required double BiasWanderDensity { get; init; }

    /// <summary>Prior σ of the input's error at the launch, m/s².</summary>
    public required double BiasSigmaMps2 { get; init; }

    /// <summary>Prior σ of the scale, a fraction: of the pulses' scale against the accelerometer's,
    /// the tyre's and the accelerometer's priors together.</summary>
    public required double CircumferenceSigma { get; init; }

    /// <summary>Prior centre of the growth at 30 m/s, a fraction (0 unless a typical growth is told).</summary>
    public double Growth { get; init; }

    /// <summary>Prior σ of the growth at 30 m/s, a fraction.</summary>
    public required double GrowthSigma { get; init; }

    /// <summary>Density of the jerk taken across a gap in the samples, m²/s⁵ (0: a gap costs nothing).</summary>
    public double GapJerkDensity { get; init; }

    /// <summary>σ of a tooth's place on the ring, m.</summary>
    public required double ToothSigmaM { get; init; }

    /// <summary>Edge timing jitter beyond the bracket, seconds.</summary>
    public required double EdgeJitterS { get; init; }

    /// <summary>Longest window after first motion, seconds.</summary>
    public required double WindowS { get; init; }

    /// <summary>Highest speed read, m/s.</summary>
    public required double TopSpeedMps { get; init; }
}
