using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Vehicle;

namespace LaunchLogger.Simulation.Tests.Vehicle;

public sealed class TyreCurveTests
{
    [Theory]
    [InlineData(1.0, 0.1, 0.8)]
    [InlineData(0.9, 0.12, 0.75)]
    [InlineData(1.2, 0.06, 0.9)]
    public void Peaks_at_the_configured_slip_and_settles_at_the_sliding_fraction(double peak, double peakSlip, double sliding)
    {
        var curve = new TyreCurve(new TyreSpec { PeakFriction = peak, PeakSlip = peakSlip, SlidingFrictionFraction = sliding });

        // Magic Formula shape (Pacejka, Tyre and Vehicle Dynamics, ch. 4): the peak D at
        // C·atan(B·κ) = π/2, and D·sin(C·π/2) as κ → ∞.
        Assert.Equal(peak, curve.Friction(peakSlip), 1e-9);
        Assert.Equal(0, curve.Slope(peakSlip), 1e-6);
        Assert.True(curve.Friction(peakSlip * 0.8) < peak && curve.Friction(peakSlip * 1.2) < peak);
        Assert.Equal(peak * sliding, curve.Friction(1e7), 1e-3);
        Assert.Equal(-curve.Friction(0.05), curve.Friction(-0.05), 1e-12);
    }

    [Fact]
    public void Slope_is_the_derivative_of_friction()
    {
        var curve = new TyreCurve(new TyreSpec());
        foreach (double k in new[] { -0.5, -0.1, 0, 0.03, 0.2, 1 })
        {
            double h = 1e-6;
            double numeric = (curve.Friction(k + h) - curve.Friction(k - h)) / (2 * h);
            Assert.Equal(numeric, curve.Slope(k), 1e-4);
        }
    }
}
