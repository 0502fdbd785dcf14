using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Simulation.Vehicle;

/// <summary>Longitudinal friction as a function of slip ratio: μ(κ) = μp·sin(C·atan(B·κ)), the
/// shape of Pacejka's Magic Formula (H. B. Pacejka, Tyre and Vehicle Dynamics, ch. 4), odd in κ.</summary>
/// <remarks>For large slip the curve tends to μp·sin(C·π/2), so C = 2 − (2/π)·asin(sliding
/// fraction) puts the full-slide friction where the scenario asks; the peak is where
/// C·atan(B·κ) = π/2, so B = tan(π/(2C)) / κpeak.</remarks>
internal sealed class TyreCurve
{
    private readonly double peak;
    private readonly double b;
    private readonly double c;

    internal TyreCurve(TyreSpec spec)
    {
        peak = spec.PeakFriction;
        double sliding = Math.Clamp(spec.SlidingFrictionFraction, 0.5, 0.995);
        c = 2 - (2 / Math.PI * Math.Asin(sliding));
        b = Math.Tan(Math.PI / (2 * c)) / spec.PeakSlip;
    }

    /// <summary>Friction coefficient at slip ratio <paramref name="slip"/> (signed).</summary>
    internal double Friction(double slip) => peak * Math.Sin(c * Math.Atan(b * slip));

    /// <summary>dμ/dκ at <paramref name="slip"/>.</summary>
    internal double Slope(double slip)
    {
        double bk = b * slip;
        return peak * Math.Cos(c * Math.Atan(bk)) * c * b / (1 + (bk * bk));
    }
}
