using System.Buffers.Binary;

namespace LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;

/// <summary>Reads <c>struct gpio_v2_line_event</c> records from the bytes that <c>read()</c>
/// returns on a line request's file descriptor.</summary>
/// <remarks>
/// Layout (linux/include/uapi/linux/gpio.h, checked against torvalds/linux):
/// <code>
/// offset  0  __aligned_u64 timestamp_ns
/// offset  8  __u32 id
/// offset 12  __u32 offset
/// offset 16  __u32 seqno
/// offset 20  __u32 line_seqno
/// offset 24  __u32 padding[6]      (reserved)
/// size   48
/// </code>
/// The kernel writes the record in the CPU's byte order; every board this runs on (arm, arm64,
/// x86-64, riscv64) is little-endian, so the fields are read little-endian explicitly rather than
/// by casting bytes to a struct. Padding is ignored: the kernel reserves it for later use.
/// </remarks>
public static class GpioLineEventParser
{
    /// <summary>Bytes in one record: <c>sizeof(struct gpio_v2_line_event)</c>.</summary>
    public const int RecordSize = 48;

    /// <summary>Parses the record at the start of <paramref name="record"/>.</summary>
    /// <exception cref="ArgumentException">Fewer than <see cref="RecordSize"/> bytes.</exception>
    public static GpioLineEvent Parse(ReadOnlySpan<byte> record)
    {
        if (record.Length < RecordSize)
        {
            throw new ArgumentException("a line event record is " + RecordSize + " bytes; got " + record.Length, nameof(record));
        }

        return new GpioLineEvent(
            BinaryPrimitives.ReadUInt64LittleEndian(record),
            BinaryPrimitives.ReadUInt32LittleEndian(record.Slice(8)),
            BinaryPrimitives.ReadUInt32LittleEndian(record.Slice(12)),
            BinaryPrimitives.ReadUInt32LittleEndian(record.Slice(16)),
            BinaryPrimitives.ReadUInt32LittleEndian(record.Slice(20)));
    }

    /// <summary>Parses every whole record in <paramref name="bytes"/> into
    /// <paramref name="destination"/>.</summary>
    /// <returns>The number of records parsed. A <c>read()</c> on a line request returns whole
    /// records only, so a trailing partial record means a caller bug or a changed kernel ABI.</returns>
    /// <exception cref="ArgumentException">The byte count is not a multiple of
    /// <see cref="RecordSize"/>, or <paramref name="destination"/> is too short.</exception>
    public static int ParseMany(ReadOnlySpan<byte> bytes, Span<GpioLineEvent> destination)
    {
        if (bytes.Length % RecordSize != 0)
        {
            throw new ArgumentException("line event bytes must be whole " + RecordSize + "-byte records; got " + bytes.Length, nameof(bytes));
        }

        int count = bytes.Length / RecordSize;
        if (destination.Length < count)
        {
            throw new ArgumentException("destination holds " + destination.Length + " events; " + count + " were read", nameof(destination));
        }

        for (int i = 0; i < count; i++)
        {
            destination[i] = Parse(bytes.Slice(i * RecordSize, RecordSize));
        }

        return count;
    }
}
