using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Simulation.Box;

/// <summary>The brake-light switch: follows the pedal after a fixed delay.</summary>
internal sealed class SimulatedBrakeSwitch : IDigitalInput
{
    private readonly List<(double TimeS, bool Pressed)> pedal = [];
    private readonly double delayS;

    internal SimulatedBrakeSwitch(double delayS) => this.delayS = delayS;

    /// <summary>Simulation time, s.</summary>
    internal double NowS { get; set; }

    /// <summary>Records a pedal movement at <paramref name="timeS"/>.</summary>
    internal void Pedal(double timeS, bool pressed) => pedal.Add((timeS, pressed));

    /// <inheritdoc/>
    public bool IsActive()
    {
        bool state = false;
        foreach ((double time, bool pressed) in pedal)
        {
            if (time + delayS > NowS)
            {
                break;
            }

            state = pressed;
        }

        return state;
    }
}
