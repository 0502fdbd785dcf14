#nullable disable
namespace LaunchLogger.Esp32.Lis3dh
{
    /// <summary>A sensor's register interface: what a register driver needs from I2C or SPI.</summary>
    /// <remarks>Our own interface rather than nanoFramework's <c>I2cDevice</c>, whose methods are
    /// not virtual: drivers written against this can be tested on the host with an emulated
    /// register map. Both calls use the whole arrays passed in (preallocated by the caller).</remarks>
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
