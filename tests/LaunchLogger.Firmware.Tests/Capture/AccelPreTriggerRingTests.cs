using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Tests.Fakes;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Capture;

public class AccelPreTriggerRingTests
{
    [Theory]
    [InlineData(100, 128, 1)]
    [InlineData(100, 3, 2)]
    [InlineData(1500, 128, 3)]
    [InlineData(7, 50, 4)]
    public void KeepsTheNewestSamplesOfTheNewestBurstsWithTheirIndicesAndReadTimes(int capacity, int bursts, int seed)
    {
        // What the ring must hold: of the newest `bursts` bursts, the newest `capacity` samples.
        var random = new Random(seed);
        var ring = new AccelPreTriggerRing(capacity, bursts);
        var fed = new List<List<(long Index, AccelSample Sample, long Read)>>();
        long index = 0, time = 0;
        for (int b = 0; b < 60; b++)
        {
            int n = random.Next(1, Math.Min(40, capacity * 2) + 1);
            time += 1000 * n;
            if (random.Next(5) == 0)
            {
                index += random.Next(1, 10); // a gap in the sensor's numbering
            }

            short[] xyz = new short[n * 3];
            var burst = new List<(long, AccelSample, long)>();
            for (int i = 0; i < n; i++)
            {
                var s = new AccelSample((short)random.Next(-2000, 2000), (short)random.Next(-2000, 2000), (short)random.Next(-2000, 2000));
                xyz[i * 3] = s.X;
                xyz[(i * 3) + 1] = s.Y;
                xyz[(i * 3) + 2] = s.Z;
                burst.Add((index + i, s, time));
            }

            ring.Add(xyz, n, index, time);
            index += n;
            fed.Add(burst);

            var expected = fed.TakeLast(bursts).SelectMany(x => x).TakeLast(capacity).ToList();
            Assert.Equal(expected.Count, ring.SampleCount);
        }

        var sink = new MemorySink();
        var writer = new FrameWriter(sink, null!);
        int written = ring.WriteTo(writer, 16, int.MaxValue);

        var want = fed.TakeLast(bursts).SelectMany(x => x).TakeLast(capacity).ToList();
        var frames = sink.Frames.Cast<AccelerationFrame>().ToList();
        var got = frames.SelectMany(f => f.Samples.Select((s, i) => (f.FirstIndex + i, s, f.ReadMicros))).ToList();
        Assert.Equal(want.Count, written);
        Assert.Equal(want, got);
        Assert.All(frames, f => Assert.InRange(f.Samples.Count, 1, 16));
        Assert.Equal(0, ring.SampleCount);
    }

    [Fact]
    public void ABurstLargerThanTheRingKeepsItsNewestSamples()
    {
        var ring = new AccelPreTriggerRing(5, 4);
        short[] xyz = Enumerable.Range(0, 8 * 3).Select(i => (short)i).ToArray();
        ring.Add(xyz, 8, 100, 5000);
        var sink = new MemorySink();
        Assert.Equal(5, ring.WriteTo(new FrameWriter(sink, null!), 100, int.MaxValue));
        var frame = Assert.IsType<AccelerationFrame>(Assert.Single(sink.Frames));
        Assert.Equal(103, frame.FirstIndex);
        Assert.Equal(5000, frame.ReadMicros);
        Assert.Equal(new AccelSample(9, 10, 11), frame.Samples[0]);
        Assert.Equal(new AccelSample(21, 22, 23), frame.Samples[^1]);
    }

    [Fact]
    public void ClearForgetsEverything()
    {
        var ring = new AccelPreTriggerRing(10, 4);
        ring.Add(new short[9], 3, 0, 1);
        ring.Clear();
        Assert.Equal(0, ring.SampleCount);
        var sink = new MemorySink();
        Assert.Equal(0, ring.WriteTo(new FrameWriter(sink, null!), 10, int.MaxValue));
        Assert.Empty(sink.Bytes);
    }
}
