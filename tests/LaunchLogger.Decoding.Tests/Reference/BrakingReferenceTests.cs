using LaunchLogger.Decoding.Braking;

namespace LaunchLogger.Decoding.Tests.Reference;

public class BrakingReferenceTests
{
    private const double G0 = 9.80665; // standard gravity (3rd CGPM, 1901)
    private const double Mps60Mph = 26.8224; // 60 mph, exact (international yard and pound, 1959)

    [Fact]
    public void MfddOfAConstantDecelerationIsThatDeceleration()
    {
        // UN Regulation No. 13 / 13-H, MFDD formula; worked check from shared REFERENCES.md:
        // 100 km/h, 0.3 s dead time then 8 m/s² → s_b = 25.6944 m, s_e = 56.0764 m, d_m = 8.0000.
        Assert.Equal(8.0000, BrakingFormulas.Mfdd(100, 25.6944, 56.0764), 3);
    }

    [Fact]
    public void MeanDecelerationIsTheConstantDecelerationIdentity()
    {
        // Kinematics: stopping from v at constant a covers v²/2a, so v²/2d returns a.
        double v = 30, a = 9.1;
        Assert.Equal(a, BrakingFormulas.MeanDecelerationMps2(v, v * v / (2 * a)), 12);
    }

    [Fact]
    public void SpeedCorrectionToNominal()
    {
        // Common practice (v_nom/v_act)² scaling; shared REFERENCES.md: 38.0 m from 101.5 km/h → 36.885 m at 100 km/h.
        Assert.Equal(36.885, BrakingFormulas.CorrectToNominalSpeed(38.0, 101.5 / 3.6, 100 / 3.6), 3);
    }

    [Fact]
    public void HundredFeetFromSixtyIsAboutOnePointTwoG()
    {
        // Shared REFERENCES.md, kinematics: from 60 mph, 100 ft of stopping → 1.2035 g, bound 2.2727 s.
        double d = 100 * 0.3048;
        Assert.Equal(1.2035, BrakingFormulas.MeanDecelerationMps2(Mps60Mph, d) / G0, 4);
        Assert.Equal(2.2727, BrakingFormulas.TractionBound0To60FromStopS(d), 4);
        Assert.Equal(2.2727, BrakingFormulas.TractionBoundS(Mps60Mph, BrakingFormulas.MeanDecelerationMps2(Mps60Mph, d)), 4);
    }

    [Fact]
    public void EightySevenFeetFromSixtyIsAboutOnePointThreeEightG()
    {
        // Common practice: a stop of about 87 ft from 60 mph is about 1.38 g and a bound just under 2 s.
        double d = 87 * 0.3048;
        Assert.Equal(1.38, BrakingFormulas.MeanDecelerationMps2(Mps60Mph, d) / G0, 2);
        double bound = BrakingFormulas.TractionBound0To60FromStopS(d);
        Assert.InRange(bound, 1.95, 2.0);
    }
}
