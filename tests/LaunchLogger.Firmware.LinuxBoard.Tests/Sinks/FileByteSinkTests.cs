using LaunchLogger.Firmware.LinuxBoard.Sinks;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Sinks;

public sealed class FileByteSinkTests : IDisposable
{
    private readonly string folder = Path.Combine(Path.GetTempPath(), "llboard-file-" + Guid.NewGuid().ToString("N"));

    public FileByteSinkTests()
    {
        Directory.CreateDirectory(folder);
    }

    public void Dispose()
    {
        Directory.Delete(folder, recursive: true);
    }

    [Fact]
    public void Flushing_every_frame_makes_each_frame_visible_to_a_reader_at_once()
    {
        string path = Path.Combine(folder, "a.log");
        long now = 0;
        using var sink = new FileByteSink(path, flushIntervalMs: 0, fsyncIntervalMs: 1000, millisecondClock: () => now);

        Assert.True(sink.Write(new byte[] { 1, 2, 3, 0 }, 0, 4));
        Assert.Equal(new byte[] { 1, 2, 3, 0 }, ReadShared(path));
        Assert.True(sink.Write(new byte[] { 9, 4, 5, 0, 9 }, 1, 3));
        Assert.Equal(new byte[] { 1, 2, 3, 0, 4, 5, 0 }, ReadShared(path));
    }

    [Fact]
    public void A_flush_interval_holds_frames_back_until_it_has_passed()
    {
        string path = Path.Combine(folder, "b.log");
        long now = 0;
        using var sink = new FileByteSink(path, flushIntervalMs: 200, fsyncIntervalMs: 10_000, millisecondClock: () => now);

        sink.Write(new byte[] { 1, 0 }, 0, 2);
        now = 150;
        sink.Write(new byte[] { 2, 0 }, 0, 2);
        Assert.Empty(ReadShared(path));

        now = 200;
        sink.Write(new byte[] { 3, 0 }, 0, 2);
        Assert.Equal(new byte[] { 1, 0, 2, 0, 3, 0 }, ReadShared(path));
    }

    [Fact]
    public void Dispose_writes_out_everything_held()
    {
        string path = Path.Combine(folder, "c.log");
        long now = 0;
        using (var sink = new FileByteSink(path, flushIntervalMs: 60_000, fsyncIntervalMs: 60_000, millisecondClock: () => now))
        {
            sink.Write(new byte[] { 7, 7, 0 }, 0, 3);
            Assert.Equal(3, sink.BytesWritten);
        }

        Assert.Equal(new byte[] { 7, 7, 0 }, File.ReadAllBytes(path));
    }

    [Fact]
    public void An_existing_log_is_never_overwritten()
    {
        string path = Path.Combine(folder, "d.log");
        File.WriteAllBytes(path, new byte[] { 42 });

        Assert.Throws<IOException>(() => new FileByteSink(path));
        Assert.Equal(new byte[] { 42 }, File.ReadAllBytes(path));
    }

    [Fact]
    public void Files_in_a_folder_are_named_after_the_start_time_and_never_collide()
    {
        var start = new DateTime(2026, 5, 9, 14, 30, 5, DateTimeKind.Utc);
        string sub = Path.Combine(folder, "logs");
        using var first = FileByteSink.CreateInFolder(sub, start, 0, 1000);
        using var second = FileByteSink.CreateInFolder(sub, start, 0, 1000);

        Assert.Equal("launchlog-20260509-143005.log", Path.GetFileName(first.Path));
        Assert.Equal("launchlog-20260509-143005-2.log", Path.GetFileName(second.Path));
    }

    private static byte[] ReadShared(string path)
    {
        using var s = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite);
        var m = new MemoryStream();
        s.CopyTo(m);
        return m.ToArray();
    }
}
