using System.Device.Gpio;
using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Esp32.Glue
{
    /// <summary>The ESP32's hardware pulse counter (PCNT, through nanoFramework's
    /// <c>GpioPulseCounter</c>) for one or two wheel pickups.</summary>
    /// <remarks>The hardware counts every edge whatever managed code is doing; the runtime extends
    /// the count to 64 bits. <c>Read()</c> also returns a <c>RelativeTime</c> sampled near the
    /// count; the core's PolledPulseSource instead brackets each read with two reads of the same
    /// microsecond clock the rest of the log uses, which keeps one time base.</remarks>
    public sealed class Esp32PulseCounter : IPulseCounter
    {
        private readonly GpioPulseCounter first;
        private readonly GpioPulseCounter second;

        // A field, not a local: the device allocates struct locals on every method entry. The
        // struct Read() returns is still made by the runtime on every read (platform API).
        private GpioPulseCount reading;

        /// <summary>Sets the counters up (not yet counting: call <see cref="Start"/>).</summary>
        /// <param name="pin">The distance pickup's GPIO.</param>
        /// <param name="secondPin">A second pickup's GPIO, or -1.</param>
        public Esp32PulseCounter(int pin, int secondPin)
        {
            first = Create(pin);
            second = secondPin >= 0 ? Create(secondPin) : null;
        }

        /// <inheritdoc/>
        public int ChannelCount
        {
            get { return second == null ? 1 : 2; }
        }

        /// <summary>Starts counting on every channel.</summary>
        public void Start()
        {
            first.Start();
            if (second != null)
            {
                second.Start();
            }
        }

        /// <inheritdoc/>
        public long ReadCount(int channel)
        {
            reading = channel == 0 ? first.Read() : second.Read();
            return reading.Count;
        }

        private static GpioPulseCounter Create(int pin)
        {
            GpioPulseCounter counter = new GpioPulseCounter(pin);

            // One edge per tooth: the input stage gives clean edges (hardware-notes/wiring.md).
            counter.Polarity = GpioPulsePolarity.Rising;
            counter.FilterPulses = 0;
            return counter;
        }
    }
}
