using System.Buffers.Binary;
using System.Runtime.InteropServices;
using System.Text;
using LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.GpioLineEvents;

public class GpioLineRequestLayoutTests
{
    // C mirrors of the v2 request structs (linux/include/uapi/linux/gpio.h, torvalds/linux), laid
    // out by the marshaller with C alignment rules. The same numbers came out of compiling
    // sizeof/offsetof against linux-libc-dev's <linux/gpio.h> on x86-64: request 592, config 272,
    // fd at 588, GPIO_V2_GET_LINE_IOCTL 0xc250b407.
    [StructLayout(LayoutKind.Sequential)]
    private struct LineAttribute
    {
        public uint Id;
        public uint Padding;
        public ulong Value;
    }

    [StructLayout(LayoutKind.Sequential)]
    private struct LineConfigAttribute
    {
        public LineAttribute Attr;
        public ulong Mask;
    }

    [StructLayout(LayoutKind.Sequential)]
    private unsafe struct LineConfig
    {
        public ulong Flags;
        public uint NumAttrs;
        public fixed uint Padding[5];
        public LineConfigAttribute A0, A1, A2, A3, A4, A5, A6, A7, A8, A9;
    }

    [StructLayout(LayoutKind.Sequential)]
    private unsafe struct LineRequest
    {
        public fixed uint Offsets[64];
        public fixed byte Consumer[32];
        public LineConfig Config;
        public uint NumLines;
        public uint EventBufferSize;
        public fixed uint Padding[5];
        public int Fd;
    }

    [Fact]
    public void Size_and_offsets_follow_the_kernel_header()
    {
        Assert.Equal(272, Marshal.SizeOf<LineConfig>());
        Assert.Equal(GpioLineRequestLayout.Size, Marshal.SizeOf<LineRequest>());
        Assert.Equal(GpioLineRequestLayout.ConsumerOffset, (int)Marshal.OffsetOf<LineRequest>(nameof(LineRequest.Consumer)));
        Assert.Equal(GpioLineRequestLayout.ConfigFlagsOffset, (int)Marshal.OffsetOf<LineRequest>(nameof(LineRequest.Config)));
        Assert.Equal(GpioLineRequestLayout.NumLinesOffset, (int)Marshal.OffsetOf<LineRequest>(nameof(LineRequest.NumLines)));
        Assert.Equal(GpioLineRequestLayout.EventBufferSizeOffset, (int)Marshal.OffsetOf<LineRequest>(nameof(LineRequest.EventBufferSize)));
        Assert.Equal(GpioLineRequestLayout.FdOffset, (int)Marshal.OffsetOf<LineRequest>(nameof(LineRequest.Fd)));
    }

    [Fact]
    public void Ioctl_number_is_the_headers_IOWR_B4_07()
    {
        // GPIO_V2_GET_LINE_IOCTL as the C preprocessor expands it with the generic encoding
        // (linux-libc-dev's <linux/gpio.h> on x86-64 printed 0xc250b407).
        Assert.Equal(0xC250B407u, GpioLineRequestLayout.GetLineIoctl);
    }

    [Theory]
    [InlineData("rising, bias as is", EdgeSelection.Rising, LineBias.AsIs, (1UL << 2) | (1UL << 4))]
    [InlineData("falling, pull-up", EdgeSelection.Falling, LineBias.PullUp, (1UL << 2) | (1UL << 5) | (1UL << 8))]
    [InlineData("both, pull-down", EdgeSelection.Both, LineBias.PullDown, (1UL << 2) | (1UL << 4) | (1UL << 5) | (1UL << 9))]
    [InlineData("rising, bias off", EdgeSelection.Rising, LineBias.Disabled, (1UL << 2) | (1UL << 4) | (1UL << 10))]
    public void Flags_are_the_headers_bits(string name, EdgeSelection edges, LineBias bias, ulong expected)
    {
        // enum gpio_v2_line_flag: INPUT bit 2, EDGE_RISING 4, EDGE_FALLING 5, PULL_UP 8,
        // PULL_DOWN 9, BIAS_DISABLED 10.
        _ = name;
        Assert.Equal(expected, GpioLineRequestLayout.Flags(edges, bias));
    }

    [Fact]
    public void Request_bytes_land_where_the_kernel_reads_them()
    {
        byte[] request = Enumerable.Repeat((byte)0xAA, 600).ToArray();
        ulong flags = GpioLineRequestLayout.Flags(EdgeSelection.Both, LineBias.PullUp);

        GpioLineRequestLayout.Write(request, new[] { 17, 27 }, "launchlogger", flags, 512);

        Assert.Equal(17u, BinaryPrimitives.ReadUInt32LittleEndian(request.AsSpan(0)));
        Assert.Equal(27u, BinaryPrimitives.ReadUInt32LittleEndian(request.AsSpan(4)));
        Assert.All(request.AsSpan(8, 248).ToArray(), b => Assert.Equal(0, b));
        Assert.Equal("launchlogger", Encoding.ASCII.GetString(request, 256, 12));
        Assert.Equal(0, request[256 + 12]);
        Assert.Equal(flags, BinaryPrimitives.ReadUInt64LittleEndian(request.AsSpan(288)));
        Assert.Equal(0u, BinaryPrimitives.ReadUInt32LittleEndian(request.AsSpan(296)));
        Assert.All(request.AsSpan(300, 260).ToArray(), b => Assert.Equal(0, b));
        Assert.Equal(2u, BinaryPrimitives.ReadUInt32LittleEndian(request.AsSpan(560)));
        Assert.Equal(512u, BinaryPrimitives.ReadUInt32LittleEndian(request.AsSpan(564)));
        Assert.All(request.AsSpan(568, 24).ToArray(), b => Assert.Equal(0, b));
        Assert.Equal(0xAA, request[592]);
    }

    [Fact]
    public void The_kernels_fd_is_read_from_offset_588()
    {
        byte[] request = new byte[GpioLineRequestLayout.Size];
        BinaryPrimitives.WriteInt32LittleEndian(request.AsSpan(588), 9);
        Assert.Equal(9, GpioLineRequestLayout.ReadFd(request));
    }

    [Theory]
    [InlineData("no lines", new int[0], "x")]
    [InlineData("repeated line", new[] { 4, 4 }, "x")]
    [InlineData("negative line", new[] { -1 }, "x")]
    [InlineData("label too long", new[] { 4 }, "a label of thirty-two characters")]
    public void Bad_requests_are_refused(string name, int[] lines, string consumer)
    {
        _ = name;
        Assert.ThrowsAny<ArgumentException>(() => GpioLineRequestLayout.Write(new byte[592], lines, consumer, 0, 0));
    }
}
