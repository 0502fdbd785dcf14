namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The pulses' scale as the rolling-scale stage measured it, to be applied.</summary>
internal sealed class RollingScaleMeasurement
{
    /// <summary>The fit: the rolling over told scale, the tyre's own (<see cref="RollingScaleMeasure.CombineScales"/>),
    /// and, for a record that opens moving, the growth.</summary>
    public required RollingScale Fit { get; init; }

    /// <summary>False when only the growth was measured (a record that opens moving, the
    /// accelerometer not calibrated): the fit's scale is then not the tyre's and is neither
    /// applied nor reported.</summary>
    public bool ScaleMeasured { get; init; } = true;

    /// <summary>Distance per pulse rescaled by the measured scale, m.</summary>
    public double MetresPerPulse { get; init; }

    /// <summary>The circumference's σ from now on, a fraction: the fit's in place of the prior's.</summary>
    public double CircumferenceSigma { get; init; }

    /// <summary>For a record that opens moving, the growth with speed the fit measured: its σ, its
    /// correlation with the scale and the distance it adds by each pulse observation, m; null for
    /// a standing start (the priors stay).</summary>
    public MeasuredGrowth? Growth { get; init; }

    /// <summary>The report's note on what was measured.</summary>
    public required string Note { get; init; }
}
