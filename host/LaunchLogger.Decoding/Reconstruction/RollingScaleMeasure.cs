using static System.FormattableString;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The rolling-scale stage: the pulses' scale measured against the accelerometer's over
/// the launch of a standing start (<see cref="RollingScaleFit"/>), or over a record that opens
/// moving (its changes of speed, and the rest it may end in), and the tyre's own scale drawn from
/// that ratio and the two priors (<see cref="CombineScales"/>) when the accelerometer's scale is
/// calibrated (nearly its scale alone); with one not calibrated, only a record that opens moving
/// is fitted, and only the tyre's growth with speed is taken from it (<see cref="GrowthOnly"/>).</summary>
internal static class RollingScaleMeasure
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

    /// <summary>A measured scale further than this from 1 is taken as a failed fit, not a tyre (ours).</summary>
    private const double LargestScaleChange = 0.2;

    /// <summary>Measures the pulses' scale (<see cref="RollingScaleFit"/>); when it is known better
    /// than the circumference's prior, gives the distance per pulse rescaled by it and its σ in
    /// place of the prior's. The caller applies it and runs the filter again.</summary>
    /// <returns>The measurement, or null when there is nothing to apply (a launch, or a tyre told
    /// as rolled, with an accelerometer not calibrated; no accelerometer or pulses, a slipping
    /// wheel, a fit no better than the prior).</returns>
    public static RollingScaleMeasurement? Measure(RollingScaleInputs input)
    {
        ReconstructionOptions options = input.Options;
        if (input.AccelEndS is null || input.Pulses is not { } pulses || input.SlipKept || (!input.Staged && input.Opening is null))
        {
            return null;
        }

        // A circumference measured by rolling at speed holds its growth: against an accelerometer
        // whose scale is not calibrated the fit's growth (σ about 0.2 %) only adds its noise (the
        // generator's calibrated tyre, no growth: 80-120 km/h p95 3.6 → 38.7 ms), and its scale
        // (1 % σ) moves a tyre known to 0.1 % by a hundredth of that. Such a tyre is left as told.
        // A launch against an accelerometer whose scale is not calibrated is left as told too: the
        // two priors weighed together (CombineScales, σ/√2) moved the generated lagged launches'
        // rollout mark (seed 1 p95 2.27 → 1.39 ms, seeds 1–4 2.05 → 1.77 ms) but at seed 2 left the
        // simulated undriven group's 0-60 mph, 60 ft and 330 ft within ±2σ in only 93.8 % of runs
        // and its 0-60 mph p95 2.4 times main's: the launch's ratio is not read as well as its σ
        // says there (ACCURACY-NOTES, 2026-12-05 late night; not traced).
        bool calibrated = options.AccelScaleCalibration is { Value: > 0 };
        if (!calibrated && (input.Staged || !(options.TyreGrowthAt30Mps > 0)))
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
        if (input.Staged && input.SlipToldApart)
        {
            return null;
        }

        // The launch only: up to the first brake, spin or stop, and while the wheel turns freely.
        double end = input.StopS ?? double.PositiveInfinity;
        foreach (TimeWindow w in input.Spin.Concat(input.Slides))
        {
            end = Math.Min(end, w.StartS);
        }

        double mpp = input.MetresPerPulse;
        StepGrid steps = input.Steps;
        double biasSigma = Math.Sqrt(Square(input.AccelRestLevelSigmaMps2) + Square(options.BiasPriorMps2));
        var noise = new RollingScaleNoise
        {
            InputDensity = input.InputDensity,
            BiasWanderDensity = options.RollingScaleBiasWanderDensity,
            BiasSigmaMps2 = biasSigma,
            CircumferenceSigma = Math.Sqrt(Square(options.CircumferenceSigmaFraction) + Square(options.ForwardScaleSigma)),
            Growth = options.TyreGrowthAt30Mps,
            GrowthSigma = options.TyreGrowthSigmaAt30Mps,
            GapJerkDensity = options.JerkDensity,
            ToothSigmaM = options.ToothSpacingErrorFraction * mpp,
            EdgeJitterS = options.EdgeJitterS,
            WindowS = options.RollingScaleWindowS,
            TopSpeedMps = options.RollingScaleTopSpeedMps,
        };
        // The fit measures the pulses' scale against the accelerometer's, ρ·(1 + s): its prior is
        // both priors' (σ² of a product near 1 is the sum of the factors' σ²), and the tyre's own
        // scale ρ is drawn from it by what each prior says (CombineScales).
        RollingScale? ratio = input.Staged
            ? RollingScaleFit.Fit(steps.TimeS, steps.StepSpeedMps, steps.StepDistanceM, steps.NoInput, pulses, mpp, input.StartS, end, noise)
            : MeasureMovingScale(input, pulses, end, noise);
        if (ratio is not { } measuredRatio || !(Math.Abs(measuredRatio.Scale.Value - 1) < LargestScaleChange))
        {
            return null;
        }

        if (!calibrated)
        {
            return GrowthOnly(measuredRatio, pulses, mpp, input);
        }

        RollingScale fit = CombineScales(measuredRatio, options.CircumferenceSigmaFraction, options.ForwardScaleSigma);
        if (!(fit.Scale.Sigma < options.CircumferenceSigmaFraction))
        {
            return null;
        }

        double scaledMpp = mpp * fit.Scale.Value;

        // Speeds from the launch's low to cruise and beyond show the growth too: the distance per
        // pulse follows it, and σ takes the fit's (correlated with the scale's).
        MeasuredGrowth? growth = input.Staged
            ? null
            : new MeasuredGrowth(fit.Growth.Sigma, fit.ScaleGrowthCorrelation, GrowthDistances(pulses, scaledMpp, steps.TimeS, input.FirstPassSpeedMps, fit.Growth.Value));
        string over = input.Staged ? "the launch" : fit.RestEquations > 0 ? "the record's changes of speed and the rest it ends in" : "the record's changes of speed";
        return new RollingScaleMeasurement
        {
            Fit = fit,
            MetresPerPulse = scaledMpp,
            CircumferenceSigma = fit.Scale.Sigma / fit.Scale.Value,
            Growth = growth,
            Note = Invariant($"the pulses' scale was measured over {over} against the calibrated accelerometer ({fit.Checkpoints} pulse observations, {fit.WindowEndS - input.StartS:0.0} s): the tyre rolls {((fit.Scale.Value * options.RollingOverToldCircumference) - 1) * 100:+0.00;-0.00} % ± {fit.Scale.Sigma * options.RollingOverToldCircumference * 100:0.00} % from the circumference told; distances and speeds use it"),
        };
    }

    /// <summary>What a record that opens moving measures against an accelerometer whose scale is
    /// not calibrated: the tyre's growth with speed alone. The accelerometer's unknown scale s
    /// multiplies every distance it gives, so the fit's scale ρ reads (1 + s) times the tyre's and
    /// is read to about 0.5 % here (the changes of speed alone; a launch reads it to 0.1 %), so
    /// weighed with the two priors (<see cref="CombineScales"/>) it would bring the tyre's σ only
    /// from 1 % to about 0.75 %; and on the bench's tyres (rolling 0–2 % below static, narrower
    /// than the 1 % prior) it cost the stops a third at p95 while the rolling starts gained a
    /// fifth (seeds 1–4; ACCURACY-NOTES, 2026-12-05 late night). The growth G is a change of the tyre's scale with speed, which a
    /// constant s leaves as it is to within s·G (a hundredth of it). So the distance per pulse
    /// and its σ stay the prior's, and the growth takes the fit's value and σ (uncorrelated with
    /// the prior's scale) where it is known better than its prior.</summary>
    private static RollingScaleMeasurement? GrowthOnly(RollingScale fit, PulseChannel pulses, double mpp, RollingScaleInputs input)
    {
        ReconstructionOptions options = input.Options;
        if (!(fit.Growth.Sigma < options.TyreGrowthSigmaAt30Mps) || !(Math.Abs(fit.Scale.Value - 1) < LargestScaleChange))
        {
            return null;
        }

        return new RollingScaleMeasurement
        {
            Fit = fit,
            ScaleMeasured = false,
            MetresPerPulse = mpp,
            CircumferenceSigma = options.CircumferenceSigmaFraction,
            Growth = new MeasuredGrowth(fit.Growth.Sigma, 0, GrowthDistances(pulses, mpp, input.Steps.TimeS, input.FirstPassSpeedMps, fit.Growth.Value)),
            Note = Invariant($"the tyre's growth with speed was measured over the record's changes of speed against the accelerometer ({fit.Checkpoints} pulse observations, {fit.WindowEndS - input.StartS:0.0} s): {fit.Growth.Value * 100:0.00} % ± {fit.Growth.Sigma * 100:0.00} % at 30 m/s; its scale is not calibrated, so the circumference stays the one told"),
        };
    }

    /// <summary>The tyre's own scale from the fit's ratio of the pulses' scale to the
    /// accelerometer's, given the two priors.</summary>
    /// <param name="ratio">The fit, its scale the ratio r = ρ·(1 + s) with its posterior σ (the
    /// fit's prior on r: σ_c² + σ_s²).</param>
    /// <param name="tyreSigma">σ_c of the tyre's scale ρ about 1 (its circumference's prior).</param>
    /// <param name="accelSigma">σ_s of the accelerometer's scale error s about 0 (its data
    /// sheet's, or its calibration's).</param>
    /// <remarks>Near 1, r ≈ ρ + s, a sum of two independent Gaussians. Given r, ρ is Gaussian with
    /// mean 1 + k·(r − 1), k = σ_c² / (σ_c² + σ_s²), and variance σ_c²·σ_s² / (σ_c² + σ_s²)
    /// (the conditional of a jointly Gaussian pair: C. M. Bishop, "Pattern Recognition and
    /// Machine Learning", 2006, §2.3.1); the data bear on ρ only through r, so r's posterior
    /// N(r̂, σ_r²) carries through as ρ ~ N(1 + k·(r̂ − 1), k²·σ_r² + σ_c²·σ_s² / (σ_c² + σ_s²)):
    /// σ_c/√2 when both priors are 1 % and r is read exactly, the inverse-variance combination of
    /// the two. A calibrated accelerometer (σ_s 0.2 %) leaves k near 1 and ρ near r; an
    /// uncalibrated one (1 %) takes half of r's departure from 1. The growth's correlation with
    /// the scale scales by k·σ_r / σ_ρ (the covariance by k).</remarks>
    internal static RollingScale CombineScales(RollingScale ratio, double tyreSigma, double accelSigma)
    {
        double prior = Square(tyreSigma) + Square(accelSigma);
        double gain = prior > 0 ? Square(tyreSigma) / prior : 1;
        double given = prior > 0 ? Square(tyreSigma) * Square(accelSigma) / prior : 0;
        Estimate r = ratio.Scale;
        double sigma = Math.Sqrt((gain * gain * r.Sigma * r.Sigma) + given);
        return ratio with
        {
            Scale = new Estimate(1 + (gain * (r.Value - 1)), sigma),
            ScaleGrowthCorrelation = sigma > 0 ? Math.Clamp(ratio.ScaleGrowthCorrelation * gain * r.Sigma / sigma, -1, 1) : 0,
        };
    }

    /// <summary>The distance the tyre's growth G·(v / 30 m/s)² adds by each pulse observation,
    /// counted from the first, at the speeds <paramref name="speedMps"/> on
    /// <paramref name="grid"/> (the filter's first pass), m.</summary>
    public static double[] GrowthDistances(PulseChannel pulses, double mpp, double[] grid, double[] speedMps, double growthAt30)
    {
        var added = new double[pulses.Length];
        int k = 0;
        for (int i = 1; i < added.Length; i++)
        {
            double mid = pulses.MidS(i);
            while (k + 1 < grid.Length && grid[k + 1] <= mid)
            {
                k++;
            }

            double v = speedMps[k] / RollingScaleFit.GrowthReferenceMps;
            added[i] = added[i - 1] + ((pulses.Counts[i] - pulses.Counts[i - 1]) * mpp * growthAt30 * v * v);
        }

        return added;
    }

    /// <summary>The fit over a record that opens moving: its pulses while the wheel rolls freely
    /// (up to <paramref name="freeEndS"/>, and before the brakes come on), its opening speed from
    /// the first pulses (a wide prior), and, when it ends at rest, the speed zero there: the
    /// acceleration integrated down to that rest against the pulses just before the brakes.</summary>
    private static RollingScale? MeasureMovingScale(RollingScaleInputs input, PulseChannel pulses, double freeEndS, RollingScaleNoise noise)
    {
        ReconstructionOptions options = input.Options;
        StepGrid steps = input.Steps;
        double startS = input.StartS;
        double[] grid = steps.TimeS;
        double openingSpeed = input.Opening!.Value.SpeedMps.Value;

        // The speed at the grid's first point: the opening speed less what the input adds up to the first pulse.
        double gained = 0;
        for (int k = 0; k + 1 < grid.Length && grid[k + 1] <= startS; k++)
        {
            gained += steps.StepSpeedMps[k];
        }

        double v0 = Math.Max(openingSpeed - gained, 0);
        double brakesOn = new DriveForceWindows(steps, options).BrakingWindows(startS, input.StopS, FreeRollingBrakeMps2, openingSpeed) is [var first, ..] ? first.StartS : double.PositiveInfinity;
        double pulsesEnd = Math.Min(freeEndS, brakesOn);
        var rest = new List<double>();
        double brakeSpan = 0;
        if (input.StopS is { } stop)
        {
            // Not over the samples the level was read from at the final rest: they would count twice.
            double dataEnd = Math.Min(Math.Min(input.AccelEndS!.Value, grid[^1]), input.FinalRestFromS);
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
            grid, steps.StepSpeedMps, steps.StepDistanceM, steps.NoInput, pulses, input.MetresPerPulse, startS, pulsesEnd,
            noise with { WindowS = options.RollingScaleMovingWindowS, TopSpeedMps = double.PositiveInfinity }, moving);
    }

    private static double Square(double x) => x * x;
}
