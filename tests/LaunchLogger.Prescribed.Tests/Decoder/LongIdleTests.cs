using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>A minute at rest before the launch, with an accelerometer whose clock runs
/// 100 ppm fast or slow against the box's. In a plain-text file nothing ties its times to the
/// pulses' clock, so by the launch its onset has slid by drift × elapsed time (6 ms): the decoder
/// matches the accelerometer's clock to the pulses' over the launch and takes the slide out, and
/// first motion's σ carries what that match leaves (the wheel lags the road as it is spun up,
/// <see cref="Sensors.SpinUpLag"/>, which the match allows for). A log ties the samples to the box's clock through its burst read
/// times, so there the goal (5 ms) holds.</summary>
public class LongIdleTests
{
    public static TheoryData<int, double> Cases => new() { { 1, -100 }, { 2, 100 }, { 3, -100 }, { 4, 100 }, { 8, -100 }, { 9, 100 } };

    [Theory]
    [MemberData(nameof(Cases))]
    public void First_motion_from_files_lies_within_three_sigma_of_the_truth(int seed, double driftPpm)
    {
        PrescribedRecord r = Record(seed, driftPpm);
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthRun t = Assert.Single(r.Truth);
        FigureCheck check = new("first motion", a.Figures.FirstMotionS.Value, a.Figures.FirstMotionS.Sigma, t.FirstMotionS!.Value, double.PositiveInfinity, 2e-4);
        Assert.True(check.Failure is null, $"{r.Spec}: {check.Failure}");

        // The drift alone is 6 ms; σ must not be so wide as to mean nothing (under 3× that).
        Assert.True(a.Figures.FirstMotionS.Sigma < 18e-3, $"{r.Spec}: σ {a.Figures.FirstMotionS.Sigma * 1e3:F1} ms");
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void The_accelerometer_clock_is_matched_to_the_pulses_so_first_motion_from_files_loses_the_slide(int seed, double driftPpm)
    {
        PrescribedRecord r = Record(seed, driftPpm);
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        TruthRun t = Assert.Single(r.Truth);

        // The slide is drift × 60 s = 6 ms; matched, first motion errs by 0.03–1.43 ms on these
        // records (measured; 0.4–2.4 ms while the match read the pitch-compensated input), so
        // 2 ms is a third of the slide and above the worst of them.
        double error = a.Figures.FirstMotionS.Value - t.FirstMotionS!.Value;
        Assert.True(Math.Abs(error) < 2e-3, $"{r.Spec}: first motion off by {error * 1e3:F2} ms");
        Assert.Contains(a.Reconstruction.Warnings, w => w.Contains("clock was matched", StringComparison.Ordinal));
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void First_motion_from_logs_keeps_the_goal(int seed, double driftPpm)
    {
        PrescribedRecord r = Record(seed, driftPpm);
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeLog(r).Runs);
        TruthRun t = Assert.Single(r.Truth);

        // Goal of issue 9: first motion within 5 ms; and within 3σ.
        FigureCheck check = new("first motion", a.Figures.FirstMotionS.Value, a.Figures.FirstMotionS.Sigma, t.FirstMotionS!.Value, 5e-3, 2e-4);
        Assert.True(check.Failure is null, $"{r.Spec}: {check.Failure}");
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void The_brake_onset_from_files_is_timed_on_the_matched_clock(int seed, double driftPpm)
    {
        PrescribedRecord r = Record(seed, driftPpm);
        RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
        RunAnalysis steady = Assert.Single(DecoderHarness.AnalyzeText(Record(seed, 0)).Runs);
        TruthStop stop = Assert.Single(r.Truth).Stop!;

        // The stop is timed on the accelerometer's own samples. Read on their clock as the file
        // gave it, the onset moved with the slide the launch's match takes out (drift × 60 s and
        // more: 6–7 ms) against the same record from an accelerometer whose clock keeps time. On
        // the matched clock what is left is the drift since the launch, drift × (onset − first
        // motion), 1.2–1.7 ms here, and the two matches' own errors (σ 0.4–0.6 ms each; within
        // 0.35 ms of that on these records, measured): 1 ms.
        double error = a.Braking!.OnsetS.Value - stop.OnsetS;
        double moved = a.Braking.OnsetS.Value - steady.Braking!.OnsetS.Value;
        double sinceLaunch = driftPpm * 1e-6 * (stop.OnsetS - Assert.Single(r.Truth).FirstMotionS!.Value);
        Assert.True(Math.Abs(moved - sinceLaunch) < 1e-3, $"{r.Spec}: brake onset {moved * 1e3:+0.00;-0.00} ms from the steady clock's, {sinceLaunch * 1e3:+0.00;-0.00} ms of drift since the launch");
        Assert.True(Math.Abs(error) <= 3 * a.Braking.OnsetS.Sigma, $"{r.Spec}: brake onset off by {error * 1e3:+0.00;-0.00} ms, σ {a.Braking.OnsetS.Sigma * 1e3:F2} ms");
    }

    private static PrescribedRecord Record(int seed, double driftPpm)
    {
        PrescribedRecordSpec spec = Records.Standing(seed, spinUp: true) with { Shape = PrescribedShapes.LongIdle(new Random(seed)) };
        return (spec with { Accel = spec.Accel! with { ClockDriftPpm = driftPpm } }).Generate();
    }
}
