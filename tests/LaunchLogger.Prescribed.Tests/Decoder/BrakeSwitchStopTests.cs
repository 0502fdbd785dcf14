using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>Stops from cruise written as logs by the firmware core with a brake switch: the
/// switch closes a seeded 0–30 ms after the pedal starts to move, the loop that reads it runs
/// every 0.1–10 ms (stalling 20 ms about once a second) or every millisecond beside exact edges,
/// and the decoder is told neither the delay nor the loop. The truth is the generator's.</summary>
public class BrakeSwitchStopTests
{
    private const int Stops = 20;

    [Fact]
    public void Onset_and_stopping_distance_from_the_switch_lie_within_their_sigma()
    {
        var random = new Random(20261203);
        int onsetWithin2 = 0, distanceWithin2 = 0;
        var lines = new List<string>();
        for (int i = 0; i < Stops; i++)
        {
            double speed = 13 + (22 * random.NextDouble());
            double rise = 0.05 + (1.95 * random.NextDouble());
            double decel = 9.80665 * (0.5 + (0.5 * random.NextDouble()));
            double delay = 0.030 * random.NextDouble();
            bool polled = i % 3 != 2;
            double period = 1e-4 * Math.Pow(100, random.NextDouble());
            PrescribedRecordSpec spec = Records.Standing(i + 1) with
            {
                Shape = PrescribedShapes.CruiseThenStop(speed, rise, decel, cruiseS: 2 + random.NextDouble()),
                Polled = polled ? new PolledCounter(period, 0.1, 1, 0.020) : null,
                BrakeSwitchDelayS = delay,
            };
            PrescribedRecord record = spec.Generate();
            RunAnalysis run = Assert.Single(DecoderHarness.AnalyzeLog(record).Runs);
            TruthStop truth = Assert.Single(record.Truth).Stop!;
            BrakingResult braking = run.Braking!;
            Assert.StartsWith(BrakingAnalyzer.SwitchMethod, braking.OnsetMethod, StringComparison.Ordinal);

            double onsetZ = (braking.OnsetS.Value - truth.OnsetS) / braking.OnsetS.Sigma;
            double distanceZ = (braking.StoppingDistanceM.Value - truth.StoppingDistanceM) / braking.StoppingDistanceM.Sigma;
            string what = FormattableString.Invariant($"{spec}, delay {delay * 1e3:0.0} ms: onset {(braking.OnsetS.Value - truth.OnsetS) * 1e3:+0.0;-0.0} ms ({onsetZ:+0.0;-0.0}σ), distance {braking.StoppingDistanceM.Value - truth.StoppingDistanceM:+0.000;-0.000} m ({distanceZ:+0.0;-0.0}σ)");
            lines.Add(what);

            // Every stop within ±3σ, and ±2σ in at least 95 % of them (the coverage goal).
            Assert.True(Math.Abs(onsetZ) <= 3, what);
            Assert.True(Math.Abs(distanceZ) <= 3, what);
            onsetWithin2 += Math.Abs(onsetZ) <= 2 ? 1 : 0;
            distanceWithin2 += Math.Abs(distanceZ) <= 2 ? 1 : 0;
        }

        Assert.True(onsetWithin2 >= 0.95 * Stops, string.Join("\n", lines));
        Assert.True(distanceWithin2 >= 0.95 * Stops, string.Join("\n", lines));
    }

    [Fact]
    public void A_measured_delay_is_used_in_place_of_the_prior()
    {
        PrescribedRecordSpec spec = Records.Standing(3) with
        {
            Shape = PrescribedShapes.CruiseThenStop(25, 0.2, 8),
            Polled = new PolledCounter(1e-3, 0.1),
            BrakeSwitchDelayS = 0.004,
        };
        PrescribedRecord record = spec.Generate();
        TruthStop truth = Assert.Single(record.Truth).Stop!;
        Decoding.Runs.DecodedRun log = Assert.Single(Decoding.Runs.LogReader.Read(record.ToLog(), "switch").Runs);

        BrakingResult measured = RunAnalyzer.Analyze(log, new AnalysisOptions { BrakeSwitchDelayS = 0.004, BrakeSwitchDelaySigmaS = 0.0005 }).Braking!;

        // The same delay saved with the car's settings (report --settings) times the stop alike.
        var saved = new CalibrationSettings { BrakeSwitchDelayS = 0.004, BrakeSwitchDelaySigmaS = 0.0005 };
        BrakingResult fromSettings = RunAnalyzer.Analyze(log, new AnalysisOptions { Calibration = saved }).Braking!;
        Assert.Equal(measured.OnsetS, fromSettings.OnsetS);
        Assert.Equal(measured.StoppingDistanceM, fromSettings.StoppingDistanceM);

        // Told the delay, only the loop's 1 ms gap is left: uniform, σ = 1 ms / √12 (and 0.5 ms
        // for the measurement) — the truth lies within 3σ of that, about 1.7 ms. The switch
        // alone times it, though an accelerometer was logged.
        Assert.Equal(BrakingAnalyzer.SwitchMethod, measured.OnsetMethod);
        Assert.True(Math.Abs(measured.OnsetS.Value - truth.OnsetS) <= 3 * measured.OnsetS.Sigma, $"{measured.OnsetS} against {truth.OnsetS}");
        Assert.True(measured.OnsetS.Sigma < 0.001);

        // Not told, and without an accelerometer, the 0–30 ms prior is centred 15 ms: 11 ms
        // earlier than the truth here, inside its σ of 30 / √12 = 8.7 ms twice.
        PrescribedRecord pulsesOnly = (spec with { Accel = null }).Generate();
        Decoding.Runs.DecodedRun pulsesLog = Assert.Single(Decoding.Runs.LogReader.Read(pulsesOnly.ToLog(), "switch, no accelerometer").Runs);
        BrakingResult prior = RunAnalyzer.Analyze(pulsesLog).Braking!;
        Assert.Equal(BrakingAnalyzer.SwitchMethod, prior.OnsetMethod);
        Assert.Equal(BrakeSwitchTiming.DelayPrior.Sigma, prior.OnsetS.Sigma, 0.001);
        Assert.InRange(prior.OnsetS.Value - Assert.Single(pulsesOnly.Truth).Stop!.OnsetS, -0.015, -0.007);
    }

    /// <summary>Issue #9's stops from cruise with a switch whose 5–25 ms delay is not told, and
    /// an accelerometer: the switch leaves the onset a 30 ms window (σ 8.7 ms, 0.3 m at 35 m/s),
    /// the deceleration's rise measures it inside that window. Fast rises (0.05–0.3 s) and slow
    /// ones (0.5–2 s) alternate, from 30–40 m/s; the delays run evenly over 5–25 ms, so the ends
    /// of the range, where the prior's centre is 10 ms off, are there.</summary>
    [Fact]
    public void With_an_accelerometer_the_deceleration_places_the_onset_within_the_switch_s_window()
    {
        // Issue #9's goals: stopping distance within 0.3 m, onset within 15 ms for brake rises
        // up to 2 s. At 40 m/s the distance's goal leaves the onset 0.3 / 40 s = 7.5 ms.
        const double distanceGoalM = 0.3, onsetGoalS = 0.015, topMps = 40;
        var random = new Random(20261205);
        int within2 = 0, distanceWithin2 = 0, failed = 0;
        var lines = new List<string>();
        for (int i = 0; i < Stops; i++)
        {
            bool fast = i % 2 == 0;
            double speed = 30 + ((topMps - 30) * random.NextDouble());
            double rise = fast ? 0.05 + (0.25 * random.NextDouble()) : 0.5 + (1.5 * random.NextDouble());
            double decel = 9.80665 * (0.5 + (0.5 * random.NextDouble()));
            double delay = 0.005 + (0.020 * i / (Stops - 1));
            bool polled = i % 3 != 2;
            PrescribedRecordSpec spec = CruiseStop(i + 40, speed, rise, decel, delay, polled ? 100 : null, random);
            (BrakingResult braking, double onsetError, double distanceError, double z, double distanceZ) = Decode(spec);

            // Both used; every stop within 3σ; a quick rise meets the distance's goal, and so its
            // onset's share of it; a slow one the onset's goal.
            bool fine = braking.OnsetMethod == BrakingAnalyzer.FusedMethod
                && Math.Abs(z) <= 3 && Math.Abs(distanceZ) <= 3
                && (fast
                    ? Math.Abs(onsetError) <= distanceGoalM / topMps && Math.Abs(distanceError) <= distanceGoalM
                    : Math.Abs(onsetError) <= onsetGoalS);
            failed += fine ? 0 : 1;
            within2 += Math.Abs(z) <= 2 ? 1 : 0;
            distanceWithin2 += Math.Abs(distanceZ) <= 2 ? 1 : 0;
            lines.Add(Line(fine, spec, delay, braking, onsetError, distanceError));
        }

        string all = string.Join("\n", lines);
        Assert.True(failed == 0, all);
        Assert.True(within2 >= 0.95 * Stops, all);
        Assert.True(distanceWithin2 >= 0.95 * Stops, all);
    }

    /// <summary>Slow rises (0.5–2 s) and steady rises through the whole stop, the delay at either
    /// end of its 5–25 ms range, where the switch's window alone leaves the onset 10 ms off its
    /// centre. The generator's rises are straight, so the deceleration's fit finds their foot to a
    /// millisecond or two; an allowance for a real rise's shape that grows with the whole rise (1 %
    /// of it: 35 ms on a 3.5-s steady rise) left the fit wider than the switch's window, and these
    /// stops 10–12 ms and 0.3–0.5 m off (bench accuracy --seed 1 --calibrated-tyre, runs 402, 422,
    /// 426, 448).</summary>
    [Fact]
    public void On_slow_and_steady_rises_the_deceleration_still_narrows_the_switch_s_window()
    {
        // Issue #9's goal for the stops from cruise, 0.3 m, leaves the onset 0.3 / 40 s = 7.5 ms
        // at 40 m/s, as in the test above.
        const double distanceGoalM = 0.3, onsetGoalS = 0.0075;
        var random = new Random(20261206);
        int failed = 0;
        var lines = new List<string>();
        for (int i = 0; i < 12; i++)
        {
            bool steady = i % 3 == 0;
            double speed = 30 + (6 * random.NextDouble());
            double rise = steady ? double.PositiveInfinity : 0.5 + (1.5 * random.NextDouble());
            double decel = steady ? 3 + (5 * random.NextDouble()) : 9.80665 * (0.5 + (0.5 * random.NextDouble()));
            double delay = i % 2 == 0 ? 0.005 : 0.025;
            bool polled = i % 4 != 3;
            PrescribedRecordSpec spec = CruiseStop(i + 80, speed, rise, decel, delay, polled ? 10 : null, random);
            (BrakingResult braking, double onsetError, double distanceError, double z, double distanceZ) = Decode(spec);
            bool fine = braking.OnsetMethod == BrakingAnalyzer.FusedMethod
                && Math.Abs(z) <= 3 && Math.Abs(distanceZ) <= 3
                && Math.Abs(distanceError) <= distanceGoalM && Math.Abs(onsetError) <= onsetGoalS;
            failed += fine ? 0 : 1;
            lines.Add(Line(fine, spec, delay, braking, onsetError, distanceError));
        }

        Assert.True(failed == 0, string.Join("\n", lines));
    }

    /// <summary>A stop from a 2–3 s cruise with a switch of <paramref name="delay"/>, its loop polled
    /// every 0.1 ms to <paramref name="pollSpan"/> times that (stalling 20 ms about once a second),
    /// or beside exact edges when null; the cruise's length and the poll drawn from <paramref name="random"/>.</summary>
    private static PrescribedRecordSpec CruiseStop(int seed, double speed, double rise, double decel, double delay, double? pollSpan, Random random) => Records.Standing(seed) with
    {
        Shape = PrescribedShapes.CruiseThenStop(speed, rise, decel, cruiseS: 2 + random.NextDouble()),
        Polled = pollSpan is { } span ? new PolledCounter(1e-4 * Math.Pow(span, random.NextDouble()), 0.1, 1, 0.020) : null,
        BrakeSwitchDelayS = delay,
    };

    /// <summary>The record written as a log and decoded: its stop, the errors against the
    /// generator's truth, and those in units of their σ.</summary>
    private static (BrakingResult Braking, double OnsetError, double DistanceError, double Z, double DistanceZ) Decode(PrescribedRecordSpec spec)
    {
        PrescribedRecord record = spec.Generate();
        BrakingResult braking = Assert.Single(DecoderHarness.AnalyzeLog(record).Runs).Braking!;
        TruthStop truth = Assert.Single(record.Truth).Stop!;
        double onsetError = braking.OnsetS.Value - truth.OnsetS;
        double distanceError = braking.StoppingDistanceM.Value - truth.StoppingDistanceM;
        return (braking, onsetError, distanceError, onsetError / braking.OnsetS.Sigma, distanceError / braking.StoppingDistanceM.Sigma);
    }

    private static string Line(bool fine, PrescribedRecordSpec spec, double delay, BrakingResult braking, double onsetError, double distanceError) =>
        (fine ? "  " : "✗ ") + FormattableString.Invariant($"{spec}, delay {delay * 1e3:0.0} ms: {braking.OnsetMethod}, onset {onsetError * 1e3:+0.0;-0.0} ms (σ {braking.OnsetS.Sigma * 1e3:0.0} ms, {onsetError / braking.OnsetS.Sigma:+0.0;-0.0}σ), distance {distanceError:+0.000;-0.000} m ({distanceError / braking.StoppingDistanceM.Sigma:+0.0;-0.0}σ)");
}
