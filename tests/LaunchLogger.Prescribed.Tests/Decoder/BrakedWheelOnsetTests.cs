using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>Brake onset from pulses alone on a wheel whose tyre slips as the brakes come on
/// (<see cref="BrakeSlip"/>): as the deceleration D builds at a rate J, the slip s = κ·D builds
/// with it, so the wheel's speed v·(1 − s) falls faster than the car's by v·κ·J for as long as
/// the rise lasts, and the wheel's deceleration steps up at the onset before it ramps. Read as a
/// plain rise, that step pulls the onset early.</summary>
public class BrakedWheelOnsetTests
{
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
            PrescribedRecordSpec spec = Records.Standing(i + 1) with
            {
                Shape = PrescribedShapes.CruiseThenStop(45, 0.2, 0.5 * TruthUnits.StandardGravity, cruiseS: 3 + (0.013 * i)),
                Pickup = new WheelPickup(teeth, TyreModel.Calibrated(2.1), 0.15 * i, Brake: new BrakeSlip(stiffness[i], axle)),
                Polled = pollS is { } p ? new PolledCounter(p, 0.1) : null,
                Accel = null,
            };
            PrescribedRecord r = spec.Generate();
            RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
            TruthStop truth = Assert.Single(r.Truth).Stop!;
            double error = a.Braking!.OnsetS.Value - truth.OnsetS;
            errors.Add(error);
            string what = FormattableString.Invariant($"C {stiffness[i]}, {(i % 2 == 0 ? "rear" : "front")}: onset {error * 1e3:+0.0;-0.0} ms, σ {a.Braking.OnsetS.Sigma * 1e3:0.0} ms");
            lines.Add(what);
            Assert.True(Math.Abs(error) <= 2 * a.Braking.OnsetS.Sigma, what);
        }

        // No one-sided lead: the mean within what a rigid wheel's onsets spread over.
        Assert.True(Math.Abs(errors.Average()) <= meanBoundMs * 1e-3, string.Join("; ", lines));
    }
}
