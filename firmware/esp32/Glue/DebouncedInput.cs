using System.Device.Gpio;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Hardware;
using nanoFramework.Hardware.Esp32;

namespace LaunchLogger.Esp32.Glue
{
    /// <summary>A switch input (brake switch, mark button) read by polling and debounced: a new
    /// level counts once it has held for the hold time (the core's <see cref="Debouncer"/>).</summary>
    /// <remarks>Polled from the capture loop rather than through pin-change events, which carry no
    /// time on this platform and arrive a scheduler tick late.</remarks>
    public sealed class DebouncedInput : IDigitalInput
    {
        private readonly GpioPin pin;
        private readonly bool activeLow;
        private readonly Debouncer debouncer;

        /// <summary>Opens <paramref name="pinNumber"/> as an input with the internal pull-up.</summary>
        public DebouncedInput(GpioController controller, int pinNumber, bool activeLow, long holdMicros)
        {
            pin = controller.OpenPin(pinNumber, PinMode.InputPullUp);
            this.activeLow = activeLow;
            debouncer = new Debouncer(holdMicros, ReadRaw());
        }

        /// <inheritdoc/>
        public bool IsActive()
        {
            return debouncer.Update(ReadRaw(), (long)HighResTimer.GetCurrent());
        }

        private bool ReadRaw()
        {
            bool high = pin.Read() == PinValue.High;
            return high != activeLow;
        }
    }
}
