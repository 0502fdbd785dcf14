using System.Runtime.InteropServices;

namespace LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;

/// <summary>The few libc calls the GPIO character device needs. Kept here, away from the
/// parsing and tracking logic, so everything else can be tested without a GPIO chip.</summary>
internal static unsafe partial class LibC
{
    // Values from asm-generic/fcntl.h, asm-generic/errno-base.h and asm-generic/poll.h, shared by
    // arm, arm64, x86 and riscv Linux.
    internal const int ORdWr = 0x2;
    internal const int OCloExec = 0x80000;
    internal const short PollIn = 0x1;
    internal const int EIntr = 4;
    internal const int EAgain = 11;

    [LibraryImport("libc", EntryPoint = "open", StringMarshalling = StringMarshalling.Utf8, SetLastError = true)]
    internal static partial int Open(string path, int flags);

    [LibraryImport("libc", EntryPoint = "close", SetLastError = true)]
    internal static partial int Close(int fd);

    // int ioctl(int fd, unsigned long request, ...): the one variadic argument is a pointer, which
    // the arm64, x86-64 and arm calling conventions pass exactly like a fixed argument.
    [LibraryImport("libc", EntryPoint = "ioctl", SetLastError = true)]
    internal static partial int Ioctl(int fd, nuint request, void* argument);

    [LibraryImport("libc", EntryPoint = "read", SetLastError = true)]
    internal static partial nint Read(int fd, void* buffer, nuint count);

    [LibraryImport("libc", EntryPoint = "poll", SetLastError = true)]
    internal static partial int Poll(PollFd* fds, nuint count, int timeoutMs);

    /// <summary><c>struct pollfd</c>: int fd; short events; short revents.</summary>
    [StructLayout(LayoutKind.Sequential)]
    internal struct PollFd
    {
        public int Fd;
        public short Events;
        public short Revents;
    }
}
