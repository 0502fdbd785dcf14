namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>How far the pulses may be ahead of the car over the first metre of a launch: the
/// disagreement between the fused distance (which the pulses carry) and the accelerometer's own
/// distance beyond what the accelerometer's error explains.</summary>
/// <remarks>
/// A driven tyre at the launch works near its grip limit and slips by several per cent, far more
/// than the fusion's linear slip law allows at that force (H. B. Pacejka, "Tire and Vehicle
/// Dynamics", ch. 1: the force–slip curve flattens towards its peak). The pulses then count more
/// than the car covered, and the rollout mark comes early by that distance over the speed. Over
/// the first second the accelerometer's double integral, taken from its resting level, is good to
/// <code>σ_acc(τ)² = (b·τ²/2)² + (s_a·d)² + (s_p·d)² + σ_f²</code>
/// with b the bias σ, s_a its scale σ, s_p the pulses' scale σ (circumference), σ_f the fused
/// distance's own σ. The allowance is
/// <code>e(τ) = √max(0, D(τ)² − σ_acc(τ)²),  D = d_fused − d_acc</code>
/// the moment estimate of the slip (E[D²] = σ_acc² + slip²), taken at its largest so far and held
/// after the window (the distance the wheel gained stays gained): nothing on a wheel that tracks
/// the car (D within σ_acc), about |D| on one that clearly does not. Subtracting 2σ_acc or 1.5σ_acc
/// instead left slips of a few millimetres on top of an uncalibrated tyre's own circumference
/// error unexplained (driven-wheel rollout marks within 2σ in 85 % and 91 % of simulated runs).
/// </remarks>
internal static class LaunchSlipAllowance
{
    /// <summary>The window ends this far from the start, m (a few rollouts: the launch slip fades
    /// as the speed builds).</summary>
    public const double WindowM = 1.0;

    /// <summary>The window ends this long after first motion, s (the accelerometer's double
    /// integral is good only so long).</summary>
    public const double WindowS = 1.0;

    /// <summary>Extra 1-σ of distance at each grid point, m; zeros before <paramref name="k0"/>.</summary>
    /// <param name="grid">Grid times, s.</param>
    /// <param name="k0">First grid index after first motion.</param>
    /// <param name="startS">First motion, s.</param>
    /// <param name="startSpeedM">Speed gained from the input between first motion and grid[k0], m/s.</param>
    /// <param name="startDistanceM">Distance gained over the same, m.</param>
    /// <param name="stepSpeedM">Speed gained from the input over each step, m/s.</param>
    /// <param name="stepDistanceM">Distance gained from the input over each step (at zero speed at its start), m.</param>
    /// <param name="fusedDistanceM">The fused distance, m.</param>
    /// <param name="fusedSigmaM">Its σ from the filter, m.</param>
    /// <param name="biasSigmaMps2">σ of the input's bias, m/s².</param>
    /// <param name="accelScaleSigma">σ of the input's scale, a fraction.</param>
    /// <param name="pulseScaleSigma">σ of the pulses' scale, a fraction.</param>
    public static double[] DistanceSigma(
        double[] grid, int k0, double startS, double startSpeedM, double startDistanceM, double[] stepSpeedM, double[] stepDistanceM,
        double[] fusedDistanceM, double[] fusedSigmaM, double biasSigmaMps2, double accelScaleSigma, double pulseScaleSigma)
    {
        int n = grid.Length;
        var extra = new double[n];
        double speed = startSpeedM;
        double distance = startDistanceM;
        double largest = 0;
        bool open = true;
        for (int k = k0; k < n; k++)
        {
            if (k > k0)
            {
                double h = grid[k] - grid[k - 1];
                distance += (speed * h) + stepDistanceM[k - 1];
                speed += stepSpeedM[k - 1];
            }

            double tau = grid[k] - startS;
            open = open && tau <= WindowS && fusedDistanceM[k] <= WindowM;
            if (open)
            {
                double d = fusedDistanceM[k];
                double bias = 0.5 * biasSigmaMps2 * tau * tau;
                double sigma2 = (bias * bias) + Square(accelScaleSigma * distance) + Square(pulseScaleSigma * d) + Square(fusedSigmaM[k]);
                double gap = d - distance;
                largest = Math.Max(largest, Math.Sqrt(Math.Max(0, (gap * gap) - sigma2)));
            }

            extra[k] = largest;
        }

        return extra;
    }

    private static double Square(double x) => x * x;
}
