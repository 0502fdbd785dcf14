namespace LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;

/// <summary>One edge as the kernel reports it: <c>struct gpio_v2_line_event</c> of the GPIO
/// character device's v2 uAPI (linux/include/uapi/linux/gpio.h).</summary>
/// <param name="TimestampNs">When the edge happened, CLOCK_MONOTONIC nanoseconds (unless the
/// request asked for another event clock, which this program never does).</param>
/// <param name="Id">1 rising edge, 2 falling edge (<c>enum gpio_v2_line_event_id</c>).</param>
/// <param name="Offset">The line's offset on its chip.</param>
/// <param name="Seqno">Sequence number among all lines of the request.</param>
/// <param name="LineSeqno">Sequence number among this line's events, starting at 1; a jump
/// means the kernel's event buffer overflowed and dropped events.</param>
public readonly record struct GpioLineEvent(ulong TimestampNs, uint Id, uint Offset, uint Seqno, uint LineSeqno)
{
    /// <summary><c>GPIO_V2_LINE_EVENT_RISING_EDGE</c>.</summary>
    public const uint RisingEdge = 1;

    /// <summary><c>GPIO_V2_LINE_EVENT_FALLING_EDGE</c>.</summary>
    public const uint FallingEdge = 2;
}
