namespace LaunchLogger.Firmware.Hardware
{
    /// <summary>A sensor's register interface: what a register driver needs from I2C or SPI.</summary>
    /// <remarks>Our own interface rather than a platform's I2C device (nanoFramework's
    /// <c>I2cDevice</c> has no virtual methods): drivers written against it are tested on the host
    /// with an emulated register map. Both calls use the whole arrays passed in, which the caller
    /// allocates once. A failed transfer is reported as false, never thrown, so a read in the
    /// capture loop becomes a counted failure.</remarks>
    public interface IRegisterBus
    {
        /// <summary>Writes <paramref name="data"/> (register address first). Returns false when
        /// the device did not acknowledge every byte.</summary>
        bool Write(byte[] data);

        /// <summary>Writes <paramref name="write"/> (a register address), then reads
        /// <paramref name="read"/>.Length bytes. Returns false on a failed transfer.</summary>
        bool WriteRead(byte[] write, byte[] read);
    }
}
