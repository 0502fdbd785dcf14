using LaunchLogger.Firmware.Sinks;
using LaunchLogger.Firmware.Tests.Fakes;

namespace LaunchLogger.Firmware.Tests.Sinks;

public class TeeByteSinkTests
{
    [Fact]
    public void Both_sinks_get_every_frame()
    {
        var file = new MemorySink();
        var stream = new MemorySink();
        var tee = new TeeByteSink(file, stream);

        Assert.True(tee.Write(new byte[] { 5, 1, 2, 0, 5 }, 1, 3));

        Assert.Equal(new byte[] { 1, 2, 0 }, file.Bytes);
        Assert.Equal(new byte[] { 1, 2, 0 }, stream.Bytes);
    }

    [Fact]
    public void The_stream_refusing_is_counted_but_the_file_answers()
    {
        var file = new MemorySink();
        var stream = new MemorySink { RefuseAll = true };
        var tee = new TeeByteSink(file, stream);

        Assert.True(tee.Write(new byte[] { 1, 0 }, 0, 2));
        Assert.Equal(1, tee.SecondaryRefusals);
        Assert.Equal(new byte[] { 1, 0 }, file.Bytes);
    }

    [Fact]
    public void The_file_refusing_is_the_answer_and_the_stream_still_gets_the_frame()
    {
        var file = new MemorySink { RefuseAll = true };
        var stream = new MemorySink();
        var tee = new TeeByteSink(file, stream);

        Assert.False(tee.Write(new byte[] { 1, 0 }, 0, 2));
        Assert.Equal(new byte[] { 1, 0 }, stream.Bytes);
        Assert.Equal(0, tee.SecondaryRefusals);
    }

    [Fact]
    public void Both_sinks_are_needed()
    {
        Assert.Throws<ArgumentNullException>(() => new TeeByteSink(new MemorySink(), null));
        Assert.Throws<ArgumentNullException>(() => new TeeByteSink(null, new MemorySink()));
    }
}
