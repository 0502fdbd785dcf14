using System.Device.I2c;
using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.LinuxBoard.Buses;

/// <summary>The core's <see cref="IRegisterBus"/> over System.Device.I2c's <see cref="I2cDevice"/>.</summary>
/// <remarks>On Linux a failed transfer throws <see cref="IOException"/> (the kernel's errno in the
/// message); here it becomes false, as the interface asks, and is kept in <see cref="LastFailure"/>
/// so that set-up can still name the kernel's reason.</remarks>
public sealed class I2cDeviceRegisterBus : IRegisterBus
{
    private readonly I2cDevice device;

    /// <summary>Wraps an open I2C device (owned by the caller).</summary>
    public I2cDeviceRegisterBus(I2cDevice device)
    {
        this.device = device ?? throw new ArgumentNullException(nameof(device));
    }

    /// <summary>The most recent failed transfer's exception, or null.</summary>
    public IOException? LastFailure { get; private set; }

    /// <inheritdoc/>
    public bool Write(byte[] data)
    {
        try
        {
            device.Write(data);
            return true;
        }
        catch (IOException e)
        {
            LastFailure = e;
            return false;
        }
    }

    /// <inheritdoc/>
    public bool WriteRead(byte[] write, byte[] read)
    {
        try
        {
            device.WriteRead(write, read);
            return true;
        }
        catch (IOException e)
        {
            LastFailure = e;
            return false;
        }
    }
}
