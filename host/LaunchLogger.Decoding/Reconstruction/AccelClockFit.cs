using MathNet.Numerics.LinearAlgebra;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>How far an accelerometer's time axis sits from the pulses' over a launch, found from
/// the data: the accelerometer's double integral matched to the distances the pulses count.</summary>
/// <remarks>
/// <para>A plain-text accelerometer file gives sample times on the sensor's own clock (often a
/// nominal rate from its first sample), which runs a little fast or slow against the clock that
/// timed the pulses; after a long idle the two axes stand milliseconds apart at the launch, and
/// first motion, read on the accelerometer's axis, is off by as much.</para>
/// <para>Model, over the launch window (τ = t − t_s from a moment at rest before the onset):
/// <code>
/// N_i·m = φ + D(t_i + δ)·(1 + s) − b·τ_i²/2 + G·∫(V/30)²·V dt + e_i
///       ≈ φ + D(t_i) + (δ + ρ·(t_i − t_onset))·V(t_i) + s·D(t_i) − b·τ_i²/2 + G·∫(V/30)²·V dt + e_i
/// </code>
/// with D and V the accelerometer's input integrated twice and once from t_s on its own axis,
/// φ the tooth phase, s a scale error (circumference, accelerometer scale), b a bias, G the tyre's
/// growth at 30 m/s (it grows with the square of speed, so over a long window it is not a scale),
/// k·V²/2 an undriven wheel's spin-up slip (k·∫V·a dt: the wheel falls behind by k·a while the car
/// speeds up; <see cref="ReconstructionOptions.UndrivenSlipPerMps2"/>, taken out of the counts with
/// its σ as an error shared by every point, as it changes with the acceleration, which no column follows),
/// δ the offset at the onset (accelerometer time = pulse time + δ) and ρ the clocks' rate
/// difference, held by its prior. The errors are those of the fusion: the input's
/// noise density q integrated twice (a random walk of speed, so
/// Cov(e_i, e_j) = q·(m²·M/2 − m³/6), m and M the smaller and larger τ) plus each edge's
/// placement (V·σ_t)² and the tooth spacing's spread. Generalised least squares
/// (Aitken 1935; any regression text, e.g. Kariya &amp; Kurata, "Generalized Least Squares", ch. 2)
/// gives δ and its σ, widened by √(χ²/dof) when the residuals say the errors are larger.</para>
/// <para>The input's density q is the measured noise plus what the model allows beyond it (the
/// fusion's vibration and cross-axis allowance, often a hundred times the noise of a quiet
/// sensor); told only that, σ comes out two to three times too wide and the prior pulls δ toward
/// zero. Given the measured part, the fit tries q from the whole down to it in steps of 4 and
/// keeps the one whose residuals are likeliest (restricted likelihood, so the fitted columns do
/// not count as fit), so the data say how much of the allowance the launch needs.</para>
/// </remarks>
internal static class AccelClockFit
{
    /// <summary>Most pulse observations used (evenly spread over the window): the covariance is dense.</summary>
    public const int MaxPoints = 240;

    private const int Columns = 6;

    /// <summary>Speed at which the tyre's growth coefficient is stated, m/s.</summary>
    private const double GrowthReferenceMps = 30;

    /// <summary>Fits δ, seconds (accelerometer time − pulse time), or null when the window holds
    /// too few pulses.</summary>
    /// <param name="timeS">Sample times on the accelerometer's axis.</param>
    /// <param name="input">Forward acceleration with the resting level removed, m/s².</param>
    /// <param name="restS">A moment at rest before the onset, where integration starts.</param>
    /// <param name="onsetS">The onset of motion, where δ is wanted (the clocks' rate difference
    /// lets δ drift along the window: δ + ρ·(t − onset)).</param>
    /// <param name="endS">End of the window (drive only), on the pulses' axis.</param>
    /// <param name="pulses">The pulse observations.</param>
    /// <param name="metresPerPulse">Distance per pulse, m.</param>
    /// <param name="toothSigmaM">σ of a tooth's position, m.</param>
    /// <param name="inputDensity">Noise density of the input, m²/s³.</param>
    /// <param name="rateSigma">Prior σ of the clocks' rate difference ρ (a pseudo-observation ρ = 0).</param>
    /// <param name="slip">An undriven wheel's slip per m/s² of acceleration and its σ, s²/m.</param>
    /// <param name="measuredDensity">The part of <paramref name="inputDensity"/> measured from the
    /// samples' own noise; when given, the density of the input's random walk is chosen between it
    /// and <paramref name="inputDensity"/> by the residuals' restricted likelihood.</param>
    public static Estimate? Fit(double[] timeS, double[] input, double restS, double onsetS, double endS, PulseChannel pulses, double metresPerPulse, double toothSigmaM, double inputDensity, double rateSigma, Estimate slip, double? measuredDensity = null)
    {
        int start = Math.Max(0, Array.BinarySearch(timeS, restS) is int f && f >= 0 ? f : ~f);
        int n = timeS.Length;
        if (n - start < 8 || endS <= restS)
        {
            return null;
        }

        // Speed and distance integrated on the accelerometer's axis (trapezoid rule).
        var speed = new double[n];
        var distance = new double[n];
        var growth = new double[n];
        for (int j = start + 1; j < n; j++)
        {
            double dt = timeS[j] - timeS[j - 1];
            speed[j] = speed[j - 1] + (0.5 * dt * (input[j - 1] + input[j]));
            distance[j] = distance[j - 1] + (0.5 * dt * (speed[j - 1] + speed[j]));
            growth[j] = growth[j - 1] + (0.5 * dt * ((speed[j - 1] * speed[j - 1] * speed[j - 1]) + (speed[j] * speed[j] * speed[j])));
        }

        var chosen = new List<int>();
        for (int i = 0; i < pulses.Length; i++)
        {
            double t = pulses.EdgeS(i);
            if (t > restS && t <= endS && t < timeS[^1])
            {
                chosen.Add(i);
            }
        }

        if (chosen.Count < 8)
        {
            return null;
        }

        int m = Math.Min(chosen.Count, MaxPoints);
        var x = Matrix<double>.Build.Dense(m, Columns);
        var y = Vector<double>.Build.Dense(m);
        var white = new double[m];
        var tau = new double[m];
        var lag = new double[m];
        for (int r = 0; r < m; r++)
        {
            int i = chosen[(int)((long)r * (chosen.Count - 1) / Math.Max(m - 1, 1))];
            double t = pulses.EdgeS(i);
            int k = Array.BinarySearch(timeS, t);
            k = k >= 0 ? k : ~k;
            k = Math.Clamp(k, start + 1, n - 1);
            double w = (t - timeS[k - 1]) / (timeS[k] - timeS[k - 1]);
            double v = speed[k - 1] + (w * (speed[k] - speed[k - 1]));
            double d = distance[k - 1] + (w * (distance[k] - distance[k - 1]));
            tau[r] = t - timeS[start];
            lag[r] = 0.5 * v * v;
            y[r] = (pulses.Counts[i] * metresPerPulse) - d - (slip.Value * lag[r]);
            x[r, 0] = 1;
            x[r, 1] = v;
            x[r, 2] = d;
            x[r, 3] = -0.5 * tau[r] * tau[r];
            x[r, 4] = v * (t - onsetS);
            x[r, 5] = (growth[k - 1] + (w * (growth[k] - growth[k - 1]))) / (GrowthReferenceMps * GrowthReferenceMps);
            double edge = v * pulses.EdgeSigmaS(i);
            white[r] = (edge * edge) + (toothSigmaM * toothSigmaM);
        }

        // The input's random walk per unit density, and the slip's shared error.
        var walk = Matrix<double>.Build.Dense(m, m);
        var shared = Matrix<double>.Build.Dense(m, m);
        for (int a = 0; a < m; a++)
        {
            for (int b = 0; b <= a; b++)
            {
                double lo = Math.Min(tau[a], tau[b]);
                double hi = Math.Max(tau[a], tau[b]);
                walk[a, b] = walk[b, a] = (lo * lo * hi / 2) - (lo * lo * lo / 6);
                shared[a, b] = shared[b, a] = slip.Sigma * slip.Sigma * lag[a] * lag[b];
            }
        }

        Solution? best = null;
        double density = inputDensity;
        double floor = Math.Max(Math.Min(measuredDensity ?? inputDensity, inputDensity), inputDensity * Math.Pow(DensityStep, -MaxDensitySteps));
        while (true)
        {
            Matrix<double> c = (density * walk) + shared;
            for (int r = 0; r < m; r++)
            {
                c[r, r] += white[r];
            }

            if (Solve(x, y, c, rateSigma) is { } solution && (best is null || solution.LogLikelihood > best.Value.LogLikelihood))
            {
                best = solution;
            }

            if (density <= floor)
            {
                break;
            }

            density = Math.Max(floor, density / DensityStep);
        }

        return best is { } pick && double.IsFinite(pick.Offset) && double.IsFinite(pick.Sigma) && pick.Sigma > 0 ? new Estimate(pick.Offset, pick.Sigma) : null;
    }

    /// <summary>Ratio between neighbouring densities tried for the input's random walk.</summary>
    private const double DensityStep = 4;

    /// <summary>Most steps down from the density told (4⁸: a sensor that reports no noise at all
    /// still gets a walk).</summary>
    private const int MaxDensitySteps = 8;

    private readonly record struct Solution(double Offset, double Sigma, double LogLikelihood);

    /// <summary>The generalised least-squares fit for one error covariance, with its restricted
    /// log-likelihood (the likelihood of the residuals, free of the fitted columns: Patterson &amp;
    /// Thompson 1971; for Gaussian errors −½·(log|C| + log|XᵀC⁻¹X| + rᵀC⁻¹r) up to a constant).</summary>
    private static Solution? Solve(Matrix<double> x, Vector<double> y, Matrix<double> c, double rateSigma)
    {
        try
        {
            var cholesky = c.Cholesky();
            Matrix<double> cx = cholesky.Solve(x);
            Vector<double> cy = cholesky.Solve(y);
            Matrix<double> information = x.TransposeThisAndMultiply(cx);
            information[4, 4] += 1 / (rateSigma * rateSigma);
            var informationCholesky = information.Cholesky();
            Matrix<double> covariance = information.Inverse();
            Vector<double> theta = covariance * x.TransposeThisAndMultiply(cy);
            Vector<double> residual = y - (x * theta);
            double chi2 = residual.DotProduct(cholesky.Solve(residual));
            int m = y.Count;
            double inflate = Math.Max(1, Math.Sqrt(chi2 / Math.Max(m - Columns, 1)));
            double sigma = Math.Sqrt(Math.Max(covariance[1, 1], 0)) * inflate;
            double logLikelihood = -0.5 * (cholesky.DeterminantLn + informationCholesky.DeterminantLn + chi2 + (theta[4] * theta[4] / (rateSigma * rateSigma)));
            return new Solution(theta[1], sigma, logLikelihood);
        }
        catch (ArgumentException)
        {
            // Not positive definite (a degenerate window): no estimate.
            return null;
        }
    }
}
