using MathNet.Numerics.LinearAlgebra;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>What <see cref="RollingScaleFit.Fit"/> found: the rolling distance per pulse over the
/// one told, and how much of the launch it read.</summary>
/// <param name="Scale">Rolling over told distance per pulse with its 1 σ (the calibrated
/// accelerometer's own scale σ included).</param>
/// <param name="Checkpoints">Pulse observations compared.</param>
/// <param name="WindowEndS">Time of the last one, seconds.</param>
/// <param name="ResidualRatio">χ² of the residuals over their degrees of freedom (σ was widened
/// by its square root when above 1).</param>
internal readonly record struct RollingScale(Estimate Scale, int Checkpoints, double WindowEndS, double ResidualRatio);

/// <summary>The pulses' scale (the tyre's rolling circumference over the one the box was told)
/// measured from a standing start against an accelerometer whose scale is calibrated: the
/// distance the accelerometer gives over the launch against the pulses counted, with the bias,
/// the pulse ring's phase and the tyre's growth with speed fitted beside it.</summary>
/// <remarks>
/// <para>From a rest at τ = 0 (a little before first motion) the input u = a + b + w (the
/// accelerometer's forward reading, resting level removed, divided by its calibrated scale; b
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
/// <para>The accelerometer's scale is known only to its calibration's σ: A and with it ρ move by
/// that fraction, added to ρ's σ. A bias that stays constant reads like a scale error when the
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
    private const double GrowthReferenceMps = 30;

    /// <summary>The fit, or null when the launch holds too few pulses before the window closes.</summary>
    /// <param name="gridS">Grid times; the first is at rest.</param>
    /// <param name="stepSpeedM">Input speed gained over each step, m/s.</param>
    /// <param name="stepDistanceM">Input distance gained over each step beyond v·Δt, m.</param>
    /// <param name="noInput">Steps the accelerometer does not cover.</param>
    /// <param name="pulses">The distance channel.</param>
    /// <param name="metresPerPulse">Distance per pulse told, m.</param>
    /// <param name="startS">First motion, seconds.</param>
    /// <param name="endS">The window closes here at the latest (braking, wheelspin, the stop), seconds.</param>
    /// <param name="noise">The error and prior sizes.</param>
    public static RollingScale? Fit(
        double[] gridS, double[] stepSpeedM, double[] stepDistanceM, bool[]? noInput, PulseChannel pulses, double metresPerPulse, double startS, double endS, RollingScaleNoise noise)
    {
        ArgumentNullException.ThrowIfNull(gridS);
        ArgumentNullException.ThrowIfNull(pulses);
        int n = gridS.Length;
        if (n < 3 || metresPerPulse <= 0)
        {
            return null;
        }

        // Speed V, distance A and growth integral Γ of the input at the grid points, from rest at grid[0].
        var speed = new double[n];
        var distance = new double[n];
        var growth = new double[n];
        int last = 0;
        for (int k = 0; k + 1 < n; k++)
        {
            if ((noInput != null && noInput[k]) || gridS[k + 1] > endS || speed[k] > noise.TopSpeedMps)
            {
                break;
            }

            double dt = gridS[k + 1] - gridS[k];
            speed[k + 1] = speed[k] + stepSpeedM[k];
            distance[k + 1] = distance[k] + (speed[k] * dt) + stepDistanceM[k];
            double v = 0.5 * (speed[k] + speed[k + 1]);
            growth[k + 1] = growth[k] + (Square(v / GrowthReferenceMps) * v * dt);
            last = k + 1;
        }

        double windowEnd = Math.Min(gridS[last], startS + noise.WindowS);
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

        int count = Math.Min(MaxCheckpoints, candidates.Count);
        var h = Matrix<double>.Build.Dense(count, 4);
        var y = Vector<double>.Build.Dense(count);
        var tau = new double[count];
        var pulseVariance = new double[count];
        double t0 = gridS[0];
        for (int j = 0; j < count; j++)
        {
            int i = candidates[(int)Math.Round((double)j * (candidates.Count - 1) / Math.Max(count - 1, 1))];
            double t = pulses.MidS(i);
            int found = Array.BinarySearch(gridS, t);
            int k = Math.Clamp(found >= 0 ? found : ~found - 1, 0, last - 1);
            double dt = gridS[k + 1] - gridS[k];
            double delta = t - gridS[k];
            double rate = stepSpeedM[k] / dt;
            double v = speed[k] + (rate * delta);
            y[j] = distance[k] + (speed[k] * delta) + (0.5 * rate * delta * delta);
            tau[j] = t - t0;
            h[j, 0] = pulses.Counts[i] * metresPerPulse;
            h[j, 1] = -1;
            h[j, 2] = 0.5 * tau[j] * tau[j];
            h[j, 3] = growth[k] + (Square(v / GrowthReferenceMps) * v * delta);
            double w = pulses.HiS[i] - pulses.LoS[i];
            pulseVariance[j] = Square(noise.ToothSigmaM) + (v * v * ((w * w / 12) + Square(noise.EdgeJitterS)));
        }

        var r = Matrix<double>.Build.Dense(count, count);
        for (int a = 0; a < count; a++)
        {
            for (int b = 0; b <= a; b++)
            {
                double s = Math.Min(tau[a], tau[b]);
                double c = Math.Abs(tau[a] - tau[b]);
                double e = (noise.InputDensity * ((s * s * (s + c) / 2) - (s * s * s / 6)))
                    + (noise.BiasWanderDensity * ((c * c * s * s * s / 3) + (c * s * s * s * s / 2) + (s * s * s * s * s / 5)) / 4);
                r[a, b] = e;
                r[b, a] = e;
            }

            r[a, a] += pulseVariance[a] + 1e-12;
        }

        var prior = Vector<double>.Build.DenseOfArray([1, 0.5 * metresPerPulse, 0, 0]);
        var priorInformation = Matrix<double>.Build.DenseOfDiagonalArray(
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
        double ratio = chi2 / Math.Max(count - 4, 1);
        double widen = Math.Max(1, ratio);
        double scale = theta[0];
        double sigma = Math.Sqrt((covariance[0, 0] * widen) + Square(scale * noise.AccelScaleSigma));
        return new RollingScale(new Estimate(scale, sigma), count, pulses.MidS(candidates[^1]), ratio);
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

    /// <summary>Prior σ of the scale, a fraction.</summary>
    public required double CircumferenceSigma { get; init; }

    /// <summary>Prior σ of the growth at 30 m/s, a fraction.</summary>
    public required double GrowthSigma { get; init; }

    /// <summary>σ of the accelerometer's calibrated scale, a fraction.</summary>
    public required double AccelScaleSigma { get; init; }

    /// <summary>σ of a tooth's place on the ring, m.</summary>
    public required double ToothSigmaM { get; init; }

    /// <summary>Edge timing jitter beyond the bracket, seconds.</summary>
    public required double EdgeJitterS { get; init; }

    /// <summary>Longest window after first motion, seconds.</summary>
    public required double WindowS { get; init; }

    /// <summary>Highest speed read, m/s.</summary>
    public required double TopSpeedMps { get; init; }
}
