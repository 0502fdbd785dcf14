using System.Device.Gpio;
using System.Threading;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;
using nanoFramework.Hardware.Esp32;

namespace LaunchLogger.Esp32.Glue
{
    /// <summary>The status LED, blinking the <see cref="PhaseBlinkPattern"/> of the current phase from
    /// a timer so the capture loop never waits on it.</summary>
    public sealed class StatusLed : IStatusIndicator
    {
        private readonly GpioPin pin;
        private readonly Timer timer;
        private readonly object sync = new object();
        private RunPhase phase;
        private long phaseStartMicros;
        private long faultUntilMicros;
        private bool lit;

        /// <summary>Opens the LED pin and starts blinking Idle.</summary>
        public StatusLed(GpioController controller, int pinNumber)
        {
            pin = controller.OpenPin(pinNumber, PinMode.Output);
            pin.Write(PinValue.Low);
            phase = RunPhase.Idle;
            phaseStartMicros = (long)HighResTimer.GetCurrent();
            timer = new Timer(Refresh, null, 0, 50);
        }

        /// <inheritdoc/>
        public void Show(RunPhase phase)
        {
            lock (sync)
            {
                this.phase = phase;
                phaseStartMicros = (long)HighResTimer.GetCurrent();
            }
        }

        /// <summary>Shows the fault pattern for <paramref name="milliseconds"/>.</summary>
        public void ShowFault(int milliseconds)
        {
            lock (sync)
            {
                faultUntilMicros = (long)HighResTimer.GetCurrent() + (milliseconds * 1000L);
            }
        }

        private void Refresh(object state)
        {
            lock (sync)
            {
                long now = (long)HighResTimer.GetCurrent();
                bool on = now < faultUntilMicros
                    ? PhaseBlinkPattern.IsFault(now / 1000)
                    : PhaseBlinkPattern.IsOn(phase, (now - phaseStartMicros) / 1000);
                if (on != lit)
                {
                    pin.Write(on ? PinValue.High : PinValue.Low);
                    lit = on;
                }
            }
        }
    }
}
