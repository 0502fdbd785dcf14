using LaunchLogger.Firmware.Wire;
using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Tests.Support;

namespace LaunchLogger.Simulation.Tests;

public sealed class SimulatorTests
{
    public static TheoryData<string> BuiltInNames => new(BuiltInScenarios.Names);

    [Theory]
    [MemberData(nameof(BuiltInNames))]
    public void Every_built_in_scenario_logs_one_whole_run(string name)
    {
        SimulationResult r = Simulator.Run(BuiltInScenarios.Get(name), seed: 11);
        LogFrames log = LogFrames.Parse(r.LogBytes);

        // LOG-FORMAT.md: every frame checks (COBS, CRC-32/ISO-HDLC), sequence numbers run on by
        // one from the power-up frame (0x07, after a lone delimiter), and a run is one
        // configuration frame first and one summary frame last, with copies of the configuration
        // (0x08) between.
        Assert.Equal(LogFormat.Delimiter, r.LogBytes[0]);
        Assert.Equal(0, log.BadFrames);
        Assert.Equal(1, r.BoxRuns);
        Assert.Equal(FrameType.PowerUp, log.Frames[0].Type);
        Assert.Equal(0, log.Frames[0].Sequence);
        Assert.Single(log.OfType(FrameType.Configuration));
        Assert.Single(log.OfType(FrameType.Summary));
        Assert.NotEmpty(log.OfType(FrameType.ConfigurationCopy));
        Assert.All(log.OfType(FrameType.ConfigurationCopy), c => Assert.Equal(log.OfType(FrameType.Configuration).Single().Body, c.Body));
        Assert.Equal(FrameType.Configuration, log.Frames[1].Type);
        Assert.Equal(FrameType.Summary, log.Frames[^1].Type);
        for (int i = 1; i < log.Frames.Count; i++)
        {
            Assert.Equal((log.Frames[i - 1].Sequence + 1) & 0xFFFF, log.Frames[i].Sequence);
        }

        // Staged, rolled out, closed by the stop.
        long flags = log.Summaries().Single()[10];
        Assert.Equal(LogFormat.SummaryFlagStaged | LogFormat.SummaryFlagRolloutReached | LogFormat.SummaryFlagClosedByStop, flags);
        Assert.Equal(0, r.Health.PulseObservationsDropped);
        Assert.Equal(0, r.Health.CountsWentBackwards);
    }

    [Theory]
    [MemberData(nameof(BuiltInNames))]
    public void Truth_events_come_in_order(string name)
    {
        SimulationResult r = Simulator.Run(BuiltInScenarios.Get(name), seed: 12);
        var e = r.Events;
        Assert.True(e.LaunchS <= e.FirstMotionS);
        Assert.True(e.FirstMotionS < e.RolloutS);
        Assert.True(e.RolloutS < e.TargetReachedS);
        Assert.True(e.TargetReachedS < e.BrakeOnsetS);
        Assert.True(e.BrakeOnsetS < e.StandstillS);
        Assert.Equal(0.3048, TrajectoryAt.Distance(r.Truth, e.RolloutS!.Value), 1e-9);
        Assert.Equal(e.RolloutSpeedMps!.Value, TrajectoryAt.Speed(r.Truth, e.RolloutS!.Value), 1e-9);
        Assert.Equal(0, TrajectoryAt.Distance(r.Truth, e.FirstMotionS!.Value), 1e-12);
        Assert.Equal(e.StandstillDistanceM!.Value, r.Truth.DistanceM[^1], 1e-9);
        Assert.Equal(0, r.Truth.SpeedMps[^1]);
        Assert.NotNull(r.Figures);
        Assert.Equal(e.RolloutS!.Value, r.Figures!.RolloutTimeS!.Value.Value, 1e-9);
    }

    [Fact]
    public void The_same_seed_gives_the_same_bytes_and_another_seed_does_not()
    {
        Scenario s = BuiltInScenarios.Default;
        byte[] first = Simulator.Run(s, seed: 42).LogBytes;
        byte[] again = Simulator.Run(s, seed: 42).LogBytes;
        byte[] other = Simulator.Run(s, seed: 43).LogBytes;
        Assert.Equal(first, again);
        Assert.NotEqual(first, other);
    }

    [Fact]
    public void The_log_shows_the_accelerometer_rate_with_its_drift()
    {
        Scenario s = BuiltInScenarios.Default;
        SimulationResult r = Simulator.Run(s, seed: 5);

        // The last sample of each burst against the burst's read time: the slope is the sensor's
        // rate on the box's clock (least squares, MathNet.Numerics Fit.Line). The read waits up
        // to one loop period after the sample, a few hundred µs over a run of ~20 s: ≪ 100 ppm.
        var bursts = LogFrames.Parse(r.LogBytes).Acceleration()
            .GroupBy(b => b.ReadMicros)
            .Select(g => (Time: g.Key * 1e-6, Last: (double)g.Max(b => b.FirstIndex + (b.Xyz.Length / 3) - 1)))
            .ToArray();
        (double _, double slope) = MathNet.Numerics.Fit.Line(bursts.Select(b => b.Time).ToArray(), bursts.Select(b => b.Last).ToArray());
        double expected = s.Accelerometer.OutputDataRateHz * (1 + (s.Accelerometer.ClockDriftPpm * 1e-6));
        Assert.InRange(slope, expected * (1 - 100e-6), expected * (1 + 100e-6));
        Assert.Equal(expected, r.Sensors.AccelTrueRateHz!.Value, 1e-6);
    }

    [Fact]
    public void Polled_capture_brackets_span_a_loop_period_and_exact_edges_one_microsecond()
    {
        SimulationResult polled = Simulator.Run(BuiltInScenarios.Get("club-hatch"), seed: 3);
        SimulationResult exact = Simulator.Run(BuiltInScenarios.Get("electric-saloon"), seed: 3);
        CaptureSpec capture = polled.Scenario.Capture;
        // A stall of the loop (a frame being written) widens the bracket it falls in by its length.
        double stall = capture.PausesPerSecond > 0 ? capture.PauseMicros : 0;
        Assert.InRange(polled.Health.WidestBracketMicros, capture.LoopPeriodMicros, (2 * (capture.LoopPeriodMicros + (5 * capture.LoopJitterMicros))) + stall);
        Assert.Equal(1, exact.Health.WidestBracketMicros);
    }

    [Fact]
    public void A_driven_wheel_pickup_counts_the_wheelspin()
    {
        SimulationResult r = Simulator.Run(BuiltInScenarios.Get("coupe-wheelspin"), seed: 4);
        long[] summary = LogFrames.Parse(r.LogBytes).Summaries().Single();

        // Summary fields (LOG-FORMAT.md 0x06): [5] channel 0 count (driven rear), [6] channel 1
        // (undriven front); both rings have 48 teeth on wheels of the same size.
        Assert.True(summary[5] > summary[6] + 5, $"driven {summary[5]} vs undriven {summary[6]}");
        Assert.True(r.Sensors.PickupOnDrivenWheel);
        Assert.True(r.Events.PeakDrivenSlip > 0.3);
    }

    [Fact]
    public void The_brake_switch_closes_after_its_delay()
    {
        SimulationResult r = Simulator.Run(BuiltInScenarios.Get("brake-test-60"), seed: 9);
        var brakeOn = LogFrames.Parse(r.LogBytes).Events().Where(e => e.Kind == EventKind.BrakeOn).Select(e => e.TimeMicros * 1e-6).ToArray();

        // Polled once per loop, so the event lands within a loop period (plus jitter) of the truth.
        Assert.Contains(brakeOn, t => Math.Abs(t - r.Events.BrakeSwitchOnS!.Value) < 0.001);
        Assert.Equal(r.Events.BrakeOnsetS!.Value + r.Scenario.BrakeSwitch.DelayS, r.Events.BrakeSwitchOnS!.Value, 1e-9);
    }

    [Fact]
    public void Abs_stops_shorter_than_locked_wheels()
    {
        Scenario s = BuiltInScenarios.Get("brake-test-60");
        SimulationResult withAbs = Simulator.Run(s, seed: 1);
        SimulationResult locked = Simulator.Run(s with { Brakes = s.Brakes with { AbsEnabled = false } }, seed: 1);

        // Common practice: a tyre held near its peak slip grips better than one sliding
        // (sliding friction 0.8 of the peak here).
        Assert.True(withAbs.Events.AbsCycles > 3);
        Assert.True(withAbs.Events.StoppingDistanceM < 0.95 * locked.Events.StoppingDistanceM);
    }

    [Fact]
    public void A_clock_that_wraps_during_the_run_still_gives_one_whole_run()
    {
        Scenario s = BuiltInScenarios.Get("electric-saloon");
        Assert.True(s.Box.ClockStartMicros + (20 * 1_000_000L) > uint.MaxValue);
        SimulationResult r = Simulator.Run(s, seed: 2);
        LogFrames log = LogFrames.Parse(r.LogBytes);
        Assert.Equal(1, r.Health.ClockWraps);
        Assert.Single(log.OfType(FrameType.Summary));
        Assert.True(r.Events.FirstMotionS * 1e6 < uint.MaxValue && r.Events.StandstillS * 1e6 > uint.MaxValue);
    }

    [Fact]
    public void Runs_without_an_accelerometer()
    {
        Scenario s = BuiltInScenarios.Default;
        SimulationResult r = Simulator.Run(s with { Accelerometer = s.Accelerometer with { Present = false } }, seed: 8);
        LogFrames log = LogFrames.Parse(r.LogBytes);
        Assert.Empty(log.OfType(FrameType.Acceleration));
        Assert.Single(log.OfType(FrameType.Summary));
        Assert.False(r.Settings.AccelPresent);
        Assert.False(r.Sensors.AccelPresent);
    }

    [Fact]
    public void The_scenarios_still_block_reaches_the_logs_configuration()
    {
        Scenario s = ScenarioFile.Parse("""{ "base": "club-hatch", "box": { "still_block_s": 0.08 } }""");
        SimulationResult r = Simulator.Run(s, seed: 8);

        Assert.Equal(80_000, r.Settings.StillBlockMicros);
        LogFrames log = LogFrames.Parse(r.LogBytes);
        Assert.True(Decoding.Reading.FrameBodies.TryReadConfiguration(log.OfType(FrameType.Configuration).Single().Body, out var configuration));
        Assert.Equal(80_000, configuration.StillBlockMicros);
        Assert.True(configuration.Staged);
        Assert.Equal(50_000, Simulator.SettingsFor(BuiltInScenarios.Get("club-hatch")).StillBlockMicros);
        var e = Assert.Throws<ArgumentException>(() => Simulator.Run(s with { Box = s.Box with { StillBlockS = 0.6 } }, 1));
        Assert.Contains("box.still_block_s", e.Message);
    }

    [Fact]
    public void An_invalid_scenario_is_refused_with_the_field_named()
    {
        Scenario s = BuiltInScenarios.Default;
        var e = Assert.Throws<ArgumentException>(() => Simulator.Run(s with { Pickup = s.Pickup with { Teeth = 0 } }, 1));
        Assert.Contains("pickup.teeth", e.Message);
    }
}
