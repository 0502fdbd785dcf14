using static System.FormattableString;

namespace LaunchLogger.Decoding.Reconstruction;

/// <content>The pulses' scale measured from the launch when the accelerometer's scale is calibrated.</content>
internal sealed partial class ReconstructionPass
{
    /// <summary>Measures the pulses' scale (<see cref="RollingScaleFit"/>) and, when it is known
    /// better than the circumference's prior, rescales the distance per pulse by it and takes its
    /// σ in place of the prior's; the caller then runs the filter again.</summary>
    /// <returns>The fit when it was applied; null (nothing changed) otherwise.</returns>
    private RollingScale? MeasureRollingScale(StepGrid steps, double startS, double? stopS, List<TimeWindow> spin, List<TimeWindow> braking, FusionResult fused)
    {
        if (options.AccelScaleCalibration is not { Value: > 0 } calibration || accel is null || pulses is null || !Staged || fused.SlipKept)
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
            GrowthSigma = options.TyreGrowthSigmaAt30Mps,
            AccelScaleSigma = calibration.Sigma,
            ToothSigmaM = options.ToothSpacingErrorFraction * mpp,
            EdgeJitterS = options.EdgeJitterS,
            WindowS = options.RollingScaleWindowS,
            TopSpeedMps = options.RollingScaleTopSpeedMps,
        };
        if (RollingScaleFit.Fit(steps.TimeS, steps.StepSpeedM, steps.StepDistanceM, steps.NoInput, pulses, mpp, startS, end, noise) is not { } fit
            || !(fit.Scale.Sigma < options.CircumferenceSigmaFraction) || !(Math.Abs(fit.Scale.Value - 1) < 0.2))
        {
            return null;
        }

        rollingScale = fit;
        mpp *= fit.Scale.Value;
        circumferenceSigma = fit.Scale.Sigma / fit.Scale.Value;
        warnings.Add(Invariant($"the pulses' scale was measured over the launch against the calibrated accelerometer ({fit.Checkpoints} pulse observations, {fit.WindowEndS - startS:0.0} s): the tyre rolls {(fit.Scale.Value - 1) * 100:+0.00;-0.00} % ± {fit.Scale.Sigma * 100:0.00} % from the circumference told; distances and speeds use it"));
        return fit;
    }
}
