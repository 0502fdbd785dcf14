using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Tests.Runs.Support;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Wire;
using UnitsNet;

namespace LaunchLogger.Decoding.Tests.Runs;

public class RunAssemblerTests
{
    [Fact]
    public void TwoRunsOfOnePowerUpAreSeparatedAndHealthIsDifferenced()
    {
        var settings = new LoggerSettings { BracketLimitMicros = 500 };
        var first = new LaunchDriver(settings) { PollMicros = 800 };
        first.Run(accelerateUntilMicros: 6_000_000, endMicros: 11_000_000);
        var healthAfterFirst = Enumerable.Range(0, LogFormat.HealthCounterCount).Select(first.Health.Get).ToArray();
        LaunchDriver second = first.Next(launchMicros: 14_000_000, startMicros: 11_000_000);
        second.Run(accelerateUntilMicros: 18_000_000, endMicros: 22_000_000);

        LogReadResult result = LogReader.Read(first.Sink.ToArray(), "two.log");

        Assert.Equal(2, result.Runs.Count);
        Assert.All(result.Runs, r => Assert.True(r.Complete));
        Assert.Equal(new[] { 1, 2 }, result.Runs.Select(r => r.Configuration.RunNumber));
        Assert.Equal(new[] { "two.log run 1", "two.log run 2" }, result.Runs.Select(r => r.Source));

        // Counts restart from each run's origin; brackets are one poll period wide.
        Assert.Equal(second.FedPulses.Select(p => p.Count - second.CounterOrigin), result.Runs[1].Pulses.Select(p => p.Count));
        Assert.Equal(second.FedPulses.Select(p => p.LoMicros), result.Runs[1].Pulses.Select(p => (long)Math.Round(p.LoS * 1e6)));

        // Every observation is 800 µs wide, over the 500 µs limit: warned, and counted by the
        // box once per run (the second run's count is differenced against the first run's close).
        long wideFirst = healthAfterFirst[4];
        Assert.Equal(first.FedPulses.Count, wideFirst);
        Assert.Equal(wideFirst, result.Runs[0].Health[HealthCounterNames.WideBrackets]);
        Assert.Equal(second.Health.WideBrackets - wideFirst, result.Runs[1].Health[HealthCounterNames.WideBrackets]);
        Assert.Equal(second.FedPulses.Count, result.Runs[1].Health[HealthCounterNames.WideBrackets]);
        Assert.Equal(800, result.Runs[1].Health[HealthCounterNames.WidestBracketMicros]);
        Assert.Contains(result.Runs[1].Warnings, w => w.Contains("wider than the 0.5 ms limit (widest 0.8 ms)", StringComparison.Ordinal));
    }

    [Fact]
    public void SecondChannelAndBrakeSwitch()
    {
        var settings = new LoggerSettings { SecondChannelEnabled = true, SecondPulsesPerRevolution = 48, SecondCircumferenceMicrometres = 1_950_000 };
        var driver = new LaunchDriver(settings) { BrakeOnMicros = 6_500_000 };
        driver.Run(accelerateUntilMicros: 6_000_000, endMicros: 10_000_000);

        DecodedRun run = LogReader.Read(driver.Sink.ToArray(), "two-wheels.log").Runs.Single();

        Assert.True(run.Configuration.HasSecondChannel);
        Assert.Equal(1.95 / 48, run.Configuration.SecondMetresPerPulse, 1e-15);
        Assert.Equal(driver.FedPulses.Where(p => p.Channel == 1).Select(p => (p.Count, p.LoMicros, p.HiMicros)), run.SecondPulses.Select(p => (p.Count, (long)Math.Round(p.LoS * 1e6), (long)Math.Round(p.HiS * 1e6))));
        Assert.Equal(driver.FedPulses.Count(p => p.Channel == 0), run.Pulses.Count);
        RunEvent brake = Assert.Single(run.Events, e => e.Kind == EventKind.BrakeOn);
        Assert.Equal(6.5, brake.TimeS);
        Assert.Empty(run.Warnings);
    }

    [Fact]
    public void SensorMountedOnItsSideWithTheForwardAxisReversed()
    {
        // Forward is −y (the y axis points backward); gravity lies on −x, so x is vertical
        // pointing down. Lateral is z, signed so that (forward, lateral, vertical) is right-handed
        // with lateral to the left (ISO 8855 vehicle axes: x forward, y left, z up, so
        // left = up × forward): (−x) × (−y) = +z.
        var settings = new LoggerSettings { ForwardAxis = 1, ForwardAxisReversed = true };
        var driver = new LaunchDriver(settings) { GravityAxis = 0, GravitySign = -1 };
        driver.Run(accelerateUntilMicros: 6_000_000, endMicros: 9_000_000);

        DecodedRun run = LogReader.Read(driver.Sink.ToArray(), "side.log").Runs.Single();

        Assert.Equal((-1000.0, 0.0, 0.0), run.RestGravityMilliG);
        AxisMapping axes = run.Accel!.Axes!;
        Assert.Equal(new AxisMapping(1, -1, 2, 1, 0, -1, true), axes);

        // At rest the vertical reads +g0 and the forward 0; while launching the forward reads +0.5 g.
        // Reference library: UnitsNet for milli-g → m/s².
        double g0 = Acceleration.FromStandardGravity(1).MetersPerSecondSquared;
        int resting = Array.FindIndex(run.Accel.TimeS, t => t > 1.0);
        int launching = Array.FindIndex(run.Accel.TimeS, t => t > 3.0);
        Assert.Equal(g0, run.Accel.VerticalMps2[resting], 1e-12);
        Assert.Equal(0, run.Accel.ForwardMps2[resting]);
        Assert.Equal(Acceleration.FromMillistandardGravity(500).MetersPerSecondSquared, run.Accel.ForwardMps2[launching], 1e-12);
        Assert.Equal(0, run.Accel.LateralMps2[launching]);
        Assert.Empty(run.Warnings);
    }

    [Fact]
    public void ForwardAxisCarryingGravityIsWarned()
    {
        // The box believes x is forward but gravity lies on x: its setting is wrong.
        var settings = new LoggerSettings { ForwardAxis = 0 };
        var driver = new LaunchDriver(settings) { GravityAxis = 0 };
        driver.Run(accelerateUntilMicros: 6_000_000, endMicros: 9_000_000);

        DecodedRun run = LogReader.Read(driver.Sink.ToArray(), "wrong-axis.log").Runs.Single();

        Assert.Contains(run.Warnings, w => w.Contains("forward axis carries more resting gravity", StringComparison.Ordinal));
    }

    [Fact]
    public void RestartedBoxStartsANewPowerUpWithoutLostFrames()
    {
        LaunchDriver before = new(new LoggerSettings());
        before.Run(6_000_000, 10_000_000);
        LaunchDriver after = new(new LoggerSettings());
        after.Run(6_000_000, 10_000_000);
        byte[] log = [.. before.Sink.ToArray(), .. after.Sink.ToArray()];

        LogReadResult result = LogReader.Read(log, "restart.log");

        Assert.Equal(2, result.Runs.Count);
        Assert.Equal(1, result.Stats.Restarts);
        Assert.Equal(0, result.Stats.FramesLost);
        Assert.Equal("restart.log run 1 (after restart 1)", result.Runs[1].Source);

        // Run 1 of the new power-up is counted from its own power-up, not against the old run.
        Assert.Equal(after.Health.WidestBracketMicros, result.Runs[1].Health[HealthCounterNames.WidestBracketMicros]);
        Assert.All(result.Runs, r => Assert.Empty(r.Warnings));
    }

    [Fact]
    public void NextConfigurationBeforeTheSummaryCutsTheRunOff()
    {
        var driver = new LaunchDriver(new LoggerSettings());
        driver.Run(6_000_000, 10_000_000);
        byte[] log = driver.Sink.ToArray();
        (int lastOffset, _) = driver.Sink.Frames[^1];

        // The first run loses its summary; a restarted box's run follows.
        LaunchDriver again = new(new LoggerSettings());
        again.Run(6_000_000, 10_000_000);
        LogReadResult result = LogReader.Read([.. log[..lastOffset], .. again.Sink.ToArray()], "cut.log");

        Assert.Equal(2, result.Runs.Count);
        Assert.False(result.Runs[0].Complete);
        Assert.Contains(result.Runs[0].Warnings, w => w.StartsWith("cut off: the next run's configuration", StringComparison.Ordinal));
        Assert.True(result.Runs[1].Complete);
    }

    [Fact]
    public void FifoOverflowStartsANewTimingSegmentAndIsWarned()
    {
        // 60 samples are lost mid-run and the box's guess of the count is 3 too high, so the
        // indices after the gap are off by 3 samples (3 ms): a single time line would put every
        // later sample 3 ms late; a new segment with its own origin keeps them right.
        var driver = new LaunchDriver(new LoggerSettings())
        {
            OverflowAtMicros = 4_000_000,
            OverflowLostSamples = 60,
            OverflowIndexError = 3,
            MaxReadLatencyMicros = 300,
            Seed = 7,
        };
        driver.Run(6_000_000, 10_000_000);

        DecodedRun run = LogReader.Read(driver.Sink.ToArray(), "gap.log").Runs.Single();

        RunEvent gap = Assert.Single(run.Events, e => e.Kind == EventKind.AccelGap);
        Assert.Equal(new long[] { 63 }, gap.Values);
        Assert.Contains(run.Warnings, w => w.StartsWith("the accelerometer's FIFO overflowed", StringComparison.Ordinal) && w.Contains("about 63 samples lost", StringComparison.Ordinal));
        AccelSeries accel = run.Accel!;
        double worst = 0;
        for (int i = 0; i < accel.Count; i++)
        {
            worst = Math.Max(worst, Math.Abs(accel.TimeS[i] - driver.FedSamples[accel.SampleIndex![i]].TrueS));
        }

        // Read latency up to 0.3 ms; the envelope puts sample times within a fraction of it.
        Assert.True(worst < 0.2e-3, $"worst sample time error {worst * 1e3:F3} ms");
        Assert.Equal(1e-3, accel.SamplePeriodS, 1e-8);
    }

    [Fact]
    public void AssemblerRefusesUseAfterCompletion()
    {
        var assembler = new RunAssembler("x");
        assembler.Complete(default);

        Assert.Throws<InvalidOperationException>(() => assembler.Complete(default));
    }
}
