using System.Runtime.InteropServices;

namespace LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;

/// <summary>Requests edge events on pickup lines from a GPIO character device
/// (<c>/dev/gpiochipN</c>, v2 uAPI) and reads the kernel-timestamped events.</summary>
/// <remarks>
/// System.Device.Gpio's event callbacks drop the kernel's timestamp, so this class makes the
/// <c>GPIO_V2_GET_LINE_IOCTL</c> call itself and reads <c>struct gpio_v2_line_event</c> records
/// from the returned file descriptor. Only the system calls live here; the request bytes come
/// from <see cref="GpioLineRequestLayout"/> and the records are decoded by
/// <see cref="GpioLineEventParser"/>, both tested without hardware.
/// </remarks>
public sealed unsafe class GpioLineEventReader : IDisposable
{
    private const int MaxEventsPerRead = 64;
    private readonly byte[] readBuffer = new byte[MaxEventsPerRead * GpioLineEventParser.RecordSize];
    private int lineFd;

    private GpioLineEventReader(int lineFd)
    {
        this.lineFd = lineFd;
    }

    /// <summary>Asks the kernel for edge events on <paramref name="lineOffsets"/> of
    /// <paramref name="chipPath"/>.</summary>
    /// <exception cref="IOException">The chip cannot be opened or the lines cannot be requested
    /// (busy, wrong offset, no permission); the message carries the errno.</exception>
    public static GpioLineEventReader Open(string chipPath, ReadOnlySpan<int> lineOffsets, EdgeSelection edges, LineBias bias, int eventBufferSize, string consumer)
    {
        byte[] request = new byte[GpioLineRequestLayout.Size];
        GpioLineRequestLayout.Write(request, lineOffsets, consumer, GpioLineRequestLayout.Flags(edges, bias), eventBufferSize);
        int chipFd = LibC.Open(chipPath, LibC.ORdWr | LibC.OCloExec);
        if (chipFd < 0)
        {
            throw Failure("cannot open " + chipPath);
        }

        try
        {
            int result;
            fixed (byte* pointer = request)
            {
                result = LibC.Ioctl(chipFd, GpioLineRequestLayout.GetLineIoctl, pointer);
            }

            if (result < 0)
            {
                throw Failure("GPIO_V2_GET_LINE_IOCTL on " + chipPath + " for lines " + string.Join(",", lineOffsets.ToArray()) + " failed");
            }

            int fd = GpioLineRequestLayout.ReadFd(request);
            if (fd <= 0)
            {
                throw new IOException("the kernel returned no line file descriptor for " + chipPath);
            }

            return new GpioLineEventReader(fd);
        }
        finally
        {
            // The line request keeps its own reference to the chip.
            LibC.Close(chipFd);
        }
    }

    /// <summary>Waits up to <paramref name="timeoutMs"/> for events and reads those waiting.</summary>
    /// <returns>Events written to <paramref name="destination"/>; 0 when none arrived in time.</returns>
    /// <exception cref="IOException">poll or read failed for a reason other than an interrupt.</exception>
    public int ReadEvents(Span<GpioLineEvent> destination, int timeoutMs)
    {
        ObjectDisposedException.ThrowIf(lineFd < 0, this);
        LibC.PollFd poll = new LibC.PollFd { Fd = lineFd, Events = LibC.PollIn };
        int ready = LibC.Poll(&poll, 1, timeoutMs);
        if (ready < 0)
        {
            int errno = Marshal.GetLastPInvokeError();
            if (errno == LibC.EIntr)
            {
                return 0;
            }

            throw Failure("poll on the line request failed");
        }

        if (ready == 0 || (poll.Revents & LibC.PollIn) == 0)
        {
            return 0;
        }

        int maxBytes = Math.Min(destination.Length, MaxEventsPerRead) * GpioLineEventParser.RecordSize;
        nint n;
        fixed (byte* pointer = readBuffer)
        {
            n = LibC.Read(lineFd, pointer, (nuint)maxBytes);
        }

        if (n < 0)
        {
            int errno = Marshal.GetLastPInvokeError();
            if (errno == LibC.EIntr || errno == LibC.EAgain)
            {
                return 0;
            }

            throw Failure("reading line events failed");
        }

        return GpioLineEventParser.ParseMany(readBuffer.AsSpan(0, (int)n), destination);
    }

    /// <summary>Releases the lines.</summary>
    public void Dispose()
    {
        if (lineFd >= 0)
        {
            LibC.Close(lineFd);
            lineFd = -1;
        }
    }

    private static IOException Failure(string what)
    {
        int errno = Marshal.GetLastPInvokeError();
        return new IOException(what + ": " + Marshal.GetPInvokeErrorMessage(errno) + " (errno " + errno + ")");
    }
}
