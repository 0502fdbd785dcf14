using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>Stops from cruise whose pickup tyre slips while braked (<see cref="BrakeSlip"/>): the
/// pulses count the stop short by v0²/(2·g0·C) (Pacejka, "Tire and Vehicle Dynamics", ch. 1,
/// linear range), and the decoder, which does not know C, adds the shortfall a car tyre's
/// C 15–30 leads it to expect and states the rest in σ.</summary>
public class BrakeSlipStopTests
{
    [Theory]
    [InlineData(15.0, 70.0, 0.9)]
    [InlineData(21.64, 60.0, 0.8)]
    [InlineData(30.0, 45.0, 0.6)]
    [InlineData(18.0, 80.0, 1.0)]
    public void The_stopping_distance_from_a_slipping_braked_wheel_holds_the_truth_within_its_sigma(double stiffness, double mph, double g)
    {
        PrescribedRecordSpec spec = Records.Standing(3) with
        {
            Shape = PrescribedShapes.CruiseThenStop(mph * TruthUnits.MpsPerMph, 0.2, g * TruthUnits.StandardGravity),
            Pickup = new WheelPickup(48, TyreModel.Calibrated(1.9), 0.3, Brake: new BrakeSlip(stiffness)),
        };
        PrescribedRecord r = spec.Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthStop truth = Assert.Single(r.Truth).Stop!;
        double v0 = mph * TruthUnits.MpsPerMph;
        double shortfall = v0 * v0 / (2 * TruthUnits.StandardGravity * stiffness);
        double error = a.Braking!.StoppingDistanceM.Value - truth.StoppingDistanceM;
        double sigma = a.Braking.StoppingDistanceM.Sigma;
        string what = $"{spec}, C {stiffness}: stop {truth.StoppingDistanceM:F2} m, pulses short by {shortfall:F2} m, error {error:F3} m, σ {sigma:F3} m, added {a.Braking.BrakeSlipCorrectionM:F3} m";

        // The range's ends lie 1.4σ (C 30) and 2.2σ (C 15) of 1/C from its mean: within 3σ.
        Assert.True(Math.Abs(error) <= 3 * sigma, what);

        // What is added is v0²/(2·g0) times the mean of 1/C over 15–30, ln 2 / 15 (within the
        // onset's few centimetres); a tyre of C 21.64 is where that mean lies, and there the
        // stop comes out as well as from a wheel that does not slip (0.3 m, the bench's goal).
        Assert.Equal(v0 * v0 / (2 * TruthUnits.StandardGravity) * Math.Log(2) / 15, a.Braking.BrakeSlipCorrectionM, 0.05 * a.Braking.BrakeSlipCorrectionM);
        if (stiffness == 21.64)
        {
            Assert.True(Math.Abs(error) <= 0.3, what);
        }

        // And the MFDD is the car's (the shape's steady deceleration) to within 1 %, where the
        // wheel's own reads it (1 − s) low, s = g/C: 3–6 %.
        Assert.Equal(g * TruthUnits.StandardGravity, a.Braking.MfddMps2!.Value, 0.01 * g * TruthUnits.StandardGravity + (g * TruthUnits.StandardGravity * Math.Abs((g / stiffness) - (g * Math.Log(2) / 15))));
    }
}
