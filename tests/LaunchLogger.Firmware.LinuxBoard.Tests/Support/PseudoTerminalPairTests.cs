using System.IO.Ports;
using LaunchLogger.Tests.Support;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Support;

/// <summary>The shared in-process pseudo-terminal (tests/Shared) behaves like a cable: raw bytes
/// both ways through <see cref="SerialPort"/>, a hang-up the port side notices, a stable link name.</summary>
public class PseudoTerminalPairTests
{
    private static readonly TimeSpan Wait = TimeSpan.FromSeconds(5);

    [Fact]
    public void All_256_byte_values_pass_unchanged_both_ways()
    {
        // Raw mode: no echo, no CR/LF translation, no control characters acted on (cfmakeraw,
        // POSIX termios; "all 256 byte values pass" is the check HARDWARE-FACTS.md records for ptys).
        byte[] every = Enumerable.Range(0, 256).Select(i => (byte)i).ToArray();
        using PseudoTerminalPair pair = PseudoTerminalPair.Open();
        using (var port = new SerialPort(pair.PortName, 115200) { ReadTimeout = 5000, WriteTimeout = 5000, Handshake = Handshake.None })
        {
            port.Open();
            pair.Write(every, Wait);
            Assert.Equal(every, ReadExactly(port, every.Length));

            port.Write(every, 0, every.Length);
            Assert.Equal(every, pair.ReadExactly(every.Length, Wait));

            // Nothing echoed back to the far end.
            Assert.Empty(pair.ReadAvailable(TimeSpan.FromMilliseconds(100)));
            port.Close();
        }
    }

    [Fact]
    public void Bytes_written_before_the_port_opens_wait_for_it()
    {
        using PseudoTerminalPair pair = PseudoTerminalPair.Open();
        pair.Write([1, 2, 3, 4], Wait);
        using var port = new SerialPort(pair.PortName) { ReadTimeout = 5000, Handshake = Handshake.None };
        port.Open();
        Assert.Equal(new byte[] { 1, 2, 3, 4 }, ReadExactly(port, 4));
        port.Close();
    }

    [Fact]
    public void A_silent_port_side_times_out_instead_of_hanging()
    {
        using PseudoTerminalPair pair = PseudoTerminalPair.Open();
        var e = Assert.Throws<TimeoutException>(() => pair.ReadExactly(1, TimeSpan.FromMilliseconds(50)));
        Assert.Contains(pair.DevicePath, e.Message);
    }

    [Fact]
    public void A_hang_up_ends_reads_on_the_port_side()
    {
        using PseudoTerminalPair pair = PseudoTerminalPair.Open();
        using var stream = new FileStream(pair.PortName, FileMode.Open, FileAccess.Read);
        pair.HangUp();
        Assert.True(pair.IsHungUp);

        // Linux pty(7): once the far end is closed, reads on the port side return end of file or EIO.
        int got;
        try
        {
            got = stream.Read(new byte[16], 0, 16);
        }
        catch (IOException)
        {
            got = 0;
        }

        Assert.Equal(0, got);
        Assert.Throws<ObjectDisposedException>(() => pair.Write([1], Wait));
    }

    [Fact]
    public void A_link_names_the_port_until_the_pair_is_disposed()
    {
        string folder = Path.Combine(Path.GetTempPath(), "launchlogger-pty-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(folder);
        try
        {
            string link = Path.Combine(folder, "box");
            using (PseudoTerminalPair pair = PseudoTerminalPair.Open(link))
            {
                Assert.Equal(link, pair.PortName);
                Assert.Equal(pair.DevicePath, File.ResolveLinkTarget(link, false)!.FullName);
                using var port = new SerialPort(link) { ReadTimeout = 5000, Handshake = Handshake.None };
                port.Open();
                pair.Write([42], Wait);
                Assert.Equal(new byte[] { 42 }, ReadExactly(port, 1));
                port.Close();
            }

            Assert.False(File.Exists(link) || Directory.Exists(link) || new FileInfo(link).LinkTarget != null);
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }

    private static byte[] ReadExactly(SerialPort port, int count)
    {
        byte[] buffer = new byte[count];
        int got = 0;
        while (got < count)
        {
            got += port.Read(buffer, got, count - got);
        }

        return buffer;
    }
}
