using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Braking;
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
            Assert.Equal("brake switch", braking.OnsetMethod);

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
        BrakingResult prior = RunAnalyzer.Analyze(log).Braking!;

        // Told the delay, only the loop's 1 ms gap is left: uniform, σ = 1 ms / √12 (and 0.5 ms
        // for the measurement) — the truth lies within 3σ of that, about 1.7 ms.
        Assert.True(Math.Abs(measured.OnsetS.Value - truth.OnsetS) <= 3 * measured.OnsetS.Sigma, $"{measured.OnsetS} against {truth.OnsetS}");
        Assert.True(measured.OnsetS.Sigma < 0.001);

        // Not told, the 0–30 ms prior is centred 15 ms: 11 ms earlier than the truth here, inside
        // its σ of 30 / √12 = 8.7 ms twice.
        Assert.Equal(BrakeSwitchTiming.DelayPrior.Sigma, prior.OnsetS.Sigma, 0.001);
        Assert.InRange(prior.OnsetS.Value - truth.OnsetS, -0.015, -0.007);
    }
}
