using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Run;

/// <summary>The still test against sample noise and engine vibration: a noisy sensor at its widest
/// bandwidth on an idling car must stage, and real motion must still end stillness and open the
/// run when it did on a quiet sensor.</summary>
/// <remarks>The noise: 294 µg/√Hz (a cheap MEMS part's density, the bench's widest) over the
/// Nyquist band of 1.6 kHz sampling, σ = 0.294 mg × √800 ≈ 8.3 mg per sample and axis (white noise
/// of density ρ sampled at f has σ = ρ·√(f/2): the sensor's datasheet convention, common
/// practice). Alone it spans about 6.4σ ≈ 53 mg of the 60 mg band over the 1 s hold, and a
/// window on samples restarts at an outlying one, from which the next second rarely stays inside:
/// such a box seldom stages. The engine: a 30 Hz vibration (a four-cylinder's firing at 900 rpm)
/// of 40 mg on z and 20 mg across. Every sample is rounded to whole mg as the sensor reports it.</remarks>
public class StillBandTests
{
    private const double HalfG = 0.5 * MotionProfile.G0;

    /// <summary>Noise per sample and axis, mg: 294 µg/√Hz over a 800 Hz Nyquist band.</summary>
    private static readonly double NoiseMilliG = 0.294 * Math.Sqrt(1600 / 2.0);

    private static LoggerSettings NoisyBox() => new() { AccelOutputDataRateMilliHz = 1_600_000 };

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    [InlineData(4)]
    [InlineData(5)]
    public void ANoisyIdlingCarStandingStillStagesAndItsLaunchIsTimedFromStandstill(int seed)
    {
        LoggerSettings settings = NoisyBox();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        const double launchS = 3.0;
        var run = new ScriptedRun(recorder, settings, MotionProfile.LaunchAndStop(launchS, HalfG, 4.0, HalfG))
        {
            AccelModifier = Shaker(seed, NoiseMilliG, 20, 20, 40),
        };

        // Staged by the first block end a hold after power-up (1.05 s), with a block to spare.
        run.RunUntil(1_100_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        run.RunUntil(2_990_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        Assert.Empty(sink.Bytes);

        run.RunUntil(3_200_000);
        IReadOnlyList<Frame> frames = sink.Frames;
        var config = Assert.IsType<ConfigurationFrame>(frames[0]);
        Assert.Equal(LogFormat.ConfigFlagStaged, config.Flags & LogFormat.ConfigFlagStaged);

        // The resting vector: thousands of samples, the noise and the vibration averaged out
        // (the noise to 8.3/√3000 ≈ 0.15 mg, a 30 Hz wave over seconds to < 0.2 mg).
        EventFrame staged = frames.SingleEvent(EventKind.Staged);
        Assert.InRange(staged.StagedX!.Value, -2, 2);
        Assert.InRange(staged.StagedY!.Value, -2, 2);
        Assert.InRange(staged.StagedZ!.Value, 998, 1002);
        Assert.True(staged.StagedSamples > 1000, $"{staged.StagedSamples} samples in the resting vector");

        // First motion from the accelerometer's onset, within two samples of the true launch
        // (the profile's step: 490 mg against 8 mg of noise).
        EventFrame motion = frames.SingleEvent(EventKind.Motion);
        Assert.Equal(MotionCause.AccelOnset, motion.Cause);
        Assert.InRange(motion.TimeMicros, (long)(launchS * 1e6) - 1250, (long)(launchS * 1e6) + 1250);
    }

    [Theory]
    [InlineData(0.03, 1)]
    [InlineData(0.03, 2)]
    [InlineData(0.08, 1)]
    [InlineData(0.08, 2)]
    public void ASlowRollFromStagedOpensTheRunWhenItDoesOnAQuietSensor(double creepG, int seed)
    {
        // A creep off the brakes at 3 s: 0.03 g stays under the 40 mg onset threshold, so the
        // first pulse opens the run (4.08 cm rolled, at 3 s + √(2 × 0.0408 / 0.294) ≈ 3.527 s);
        // 0.08 g passes it, so the onset does. The vibration here is across and vertical only:
        // the onset against a shake along the car is ForwardShakeOnsetTests' to judge.
        const double creepS = 3.0;
        MotionProfile creep = MotionProfile.Launch(creepS, creepG * MotionProfile.G0);
        (long quietMotion, MotionCause quietCause) = FirstMotion(creep, null);
        (long noisyMotion, MotionCause noisyCause) = FirstMotion(creep, Shaker(seed, NoiseMilliG, 0, 20, 40));

        Assert.Equal(quietCause, noisyCause);
        if (creepG < 0.04)
        {
            // The first edge, from the profile: its 1 µs bracket starts a microsecond before it.
            var settings = NoisyBox();
            double mpp = settings.CircumferenceMicrometres * 1e-6 / settings.PulsesPerRevolution;
            long edgeMicros = (long)Math.Ceiling(creep.TimeAtDistance(mpp) * 1e6);
            Assert.Equal(MotionCause.PulseCount, noisyCause);
            Assert.Equal(edgeMicros - 1, quietMotion);
            Assert.Equal(edgeMicros - 1, noisyMotion);
        }
        else
        {
            // Onset where the stretch of excess over the threshold begins: the creep's first sample
            // on the quiet sensor, within a few samples of it on the noisy one (78 mg against 8 mg).
            Assert.Equal(MotionCause.AccelOnset, noisyCause);
            Assert.InRange(quietMotion, (long)(creepS * 1e6), (long)(creepS * 1e6) + 625);
            Assert.InRange(noisyMotion - quietMotion, -3 * 625, 3 * 625);
        }
    }

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    public void SomeoneClimbingInRestartsTheHoldOnANoisySensor(int seed)
    {
        // The car sways: a 150 mg half-sine on z and 80 mg across, 0.4 s long (1.25 Hz), from
        // 0.6 s. Staging must wait a full hold after it, as on a quiet sensor.
        LoggerSettings settings = NoisyBox();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        Func<long, AccelSample, AccelSample> shake = Shaker(seed, NoiseMilliG, 20, 20, 40);
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(10.0, HalfG))
        {
            AccelModifier = (t, s) =>
            {
                AccelSample noisy = shake(t, s);
                double sway = t >= 600_000 && t <= 1_000_000 ? Math.Sin(Math.PI * (t - 600_000) / 400_000.0) : 0;
                return noisy with { Y = (short)(noisy.Y + Math.Round(80 * sway)), Z = (short)(noisy.Z + Math.Round(150 * sway)) };
            },
        };

        run.RunUntil(1_900_000);
        Assert.Equal(RunPhase.Idle, recorder.Phase);
        run.RunUntil(2_300_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);

        // The staging window opened in the sway's tail, once the block means settled.
        run.RunUntil(10_100_000);
        EventFrame staged = sink.Frames.SingleEvent(EventKind.Staged);
        Assert.InRange(staged.TimeMicros, 850_000, 1_200_000);
    }

    /// <summary>When and how the run opens on <paramref name="profile"/>, the samples changed by
    /// <paramref name="modifier"/> (none: a quiet sensor).</summary>
    private static (long Micros, MotionCause Cause) FirstMotion(MotionProfile profile, Func<long, AccelSample, AccelSample>? modifier)
    {
        LoggerSettings settings = NoisyBox();
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, profile) { AccelModifier = modifier };
        run.RunUntil(2_900_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        run.RunUntil(5_000_000);
        EventFrame motion = sink.Frames.SingleEvent(EventKind.Motion);
        return (motion.TimeMicros, motion.Cause!.Value);
    }

    private static Func<long, AccelSample, AccelSample> Shaker(int seed, double sigmaMilliG, double x, double y, double z) =>
        AccelShaker.Make(seed, sigmaMilliG, x, y, z);
}
