using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>Hard stops from cruise with a 100 Hz accelerometer: the deceleration rises steadily
/// through the whole stop and falls from about 2 g to nothing between two samples 10 ms apart.
/// The braked wheel's tyre slips by a/(g0·C) (<see cref="BrakeSlip"/>; Pacejka, "Tire and Vehicle
/// Dynamics", ch. 1, linear range), so the fusion fits that slip against the accelerometer and
/// holds the car at rest from the stop on. The stop search used to want three samples in the
/// 20 ms either side of the step, which 100 Hz never gives: the stop then came from the last
/// pulses' speed integrated on, a sample early or tens of milliseconds late, and the hold at rest
/// (or, with the step found, the input taken as linear across it, D·T/2 whatever the gap held)
/// left the speed the car lost inside the last gap — up to 0.1 m/s — for the braked slip to take:
/// 8–16 % low, 0.2–0.4 m short (bench seeds 1 and 3).</summary>
public class HundredHertzStopTests
{
    /// <summary>Speed, mph; the deceleration's rise, m/s³; the tyre's C; teeth; noise seed.
    /// 67–75 mph at 5–7.5 m/s³ ends at 18–23 m/s², near 2 g (v = J·t²/2, constant jerk).</summary>
    public static TheoryData<double, double, double, int, int> Stops => new()
    {
        { 71, 5.1, 19.4, 100, 1 },
        { 67, 7.0, 21.9, 24, 2 },
        { 74, 5.4, 18.5, 12, 3 },
        { 70, 6.2, 26.0, 48, 4 },
        { 68, 7.5, 16.0, 60, 5 },
    };

    [Theory]
    [MemberData(nameof(Stops))]
    public void The_stop_is_found_inside_its_sample_gap_and_the_braked_slip_is_the_tyre_s(double mph, double jerk, double stiffness, int teeth, int seed)
    {
        PrescribedRecordSpec spec = Records.Standing(seed) with
        {
            Shape = PrescribedShapes.CruiseThenStop(mph * TruthUnits.MpsPerMph, double.PositiveInfinity, jerk),
            Pickup = new WheelPickup(teeth, TyreModel.Calibrated(1.95), 0.1 * seed, Brake: new BrakeSlip(stiffness)),
            Accel = Records.Standing(seed).Accel! with { RateHz = 100 },
        };
        PrescribedRecord r = spec.Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthStop truth = Assert.Single(r.Truth).Stop!;
        double stop = Assert.IsType<double>(a.Reconstruction.StopS);
        double slip = a.Reconstruction.BrakeSlipPerMps2!.Value.Value;
        double trueSlip = 1 / (TruthUnits.StandardGravity * stiffness);
        double error = a.Braking!.StoppingDistanceM.Value - truth.StoppingDistanceM;
        string what = $"{spec}: stop {(stop - truth.StandstillS) * 1e3:+0.0;-0.0} ms from the truth, braked slip {((slip / trueSlip) - 1) * 100:+0.0;-0.0} % off the tyre's, stopping distance {error:+0.000;-0.000} m (σ {a.Braking.StoppingDistanceM.Sigma:F3} m)";

        // The deceleration holds until the car rests, then is nothing: the last sample still
        // braking and the first at rest bracket the truth, and the stop is placed mid-way, within
        // half a period (5 ms) — plus the accelerometer clock's match to the pulses (its drift,
        // up to 100 ppm here, is fitted over the record; 1 ms allowed).
        Assert.True(Math.Abs(stop - truth.StandstillS) <= 0.006, what);

        // The braked slip is the tyre's 1/(g0·C) (the wheel works at the car's deceleration) to
        // within 5 %: the pulses fall behind the accelerometer by ∫ v·a/(g0·C) dt, which a
        // 2-g stop from 70 mph makes half a metre or more, far above a pitch's tenths of a percent.
        Assert.True(Math.Abs((slip / trueSlip) - 1) <= 0.05, what);

        // The stop then carries none of the slip's error: within 0.15 m (issue 9's goal is
        // 0.3 m at p95) and within 3σ.
        Assert.True(Math.Abs(error) <= 0.15, what);
        Assert.True(Math.Abs(error) <= 3 * a.Braking.StoppingDistanceM.Sigma, what);
    }
}
