using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>A LIS3DH behind the core's register bus: a 128-register map plus a 32-sample FIFO.
/// Register behaviour per the LIS3DH datasheet and ST AN3308 (from memory): bit 7 of the
/// sub-address asks for auto-increment; with CTRL_REG5.FIFO_EN set and FIFO_CTRL_REG in stream
/// mode, reading the six output bytes takes the oldest stored sample, and a full FIFO shows OVRN
/// with FSS = 31 and loses its oldest sample to the next one; bypass mode empties the FIFO.</summary>
public sealed class FakeLis3dhBus : IRegisterBus
{
    public const int FifoDepth = 32;

    private readonly byte[] registers = new byte[128];
    private readonly Queue<short[]> fifo = new();
    private short[] latest = new short[3];

    public FakeLis3dhBus()
    {
        registers[0x0F] = 0x33;
    }

    /// <summary>When set, every transfer fails (returns false).</summary>
    public bool Fail { get; set; }

    /// <summary>Samples the chip overwrote because nobody read them in time.</summary>
    public int SamplesLost { get; private set; }

    /// <summary>Register writes in order, as (address, value).</summary>
    public List<(int Address, byte Value)> Writes { get; } = new();

    public byte Register(int address) => registers[address];

    public void SetRegister(int address, byte value) => registers[address] = value;

    private bool FifoOn => (registers[0x24] & 0x40) != 0 && (registers[0x2E] & 0xC0) != 0;

    /// <summary>A new sample from the sensing element, left-justified 16-bit raw values.</summary>
    public void Produce(short x, short y, short z)
    {
        latest = new[] { x, y, z };
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

    public bool Write(byte[] data)
    {
        if (Fail)
        {
            return false;
        }

        int address = data[0] & 0x7F;
        for (int i = 1; i < data.Length; i++)
        {
            registers[address] = data[i];
            Writes.Add((address, data[i]));
            if (address == 0x2E && (data[i] & 0xC0) == 0)
            {
                fifo.Clear();
            }

            if ((data[0] & 0x80) != 0)
            {
                address++;
            }
        }

        return true;
    }

    public bool WriteRead(byte[] write, byte[] read)
    {
        if (Fail)
        {
            return false;
        }

        int address = write[0] & 0x7F;
        bool increment = (write[0] & 0x80) != 0;
        if (address == 0x28 && read.Length == 6 && increment)
        {
            short[] s = FifoOn && fifo.Count > 0 ? fifo.Dequeue() : latest;
            for (int axis = 0; axis < 3; axis++)
            {
                read[axis * 2] = (byte)s[axis];
                read[(axis * 2) + 1] = (byte)(s[axis] >> 8);
            }

            return true;
        }

        for (int i = 0; i < read.Length; i++)
        {
            read[i] = address == 0x2F ? FifoSource() : registers[address];
            if (increment)
            {
                address++;
            }
        }

        return true;
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
}
