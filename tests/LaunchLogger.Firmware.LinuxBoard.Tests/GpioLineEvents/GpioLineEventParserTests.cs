using System.Runtime.InteropServices;
using LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;
using LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.GpioLineEvents;

public class GpioLineEventParserTests
{
    // C mirror of struct gpio_v2_line_event from linux/include/uapi/linux/gpio.h (torvalds/linux;
    // also checked here by compiling sizeof/offsetof against linux-libc-dev's <linux/gpio.h>:
    // 48 bytes, line_seqno at 20). The marshaller lays a sequential struct out by the C rules.
    [StructLayout(LayoutKind.Sequential)]
    private unsafe struct KernelLineEvent
    {
        public ulong TimestampNs;
        public uint Id;
        public uint Offset;
        public uint Seqno;
        public uint LineSeqno;
        public fixed uint Padding[6];
    }

    [Fact]
    public void Record_size_and_field_offsets_follow_the_kernel_header()
    {
        Assert.Equal(48, GpioLineEventParser.RecordSize);
        Assert.Equal(GpioLineEventParser.RecordSize, Marshal.SizeOf<KernelLineEvent>());
        Assert.Equal(0, (int)Marshal.OffsetOf<KernelLineEvent>(nameof(KernelLineEvent.TimestampNs)));
        Assert.Equal(8, (int)Marshal.OffsetOf<KernelLineEvent>(nameof(KernelLineEvent.Id)));
        Assert.Equal(12, (int)Marshal.OffsetOf<KernelLineEvent>(nameof(KernelLineEvent.Offset)));
        Assert.Equal(16, (int)Marshal.OffsetOf<KernelLineEvent>(nameof(KernelLineEvent.Seqno)));
        Assert.Equal(20, (int)Marshal.OffsetOf<KernelLineEvent>(nameof(KernelLineEvent.LineSeqno)));
    }

    [Fact]
    public void Golden_record_parses_field_by_field()
    {
        // 1 234 567 890 123 ns = 0x0000_011F_71FB_04CB; rising edge on line 17, 5th event of the
        // request and 3rd of the line; padding filled to show it is ignored.
        byte[] record =
        {
            0xCB, 0x04, 0xFB, 0x71, 0x1F, 0x01, 0x00, 0x00,
            0x01, 0x00, 0x00, 0x00,
            0x11, 0x00, 0x00, 0x00,
            0x05, 0x00, 0x00, 0x00,
            0x03, 0x00, 0x00, 0x00,
            0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE,
            0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE, 0xEE,
        };

        GpioLineEvent e = GpioLineEventParser.Parse(record);

        Assert.Equal(1_234_567_890_123UL, e.TimestampNs);
        Assert.Equal(GpioLineEvent.RisingEdge, e.Id);
        Assert.Equal(17u, e.Offset);
        Assert.Equal(5u, e.Seqno);
        Assert.Equal(3u, e.LineSeqno);
    }

    [Fact]
    public void Parse_reads_the_same_values_the_C_layout_writes()
    {
        var source = new KernelLineEvent { TimestampNs = ulong.MaxValue - 7, Id = 2, Offset = 200, Seqno = uint.MaxValue, LineSeqno = 0x8000_0001 };
        byte[] bytes = new byte[48];
        MemoryMarshal.Write(bytes, in source);

        GpioLineEvent e = GpioLineEventParser.Parse(bytes);

        Assert.Equal(new GpioLineEvent(ulong.MaxValue - 7, 2, 200, uint.MaxValue, 0x8000_0001), e);
    }

    [Fact]
    public void ParseMany_reads_back_to_back_records_in_order()
    {
        byte[] bytes = LineEventRecords.Build(1000, 1, 17, 1, 1)
            .Concat(LineEventRecords.Build(2000, 2, 18, 2, 1))
            .Concat(LineEventRecords.Build(3000, 1, 17, 3, 2))
            .ToArray();
        var events = new GpioLineEvent[4];

        int n = GpioLineEventParser.ParseMany(bytes, events);

        Assert.Equal(3, n);
        Assert.Equal(new GpioLineEvent(1000, 1, 17, 1, 1), events[0]);
        Assert.Equal(new GpioLineEvent(2000, 2, 18, 2, 1), events[1]);
        Assert.Equal(new GpioLineEvent(3000, 1, 17, 3, 2), events[2]);
    }

    [Theory]
    [InlineData("empty", 0, 0)]
    [InlineData("one record", 48, 1)]
    [InlineData("sixty-four records", 48 * 64, 64)]
    public void ParseMany_counts_whole_records(string name, int bytes, int expected)
    {
        _ = name;
        Assert.Equal(expected, GpioLineEventParser.ParseMany(new byte[bytes], new GpioLineEvent[64]));
    }

    [Theory]
    [InlineData("short record", 47)]
    [InlineData("record and a half", 72)]
    public void Partial_records_are_a_caller_error(string name, int bytes)
    {
        _ = name;
        Assert.Throws<ArgumentException>(() => GpioLineEventParser.ParseMany(new byte[bytes], new GpioLineEvent[4]));
    }

    [Fact]
    public void Too_small_destination_is_a_caller_error()
    {
        Assert.Throws<ArgumentException>(() => GpioLineEventParser.ParseMany(new byte[96], new GpioLineEvent[1]));
        Assert.Throws<ArgumentException>(() => GpioLineEventParser.Parse(new byte[20]));
    }
}
