using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Tests.Runs.Support;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Wire;
using UnitsNet;

namespace LaunchLogger.Decoding.Tests.Runs;

public class LogReaderTests
{
    private const long IdealLaunchMicros = 2_000_000; // the driver's default launch time

    private static LaunchDriver IdealLaunch(Action<LoggerSettings>? configure = null)
    {
        var settings = new LoggerSettings();
        configure?.Invoke(settings);
        var driver = new LaunchDriver(settings);
        driver.Run(accelerateUntilMicros: 7_000_000, endMicros: 10_000_000);
        return driver;
    }

    [Fact]
    public void RoundTripGivesBackExactlyThePulsesFed()
    {
        LaunchDriver driver = IdealLaunch();

        LogReadResult result = LogReader.Read(driver.Sink.ToArray(), "ideal.log");

        DecodedRun run = Assert.Single(result.Runs);
        Assert.True(run.Complete);
        Assert.Empty(run.Warnings);
        Assert.Empty(result.Warnings);
        Assert.False(result.Stats.HasDamage);
        Assert.Equal(driver.FedPulses.Count, run.Pulses.Count);
        for (int i = 0; i < run.Pulses.Count; i++)
        {
            PulseObservation fed = driver.FedPulses[i];
            PulseRecord read = run.Pulses[i];
            Assert.Equal(fed.Count, read.Count);

            // Exact: whole microseconds survive the conversion to seconds and back.
            Assert.Equal(fed.LoMicros, (long)Math.Round(read.LoS * 1e6));
            Assert.Equal(fed.HiMicros, (long)Math.Round(read.HiS * 1e6));

            // Reference library: UnitsNet for µs → s.
            Assert.Equal(Duration.FromMicroseconds(fed.HiMicros).Seconds, read.HiS, 1e-12);
        }

        Assert.Empty(run.SecondPulses);
    }

    [Fact]
    public void RoundTripGivesBackTheAccelerometerSamplesByIndex()
    {
        LaunchDriver driver = IdealLaunch();

        DecodedRun run = LogReader.Read(driver.Sink.ToArray(), "ideal.log").Runs.Single();

        AccelSeries accel = run.Accel!;
        Assert.NotNull(accel.SampleIndex);
        long[] index = accel.SampleIndex!;
        Assert.Equal(accel.Count, index.Length);

        // Contiguous from the oldest pre-trigger sample to the last sample of the run.
        Assert.Equal(Enumerable.Range(0, index.Length).Select(i => index[0] + i), index);
        long openIndex = (long)Math.Floor(run.Configuration.OpenedS / driver.TruePeriodS);
        Assert.InRange(openIndex - index[0], driver.Settings.PreTriggerSamples - driver.BurstSamples, driver.Settings.PreTriggerSamples + driver.BurstSamples);
        for (int i = 0; i < accel.Count; i++)
        {
            (short x, short y, short z, double trueS) = driver.FedSamples[index[i]];

            // Reference library: UnitsNet for milli-g → m/s² (standard gravity 9.80665 m/s²).
            Assert.Equal(Acceleration.FromMillistandardGravity(x).MetersPerSecondSquared, accel.ForwardMps2[i], 1e-12);
            Assert.Equal(Acceleration.FromMillistandardGravity(y).MetersPerSecondSquared, accel.LateralMps2[i], 1e-12);
            Assert.Equal(Acceleration.FromMillistandardGravity(z).MetersPerSecondSquared, accel.VerticalMps2[i], 1e-12);

            // Bursts are read exactly at their last sample here, so times are right to the µs.
            Assert.Equal(trueS, accel.TimeS[i], 2e-6);
        }

        Assert.True(accel.HasAllAxes);
        Assert.Equal(1e-3, accel.SamplePeriodS, 1e-9);
    }

    [Fact]
    public void RoundTripGivesBackEventsConfigurationAndSummary()
    {
        LaunchDriver driver = IdealLaunch();
        RunRecorder recorder = driver.Recorder;

        DecodedRun run = LogReader.Read(driver.Sink.ToArray(), "ideal.log").Runs.Single();

        Assert.Equal(
            new[] { EventKind.Staged, EventKind.Motion, EventKind.Rollout, EventKind.Stopped },
            run.Events.Select(e => e.Kind));
        Assert.Equal(run.Events.OrderBy(e => e.TimeS).Select(e => e.TimeS), run.Events.Select(e => e.TimeS));
        Assert.Equal(new long[] { (long)MotionCause.AccelOnset }, run.Events[1].Values);
        Assert.Equal((0.0, 0.0, 1000.0), run.RestGravityMilliG);
        Assert.Equal(recorder.MotionMicros / 1e6, run.FirmwareMotionS);
        Assert.Equal(recorder.RolloutMicros / 1e6, run.FirmwareRolloutS);
        Assert.Equal(driver.FedPulses[^1].HiMicros / 1e6, run.Events[^1].TimeS);

        // The box's rollout speed (mm/s) against kinematics: v = √(2·a·d) at d = 1 ft, a = 0.5 g
        // (REFERENCES.md: physics, any textbook), 1.72885 m/s. The box reports the mean speed over
        // the pulse interval that crosses the mark (0.0408 m here), which reads slightly high under
        // acceleration: +0.12 % on this launch (measured), plus up to 1 mm/s of truncation; the
        // check allows 0.3 %.
        double boxMps = run.Events[2].Values[0] / 1000.0;
        double exactMps = Math.Sqrt(2 * 0.5 * 9.80665 * 0.3048);
        Assert.InRange(boxMps / exactMps, 0.997, 1.003);

        RunConfiguration c = run.Configuration;
        Assert.Equal(LogFormat.Version, c.FormatVersion);
        Assert.Equal($"{Firmware.FirmwareVersion.Major}.{Firmware.FirmwareVersion.Minor}.{Firmware.FirmwareVersion.Patch}", c.FirmwareVersion);
        Assert.Equal(1, c.RunNumber);
        Assert.True(c.Staged);
        Assert.Equal(48, c.PulsesPerRevolution);
        Assert.Equal(Length.FromMicrometers(1_960_000).Meters, c.CircumferenceM, 1e-12);
        Assert.Equal(1.96 / 48, c.MetresPerPulse, 1e-15);
        Assert.Equal(Length.FromFeet(1).Meters, c.RolloutM, 1e-12); // 1 ft = 0.3048 m exactly
        Assert.True(c.HasAccelerometer);
        Assert.Equal(1000.0, c.AccelNominalRateHz);
        Assert.Equal(Acceleration.FromStandardGravity(8).MetersPerSecondSquared, c.AccelFullScaleMps2, 1e-12);
        Assert.Equal((0, false), (c.ForwardAxis, c.ForwardAxisReversed));
        Assert.Equal(2.0, c.StopHoldS);
        Assert.Equal(0.002, c.BracketLimitS);
        Assert.False(c.HasSecondChannel);
        // The box's motion is the accelerometer's onset, on the launch itself to within one
        // sample (1 kHz: measured 0.005 ms); the first pulse follows √(2·d/a) later, one pulse
        // (1.96 m / 48) from the standstill position (kinematics): 0.12906 s.
        double launchS = IdealLaunchMicros / 1e6;
        Assert.InRange(run.FirmwareMotionS!.Value - launchS, -0.001, 0.001);
        Assert.Equal(launchS + Math.Sqrt(2 * (1.96 / 48) / (0.5 * 9.80665)), run.Pulses[0].HiS, 0.001);
    }

    [Fact]
    public void HealthOfTheFirstRunIsCountedFromPowerUp()
    {
        LaunchDriver driver = IdealLaunch();

        DecodedRun run = LogReader.Read(driver.Sink.ToArray(), "ideal.log").Runs.Single();

        Assert.Equal(HealthCounterNames.InLogOrder, run.Health.Keys.OrderBy(k => HealthCounterNames.InLogOrder.ToList().IndexOf(k)));
        Assert.Equal(LogFormat.HealthCounterCount, HealthCounterNames.InLogOrder.Count);
        for (int i = 0; i < LogFormat.HealthCounterCount; i++)
        {
            Assert.Equal(driver.Health.Get(i), run.Health[HealthCounterNames.InLogOrder[i]]);
        }

        Assert.Equal(1, run.Health[HealthCounterNames.WidestBracketMicros]);
    }

    [Fact]
    public void CutOffLogGivesAnIncompleteRunWithAWarning()
    {
        LaunchDriver driver = IdealLaunch();
        byte[] log = driver.Sink.ToArray();

        // Cut in the middle of a frame half-way through the run, as power loss would.
        (int offset, int length) = driver.Sink.Frames[driver.Sink.Frames.Count / 2];
        LogReadResult result = LogReader.Read(log.AsSpan(0, offset + (length / 2)), "cut.log");

        DecodedRun run = Assert.Single(result.Runs);
        Assert.False(run.Complete);
        Assert.Contains(run.Warnings, w => w.StartsWith("cut off", StringComparison.Ordinal));
        Assert.True(result.Stats.TruncatedBytes > 0);
        Assert.True(run.Pulses.Count > 0 && run.Pulses.Count < driver.FedPulses.Count);
        Assert.Equal(driver.FedPulses.Take(run.Pulses.Count).Select(p => p.Count), run.Pulses.Select(p => p.Count));
        Assert.Null(run.Events.FirstOrDefault(e => e.Kind == EventKind.Stopped));
    }

    [Fact]
    public void FramesBeforeAnyConfigurationAreCountedAndReported()
    {
        LaunchDriver driver = IdealLaunch();
        byte[] log = driver.Sink.ToArray();

        // A capture that started mid-run, after the run's last configuration copy: nothing in
        // what was captured says how to decode the run.
        int start = LastFrameIndex(driver, log, FrameType.ConfigurationCopy) + 1;
        LogReadResult result = LogReader.Read(log.AsSpan(driver.Sink.Frames[start].Offset), "late.log");

        Assert.Empty(result.Runs);
        Assert.Equal(driver.Sink.Frames.Count - start, result.Stats.OrphanFrames);
        Assert.Contains(result.Warnings, w => w.Contains("outside any run", StringComparison.Ordinal));
    }

    [Fact]
    public void ACaptureThatStartedMidRunIsDecodedFromTheNextConfigurationCopy()
    {
        LaunchDriver driver = IdealLaunch();
        byte[] log = driver.Sink.ToArray();
        DecodedRun whole = LogReader.Read(log, "whole.log").Runs.Single();

        // The first ten frames (the configuration among them) are missing; a copy follows.
        LogReadResult result = LogReader.Read(log.AsSpan(driver.Sink.Frames[10].Offset), "late.log");

        DecodedRun run = Assert.Single(result.Runs);
        Assert.True(run.Complete);
        Assert.Contains(run.Warnings, w => w.Contains("repeated copy", StringComparison.Ordinal));
        Assert.Equal(0, result.Stats.OrphanFrames);
        Assert.Equal(whole.Configuration, run.Configuration);
        Assert.Equal(whole.Pulses.TakeLast(run.Pulses.Count), run.Pulses);
    }

    private static int LastFrameIndex(LaunchDriver driver, byte[] log, FrameType type)
    {
        int last = -1;
        for (int i = 0; i < driver.Sink.Frames.Count; i++)
        {
            (int offset, int length) = driver.Sink.Frames[i];
            var payload = new byte[length];
            if (Cobs.Decode(log, offset, length - 1, payload, 0) > 0 && payload[0] == (byte)type)
            {
                last = i;
            }
        }

        Assert.True(last >= 0, "the log has no frame of that type");
        return last;
    }

    [Fact]
    public void LostFrameAndCrcErrorInsideARunAreWarned()
    {
        LaunchDriver driver = IdealLaunch();
        byte[] log = driver.Sink.ToArray();
        int pulsesFrame = FrameIndex(driver, log, FrameType.Pulses, 3);
        int accelFrame = FrameIndex(driver, log, FrameType.Acceleration, 100);
        (int dropAt, int dropLength) = driver.Sink.Frames[pulsesFrame];
        (int flipAt, _) = driver.Sink.Frames[accelFrame];
        byte[] damaged = log.ToArray();
        damaged[flipAt + 20] ^= 0x01;
        damaged = [.. damaged[..dropAt], .. damaged[(dropAt + dropLength)..]];

        LogReadResult result = LogReader.Read(damaged, "damaged.log");

        DecodedRun run = Assert.Single(result.Runs);
        Assert.True(run.Complete);
        Assert.Equal(2, result.Stats.FramesLost);
        Assert.Equal(1, result.Stats.CrcErrors + result.Stats.MalformedFrames);
        Assert.Contains(run.Warnings, w => w.Contains("2 frame(s) lost", StringComparison.Ordinal));
        Assert.Contains(run.Warnings, w => w.Contains("pulse observations the summary counts are missing", StringComparison.Ordinal));
        Assert.Contains(run.Warnings, w => w.Contains("accelerometer samples the summary counts are missing", StringComparison.Ordinal));
        Assert.Contains(run.Warnings, w => w.Contains("2 of the", StringComparison.Ordinal) && w.EndsWith("frames the summary counts are missing", StringComparison.Ordinal));
        Assert.All(run.Pulses, p => Assert.Contains(driver.FedPulses, f => f.Count == p.Count && f.HiMicros == (long)Math.Round(p.HiS * 1e6)));
    }

    [Fact]
    public void StreamReadInTinyPiecesEqualsTheWholeRead()
    {
        LaunchDriver driver = IdealLaunch();
        byte[] log = driver.Sink.ToArray();

        LogReadResult whole = LogReader.Read(log, "x");
        LogReadResult streamed = LogReader.Read(new TricklingStream(log, 3), "x");

        Assert.Equal(whole.Stats, streamed.Stats);
        DecodedRun a = whole.Runs.Single();
        DecodedRun b = streamed.Runs.Single();
        Assert.Equal(a.Pulses, b.Pulses);
        Assert.Equal(a.Accel!.TimeS, b.Accel!.TimeS);
        Assert.Equal(a.Accel.ForwardMps2, b.Accel.ForwardMps2);
        Assert.Equal(a.Events.Select(e => (e.Kind, e.TimeS)), b.Events.Select(e => (e.Kind, e.TimeS)));
        Assert.Equal(a.Health, b.Health);
    }

    [Fact]
    public void ReadFileNamesAMissingFile()
    {
        string path = Path.Combine(Path.GetTempPath(), "no-such-log-" + Guid.NewGuid() + ".log");

        var e = Assert.Throws<Decoding.Import.InputException>(() => LogReader.ReadFile(path));

        Assert.Equal(path + ": file not found", e.Message);
    }

    [Fact]
    public void ReadFileReadsWhatWasWritten()
    {
        LaunchDriver driver = IdealLaunch();
        string path = Path.Combine(Path.GetTempPath(), "launch-" + Guid.NewGuid() + ".log");
        File.WriteAllBytes(path, driver.Sink.ToArray());
        try
        {
            LogReadResult result = LogReader.ReadFile(path);

            Assert.Equal(Path.GetFileName(path), result.Source);
            Assert.Equal(driver.FedPulses.Count, result.Runs.Single().Pulses.Count);
            Assert.StartsWith(Path.GetFileName(path) + " run 1", result.Runs[0].Source, StringComparison.Ordinal);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void NotALogAtAll()
    {
        LogReadResult result = LogReader.Read("t_s\n1.0\n2.0\n"u8, "edges.csv");

        Assert.Empty(result.Runs);
        Assert.Contains(result.Warnings, w => w.StartsWith("no readable frames", StringComparison.Ordinal));
    }

    /// <summary>The index in the sink of the <paramref name="nth"/> frame of a type.</summary>
    private static int FrameIndex(LaunchDriver driver, byte[] log, FrameType type, int nth)
    {
        int seen = 0;
        for (int i = 0; i < driver.Sink.Frames.Count; i++)
        {
            (int offset, int length) = driver.Sink.Frames[i];
            var payload = new byte[length];
            int n = Cobs.Decode(log, offset, length - 1, payload, 0);
            if (n > 0 && payload[0] == (byte)type && seen++ == nth)
            {
                return i;
            }
        }

        throw new InvalidOperationException("not that many frames of that type");
    }

    /// <summary>A stream that hands out at most a few bytes per read.</summary>
    private sealed class TricklingStream(byte[] data, int most) : MemoryStream(data)
    {
        public override int Read(byte[] buffer, int offset, int count) => base.Read(buffer, offset, Math.Min(count, most));
    }
}
