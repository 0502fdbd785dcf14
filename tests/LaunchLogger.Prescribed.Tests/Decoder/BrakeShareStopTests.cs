using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>Pulses-only stops whose pickup tyre works at its own axle's force over load, not at
/// the car's deceleration (<see cref="BrakedAxle"/>): under a front-biased split a rear tyre
/// slips less than the car's deceleration would make it, a front one more. The decoder is not
/// told the axle, so its slip prior must cover both.</summary>
public class BrakeShareStopTests
{
    /// <summary>An invented all-wheel-drive saloon: 68 % of the brake force on the front axle,
    /// 49 % of the weight on it at rest, centre of mass 0.48 m high on a 2.95 m wheelbase.</summary>
    private const double FrontBias = 0.68, FrontWeight = 0.49, HeightOverWheelbase = 0.48 / 2.95;

    [Theory]
    // The wheel's slip per unit of the car's deceleration over g0, share/C, against the prior's
    // (share uniform 0.6–1.3 and C uniform 15–30, independent: mean 0.0439, σ 0.0130): rear on
    // C 30 0.0249 (−1.5σ), rear on C 15 0.0498 (+0.5σ), front on C 30 0.0397 (−0.3σ), rear on
    // C 25 0.0299 (−1.1σ), front on C 18 0.0661 (+1.7σ): within 2σ of the prior, so within 2σ of
    // the decoder's σ; front on C 15 0.0793 (+2.7σ): within 3σ.
    [InlineData(false, 30.0, 1, 2)]
    [InlineData(false, 15.0, 2, 2)]
    [InlineData(true, 15.0, 3, 3)]
    [InlineData(true, 30.0, 4, 2)]
    [InlineData(false, 25.0, 5, 2)]
    [InlineData(true, 18.0, 6, 2)]
    public void A_pickup_on_either_axle_under_a_front_biased_split_stops_within_its_sigma(bool front, double stiffness, int seed, double sigmas)
    {
        // The brake switch times the onset (its delay drawn 0–30 ms and not told: about 9 ms σ),
        // so what is left of the error is the braked wheel's slip and the path.
        BrakedAxle axle = front
            ? BrakedAxle.Front(FrontBias, FrontWeight, HeightOverWheelbase)
            : BrakedAxle.Rear(FrontBias, FrontWeight, HeightOverWheelbase);
        double v0 = 45;
        double decel = 0.5 * TruthUnits.StandardGravity;
        PrescribedRecordSpec spec = Records.Standing(seed) with
        {
            Shape = PrescribedShapes.CruiseThenStop(v0, 0.2, decel),
            Pickup = new WheelPickup(48, TyreModel.Calibrated(2.1), 0.1 * seed, Brake: new BrakeSlip(stiffness, axle)),
            Accel = null,
            BrakeSwitchDelayS = 0.003 * seed,
        };
        PrescribedRecord record = spec.Generate();
        // The tyre told as a roll over a measured 100 m gives it (0.1 %), so the path's σ does not
        // hide the slip's.
        var told = new AnalysisOptions { Calibration = new CalibrationSettings { CircumferenceM = 2.1, CircumferenceSigmaM = 0.0021 } };
        RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeLog(record, told).Runs);
        TruthStop truth = Assert.Single(record.Truth).Stop!;
        BrakingResult braking = run.Braking!;
        Assert.Equal("brake switch", braking.OnsetMethod);
        double error = braking.StoppingDistanceM.Value - truth.StoppingDistanceM;
        double sigma = braking.StoppingDistanceM.Sigma;
        double share = axle.WorkAt(decel);
        string what = FormattableString.Invariant($"{(front ? "front" : "rear")} wheel (works at {share:0.000} of the car's deceleration), C {stiffness}: stop {truth.StoppingDistanceM:0.00} m, error {error:+0.000;-0.000} m, σ {sigma:0.000} m ({error / sigma:+0.0;-0.0}σ), added {braking.BrakeSlipCorrectionM:0.000} m");

        // Before the share was in the prior (every wheel taken to work at the car's deceleration,
        // ±20 % in 1/C), the rear wheel on C 30 read +2.2σ long and the front on C 15 −2.6σ short.
        Assert.True(Math.Abs(error) <= sigmas * sigma, what);

        // The shortfall added is the prior's mean: over a whole stop from v0, v0²/(2·g0) ×
        // E[share] × E[1/C], the mean share 0.95 and E[1/C] = ln 2 / 15 (to 2 %: the onset's
        // speed is the reconstruction's).
        double expected = v0 * v0 / (2 * TruthUnits.StandardGravity) * 0.95 * Math.Log(2) / 15;
        Assert.Equal(expected, braking.BrakeSlipCorrectionM, 0.02 * expected);
    }
}
