using System.Diagnostics;
using System.Text.RegularExpressions;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;

/// <summary>Two linked pseudo-terminals made by <c>socat -d -d pty,raw,echo=0 pty,raw,echo=0</c>
/// (Debian package socat): bytes written to one come out of the other. Close every port on them
/// before disposing this: a port whose peer dies mid-write can hang (HARDWARE-FACTS.md).</summary>
internal sealed partial class SocatPtyPair : IDisposable
{
    private readonly Process process;

    private SocatPtyPair(Process process, string first, string second)
    {
        this.process = process;
        First = first;
        Second = second;
    }

    public string First { get; }

    public string Second { get; }

    public static SocatPtyPair Start()
    {
        var info = new ProcessStartInfo("socat", "-d -d pty,raw,echo=0 pty,raw,echo=0")
        {
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        Process process;
        try
        {
            process = Process.Start(info) ?? throw new InvalidOperationException("socat did not start");
        }
        catch (System.ComponentModel.Win32Exception e)
        {
            throw new InvalidOperationException("socat is needed for the serial tests: apt-get install socat (" + e.Message + ")", e);
        }

        var names = new List<string>();
        try
        {
            while (names.Count < 2)
            {
                string? line = process.StandardError.ReadLine();
                if (line == null)
                {
                    throw new InvalidOperationException("socat exited before opening two pseudo-terminals");
                }

                Match m = PtyLine().Match(line);
                if (m.Success)
                {
                    names.Add(m.Groups[1].Value);
                }
            }

            // Keep draining socat's log so it never blocks on a full pipe.
            StreamReader log = process.StandardError;
            _ = Task.Run(() => log.ReadToEnd());
        }
        catch
        {
            // Never leave a socat behind when set-up fails.
            if (!process.HasExited)
            {
                process.Kill(entireProcessTree: true);
            }

            process.Dispose();
            throw;
        }

        return new SocatPtyPair(process, names[0], names[1]);
    }

    public void Dispose()
    {
        if (!process.HasExited)
        {
            process.Kill(entireProcessTree: true);
            process.WaitForExit();
        }

        process.Dispose();
    }

    [GeneratedRegex(@"PTY is (\S+)")]
    private static partial Regex PtyLine();
}
