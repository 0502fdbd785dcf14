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
/// <para>On a wheel the run shows to be driven (a slip kept, or wheelspin) the moment estimate
/// is not enough: it reads the accelerometer's error as part of the slip's, so an accelerometer
/// that reads high by about the slip (D ≈ slip − s_a·d ≈ 0) leaves the slip out of σ entirely.
/// There the fused distance's error y = x + u (x the slip, prior σ_x; u the pulses' scale and the
/// filter's own error, σ_u² = (s_p·d)² + σ_f², already in σ) is measured by D = y − w against the
/// accelerometer's error w (σ_w² = (b·τ²/2)² + (s_a·d)²); given D (Gaussian conditioning)
/// <code>E[y² | D] = (D·σ_y² / (σ_y² + σ_w²))² + σ_y²·σ_w² / (σ_y² + σ_w²),  σ_y² = σ_x² + σ_u²</code>
/// and the allowance is what that adds to σ_u²: e² = max(0, E[y² | D] − σ_u²). With a slip prior
/// far wider than the accelerometer's error this is about D² + σ_w² − σ_u²: the distance is
/// known only as well as the accelerometer that measured the slip. σ_x is the launch slip's prior
/// (<see cref="ReconstructionOptions.PulsesOnlyLaunchSlip"/> fading over
/// <see cref="ReconstructionOptions.LaunchSlipFadeM"/>).</para>
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
    /// <param name="slipPrior">For a wheel shown to be driven: the launch slip's prior σ as a
    /// fraction of the distance and the distance it fades over, m; null for the moment estimate.</param>
    public static double[] DistanceSigma(
        double[] grid, int k0, double startS, double startSpeedM, double startDistanceM, double[] stepSpeedM, double[] stepDistanceM,
        double[] fusedDistanceM, double[] fusedSigmaM, double biasSigmaMps2, double accelScaleSigma, double pulseScaleSigma,
        (double Fraction, double FadeM)? slipPrior = null)
    {
        int n = grid.Length;
        var extra = new double[n];
        double[] accelDistance = AccelDistance(grid, k0, startSpeedM, startDistanceM, stepSpeedM, stepDistanceM);
        double largest = 0;
        bool open = true;
        for (int k = k0; k < n; k++)
        {
            double distance = accelDistance[k];
            double tau = grid[k] - startS;
            open = open && tau <= WindowS && fusedDistanceM[k] <= WindowM;
            if (open)
            {
                double d = fusedDistanceM[k];
                double accel2 = Square(AccelSigma(tau, distance, biasSigmaMps2, accelScaleSigma));
                double fused2 = Square(pulseScaleSigma * d) + Square(fusedSigmaM[k]);
                double gap = d - distance;
                double slip2;
                if (slipPrior is { } prior)
                {
                    double x = prior.Fraction * prior.FadeM * (1 - Math.Exp(-Math.Max(d, 0) / prior.FadeM));
                    double y2 = (x * x) + fused2;
                    double total = y2 + accel2;
                    double mean = total > 0 ? gap * y2 / total : 0;
                    slip2 = (mean * mean) + (total > 0 ? y2 * accel2 / total : 0) - fused2;
                }
                else
                {
                    slip2 = (gap * gap) - accel2 - fused2;
                }

                largest = Math.Max(largest, Math.Sqrt(Math.Max(0, slip2)));
            }

            extra[k] = largest;
        }

        return extra;
    }

    /// <summary>The speed counterpart of a distance allowance, m/s: a launch slip that fades as the
    /// prior's shape x(d) = F·L·(1 − e^(−d/L)) has run ahead by <paramref name="allowanceM"/> at
    /// <paramref name="distanceM"/> when F = e / (L·(1 − e^(−d/L))), and then runs ahead at
    /// dx/dt = F·e^(−d/L)·v: the pulses read that much fast.</summary>
    /// <param name="allowanceM">The distance allowance e there, m.</param>
    /// <param name="distanceM">The distance d from first motion, m.</param>
    /// <param name="speedMps">The speed v there, m/s.</param>
    /// <param name="fadeM">The distance L the slip fades over, m.</param>
    public static double SpeedSigma(double allowanceM, double distanceM, double speedMps, double fadeM)
    {
        double d = Math.Max(distanceM, 0);
        double reach = fadeM * (1 - Math.Exp(-d / fadeM));
        return allowanceM > 0 && reach > 0 ? allowanceM / reach * Math.Exp(-d / fadeM) * speedMps : 0;
    }

    /// <summary>The car's distance d from first motion when a wheel slipping ahead of it by the
    /// fading launch slip x(d) = F·L·(1 − e^(−d/L)) has counted <paramref name="countedM"/>:
    /// the root of d + x(d) = counted, m. Newton's method from the counted distance; x' ≤ F, so
    /// a few steps reach the double's precision.</summary>
    /// <param name="countedM">The distance the wheel counted, m.</param>
    /// <param name="fraction">F, the slip at the start as a fraction.</param>
    /// <param name="fadeM">L, the distance it fades over, m.</param>
    public static double WithoutSlip(double countedM, double fraction, double fadeM)
    {
        if (countedM <= 0 || fraction <= 0)
        {
            return countedM;
        }

        double d = countedM;
        for (int i = 0; i < 8; i++)
        {
            double fading = Math.Exp(-d / fadeM);
            double step = (d + (fraction * fadeM * (1 - fading)) - countedM) / (1 + (fraction * fading));
            d -= step;
            if (Math.Abs(step) < 1e-12 * (1 + countedM))
            {
                break;
            }
        }

        return Math.Max(d, 0);
    }

    /// <summary>The accelerometer's own distance from first motion at each grid point, m (zeros
    /// before <paramref name="k0"/>): the input integrated twice from rest.</summary>
    public static double[] AccelDistance(double[] grid, int k0, double startSpeedM, double startDistanceM, double[] stepSpeedM, double[] stepDistanceM)
    {
        var distance = new double[grid.Length];
        double speed = startSpeedM;
        double d = startDistanceM;
        for (int k = k0; k < grid.Length; k++)
        {
            if (k > k0)
            {
                d += (speed * (grid[k] - grid[k - 1])) + stepDistanceM[k - 1];
                speed += stepSpeedM[k - 1];
            }

            distance[k] = d;
        }

        return distance;
    }

    /// <summary>σ_w of the accelerometer's own distance <paramref name="distanceM"/> reached
    /// <paramref name="tauS"/> after first motion: its bias integrated twice and its scale, m.</summary>
    public static double AccelSigma(double tauS, double distanceM, double biasSigmaMps2, double accelScaleSigma)
    {
        double bias = 0.5 * biasSigmaMps2 * tauS * tauS;
        return Math.Sqrt((bias * bias) + Square(accelScaleSigma * distanceM));
    }

    private static double Square(double x) => x * x;
}
