using System.ComponentModel;
using System.Runtime.InteropServices;
using System.Text;

namespace LaunchLogger.Tests.Support;

/// <summary>A pseudo-terminal made in-process (libc <c>posix_openpt</c>, <c>grantpt</c>,
/// <c>unlockpt</c>, <c>ptsname_r</c>), in raw mode (<c>cfmakeraw</c>): the code under test opens
/// <see cref="PortName"/> like any serial device (<c>System.IO.Ports.SerialPort</c>), and the test
/// plays the far end of the cable through <see cref="Write"/> and <see cref="ReadExactly"/>.
/// Nothing beyond the .NET SDK and libc is needed. Linux only.</summary>
/// <remarks>
/// <para>To use it from a test project, link the file:
/// <c>&lt;Compile Include="../Shared/PseudoTerminalPair.cs" Link="Shared/PseudoTerminalPair.cs" /&gt;</c>.</para>
/// <para>The pair keeps one descriptor on the port side open itself, so the far end never sees a
/// hang-up while the code under test closes and reopens the port, and bytes written before the
/// port is opened wait in the terminal's buffer. <see cref="HangUp"/> closes the far end, as a
/// pulled cable does; <paramref name="linkPath"/> of <see cref="Open"/> gives the port a stable
/// name (a symbolic link), so a test can "plug the cable back in" by opening a new pair on the
/// same link.</para>
/// <para>Every wait has a timeout: a test never hangs on a silent peer. Close every port opened on
/// <see cref="PortName"/> before disposing the pair (HARDWARE-FACTS.md, serial).</para>
/// </remarks>
internal sealed class PseudoTerminalPair : IDisposable
{
    // asm-generic/fcntl.h and asm-generic/poll.h values, shared by x86, x86-64, arm and arm64 Linux.
    private const int ORdWr = 0x2;
    private const int ONoCtty = 0x100;
    private const int ONonBlock = 0x800;
    private const int OCloExec = 0x80000;
    private const int FGetFl = 3;
    private const int FSetFl = 4;
    private const short PollIn = 0x1;
    private const short PollOut = 0x4;
    private const int EIntr = 4;
    private const int EAgain = 11;
    private const int TcsaNow = 0;

    // struct termios is 60 bytes with glibc and musl on every Linux architecture we build for; a
    // larger opaque buffer keeps this independent of the exact layout.
    private const int TermiosBufferBytes = 256;

    private readonly string? linkPath;
    private int farEnd;
    private int portSide;

    private PseudoTerminalPair(int farEnd, int portSide, string ptsPath, string? linkPath)
    {
        this.farEnd = farEnd;
        this.portSide = portSide;
        this.linkPath = linkPath;
        DevicePath = ptsPath;
        PortName = linkPath ?? ptsPath;
    }

    /// <summary>The name to open as a serial port: the link given to <see cref="Open"/>, else the
    /// terminal's own device path.</summary>
    public string PortName { get; }

    /// <summary>The terminal's device path, e.g. <c>/dev/pts/7</c>.</summary>
    public string DevicePath { get; }

    /// <summary>Whether <see cref="HangUp"/> or <see cref="Dispose"/> has closed the far end.</summary>
    public bool IsHungUp => farEnd < 0;

    /// <summary>Makes a new pseudo-terminal in raw mode (no echo, no line editing, no character
    /// translation: all 256 byte values pass unchanged).</summary>
    /// <param name="linkPath">If given, a symbolic link made (or replaced) there that points to the
    /// terminal; removed again on <see cref="Dispose"/>.</param>
    /// <exception cref="PlatformNotSupportedException">Not on Linux.</exception>
    /// <exception cref="Win32Exception">A libc call failed; the message names it.</exception>
    public static PseudoTerminalPair Open(string? linkPath = null)
    {
        if (!OperatingSystem.IsLinux())
        {
            throw new PlatformNotSupportedException("the in-process pseudo-terminal pair needs Linux (libc posix_openpt)");
        }

        int master = Check(posix_openpt(ORdWr | ONoCtty), "posix_openpt");
        int slave = -1;
        try
        {
            Check(grantpt(master), "grantpt");
            Check(unlockpt(master), "unlockpt");
            byte[] name = new byte[128];
            int err = ptsname_r(master, name, (nuint)name.Length);
            if (err != 0)
            {
                throw new Win32Exception(err, "ptsname_r failed");
            }

            string ptsPath = Encoding.UTF8.GetString(name, 0, Array.IndexOf(name, (byte)0));
            slave = Check(open(ptsPath, ORdWr | ONoCtty | OCloExec), "open " + ptsPath);
            MakeRaw(slave);
            MakeRaw(master);
            int flags = Check(fcntl(master, FGetFl, 0), "fcntl F_GETFL");
            Check(fcntl(master, FSetFl, flags | ONonBlock), "fcntl F_SETFL");
            if (linkPath != null)
            {
                File.Delete(linkPath);
                File.CreateSymbolicLink(linkPath, ptsPath);
            }

            return new PseudoTerminalPair(master, slave, ptsPath, linkPath);
        }
        catch
        {
            if (slave >= 0)
            {
                _ = close(slave);
            }

            _ = close(master);
            throw;
        }
    }

    /// <summary>Writes all of <paramref name="count"/> bytes into the far end, to come out of
    /// <see cref="PortName"/>.</summary>
    /// <exception cref="TimeoutException">The port side stopped taking bytes for longer than
    /// <paramref name="timeout"/> (nobody reading, buffer full).</exception>
    public void Write(byte[] buffer, int offset, int count, TimeSpan timeout)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(offset);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(count, buffer.Length - offset);
        int done = 0;
        while (done < count)
        {
            WaitFor(PollOut, timeout, "write " + (count - done) + " more bytes");
            nint n = write(RequireOpen(), ref buffer[offset + done], (nuint)(count - done));
            if (n < 0)
            {
                ThrowUnlessRetry("write");
                continue;
            }

            done += (int)n;
        }
    }

    /// <summary>Writes all of <paramref name="bytes"/> into the far end.</summary>
    public void Write(byte[] bytes, TimeSpan timeout) => Write(bytes, 0, bytes.Length, timeout);

    /// <summary>Reads exactly <paramref name="count"/> bytes that were written into
    /// <see cref="PortName"/>.</summary>
    /// <exception cref="TimeoutException">Fewer bytes came within <paramref name="timeout"/> of
    /// the last one; the message says how many.</exception>
    public byte[] ReadExactly(int count, TimeSpan timeout)
    {
        byte[] buffer = new byte[count];
        int done = 0;
        while (done < count)
        {
            WaitFor(PollIn, timeout, "read: " + done + " of " + count + " bytes came");
            nint n = read(RequireOpen(), ref buffer[done], (nuint)(count - done));
            if (n < 0)
            {
                ThrowUnlessRetry("read");
                continue;
            }

            done += (int)n;
        }

        return buffer;
    }

    /// <summary>Reads whatever has arrived within <paramref name="wait"/> (possibly nothing).</summary>
    public byte[] ReadAvailable(TimeSpan wait)
    {
        var got = new MemoryStream();
        byte[] chunk = new byte[4096];
        while (Poll(PollIn, wait))
        {
            nint n = read(RequireOpen(), ref chunk[0], (nuint)chunk.Length);
            if (n < 0)
            {
                ThrowUnlessRetry("read");
                continue;
            }

            if (n == 0)
            {
                break;
            }

            got.Write(chunk, 0, (int)n);
            wait = TimeSpan.Zero;
        }

        return got.ToArray();
    }

    /// <summary>Closes the far end, as a pulled cable does: the port side's reads end and its
    /// writes fail. The port name stays until <see cref="Dispose"/>.</summary>
    public void HangUp()
    {
        int fd = Interlocked.Exchange(ref farEnd, -1);
        if (fd >= 0)
        {
            _ = close(fd);
        }
    }

    /// <summary>Hangs up, closes the pair's own port-side descriptor and removes the link.</summary>
    public void Dispose()
    {
        HangUp();
        int fd = Interlocked.Exchange(ref portSide, -1);
        if (fd >= 0)
        {
            _ = close(fd);
        }

        if (linkPath != null && File.ResolveLinkTarget(linkPath, false)?.FullName == DevicePath)
        {
            File.Delete(linkPath);
        }
    }

    private static void MakeRaw(int fd)
    {
        byte[] termios = new byte[TermiosBufferBytes];
        Check(tcgetattr(fd, termios), "tcgetattr");
        cfmakeraw(termios);
        Check(tcsetattr(fd, TcsaNow, termios), "tcsetattr");
    }

    private static int Check(int result, string call)
    {
        if (result < 0)
        {
            throw new Win32Exception(Marshal.GetLastPInvokeError(), call + " failed");
        }

        return result;
    }

    private static void ThrowUnlessRetry(string call)
    {
        int errno = Marshal.GetLastPInvokeError();
        if (errno != EIntr && errno != EAgain)
        {
            throw new Win32Exception(errno, call + " on the pseudo-terminal failed");
        }
    }

    private int RequireOpen()
    {
        int fd = farEnd;
        ObjectDisposedException.ThrowIf(fd < 0, this);
        return fd;
    }

    private void WaitFor(short events, TimeSpan timeout, string what)
    {
        if (!Poll(events, timeout))
        {
            throw new TimeoutException("pseudo-terminal " + DevicePath + ": timed out after " + timeout.TotalMilliseconds + " ms waiting to " + what);
        }
    }

    private bool Poll(short events, TimeSpan timeout)
    {
        var fds = new[] { new PollFd { Fd = RequireOpen(), Events = events } };
        long deadline = Environment.TickCount64 + (long)timeout.TotalMilliseconds;
        while (true)
        {
            int left = (int)Math.Max(0, deadline - Environment.TickCount64);
            int n = poll(fds, 1, left);
            if (n > 0)
            {
                return true;
            }

            if (n == 0)
            {
                return false;
            }

            ThrowUnlessRetry("poll");
        }
    }

    [DllImport("libc", SetLastError = true)]
    private static extern int posix_openpt(int flags);

    [DllImport("libc", SetLastError = true)]
    private static extern int grantpt(int fd);

    [DllImport("libc", SetLastError = true)]
    private static extern int unlockpt(int fd);

    [DllImport("libc")]
    private static extern int ptsname_r(int fd, byte[] buffer, nuint length);

    [DllImport("libc", SetLastError = true)]
    private static extern int open([MarshalAs(UnmanagedType.LPUTF8Str)] string path, int flags);

    [DllImport("libc", SetLastError = true)]
    private static extern int close(int fd);

    // int fcntl(int fd, int cmd, ...): the one int argument passes like a fixed one on the
    // x86-64, arm and arm64 Linux calling conventions.
    [DllImport("libc", SetLastError = true)]
    private static extern int fcntl(int fd, int cmd, int argument);

    [DllImport("libc", SetLastError = true)]
    private static extern int tcgetattr(int fd, byte[] termios);

    [DllImport("libc", SetLastError = true)]
    private static extern int tcsetattr(int fd, int optionalActions, byte[] termios);

    [DllImport("libc")]
    private static extern void cfmakeraw(byte[] termios);

    [DllImport("libc", SetLastError = true)]
    private static extern nint read(int fd, ref byte buffer, nuint count);

    [DllImport("libc", SetLastError = true)]
    private static extern nint write(int fd, ref byte buffer, nuint count);

    [DllImport("libc", SetLastError = true)]
    private static extern int poll([In, Out] PollFd[] fds, nuint count, int timeoutMs);

    /// <summary><c>struct pollfd</c>: int fd; short events; short revents.</summary>
    [StructLayout(LayoutKind.Sequential)]
    private struct PollFd
    {
        public int Fd;
        public short Events;
        public short Revents;
    }
}
