using static System.FormattableString;

namespace LaunchLogger.Decoding.Reconstruction;

/// <content>The pulses' scale measured when the accelerometer's scale is calibrated: over the
/// launch of a standing start, or over a record that opens moving (its changes of speed, and the
/// rest it may end in).</content>
internal sealed partial class ReconstructionPass
{
    /// <summary>Braking force per unit mass from which a wheel no longer rolls freely for the
    /// rolling-scale fit, m/s²: a braked tyre slips by about its deceleration in g over a slip
    /// stiffness of 15–30 (<c>BrakeSlipPrior.CarTyres</c>), 0.17–0.34 % here, and the fit's window
    /// closes 0.1 s before it is reached.</summary>
    private const double FreeRollingBrakeMps2 = 0.5;

    /// <summary>The speed equations at rest after a stop: from this long after it…</summary>
    private const double RestFromS = 0.2;

    /// <summary>…every this often…</summary>
    private const double RestEveryS = 0.1;

    /// <summary>…up to this long after it, seconds.</summary>
    private const double RestToS = 1.5;

    /// <summary>The measured rolling over told scale, 1 until measured.</summary>
    private double MeasuredScale => rollingScale?.Scale.Value ?? 1;

    /// <summary>Measures the pulses' scale (<see cref="RollingScaleFit"/>) and, when it is known
    /// better than the circumference's prior, rescales the distance per pulse by it and takes its
    /// σ in place of the prior's; the caller then runs the filter again.</summary>
    /// <returns>The fit when it was applied; null (nothing changed) otherwise.</returns>
    private RollingScale? MeasureRollingScale(StepGrid steps, double startS, double? stopS, List<TimeWindow> spin, List<TimeWindow> braking, FusionResult fused)
    {
        if (options.AccelScaleCalibration is not { Value: > 0 } calibration || accel is null || pulses is null || fused.SlipKept || (!Staged && opening is null))
        {
            return null;
        }

        // The fit takes the wheel to roll freely over the launch. A slip coefficient the pulses
        // tell apart from an undriven wheel's (beyond 3σ of the two combined) says it does not,
        // even when it is too small to keep: a driven wheel's slip grows with the distance much as
        // a scale error does, so the fit would read one as the other (an electric saloon's driven
        // wheel: the scale off by a few per cent and its stops 3-11 m short, beyond their σ).
        // (A record that opens moving has no launch and no slip state: its fit reads the changes
        // of speed and the rest it ends in.)
        if (Staged && SlipToldApart(fused))
        {
            return null;
        }

        // The launch only: up to the first brake, spin or stop, and while the wheel turns freely.
        double end = stopS ?? double.PositiveInfinity;
        foreach (TimeWindow w in spin.Concat(braking))
        {
            end = Math.Min(end, w.StartS);
        }

        double biasSigma = Math.Sqrt(Square(accel.RestLevelSigmaMps2) + Square(options.BiasPriorMps2));
        var noise = new RollingScaleNoise
        {
            InputDensity = InputDensity(accel, startS),
            BiasWanderDensity = options.RollingScaleBiasWanderDensity,
            BiasSigmaMps2 = biasSigma,
            CircumferenceSigma = options.CircumferenceSigmaFraction,
            Growth = options.TyreGrowthAt30Mps,
            GrowthSigma = options.TyreGrowthSigmaAt30Mps,
            AccelScaleSigma = calibration.Sigma,
            ToothSigmaM = options.ToothSpacingErrorFraction * mpp,
            EdgeJitterS = options.EdgeJitterS,
            WindowS = options.RollingScaleWindowS,
            TopSpeedMps = options.RollingScaleTopSpeedMps,
        };
        RollingScale? measured = Staged
            ? RollingScaleFit.Fit(steps.TimeS, steps.StepSpeedMps, steps.StepDistanceM, steps.NoInput, pulses, mpp, startS, end, noise)
            : MeasureMovingScale(steps, startS, stopS, end, noise);
        if (measured is not { } fit || !(fit.Scale.Sigma < options.CircumferenceSigmaFraction) || !(Math.Abs(fit.Scale.Value - 1) < 0.2))
        {
            return null;
        }

        rollingScale = fit;
        mpp *= fit.Scale.Value;
        circumferenceSigma = fit.Scale.Sigma / fit.Scale.Value;
        if (!Staged)
        {
            // Speeds from the launch's low to cruise and beyond show the growth too: the distance
            // per pulse follows it, and σ takes the fit's (correlated with the scale's).
            growthSigma = fit.Growth.Sigma;
            growthCorrelation = fit.ScaleGrowthCorrelation;
            pulseGrowthM = GrowthDistances(steps.TimeS, fused.SpeedMps, fit.Growth.Value);
        }

        string over = Staged ? "the launch" : fit.RestEquations > 0 ? "the record's changes of speed and the rest it ends in" : "the record's changes of speed";
        warnings.Add(Invariant($"the pulses' scale was measured over {over} against the calibrated accelerometer ({fit.Checkpoints} pulse observations, {fit.WindowEndS - startS:0.0} s): the tyre rolls {((fit.Scale.Value * options.RollingOverToldCircumference) - 1) * 100:+0.00;-0.00} % ± {fit.Scale.Sigma * options.RollingOverToldCircumference * 100:0.00} % from the circumference told; distances and speeds use it"));
        return fit;
    }

    /// <summary>The distance the tyre's growth G·(v / 30 m/s)² adds by each pulse observation,
    /// counted from the first, at the speeds of the filter's first pass, m.</summary>
    private double[] GrowthDistances(double[] grid, double[] speedMps, double growthAt30)
    {
        var added = new double[pulses!.Length];
        int k = 0;
        for (int i = 1; i < added.Length; i++)
        {
            double mid = pulses.MidS(i);
            while (k + 1 < grid.Length && grid[k + 1] <= mid)
            {
                k++;
            }

            double v = speedMps[k] / GrowthReferenceMps;
            added[i] = added[i - 1] + ((pulses.Counts[i] - pulses.Counts[i - 1]) * mpp * growthAt30 * v * v);
        }

        return added;
    }

    /// <summary>The fit over a record that opens moving: its pulses while the wheel rolls freely
    /// (up to <paramref name="freeEndS"/>, and before the brakes come on), its opening speed from
    /// the first pulses (a wide prior), and, when it ends at rest, the speed zero there: the
    /// acceleration integrated down to that rest against the pulses just before the brakes.</summary>
    private RollingScale? MeasureMovingScale(StepGrid steps, double startS, double? stopS, double freeEndS, RollingScaleNoise noise)
    {
        double[] grid = steps.TimeS;
        double openingSpeed = opening!.Value.SpeedMps.Value;

        // The speed at the grid's first point: the opening speed less what the input adds up to the first pulse.
        double gained = 0;
        for (int k = 0; k + 1 < grid.Length && grid[k + 1] <= startS; k++)
        {
            gained += steps.StepSpeedMps[k];
        }

        double v0 = Math.Max(openingSpeed - gained, 0);
        double brakesOn = new DriveForceWindows(steps, options).BrakingWindows(startS, stopS, FreeRollingBrakeMps2, openingSpeed) is [var first, ..] ? first.StartS : double.PositiveInfinity;
        double pulsesEnd = Math.Min(freeEndS, brakesOn);
        var rest = new List<double>();
        double brakeSpan = 0;
        if (stopS is { } stop)
        {
            // Not over the samples the level was read from at the final rest: they would count twice.
            double dataEnd = Math.Min(Math.Min(accel!.TimeS[^1], grid[^1]), finalRestFromS);
            for (double t = stop + RestFromS; t <= Math.Min(stop + RestToS, dataEnd) + 1e-9; t += RestEveryS)
            {
                rest.Add(t);
            }

            brakeSpan = Math.Max(stop - Math.Min(pulsesEnd, stop), 0);
        }

        // The opening speed's prior is wide (1 m/s and 10 %, ten times the circumference's 1 %):
        // the pulses and the rest tell it, at the scale being measured.
        var moving = new MovingWindow(new Estimate(v0, 1 + (0.1 * v0)), [.. rest], brakeSpan, options.BrakeBiasStepSigmaMps2);
        return RollingScaleFit.Fit(
            grid, steps.StepSpeedMps, steps.StepDistanceM, steps.NoInput, pulses!, mpp, startS, pulsesEnd,
            noise with { WindowS = options.RollingScaleMovingWindowS, TopSpeedMps = double.PositiveInfinity }, moving);
    }
}
