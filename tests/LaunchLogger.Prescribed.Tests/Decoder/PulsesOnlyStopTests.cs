using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>A stop from cruise seen by pulses alone: the onset is read off a trajectory the
/// pulses resolve only as finely as their positions are known, and its σ must say so. On a wheel
/// whose tyre slips as the brakes come on (<see cref="BrakeSlip"/>): as the deceleration D builds
/// at a rate J, the slip s = κ·D builds with it, so the wheel's speed v·(1 − s) falls faster than
/// the car's by v·κ·J for as long as the rise lasts, and the wheel's deceleration steps up at the
/// onset before it ramps. Read as a plain rise, that step pulls the onset early.</summary>
public class PulsesOnlyStopTests
{
    [Theory]
    [InlineData(48, null)]
    [InlineData(16, 2e-3)]
    [InlineData(16, 7.5e-3)]
    public void The_onset_from_pulses_alone_lies_within_its_stated_three_sigma(int teeth, double? pollS)
    {
        PrescribedRecordSpec spec = PulsesOnly(Records.Standing(5), PrescribedShapes.CruiseThenStop(60 * TruthUnits.MpsPerMph, 0.2, 0.8 * TruthUnits.StandardGravity), new WheelPickup(teeth, TyreModel.Calibrated(1.9)), pollS);

        // Before the smoothing term the polled 16-tooth case's σ was a tenth of its error (the
        // simulator's pulses-only stops: 106 ms early at σ 11 ms).
        (double error, double sigma) = OnsetError(spec);
        Assert.True(Math.Abs(error) <= 3 * sigma, $"{spec}: onset error {error * 1e3:F1} ms, σ {sigma * 1e3:F1} ms");
    }

    [Theory]
    [InlineData(48, null, 6.0)]
    [InlineData(16, null, 6.0)]
    [InlineData(36, 1e-3, 25.0)]
    public void The_onset_from_a_slipping_wheel_is_not_early(int teeth, double? pollS, double meanBoundMs)
    {
        // Cruise at 45 m/s, a 0.2 s rise to 0.5 g (the generator's kinematics), the pickup's tyre
        // C 15–30 on a front or a rear wheel of a front-biased car; pulses only. With a rigid
        // wheel such records' onsets average −0.2 ms (48 teeth, edges) and +1.4 ms (16 teeth),
        // and lie −8 to +29 ms from the truth polled every 1 ms on 36 teeth (the bound on the
        // mean is that spread); with the slip they averaged −17, −26 and −53 ms before the step
        // was fitted (now within 1, 2 and 20 ms).
        double[] stiffness = [15, 20, 25, 30, 17.5, 27.5];
        var errors = new List<double>();
        var lines = new List<string>();
        for (int i = 0; i < stiffness.Length; i++)
        {
            BrakedAxle axle = i % 2 == 0 ? BrakedAxle.Rear(0.68, 0.49, 0.163) : BrakedAxle.Front(0.68, 0.49, 0.163);
            PrescribedRecordSpec spec = PulsesOnly(
                Records.Standing(i + 1),
                PrescribedShapes.CruiseThenStop(45, 0.2, 0.5 * TruthUnits.StandardGravity, cruiseS: 3 + (0.013 * i)),
                new WheelPickup(teeth, TyreModel.Calibrated(2.1), 0.15 * i, Brake: new BrakeSlip(stiffness[i], axle)),
                pollS);
            (double error, double sigma) = OnsetError(spec);
            errors.Add(error);
            string what = FormattableString.Invariant($"C {stiffness[i]}, {(i % 2 == 0 ? "rear" : "front")}: onset {error * 1e3:+0.0;-0.0} ms, σ {sigma * 1e3:0.0} ms");
            lines.Add(what);
            Assert.True(Math.Abs(error) <= 2 * sigma, what);
        }

        // No one-sided lead: the mean within what a rigid wheel's onsets spread over.
        Assert.True(Math.Abs(errors.Average()) <= meanBoundMs * 1e-3, string.Join("; ", lines));
    }

    /// <summary><paramref name="record"/> with the shape and pickup given, pulses only, polled
    /// every <paramref name="pollS"/> (with 0.1 of it as jitter) or edge-timed.</summary>
    private static PrescribedRecordSpec PulsesOnly(PrescribedRecordSpec record, Shape shape, WheelPickup pickup, double? pollS) => record with
    {
        Shape = shape,
        Pickup = pickup,
        Polled = pollS is { } p ? new PolledCounter(p, 0.1) : null,
        Accel = null,
    };

    /// <summary>The stop's onset as decoded from the record's text files, less the truth, and its σ, s.</summary>
    private static (double Error, double Sigma) OnsetError(PrescribedRecordSpec spec)
    {
        PrescribedRecord r = spec.Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthStop truth = Assert.Single(r.Truth).Stop!;
        return (a.Braking!.OnsetS.Value - truth.OnsetS, a.Braking.OnsetS.Sigma);
    }
}

