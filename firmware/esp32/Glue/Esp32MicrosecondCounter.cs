using LaunchLogger.Firmware.Hardware;
using nanoFramework.Hardware.Esp32;

namespace LaunchLogger.Esp32.Glue
{
    /// <summary>The ESP32's microsecond boot timer as the core's 32-bit microsecond counter.</summary>
    /// <remarks><c>HighResTimer.GetCurrent()</c> is µs since boot (64-bit); the core's
    /// MonotonicClock extends the low 32 bits again and counts the wraps in the health frame.</remarks>
    public sealed class Esp32MicrosecondCounter : IMicrosecondCounter
    {
        /// <inheritdoc/>
        public uint ReadMicros32()
        {
            return (uint)HighResTimer.GetCurrent();
        }
    }
}
