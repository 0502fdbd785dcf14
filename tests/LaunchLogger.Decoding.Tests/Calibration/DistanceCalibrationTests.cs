using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Tests.Runs.Support;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Decoding.Tests.Calibration;

public class DistanceCalibrationTests
{
    private static RollMeasurement Roll(long pulses, double configured = 2.0) => new("roll.log run 1", pulses, 48, configured);

    [Fact]
    public void TheWorkedExampleOfTheCalibrationNotes()
    {
        // hardware-notes/calibration.md §1 (common practice, the measured-roll method): a 48-tooth
        // ring, 100.00 m, 2449 pulses → 100 × 48 / 2449 = 1.959984 m, 40.83 mm per pulse.
        CircumferenceCalibration c = DistanceCalibration.Compute([Roll(2449)], 100.0, 0.05);

        Assert.Equal(4800.0 / 2449, c.CircumferenceM, 12);
        Assert.Equal(1_959_984, Math.Round(c.CircumferenceM * 1e6));
        Assert.Equal(40.83, c.MetresPerPulse * 1000, 2);

        // Each end's position within a pitch is uniform over one pulse: variance 1/12 each
        // (uniform distribution, any statistics text), so the count is good to 1/√6 pulse.
        Assert.Equal(c.CircumferenceM / 2449 / Math.Sqrt(6), c.CountingSigmaM, 12);
        Assert.Equal(c.CircumferenceM * 0.05 / 100, c.TapeSigmaPartM, 12);
        Assert.Equal(Math.Sqrt((c.CountingSigmaM * c.CountingSigmaM) + (c.TapeSigmaPartM * c.TapeSigmaPartM)), c.SigmaM, 12);
        Assert.Equal((c.CircumferenceM - 2.0) / 2.0, c.ChangeFraction, 12);
        Assert.Equal(c.CircumferenceM - 2.0, c.ChangeM, 12);
        Assert.Empty(c.Warnings);
    }

    [Fact]
    public void RepeatsAreAveragedAndTheirScatterUsedWhenLarger()
    {
        CircumferenceCalibration agree = DistanceCalibration.Compute([Roll(2448), Roll(2449), Roll(2450)], 100.0, 0);
        Assert.Equal(4800.0 / 2449, agree.CircumferenceM, 12);
        Assert.Empty(agree.Warnings);

        // Standard error of the mean of 2448, 2449, 2450: s = 1, s/√3, larger than (1/√6)/√3.
        Assert.Equal(agree.CircumferenceM * (1 / Math.Sqrt(3)) / 2449, agree.CountingSigmaM, 12);

        CircumferenceCalibration disagree = DistanceCalibration.Compute([Roll(2449), Roll(2455)], 100.0, 0);
        Assert.Contains(disagree.Warnings, w => w.Contains("disagree", StringComparison.Ordinal));
        Assert.Equal(6.0 / 2452, disagree.SpreadFraction, 12);
    }

    [Fact]
    public void AWildlyDifferentResultAsksToCheckTheInputs()
    {
        CircumferenceCalibration c = DistanceCalibration.Compute([Roll(2449, configured: 1.2)], 100.0, 0.05);

        Assert.Contains(c.Warnings, w => w.Contains("--metres", StringComparison.Ordinal));
    }

    [Fact]
    public void OneRunCountsItsLastObservation()
    {
        LaunchDriver driver = Launch(out byte[] log);
        LogReadResult read = LogReader.Read(log, "roll.log");

        RollMeasurement roll = DistanceCalibration.CountRoll([read.Runs[0]], RunOrigins.Read(log));

        Assert.Equal(driver.LastCount, roll.Pulses);
        Assert.Equal(48, roll.PulsesPerRevolution);
        Assert.Equal(1.96, roll.ConfiguredCircumferenceM, 9);
    }

    [Fact]
    public void RunsOfOnePowerUpJoinThroughTheirOriginCounts()
    {
        // Stopped short, then crept up to the line: the hardware counter runs on across the runs.
        LaunchDriver first = Launch(out _);
        LaunchDriver second = first.Next(launchMicros: 14_000_000, startMicros: 11_000_000);
        second.Run(accelerateUntilMicros: 15_000_000, endMicros: 19_000_000);
        byte[] log = first.Sink.ToArray();
        LogReadResult read = LogReader.Read(log, "roll.log");
        RunOrigins origins = RunOrigins.Read(log);

        Assert.Equal(2, read.Runs.Count);
        Assert.Equal(first.CounterOrigin, origins.OriginOf(read.Runs[0]));
        Assert.Equal(second.CounterOrigin, origins.OriginOf(read.Runs[1]));

        RollMeasurement roll = DistanceCalibration.CountRoll(read.Runs, origins);
        Assert.Equal(first.LastCount + second.LastCount, roll.Pulses);
        Assert.Contains("to run 2", roll.Source, StringComparison.Ordinal);

        var e = Assert.Throws<CalibrationException>(() => DistanceCalibration.CountRoll(read.Runs, RunOrigins.None));
        Assert.Contains("starting count", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ARunThatOpenedWhileRollingIsRefused()
    {
        DecodedRun run = CalibrationRuns.Launch((0, 0, CalibrationRuns.G0), staged: false);

        var e = Assert.Throws<CalibrationException>(() => DistanceCalibration.CountRoll([run], RunOrigins.None));

        Assert.Contains("standstill", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void ACutOffRunIsRefused()
    {
        DecodedRun run = CalibrationRuns.Launch((0, 0, CalibrationRuns.G0), complete: false);

        var e = Assert.Throws<CalibrationException>(() => DistanceCalibration.CountRoll([run], RunOrigins.None));

        Assert.Contains("cut off", e.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("no distance", 0.0, 0.05)]
    [InlineData("negative tape uncertainty", 100.0, -0.01)]
    public void ImpossibleArgumentsAreCallerBugs(string name, double metres, double tape)
    {
        _ = name;
        Assert.Throws<ArgumentException>(() => DistanceCalibration.Compute([Roll(2449)], metres, tape));
    }

    private static LaunchDriver Launch(out byte[] log)
    {
        var driver = new LaunchDriver(new LoggerSettings()) { CounterOrigin = 12_345 };
        driver.Run(accelerateUntilMicros: 6_000_000, endMicros: 11_000_000);
        log = driver.Sink.ToArray();
        return driver;
    }
}
