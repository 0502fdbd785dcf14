using LaunchLogger.Firmware.Sinks;

namespace LaunchLogger.Firmware.Tests.Sinks;

public class ByteRingQueueTests
{
    [Fact]
    public void Bytes_come_out_in_the_order_they_went_in_across_the_wrap()
    {
        var queue = new ByteRingQueue(10);
        var chunk = new byte[4];
        var got = new List<byte>();
        byte next = 0;
        for (int round = 0; round < 20; round++)
        {
            byte[] frame = { next, (byte)(next + 1), (byte)(next + 2) };
            Assert.True(queue.TryWrite(frame, 0, 3));
            next += 3;
            int n;
            while ((n = queue.Peek(chunk)) > 0)
            {
                got.AddRange(chunk.Take(n));
                queue.Skip(n);
            }
        }

        Assert.Equal(Enumerable.Range(0, 60).Select(i => (byte)i), got);
        Assert.Equal(0, queue.Count);
    }

    [Fact]
    public void A_write_that_does_not_fit_is_refused_whole_and_counted()
    {
        var queue = new ByteRingQueue(8);
        Assert.True(queue.TryWrite(new byte[] { 9, 1, 2, 3, 4, 5 }, 1, 5));
        Assert.False(queue.TryWrite(new byte[] { 6, 7, 8, 9 }, 0, 4));
        Assert.True(queue.TryWrite(new byte[] { 6, 7, 8 }, 0, 3));
        Assert.False(queue.TryWrite(new byte[] { 1 }, 0, 1));

        Assert.Equal(2, queue.WritesRefused);
        Assert.Equal(8, queue.Count);
        var all = new byte[8];
        Assert.Equal(8, queue.Peek(all));
        Assert.Equal(new byte[] { 1, 2, 3, 4, 5, 6, 7, 8 }, all);
    }

    [Fact]
    public void Peek_gives_at_most_the_unbroken_part_and_leaves_it_in_place()
    {
        var queue = new ByteRingQueue(8);
        queue.TryWrite(new byte[] { 1, 2, 3, 4, 5, 6 }, 0, 6);
        queue.Skip(5);
        queue.TryWrite(new byte[] { 7, 8, 9, 10 }, 0, 4);

        var chunk = new byte[8];
        Assert.Equal(3, queue.Peek(chunk));
        Assert.Equal(new byte[] { 6, 7, 8 }, chunk.Take(3));
        Assert.Equal(3, queue.Peek(chunk));
        queue.Skip(3);
        Assert.Equal(2, queue.Peek(chunk));
        Assert.Equal(new byte[] { 9, 10 }, chunk.Take(2));
    }

    [Fact]
    public void Peek_stops_at_the_destinations_length()
    {
        var queue = new ByteRingQueue(16);
        queue.TryWrite(new byte[10], 0, 10);
        Assert.Equal(4, queue.Peek(new byte[4]));
    }

    [Fact]
    public void Clear_empties_and_says_how_much_it_removed()
    {
        var queue = new ByteRingQueue(8);
        queue.TryWrite(new byte[] { 1, 2, 3, 4, 5 }, 0, 5);
        queue.Skip(2);

        Assert.Equal(3, queue.Clear());
        Assert.Equal(0, queue.Count);
        Assert.Equal(0, queue.Peek(new byte[8]));
        Assert.True(queue.TryWrite(new byte[8], 0, 8));
    }

    [Fact]
    public void Skip_never_removes_more_than_is_waiting()
    {
        var queue = new ByteRingQueue(8);
        queue.TryWrite(new byte[] { 1, 2 }, 0, 2);
        queue.Skip(5);
        Assert.Equal(0, queue.Count);
        Assert.True(queue.TryWrite(new byte[8], 0, 8));
    }

    [Fact]
    public void A_writer_thread_and_a_draining_thread_lose_nothing()
    {
        var queue = new ByteRingQueue(64);
        const int Frames = 20000;
        var got = new List<byte>();
        var drain = new Thread(() =>
        {
            var chunk = new byte[16];
            while (got.Count < Frames * 3)
            {
                int n = queue.Peek(chunk);
                got.AddRange(chunk.Take(n));
                queue.Skip(n);
            }
        });
        drain.Start();
        var frame = new byte[3];
        for (int k = 0; k < Frames; k++)
        {
            frame[0] = (byte)k;
            frame[1] = (byte)(k >> 8);
            frame[2] = 0xA5;
            while (!queue.TryWrite(frame, 0, 3))
            {
                Thread.Yield();
            }
        }

        drain.Join();
        for (int k = 0; k < Frames; k++)
        {
            Assert.Equal((byte)k, got[k * 3]);
            Assert.Equal((byte)(k >> 8), got[(k * 3) + 1]);
            Assert.Equal(0xA5, got[(k * 3) + 2]);
        }
    }

    [Fact]
    public void A_capacity_below_one_is_refused()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new ByteRingQueue(0));
    }
}
