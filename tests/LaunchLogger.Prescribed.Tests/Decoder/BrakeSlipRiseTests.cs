using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>The braked wheel's slip as the fusion measures it, against the generator's tyre
/// (<see cref="BrakeSlip"/>: the pulses count the road's distance times 1 − a/(g0·C); Pacejka,
/// "Tire and Vehicle Dynamics", ch. 1, linear range, C 15–30 for car tyres from memory), on
/// stops from cruise whose brakes come on within 0.05 s and over up to 2 s, with an
/// accelerometer 1.2 % off in scale either way. The truth 1/(g0·C) is the generator's, not the
/// decoder's: the slip is measured from the pulses falling behind the accelerometer.</summary>
public class BrakeSlipRiseTests
{
    /// <summary>Seed (the ring, accelerometer, speed and deceleration drawn from it), brake
    /// rise time, C, the accelerometer's scale error.</summary>
    public static TheoryData<int, double, double, double> Cases => new()
    {
        { 2, 0.05, 15, 0.012 },
        { 9, 0.2, 22, -0.012 },
        { 17, 0.5, 30, -0.012 },
        { 21, 1.0, 22, -0.012 },
        { 22, 1.0, 22, 0.012 },
        { 26, 2.0, 15, 0.012 },
        { 28, 2.0, 22, 0.012 },
        { 29, 2.0, 30, -0.012 },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void The_fused_brake_slip_is_the_tyre_s_and_the_stop_takes_it(int seed, double riseS, double stiffness, double scaleError)
    {
        double mph = 30 + (seed * 37 % 50);
        double g = 0.5 + (0.05 * (seed * 13 % 10));
        PrescribedRecordSpec spec = Records.Standing(seed) with
        {
            Shape = PrescribedShapes.CruiseThenStop(mph * TruthUnits.MpsPerMph, riseS, g * TruthUnits.StandardGravity),
            Pickup = new WheelPickup(new[] { 8, 12, 24, 48, 60, 100 }[seed % 6], TyreModel.Calibrated(1.9), 0.3, Brake: new BrakeSlip(stiffness)),
            Accel = Records.Standing(seed).Accel! with { ScaleError = scaleError },
        };
        PrescribedRecord r = spec.Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthStop truth = Assert.Single(r.Truth).Stop!;
        double kbTrue = 1 / (TruthUnits.StandardGravity * stiffness);
        Estimate kb = a.Reconstruction.BrakeSlipPerMps2!.Value;
        double error = a.Braking!.StoppingDistanceM.Value - truth.StoppingDistanceM;
        double sigma = a.Braking.StoppingDistanceM.Sigma;
        string what = FormattableString.Invariant($"{spec}, {spec.Pickup.Teeth} teeth, C {stiffness}: k_b {kb.Value / kbTrue:0.000} ± {kb.Sigma / kbTrue:0.000} of the tyre's; stop {truth.StoppingDistanceM:F2} m, error {error:+0.000;-0.000} m ± {sigma:0.000}, slip added {a.Braking.BrakeSlipCorrectionM:F3} m");

        // Before the brake windows opened at the rise's foot (and the accelerometer's scale was
        // one state), a 1-s rise gave 0.4 of the slip and a 2-s rise 0.1, at 15–50σ. Within 3σ,
        // or 2 % where σ is smaller (the braked wheel's own speed in the slip's signal is put
        // back with the prior's mean slip, a per cent or so off for a tyre at the range's ends).
        Assert.True(Math.Abs(kb.Value - kbTrue) <= 3 * kb.Sigma || Math.Abs(kb.Value - kbTrue) <= 0.02 * kbTrue, what);
        Assert.True(Math.Abs(kb.Value - kbTrue) <= 0.1 * kbTrue, what);

        // The stop takes the measured slip: within the goal's 0.3 m whatever the tyre (the
        // prior's mean alone left C 15 and C 30 short and long by up to 0.8 and 0.5 m from 60 mph).
        Assert.True(Math.Abs(error) <= 0.3, what);
        Assert.True(Math.Abs(error) <= 3 * sigma, what);
    }

    /// <summary>Seed (speed, deceleration or steady rise, accelerometer and the scale error's
    /// sign drawn from it), teeth, brake rise time (+∞: a steady rise through the stop), C, and
    /// whether the counter is polled (every 0.5 ms) rather than edges timed.</summary>
    public static TheoryData<int, int, double, double, bool> CoarseRingCases => new()
    {
        { 107, 8, 1.0, 15, true },
        { 112, 8, 2.0, 15, false },
        { 113, 8, 2.0, 15, true },
        { 114, 8, 2.0, 22, false },
        { 119, 8, double.PositiveInfinity, 15, true },
        { 122, 8, double.PositiveInfinity, 30, false },
        { 130, 12, 1.0, 15, false },
        { 136, 12, 2.0, 15, false },
        { 142, 12, double.PositiveInfinity, 15, false },
    };

    [Theory]
    [MemberData(nameof(CoarseRingCases))]
    public void On_coarse_rings_slow_and_steady_rises_give_the_tyre_s_slip_too(int seed, int teeth, double riseS, double stiffness, bool polled)
    {
        double mph = 30 + (seed * 37 % 50);
        double decel = double.IsPositiveInfinity(riseS) ? 3 + (seed % 5) : (0.5 + (0.05 * (seed * 13 % 10))) * TruthUnits.StandardGravity;
        PrescribedRecordSpec spec = Records.Standing(seed) with
        {
            Shape = PrescribedShapes.CruiseThenStop(mph * TruthUnits.MpsPerMph, riseS, decel),
            Pickup = new WheelPickup(teeth, TyreModel.Calibrated(1.9), 0.3, Brake: new BrakeSlip(stiffness)),
            Accel = Records.Standing(seed).Accel! with { ScaleError = seed % 2 == 0 ? 0.012 : -0.012 },
            Polled = polled ? new PolledCounter(0.0005, 0.1, 1, 5e-3) : null,
        };
        PrescribedRecord r = spec.Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthStop truth = Assert.Single(r.Truth).Stop!;
        double kbTrue = 1 / (TruthUnits.StandardGravity * stiffness);
        Estimate kb = a.Reconstruction.BrakeSlipPerMps2!.Value;
        // The braked wheel misses v0²/(2·g0·C) of a whole stop from v0, whatever the
        // deceleration's shape (the generator's tyre, BrakeSlip's remarks).
        double shortfall = truth.OnsetSpeedMps * truth.OnsetSpeedMps / (2 * TruthUnits.StandardGravity * stiffness);
        double error = a.Braking!.StoppingDistanceM.Value - truth.StoppingDistanceM;
        double sigma = a.Braking.StoppingDistanceM.Sigma;
        string what = FormattableString.Invariant($"{spec}, {teeth} teeth{(polled ? ", polled" : "")}, C {stiffness}: k_b {kb.Value / kbTrue:0.000} ± {kb.Sigma / kbTrue:0.000} of the tyre's; slip added {a.Braking.BrakeSlipCorrectionM:F3} m of {shortfall:F3} m; stop error {error:+0.000;-0.000} m ± {sigma:0.000}");

        // Before the slip signal carried the car's speed down to the stop, the last metres of a
        // stop on a coarse ring (too few pulses within a period window for a speed: below
        // 3–5 m/s on 8–12 teeth) counted no slip, and these read 0.38–0.65 of the tyre's at 4–14σ.
        Assert.True(Math.Abs(kb.Value - kbTrue) <= 3 * kb.Sigma || Math.Abs(kb.Value - kbTrue) <= 0.02 * kbTrue, what);
        Assert.True(Math.Abs(kb.Value - kbTrue) <= 0.1 * kbTrue, what);
        Assert.Equal(shortfall, a.Braking.BrakeSlipCorrectionM, 0.1 * shortfall);
        Assert.True(Math.Abs(error) <= 3 * sigma, what);
    }
}
