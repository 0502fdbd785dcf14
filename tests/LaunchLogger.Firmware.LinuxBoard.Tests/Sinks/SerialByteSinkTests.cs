using LaunchLogger.Firmware.LinuxBoard.Sinks;
using LaunchLogger.Tests.Support;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Sinks;

public class SerialByteSinkTests
{
    [Fact]
    public void Every_byte_value_arrives_in_order_over_a_real_pseudo_terminal()
    {
        using PseudoTerminalPair pair = PseudoTerminalPair.Open();
        byte[] expected = new byte[4 * 256 * 3];
        using (var sink = new SerialByteSink(pair.PortName, 115200, writeTimeoutMs: 500))
        {
            byte[] frame = new byte[256];
            for (int i = 0; i < 256; i++)
            {
                frame[i] = (byte)i;
            }

            for (int k = 0; k < expected.Length / 256; k++)
            {
                Assert.True(sink.Write(frame, 0, 256));
                Array.Copy(frame, 0, expected, k * 256, 256);
            }

            byte[] got = pair.ReadExactly(expected.Length, TimeSpan.FromSeconds(5));
            Assert.Equal(expected, got);
            Assert.Equal(0, sink.FramesRefused);
        }
    }

    [Fact]
    public void Write_never_blocks_and_refuses_whole_frames_once_the_buffer_is_full()
    {
        using PseudoTerminalPair pair = PseudoTerminalPair.Open();
        byte[] frame = Enumerable.Range(1, 1000).Select(i => (byte)i).ToArray();
        const int Frames = 2000;
        int accepted = 0;
        long sent;
        long dropped;
        using (var sink = new SerialByteSink(pair.PortName, 115200, writeTimeoutMs: 100, bufferBytes: 16384))
        {
            // Nobody reads the far end: the terminal's buffer fills up and the ring buffer after it.
            for (int k = 0; k < Frames; k++)
            {
                if (sink.Write(frame, 0, frame.Length))
                {
                    accepted++;
                }
            }

            Assert.True(sink.FramesRefused > 0);
            Assert.Equal(Frames, accepted + sink.FramesRefused);
            sink.Dispose();
            sent = sink.BytesSent;
            dropped = sink.BytesDropped;
        }

        // Every accepted byte was either sent or dropped at a timeout: none vanished.
        Assert.Equal((long)accepted * frame.Length, sent + dropped);
    }

    [Fact]
    public void A_port_that_cannot_open_says_which_and_why()
    {
        var e = Assert.Throws<IOException>(() => new SerialByteSink("/dev/launchlogger-no-such-port"));
        Assert.Contains("/dev/launchlogger-no-such-port", e.Message);
    }
}
