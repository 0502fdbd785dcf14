using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.Tests.Capture;

public class EdgeObservationQueueTests
{
    [Fact]
    public void ReadsComeOutInTheOrderWrittenAcrossTheRingsWrap()
    {
        var queue = new EdgeObservationQueue(4, new HealthCounters());
        long written = 0, read = 0;
        for (int round = 0; round < 10; round++)
        {
            for (int i = 0; i < 3; i++)
            {
                written++;
                Assert.True(queue.TryWrite(round % 2, written, written * 10, (written * 10) + 3));
            }

            for (int i = 0; i < 3; i++)
            {
                Assert.True(queue.TryRead(out PulseObservation o));
                read++;
                Assert.Equal((int)((read - 1) / 3 % 2), o.Channel);
                Assert.Equal(read, o.Count);
                Assert.Equal(read * 10, o.LoMicros);
                Assert.Equal((read * 10) + 3, o.HiMicros);
            }
        }

        Assert.False(queue.TryRead(out _));
    }

    [Fact]
    public void WritesToAFullQueueAreDroppedAndCounted()
    {
        var health = new HealthCounters();
        var queue = new EdgeObservationQueue(3, health);
        for (int i = 1; i <= 5; i++)
        {
            Assert.Equal(i <= 3, queue.TryWrite(0, i, i, i + 1));
        }

        Assert.Equal(2, health.PulseObservationsDropped);
        for (int i = 1; i <= 3; i++)
        {
            Assert.True(queue.TryRead(out PulseObservation o));
            Assert.Equal(i, o.Count);
        }

        Assert.False(queue.TryRead(out _));
        Assert.True(queue.TryWrite(0, 6, 6, 7));
        Assert.Equal(2, health.PulseObservationsDropped);
    }

    [Fact]
    public void AnExactEdgeIsABracketOneMicrosecondWideEndingAtTheEdge()
    {
        var queue = new EdgeObservationQueue(2, null!);
        Assert.True(queue.TryWriteEdge(1, 42, 1_000_000));
        Assert.True(queue.TryRead(out PulseObservation o));
        Assert.Equal((1, 42L, 999_999L, 1_000_000L), (o.Channel, o.Count, o.LoMicros, o.HiMicros));
    }

    [Fact]
    public void AWriterThreadAndAReaderThreadLoseNothingUncounted()
    {
        var health = new HealthCounters();
        var queue = new EdgeObservationQueue(64, health);
        const int total = 200_000;
        long refused = 0;
        var writer = new Thread(() =>
        {
            for (int i = 1; i <= total; i++)
            {
                if (!queue.TryWrite(0, i, i, i + 1))
                {
                    refused++;
                }
            }
        });
        writer.Start();

        long readCount = 0, last = 0;
        while (writer.IsAlive)
        {
            while (queue.TryRead(out PulseObservation o))
            {
                Assert.True(o.Count > last);
                last = o.Count;
                readCount++;
            }
        }

        writer.Join();
        while (queue.TryRead(out PulseObservation o))
        {
            Assert.True(o.Count > last);
            last = o.Count;
            readCount++;
        }

        Assert.Equal(total, readCount + refused);
        Assert.Equal(refused, health.PulseObservationsDropped);
    }

    [Fact]
    public void ACapacityBelowOneIsRejected()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new EdgeObservationQueue(0, new HealthCounters()));
    }
}
