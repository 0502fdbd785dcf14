using LaunchLogger.Simulation.Box;
using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Sensors;

namespace LaunchLogger.Simulation.Tests.Box;

public sealed class SimulatedAccelerometerTests
{
    private static AccelerometerModel Model(double seconds)
    {
        var spec = new AccelerometerSpec { OutputDataRateHz = 1000, ClockDriftPpm = 0, NoiseDensityMicroGPerRootHz = 0, VibrationMilliGRms = 0 };
        var model = new AccelerometerModel(spec, 0, new Random(1));
        for (int i = 0; i < seconds / 1e-4; i++)
        {
            model.Advance(i * 1e-4, (i + 1) * 1e-4, 0, 0, 0);
        }

        return model;
    }

    [Fact]
    public void Returns_only_samples_taken_by_now_oldest_first()
    {
        var sensor = new SimulatedAccelerometer(Model(0.1), 1_000_000, 8000, 32) { NowS = 0.0105 };
        var buffer = new short[32 * 3];
        int n = sensor.ReadBurst(buffer, 32, out bool overflowed);
        Assert.InRange(n, 10, 11);
        Assert.False(overflowed);
        Assert.Equal(0, sensor.ReadBurst(buffer, 32, out _));
    }

    [Fact]
    public void A_full_fifo_loses_the_oldest_samples_and_says_so_once()
    {
        AccelerometerModel model = Model(0.1);
        var sensor = new SimulatedAccelerometer(model, 1_000_000, 8000, 8) { NowS = 0.05 };
        var buffer = new short[8 * 3];
        int produced = model.SampleTimesS.Count(t => t <= 0.05);
        int n = sensor.ReadBurst(buffer, 8, out bool overflowed);
        Assert.Equal(8, n);
        Assert.True(overflowed);
        Assert.Equal(produced - 8, sensor.SamplesLost);

        sensor.NowS = 0.052;
        sensor.ReadBurst(buffer, 8, out overflowed);
        Assert.False(overflowed);
    }
}
