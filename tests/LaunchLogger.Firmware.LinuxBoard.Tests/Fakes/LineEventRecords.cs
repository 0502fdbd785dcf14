using System.Buffers.Binary;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;

/// <summary>Builds struct gpio_v2_line_event records byte by byte, the way the kernel lays them
/// out (linux/include/uapi/linux/gpio.h): u64 timestamp_ns at 0, u32 id at 8, offset at 12,
/// seqno at 16, line_seqno at 20, 24 bytes of padding; 48 bytes, little-endian on our boards.</summary>
internal static class LineEventRecords
{
    public static byte[] Build(ulong timestampNs, uint id, uint offset, uint seqno, uint lineSeqno, byte paddingFill = 0)
    {
        byte[] record = new byte[48];
        BinaryPrimitives.WriteUInt64LittleEndian(record.AsSpan(0), timestampNs);
        BinaryPrimitives.WriteUInt32LittleEndian(record.AsSpan(8), id);
        BinaryPrimitives.WriteUInt32LittleEndian(record.AsSpan(12), offset);
        BinaryPrimitives.WriteUInt32LittleEndian(record.AsSpan(16), seqno);
        BinaryPrimitives.WriteUInt32LittleEndian(record.AsSpan(20), lineSeqno);
        record.AsSpan(24).Fill(paddingFill);
        return record;
    }
}
