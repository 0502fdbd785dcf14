using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>Slow smooth take-ups (a raised cosine over 0.38 s, the generator's slowest third),
/// decoded whole from files, their first motion against the generator's own truth. The pulses'
/// back-extrapolation fitted such a rise with linear ramps and put it 40–120 ms late, at 2–3 of its
/// own σ (bench GeneratedStandingSmooth, seed 2, issue 9); the inverse-variance mean with the
/// accelerometer's onset took a few per cent of that, so the first motion of every slow take-up
/// came out late (the group's mean +3.5 ms over its 17 rises of 0.3 s and more, main 4696cad).
/// With the take-up family the accelerometer saw the pulses' start is unbiased to within its
/// prior over the rise time and its σ covers it.</summary>
public class SlowTakeUpFirstMotionTests
{
    private const double RiseS = 0.38;

    /// <summary>Ten seeds (8–100 teeth, 100–1600 Hz, the rise 0.38 s at 0.25–1.1 g): each first
    /// motion within the goal's 5 ms and ±3σ, and their mean error at most 1.75 ms. Main 4696cad:
    /// +0.9 to +4.4 ms, mean +2.07 ms (fails); the accelerometer's onset alone is late by about
    /// +1.5 ms on such rises (the onset fit's own share, ACCURACY-NOTES), so the mean cannot be
    /// asked much nearer zero by this change.</summary>
    [Fact]
    public void Slow_take_ups_are_not_pulled_late_by_the_pulses()
    {
        var errors = new List<double>();
        var failures = new List<string>();
        for (int seed = 1; seed <= 10; seed++)
        {
            PrescribedRecordSpec spec = Records.Standing(seed);
            PrescribedRecord r = (spec with { Shape = PrescribedShapes.StandingStart(new Random(seed), launchRiseS: RiseS, takeUp: LaunchTakeUp.RaisedCosine) }).Generate();
            RunAnalysis a = Assert.Single(DecoderHarness.AnalyzeText(r).Runs);
            TruthRun t = Assert.Single(r.Truth);
            FigureCheck check = new("first motion", a.Figures.FirstMotionS.Value, a.Figures.FirstMotionS.Sigma, t.FirstMotionS!.Value, 5e-3, 2e-4);
            errors.Add(check.Error!.Value);
            if (check.Failure is { } failure)
            {
                failures.Add($"seed {seed}: {failure}");
            }
        }

        Assert.Empty(failures);
        Assert.True(errors.Average() <= 1.75e-3, $"mean error {errors.Average() * 1e3:F2} ms: {string.Join(", ", errors.Select(e => (e * 1e3).ToString("F2", System.Globalization.CultureInfo.InvariantCulture)))}");
    }
}
