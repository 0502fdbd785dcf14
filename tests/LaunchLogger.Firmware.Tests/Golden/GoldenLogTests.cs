using System.Security.Cryptography;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;

namespace LaunchLogger.Firmware.Tests.Golden;

/// <summary>The log bytes of fixed scripted runs, compared byte for byte with files recorded
/// before the capture and logging paths were reworked for the device (by-reference observations,
/// incremental frame encoding). A change to the wire bytes must be deliberate: regenerate with
/// LAUNCHLOGGER_WRITE_GOLDEN=1 and say why in the commit.</summary>
public class GoldenLogTests
{
    private const double HalfG = 0.5 * MotionProfile.G0;

    public static TheoryData<string> Runs => new() { "loop-polled-accel", "loop-queue-two-channels", "scripted-exact", "scripted-polled-no-accel" };

    [Theory]
    [MemberData(nameof(Runs))]
    public void TheLogBytesAreUnchanged(string name)
    {
        byte[] bytes = Produce(name);
        string path = Path.Combine(GoldenFolder(), name + ".log");
        if (Environment.GetEnvironmentVariable("LAUNCHLOGGER_WRITE_GOLDEN") == "1")
        {
            File.WriteAllBytes(path, bytes);
        }

        Assert.True(File.Exists(path), "golden log missing: " + path);
        byte[] golden = File.ReadAllBytes(path);
        Assert.True(bytes.Length > 1000, "the run wrote almost nothing");
        int first = FirstDifference(golden, bytes);
        Assert.True(first < 0, $"{name}: {bytes.Length} bytes against {golden.Length} golden, first difference at byte {first} (sha256 {Convert.ToHexString(SHA256.HashData(bytes))[..16]})");
    }

    private static int FirstDifference(byte[] a, byte[] b)
    {
        int n = Math.Min(a.Length, b.Length);
        for (int i = 0; i < n; i++)
        {
            if (a[i] != b[i])
            {
                return i;
            }
        }

        return a.Length == b.Length ? -1 : n;
    }

    internal static byte[] Produce(string name)
    {
        switch (name)
        {
            case "loop-polled-accel":
                return LoopRun(secondChannel: false, queue: false);
            case "loop-queue-two-channels":
                return LoopRun(secondChannel: true, queue: true);
            case "scripted-exact":
                {
                    var settings = new LoggerSettings { SecondChannelEnabled = true, SecondPulsesPerRevolution = 48, SecondCircumferenceMicrometres = 1_990_000 };
                    var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
                    var run = new ScriptedRun(recorder, settings, MotionProfile.LaunchAndStop(2.0, HalfG, 5.0, 0.9 * MotionProfile.G0));
                    run.RunUntil(9_000_000);
                    recorder.Shutdown(run.NowMicros);
                    return sink.Bytes;
                }

            case "scripted-polled-no-accel":
                {
                    var settings = new LoggerSettings { AccelPresent = false };
                    var (recorder, sink, _) = ScriptedRun.NewRecorder(settings);
                    var run = new ScriptedRun(recorder, settings, MotionProfile.LaunchAndStop(2.0, HalfG, 4.0, 0.7 * MotionProfile.G0)) { PollPeriodMicros = 700 };
                    run.RunUntil(8_000_000);
                    recorder.Shutdown(run.NowMicros);
                    return sink.Bytes;
                }

            default:
                throw new ArgumentException(name);
        }
    }

    /// <summary>The whole loop (pulse source, accelerometer, brake switch, mark button) stepped
    /// every millisecond through a launch, a stall that overflows the FIFO, braking and a stop.</summary>
    private static byte[] LoopRun(bool secondChannel, bool queue)
    {
        var profile = MotionProfile.LaunchAndStop(2.5, HalfG, 4.5, 0.8 * MotionProfile.G0);
        var counter = new FakeMicrosecondCounter(0);
        var health = new HealthCounters();
        var sink = new MemorySink();
        var settings = new LoggerSettings();
        if (secondChannel)
        {
            settings.SecondChannelEnabled = true;
            settings.SecondPulsesPerRevolution = 36;
            settings.SecondCircumferenceMicrometres = 2_010_000;
        }

        var clock = new MonotonicClock(counter, health);
        var recorder = new RunRecorder(settings, sink, health);
        var accelerometer = new FakeAccelerometer(counter, 0, 1000, 64, t =>
            new AccelSample((short)Math.Round(profile.AccelAt(t / 1e6) / MotionProfile.G0 * 1000), 3, 1000));
        var pulses = new FakePulseCounter(settings.ChannelCount);
        var brake = new FakeDigitalInput();
        var mark = new FakeDigitalInput();
        PolledPulseSource polled = queue ? null! : new PolledPulseSource(pulses, clock);
        var edges = new EdgeObservationQueue(256, health);
        var loop = new CaptureLoop(clock, queue ? edges : polled, accelerometer, brake, mark, new RecordingIndicator(), recorder, 64, 20_000);
        for (int c = 0; c < settings.ChannelCount; c++)
        {
            recorder.SetCounterOrigin(c, 0);
        }

        double[] metresPerPulse = { settings.CircumferenceMicrometres * 1e-6 / settings.PulsesPerRevolution, secondChannel ? settings.SecondCircumferenceMicrometres * 1e-6 / settings.SecondPulsesPerRevolution : 1 };
        bool stalled = false;
        while (counter.TrueMicros < 9_000_000)
        {
            // One 150 ms stall (a slow card write) at 3 s overflows the accelerometer's FIFO.
            bool stall = !stalled && counter.TrueMicros >= 3_000_000;
            stalled |= stall;
            counter.TrueMicros += stall ? 150_000UL : 1000UL;
            double s = counter.TrueMicros / 1e6;
            brake.Active = s > 4.5 && s < 6.0;
            mark.Active = s > 3.5 && s < 3.6;
            for (int c = 0; c < settings.ChannelCount; c++)
            {
                long n = (long)Math.Floor((profile.DistanceAt(s) / metresPerPulse[c]) + 1e-9);
                if (queue)
                {
                    for (long k = pulses[c] + 1; k <= n; k++)
                    {
                        long edge = (long)Math.Ceiling(profile.TimeAtDistance(k * metresPerPulse[c]) * 1e6);
                        edges.TryWriteEdge(c, k, edge);
                    }
                }

                pulses[c] = n;
            }

            if (!queue)
            {
                polled.Poll();
            }

            loop.Step();
        }

        recorder.Shutdown((long)counter.TrueMicros);
        return sink.Bytes;
    }

    private static string GoldenFolder()
    {
        for (DirectoryInfo? dir = new(AppContext.BaseDirectory); dir != null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "LaunchLogger.sln")))
            {
                return Path.Combine(dir.FullName, "tests", "LaunchLogger.Firmware.Tests", "Golden");
            }
        }

        throw new InvalidOperationException("LaunchLogger.sln not found above " + AppContext.BaseDirectory);
    }
}
