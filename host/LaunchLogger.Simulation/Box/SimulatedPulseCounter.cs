using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Simulation.Box;

/// <summary>A hardware edge counter (the ESP32's pulse counter unit) per channel: the count of
/// true edges up to the present simulation time.</summary>
internal sealed class SimulatedPulseCounter : IPulseCounter
{
    private readonly List<double>[] edgeTimesS;
    private readonly int[] passed;
    private readonly long start;

    internal SimulatedPulseCounter(List<double>[] edgeTimesS, long start)
    {
        this.edgeTimesS = edgeTimesS;
        passed = new int[edgeTimesS.Length];
        this.start = start;
    }

    /// <summary>Simulation time, s.</summary>
    internal double NowS { get; set; }

    /// <inheritdoc/>
    public int ChannelCount => edgeTimesS.Length;

    /// <inheritdoc/>
    public long ReadCount(int channel)
    {
        List<double> edges = edgeTimesS[channel];
        int n = passed[channel];
        while (n < edges.Count && edges[n] <= NowS)
        {
            n++;
        }

        passed[channel] = n;
        return start + n;
    }
}
