using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Simulation.Sensors;

namespace LaunchLogger.Simulation.Box;

/// <summary>The accelerometer as the box's driver sees it: a FIFO of fixed depth filled at the
/// sensor's own rate. When it is full the oldest sample is lost and the overflow flag is raised
/// until the next read (stream mode).</summary>
internal sealed class SimulatedAccelerometer : IAccelerometer
{
    private readonly AccelerometerModel model;
    private readonly short[] fifo;
    private readonly int depth;
    private int head;
    private int count;
    private int produced;
    private bool overflowed;

    internal SimulatedAccelerometer(AccelerometerModel model, int outputDataRateMilliHz, int fullScaleMilliG, int fifoDepth)
    {
        this.model = model;
        OutputDataRateMilliHz = outputDataRateMilliHz;
        FullScaleMilliG = fullScaleMilliG;
        depth = fifoDepth;
        fifo = new short[fifoDepth * 3];
    }

    /// <summary>Simulation time, s.</summary>
    internal double NowS { get; set; }

    /// <summary>Samples lost to FIFO overflow.</summary>
    internal long SamplesLost { get; private set; }

    /// <inheritdoc/>
    public int OutputDataRateMilliHz { get; }

    /// <inheritdoc/>
    public int FullScaleMilliG { get; }

    /// <inheritdoc/>
    public int ReadBurst(short[] xyzMilliG, int maxSamples, out bool fifoOverflowed)
    {
        List<double> times = model.SampleTimesS;
        List<short> values = model.SamplesMilliG;
        while (produced < times.Count && times[produced] <= NowS)
        {
            if (count == depth)
            {
                head = (head + 1) % depth;
                count--;
                overflowed = true;
                SamplesLost++;
            }

            int slot = ((head + count) % depth) * 3;
            int src = produced * 3;
            fifo[slot] = values[src];
            fifo[slot + 1] = values[src + 1];
            fifo[slot + 2] = values[src + 2];
            count++;
            produced++;
        }

        int n = Math.Min(count, maxSamples);
        for (int i = 0; i < n; i++)
        {
            int slot = head * 3;
            xyzMilliG[i * 3] = fifo[slot];
            xyzMilliG[(i * 3) + 1] = fifo[slot + 1];
            xyzMilliG[(i * 3) + 2] = fifo[slot + 2];
            head = (head + 1) % depth;
        }

        count -= n;
        fifoOverflowed = overflowed;
        overflowed = false;
        return n;
    }
}
