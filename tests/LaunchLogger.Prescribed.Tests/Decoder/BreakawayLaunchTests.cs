using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Prescribed.Motion;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>A launch whose driven tyres break away, seen by pulses alone on an undriven wheel:
/// first motion rests on the kinematic model, and the launch is outside its family of ramps.</summary>
public class BreakawayLaunchTests
{
    // Seed (the wheel's spin-up lag, tyre and edge noise), teeth, the pickup's phase: the first
    // five were beyond 2σ before the ramp length's likelihood was tempered.
    public static TheoryData<int, int, double> Cases => new()
    {
        { 1, 80, 0.1875 }, { 8, 100, 0.0625 }, { 16, 80, 0.0625 }, { 17, 100, 0.1875 }, { 32, 100, 0.0625 },
        { 5, 100, 0.6875 }, { 12, 60, 0.5625 }, { 24, 60, 0.0625 }, { 40, 80, 0.0625 }, { 50, 100, 0.3125 },
    };

    /// <summary>The acceleration peaks at 4.6 m/s² 0.06 s after the start, sags, falls to 1.4 m/s²
    /// at 0.12 s as the tyres let go, and hunts about 3.75 m/s² at 7 Hz (traction control) while
    /// the swing dies away; then a pull falling off toward 1 m/s².</summary>
    public static Shape Breakaway()
    {
        var times = new List<double>();
        var accels = new List<double>();
        for (int i = 0; i <= 200; i++)
        {
            double t = 0.005 * i;
            double a = t < 0.06 ? 4.6 * t / 0.06
                : t < 0.11 ? 4.6 - (1.1 * (t - 0.06) / 0.05)
                : t < 0.12 ? 3.5 - (2.1 * (t - 0.11) / 0.01)
                : 3.75 - (2.35 * Math.Cos(2 * Math.PI * 7 * (t - 0.12)) * Math.Exp(-(t - 0.12) / 0.8));
            times.Add(t);
            accels.Add(a);
        }

        var b = new MotionProfileBuilder().Hold(PrescribedShapes.IdleS).Then(new TabulatedSegment(times, accels)).Exponential(9, 3.75, 1.0, 6);
        b.Hold(0.5).BrakeToStop(0.3, 8).Hold(PrescribedShapes.RestAfterS);
        return new Shape("launch with the tyres breaking away", ShapeKind.StandingStart, b.Build());
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void First_motion_and_the_rollout_after_it_lie_within_two_sigma(int seed, int teeth, double phase)
    {
        // Before the ramp length's likelihood was tempered, seed 8 put first motion 76.3 ms early
        // at σ 25.8 ms (2.95σ): the breakaway's dip made the pulses look like the longest ramps,
        // and those alone were averaged.
        PrescribedRecordSpec spec = Records.Standing(seed, spinUp: true) with { Accel = null, Shape = Breakaway() };
        spec = spec with { Pickup = spec.Pickup with { Teeth = teeth, PhaseFraction = phase } };
        PrescribedRecord r = spec.Generate();
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthRun t = Assert.Single(r.Truth);

        double error = a.Figures.FirstMotionS.Value - t.FirstMotionS!.Value;
        double sigma = a.Figures.FirstMotionS.Sigma;
        Assert.True(Math.Abs(error) <= 2 * sigma, $"{spec}: first motion error {error * 1e3:F1} ms, σ {sigma * 1e3:F1} ms ({error / sigma:F2}σ)");

        RolloutReport rollout = RunReportBuilder.Build(a).Rollout;
        double afterError = rollout.AfterFirstMotionS!.Value - (t.RolloutS!.Value - t.FirstMotionS!.Value);
        double afterSigma = rollout.AfterFirstMotionUncertaintyS!.Value;
        Assert.True(Math.Abs(afterError) <= 2 * afterSigma, $"{spec}: rollout after first motion error {afterError * 1e3:F1} ms, σ {afterSigma * 1e3:F1} ms ({afterError / afterSigma:F2}σ)");
    }
}
