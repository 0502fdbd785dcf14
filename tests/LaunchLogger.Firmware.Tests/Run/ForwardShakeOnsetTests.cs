using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;
using Xunit.Abstractions;

namespace LaunchLogger.Firmware.Tests.Run;

/// <summary>The accelerometer onset against engine vibration along the car: an idling car that
/// the still test stages must not open a run by its shake alone, and its launch must still be
/// timed by the onset, close to the true start.</summary>
/// <remarks>The shake: 80 mg along the car at 20, 30 and 45 Hz (a three-cylinder's firing at
/// 800 rpm, a four's at 900, a six's at 900: cylinders ÷ 2 firings a revolution, common
/// practice), with 20 mg across and 40 mg vertical as in <see cref="StillBandTests"/>. The still
/// test averages 50-ms blocks, which pass at most 1/(π·f·T) of it (a fifth at 30 Hz: block means
/// within about 35 mg of each other), so the box stages; a short window does not average it out
/// (16 samples at 1.6 kHz hold a third of a 30 Hz cycle, whose mean reaches 0.86 × 80 = 69 mg,
/// past the 40 mg threshold).</remarks>
public class ForwardShakeOnsetTests(ITestOutputHelper output)
{
    private const double HalfG = 0.5 * MotionProfile.G0;
    private const double ShakeMilliG = 80;

    public static TheoryData<int, double, double, int> Boxes => new()
    {
        // rate (Hz), noise per sample (mg), shake (Hz), seed
        { 1600, 0.294 * Math.Sqrt(1600 / 2.0), 20, 1 }, // the noisiest sensor of StillBandTests
        { 1600, 0.294 * Math.Sqrt(1600 / 2.0), 30, 2 },
        { 1600, 0.294 * Math.Sqrt(1600 / 2.0), 45, 3 },
        { 1000, 2.0, 20, 4 },                           // the default rate, a quieter sensor
        { 1000, 2.0, 30, 5 },
        { 1000, 2.0, 45, 6 },
    };

    [Theory]
    [MemberData(nameof(Boxes))]
    public void AnIdleShakeAlongTheCarStagesAndOpensNoRun(int rateHz, double noiseMilliG, double shakeHz, int seed)
    {
        LoggerSettings settings = new() { AccelOutputDataRateMilliHz = rateHz * 1000 };
        var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
        var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(60.0, HalfG))
        {
            AccelModifier = AccelShaker.Make(seed, noiseMilliG, ShakeMilliG, 20, 40, shakeHz),
        };

        run.RunUntil(1_100_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        run.RunUntil(20_000_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        Assert.Empty(sink.Bytes);
    }

    [Theory]
    [MemberData(nameof(Boxes))]
    public void ALaunchThroughTheShakeIsTimedByItsOnset(int rateHz, double noiseMilliG, double shakeHz, int seed)
    {
        // Eight launches spread over the shake's cycle.
        double periodMicros = 1e6 / shakeHz;
        for (int k = 0; k < 8; k++)
        {
            LoggerSettings settings = new() { AccelOutputDataRateMilliHz = rateHz * 1000 };
            var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
            double launchS = 3.0 + (k * periodMicros / 8 / 1e6);
            var run = new ScriptedRun(recorder, settings, MotionProfile.Launch(launchS, HalfG))
            {
                AccelModifier = AccelShaker.Make(seed + (10 * k), noiseMilliG, ShakeMilliG, 20, 40, shakeHz),
            };

            run.RunUntil(3_500_000);

            EventFrame motion = sink.Frames.SingleEvent(EventKind.Motion);
            Assert.Equal(MotionCause.AccelOnset, motion.Cause);
            long samplePeriodMicros = 1_000_000 / rateHz;
            long launchMicros = (long)Math.Ceiling(launchS * 1e6 / samplePeriodMicros) * samplePeriodMicros; // the first sample of the launch
            output.WriteLine($"{rateHz} Hz, shake {shakeHz} Hz, launch {k}: motion {motion.TimeMicros - launchMicros} us from the launch's first sample");
            Assert.InRange(motion.TimeMicros - launchMicros, -(long)(0.6 * periodMicros) - (2 * samplePeriodMicros), 2 * samplePeriodMicros);
        }
    }
}
