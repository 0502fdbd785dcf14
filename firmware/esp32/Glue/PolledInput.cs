using System.Device.Gpio;
using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Esp32.Glue
{
    /// <summary>A switch input (brake switch, mark button) read by polling; the raw level is
    /// returned and the core's loop debounces it on the loop's clock, dating a change to the pass
    /// that first saw it (<c>CaptureLoop.SwitchHoldMicros</c>).</summary>
    /// <remarks>Polled from the capture loop rather than through pin-change events, which carry no
    /// time on this platform and arrive a scheduler tick late.</remarks>
    public sealed class PolledInput : IDigitalInput
    {
        private readonly GpioPin pin;
        private readonly bool activeLow;

        /// <summary>Opens <paramref name="pinNumber"/> as an input with the internal pull-up.</summary>
        public PolledInput(GpioController controller, int pinNumber, bool activeLow)
        {
            pin = controller.OpenPin(pinNumber, PinMode.InputPullUp);
            this.activeLow = activeLow;
        }

        /// <inheritdoc/>
        public bool IsActive()
        {
            // The level as a byte (0 low, 1 high): comparing with PinValue.High would build a
            // second PinValue and pass both by value, each a heap object on the device.
            bool high = (byte)pin.Read() != 0;
            return high != activeLow;
        }
    }
}
