using System.Device.I2c;
using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Esp32.Glue
{
    /// <summary><see cref="IRegisterBus"/> over nanoFramework's <c>I2cDevice</c>.</summary>
    /// <remarks>nanoFramework reports a failed transfer in the result's status instead of throwing;
    /// it becomes false here and an accelerometer read failure in the core's health counters.</remarks>
    public sealed class I2cRegisterBus : IRegisterBus
    {
        private readonly I2cDevice device;

        // A field, not a local: the device allocates struct locals on every method entry.
        private I2cTransferResult result;

        /// <summary>Wraps an open I2C device.</summary>
        public I2cRegisterBus(I2cDevice device)
        {
            if (device == null)
            {
                throw new System.ArgumentNullException("device");
            }

            this.device = device;
        }

        /// <inheritdoc/>
        public bool Write(byte[] data)
        {
            result = device.Write(data);
            return result.Status == I2cTransferStatus.FullTransfer;
        }

        /// <inheritdoc/>
        public bool WriteRead(byte[] write, byte[] read)
        {
            result = device.WriteRead(write, read);
            return result.Status == I2cTransferStatus.FullTransfer;
        }
    }
}
