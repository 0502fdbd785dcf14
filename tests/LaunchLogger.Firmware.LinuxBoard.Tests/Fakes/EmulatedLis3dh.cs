using System.Device.I2c;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;

/// <summary>A LIS3DH as seen over I2C: a 128-register map plus a 32-sample FIFO, enough for the
/// Iot.Device.Bindings driver and for our FIFO reader. Register behaviour per the LIS3DH
/// datasheet and ST AN3308 (from memory): bit 7 of the sub-address asks for auto-increment;
/// with CTRL_REG5.FIFO_EN set and FIFO_CTRL_REG in stream mode, reading the six output bytes takes
/// the oldest stored sample, and a full FIFO shows OVRN with FSS = 31 and loses its oldest sample
/// to the next one.</summary>
internal sealed class EmulatedLis3dh : I2cDevice
{
    public const int FifoDepth = 32;

    private readonly byte[] registers = new byte[128];
    private readonly Queue<(short X, short Y, short Z)> fifo = new();
    private (short X, short Y, short Z) latest;

    public EmulatedLis3dh(int address = 0x18)
    {
        ConnectionSettings = new I2cConnectionSettings(1, address);
        registers[0x0F] = 0x33;
    }

    public override I2cConnectionSettings ConnectionSettings { get; }

    /// <summary>When set, every transfer throws as a bus error does on Linux.</summary>
    public bool FailTransfers { get; set; }

    /// <summary>Samples the chip overwrote because nobody read them in time.</summary>
    public int SamplesLost { get; private set; }

    public int FifoCount => fifo.Count;

    public byte Register(int address) => registers[address];

    public void SetRegister(int address, byte value) => registers[address] = value;

    private bool FifoOn => (registers[0x24] & 0x40) != 0 && (registers[0x2E] & 0xC0) != 0;

    /// <summary>A new sample from the sensing element, left-justified 16-bit raw values.</summary>
    public void Produce(short x, short y, short z)
    {
        latest = (x, y, z);
        if (!FifoOn)
        {
            return;
        }

        if (fifo.Count == FifoDepth)
        {
            fifo.Dequeue();
            SamplesLost++;
        }

        fifo.Enqueue(latest);
    }

    public override void Read(Span<byte> buffer) => throw new NotSupportedException("the drivers under test always address a register");

    public override void Write(ReadOnlySpan<byte> buffer)
    {
        Check();
        int address = buffer[0] & 0x7F;
        for (int i = 1; i < buffer.Length; i++)
        {
            registers[address] = buffer[i];
            if (address == 0x2E && (buffer[i] & 0xC0) == 0)
            {
                fifo.Clear();
            }

            if ((buffer[0] & 0x80) != 0)
            {
                address++;
            }
        }
    }

    public override void WriteRead(ReadOnlySpan<byte> writeBuffer, Span<byte> readBuffer)
    {
        Check();
        int address = writeBuffer[0] & 0x7F;
        bool increment = (writeBuffer[0] & 0x80) != 0;
        if (address == 0x28 && readBuffer.Length == 6)
        {
            var s = FifoOn && fifo.Count > 0 ? fifo.Dequeue() : latest;
            readBuffer[0] = (byte)s.X;
            readBuffer[1] = (byte)(s.X >> 8);
            readBuffer[2] = (byte)s.Y;
            readBuffer[3] = (byte)(s.Y >> 8);
            readBuffer[4] = (byte)s.Z;
            readBuffer[5] = (byte)(s.Z >> 8);
            return;
        }

        for (int i = 0; i < readBuffer.Length; i++)
        {
            readBuffer[i] = address == 0x2F ? FifoSource() : registers[address];
            if (increment)
            {
                address++;
            }
        }
    }

    private byte FifoSource()
    {
        int n = fifo.Count;
        byte value = (byte)(n >= FifoDepth - 1 ? 0x1F : n);
        if (n == FifoDepth)
        {
            value |= 0x40;
        }

        if (n == 0)
        {
            value |= 0x20;
        }

        return value;
    }

    private void Check()
    {
        if (FailTransfers)
        {
            throw new IOException("Error 121 performing I2C data transfer.");
        }
    }
}
