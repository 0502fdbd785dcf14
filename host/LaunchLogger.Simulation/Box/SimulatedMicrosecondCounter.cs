using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Simulation.Box;

/// <summary>The box's free-running 32-bit microsecond counter, driven by simulation time.</summary>
internal sealed class SimulatedMicrosecondCounter : IMicrosecondCounter
{
    private readonly long startMicros;

    internal SimulatedMicrosecondCounter(long startMicros) => this.startMicros = startMicros;

    /// <summary>Simulation time, µs since the simulation began.</summary>
    internal long NowMicros { get; set; }

    /// <summary>The box's 64-bit time at a simulation time, µs (what its monotonic clock reads).</summary>
    internal long BoxMicros(long simMicros) => startMicros + simMicros;

    /// <inheritdoc/>
    public uint ReadMicros32() => unchecked((uint)(startMicros + NowMicros));
}
