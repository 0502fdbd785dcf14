namespace LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;

/// <summary>The pull resistor the kernel sets on a pickup line.</summary>
public enum LineBias
{
    /// <summary>Leave the line's bias as the board configured it.</summary>
    AsIs,

    /// <summary>Internal pull-up (for open-collector Hall sensors without their own resistor).</summary>
    PullUp,

    /// <summary>Internal pull-down.</summary>
    PullDown,

    /// <summary>No pull resistor (the input stage drives the line).</summary>
    Disabled,
}
