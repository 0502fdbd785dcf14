using System.Buffers.Binary;
using System.Text;

namespace LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;

/// <summary>Builds the <c>struct gpio_v2_line_request</c> that <c>GPIO_V2_GET_LINE_IOCTL</c>
/// takes, asking for edge events on input lines.</summary>
/// <remarks>
/// Layout (linux/include/uapi/linux/gpio.h, checked against torvalds/linux; GPIO_V2_LINES_MAX 64,
/// GPIO_MAX_NAME_SIZE 32, GPIO_V2_LINE_NUM_ATTRS_MAX 10):
/// <code>
/// offset   0  __u32 offsets[64]
/// offset 256  char  consumer[32]
/// offset 288  struct gpio_v2_line_config  (272 bytes)
///               +0  __aligned_u64 flags
///               +8  __u32 num_attrs
///              +12  __u32 padding[5]
///              +32  struct gpio_v2_line_config_attribute attrs[10]  (24 bytes each)
/// offset 560  __u32 num_lines
/// offset 564  __u32 event_buffer_size
/// offset 568  __u32 padding[5]
/// offset 588  __s32 fd                      (filled in by the kernel)
/// size   592
/// </code>
/// No per-line attributes are used (num_attrs 0): every requested line gets the same flags. In
/// particular no debounce attribute: a software debounce in the kernel delays the timestamp to
/// the end of the debounce period, and the pickup's input stage (Schmitt trigger) already gives
/// clean edges. The event clock flags are left clear, so events carry CLOCK_MONOTONIC.
/// </remarks>
public static class GpioLineRequestLayout
{
    /// <summary><c>sizeof(struct gpio_v2_line_request)</c>.</summary>
    public const int Size = 592;

    /// <summary>Where the kernel writes the new line request's file descriptor.</summary>
    public const int FdOffset = 588;

    /// <summary>The most lines one request may ask for (GPIO_V2_LINES_MAX).</summary>
    public const int MaxLines = 64;

    /// <summary>Bytes of the consumer label, terminating zero included (GPIO_MAX_NAME_SIZE).</summary>
    public const int MaxNameSize = 32;

    internal const int ConsumerOffset = 256;
    internal const int ConfigFlagsOffset = 288;
    internal const int ConfigNumAttrsOffset = 296;
    internal const int NumLinesOffset = 560;
    internal const int EventBufferSizeOffset = 564;

    /// <summary><c>GPIO_V2_LINE_FLAG_INPUT</c>.</summary>
    public const ulong FlagInput = 1UL << 2;

    /// <summary><c>GPIO_V2_LINE_FLAG_EDGE_RISING</c>.</summary>
    public const ulong FlagEdgeRising = 1UL << 4;

    /// <summary><c>GPIO_V2_LINE_FLAG_EDGE_FALLING</c>.</summary>
    public const ulong FlagEdgeFalling = 1UL << 5;

    /// <summary><c>GPIO_V2_LINE_FLAG_BIAS_PULL_UP</c>.</summary>
    public const ulong FlagBiasPullUp = 1UL << 8;

    /// <summary><c>GPIO_V2_LINE_FLAG_BIAS_PULL_DOWN</c>.</summary>
    public const ulong FlagBiasPullDown = 1UL << 9;

    /// <summary><c>GPIO_V2_LINE_FLAG_BIAS_DISABLED</c>.</summary>
    public const ulong FlagBiasDisabled = 1UL << 10;

    /// <summary><c>GPIO_V2_GET_LINE_IOCTL</c> = <c>_IOWR(0xB4, 0x07, struct gpio_v2_line_request)</c>,
    /// in the generic ioctl encoding (asm-generic/ioctl.h: 2 direction bits at 30, 14 size bits at
    /// 16, type at 8, number at 0) used by arm, arm64, x86 and riscv. MIPS, PowerPC and SPARC
    /// encode ioctls differently and are not supported.</summary>
    public static readonly uint GetLineIoctl = EncodeIowr(0xB4, 0x07, Size);

    /// <summary>The line flags for edge events with the given edges and bias.</summary>
    public static ulong Flags(EdgeSelection edges, LineBias bias)
    {
        ulong flags = FlagInput;
        flags |= edges switch
        {
            EdgeSelection.Rising => FlagEdgeRising,
            EdgeSelection.Falling => FlagEdgeFalling,
            EdgeSelection.Both => FlagEdgeRising | FlagEdgeFalling,
            _ => throw new ArgumentOutOfRangeException(nameof(edges)),
        };
        flags |= bias switch
        {
            LineBias.AsIs => 0,
            LineBias.PullUp => FlagBiasPullUp,
            LineBias.PullDown => FlagBiasPullDown,
            LineBias.Disabled => FlagBiasDisabled,
            _ => throw new ArgumentOutOfRangeException(nameof(bias)),
        };
        return flags;
    }

    /// <summary>Fills <paramref name="request"/> (at least <see cref="Size"/> bytes, zeroed here)
    /// with a request for edge events on <paramref name="lineOffsets"/>.</summary>
    /// <param name="request">Destination.</param>
    /// <param name="lineOffsets">Line offsets on the chip, 1 to 64 of them, no repeats.</param>
    /// <param name="consumer">Label the kernel shows for the lines (ASCII, at most 31 bytes).</param>
    /// <param name="flags">From <see cref="Flags"/>.</param>
    /// <param name="eventBufferSize">Suggested kernel event buffer length in events (0 = kernel default).</param>
    /// <exception cref="ArgumentException">A parameter is out of range.</exception>
    public static void Write(Span<byte> request, ReadOnlySpan<int> lineOffsets, string consumer, ulong flags, int eventBufferSize)
    {
        if (request.Length < Size)
        {
            throw new ArgumentException("the request needs " + Size + " bytes", nameof(request));
        }

        if (lineOffsets.Length < 1 || lineOffsets.Length > MaxLines)
        {
            throw new ArgumentException("request 1 to " + MaxLines + " lines", nameof(lineOffsets));
        }

        if (eventBufferSize < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(eventBufferSize));
        }

        int labelBytes = Encoding.ASCII.GetByteCount(consumer);
        if (labelBytes >= MaxNameSize)
        {
            throw new ArgumentException("the consumer label must be shorter than " + MaxNameSize + " bytes", nameof(consumer));
        }

        request.Slice(0, Size).Clear();
        for (int i = 0; i < lineOffsets.Length; i++)
        {
            if (lineOffsets[i] < 0)
            {
                throw new ArgumentException("line offsets are never negative", nameof(lineOffsets));
            }

            for (int j = 0; j < i; j++)
            {
                if (lineOffsets[j] == lineOffsets[i])
                {
                    throw new ArgumentException("line " + lineOffsets[i] + " is requested twice", nameof(lineOffsets));
                }
            }

            BinaryPrimitives.WriteUInt32LittleEndian(request.Slice(i * 4), (uint)lineOffsets[i]);
        }

        Encoding.ASCII.GetBytes(consumer, request.Slice(ConsumerOffset, MaxNameSize));
        BinaryPrimitives.WriteUInt64LittleEndian(request.Slice(ConfigFlagsOffset), flags);
        BinaryPrimitives.WriteUInt32LittleEndian(request.Slice(ConfigNumAttrsOffset), 0);
        BinaryPrimitives.WriteUInt32LittleEndian(request.Slice(NumLinesOffset), (uint)lineOffsets.Length);
        BinaryPrimitives.WriteUInt32LittleEndian(request.Slice(EventBufferSizeOffset), (uint)eventBufferSize);
    }

    /// <summary>The file descriptor the kernel returned in a completed request.</summary>
    public static int ReadFd(ReadOnlySpan<byte> request)
    {
        return BinaryPrimitives.ReadInt32LittleEndian(request.Slice(FdOffset));
    }

    /// <summary><c>_IOWR(type, nr, size)</c> in the generic encoding: read|write = 3 at bit 30.</summary>
    internal static uint EncodeIowr(uint type, uint number, int size)
    {
        const int NumberShift = 0;
        const int TypeShift = 8;
        const int SizeShift = 16;
        const int DirectionShift = 30;
        const uint ReadWrite = 3;
        if (size < 0 || size >= 1 << 14)
        {
            throw new ArgumentOutOfRangeException(nameof(size));
        }

        return (ReadWrite << DirectionShift) | ((uint)size << SizeShift) | (type << TypeShift) | (number << NumberShift);
    }
}
