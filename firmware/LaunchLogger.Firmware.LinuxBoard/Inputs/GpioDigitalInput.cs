using System.Device.Gpio;
using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.LinuxBoard.Inputs;

/// <summary>The brake switch or mark button on a GPIO pin, read through System.Device.Gpio.</summary>
/// <remarks>Input stages in hardware-notes/wiring.md pull the pin low when active (opto-coupler,
/// button to ground), hence <c>activeLow</c>. Reading a pin is a cheap syscall, fine for the
/// capture loop's rate; these inputs need no microsecond timing. The raw level is returned: the
/// core's loop debounces it on its own clock and dates a change to the pass that first saw it
/// (<see cref="CaptureLoop.SwitchHoldMicros"/>).</remarks>
public sealed class GpioDigitalInput : IDigitalInput
{
    private readonly GpioController controller;
    private readonly int pin;
    private readonly bool activeLow;

    /// <summary>Opens <paramref name="pin"/> as an input.</summary>
    /// <param name="controller">The GPIO controller (owned by the caller).</param>
    /// <param name="pin">Pin number in the controller's numbering.</param>
    /// <param name="activeLow">True when a low level means active.</param>
    /// <param name="pull">Input mode: plain, pull-up or pull-down.</param>
    public GpioDigitalInput(GpioController controller, int pin, bool activeLow, PinMode pull)
    {
        this.controller = controller ?? throw new ArgumentNullException(nameof(controller));
        if (pull != PinMode.Input && pull != PinMode.InputPullUp && pull != PinMode.InputPullDown)
        {
            throw new ArgumentException("an input mode is needed", nameof(pull));
        }

        this.pin = pin;
        this.activeLow = activeLow;
        controller.OpenPin(pin, pull);
    }

    /// <inheritdoc/>
    public bool IsActive()
    {
        bool high = controller.Read(pin) == PinValue.High;
        return high != activeLow;
    }
}
