using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Tests.Metrics;

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

    // A stop whose deceleration changes part-way, worked by hand (kinematics: from v to u at a
    // constant a covers (v² − u²)/(2a)). From v0 = 100 km/h the brakes give 6 m/s² down to
    // 0.5·v0, then 9 m/s² to standstill. UN Regulation No. 13-H, Annex 3 (MFDD): v_b = 0.8·v0,
    // v_e = 0.1·v0, d_m = (v_b² − v_e²)/(25.92·(s_e − s_b)). By hand, with V = v0² in (m/s)²:
    //   s_b = (1 − 0.64)·V/12 = 0.03·V = 23.1481 m      (V = 27.7778² = 771.605)
    //   s_e − s_b = (0.64 − 0.25)·V/12 + (0.25 − 0.01)·V/18 = (11/240)·V = 35.3652 m
    //   d_m = (80² − 10²)/(25.92 × 35.3652) = 6300/916.667 = 6.8727 m/s²  (exactly 75.6/11).
    // Constant deceleration would return itself for any window; this one does not:
    //   window 0.9 → 0.1 gives 0.80/(2·(0.56/12 + 0.24/18)) = 6.6667 m/s²,
    //   window 0.8 → 0.2 gives 0.60/(2·(0.39/12 + 0.21/18)) = 6.7925 m/s².
    private const double TwoStageMfdd = 75.6 / 11;
    private const double TwoStageSbM = 23.1481;
    private const double TwoStageSeM = 23.1481 + 35.3652;

    [Fact]
    public void MfddFormulaOnAHandWorkedTwoStageStop()
    {
        // Window and formula of UN R13-H Annex 3, distances worked by hand above.
        Assert.Equal(TwoStageMfdd, BrakingFormulas.Mfdd(100, TwoStageSbM, TwoStageSeM), 3);
    }

    [Fact]
    public void MfddOfAMeasuredTwoStageStopUsesTheR13Window()
    {
        // The same stop as a sampled trajectory through the analyzer: it must find v_b and v_e at
        // 0.8·v0 and 0.1·v0 itself. Sampling every 0.5 ms costs under 0.001 m/s² here; the wrong
        // windows above miss by 0.08 m/s² or more.
        double v0 = 100 / 3.6;
        BrakingResult result = BrakingAnalyzer.Analyze(TwoStageStop(v0, brakeAtS: 1.0, firstMps2: 6, secondMps2: 9, changeAtFraction: 0.5), brakeSwitchOnS: [1.0])!;

        Assert.Equal(v0, result.FromMps, 6);
        Assert.InRange(result.MfddMps2!.Value, TwoStageMfdd - 0.005, TwoStageMfdd + 0.005);
        // Stopping distance by hand: (1 − 0.25)·V/12 + 0.25·V/18 = (0.0625 + 0.013889)·V = 58.9420 m.
        Assert.InRange(result.StoppingDistanceM.Value, 58.9420 - 0.005, 58.9420 + 0.005);
    }

    /// <summary>Cruise at <paramref name="v0"/> until <paramref name="brakeAtS"/>, then
    /// <paramref name="firstMps2"/> down to <paramref name="changeAtFraction"/>·v0, then
    /// <paramref name="secondMps2"/> to standstill and 1 s standing (<see cref="ClosedFormTrajectory.Stop"/>).</summary>
    private static Trajectory TwoStageStop(double v0, double brakeAtS, double firstMps2, double secondMps2, double changeAtFraction) =>
        ClosedFormTrajectory.Stop(v0, brakeAtS, [new StopPhase(firstMps2, 0, (1 - changeAtFraction) * v0 / firstMps2), new StopPhase(secondMps2, 0, 0)]);

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
