using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Simulation.Box;

/// <summary>The box's mark button, held down over one stretch of simulation time.</summary>
internal sealed class SimulatedMarkButton(double pressedS, double releasedS) : IDigitalInput
{
    /// <summary>Simulation time, s.</summary>
    internal double NowS { get; set; }

    /// <inheritdoc/>
    public bool IsActive() => NowS >= pressedS && NowS < releasedS;
}
