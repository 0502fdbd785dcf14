using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>One accelerometer sample, milli-g per axis.</summary>
public readonly record struct AccelSample(short X, short Y, short Z);

/// <summary>An accelerometer with a FIFO that fills in true time: sample k is taken at
/// start + (k + 1) × period; when the FIFO is full the oldest sample is lost and the next read
/// reports the overflow, as sensors with a stream-mode FIFO do. Remembers the true index of
/// everything it hands out and how many samples it really lost.</summary>
public sealed class FakeAccelerometer : IAccelerometer
{
    private readonly FakeMicrosecondCounter clock;
    private readonly long startMicros;
    private readonly long periodMicros;
    private readonly AccelSample[] fifo;
    private readonly long[] fifoIndex;
    private readonly Func<long, AccelSample> sampleAtMicros;
    private int fifoHead;
    private int fifoCount;
    private long produced;
    private bool overflowPending;

    public FakeAccelerometer(FakeMicrosecondCounter clock, long startMicros, int rateHz, int fifoDepth, Func<long, AccelSample> sampleAtMicros)
    {
        this.clock = clock;
        this.startMicros = startMicros;
        periodMicros = 1_000_000 / rateHz;
        fifo = new AccelSample[fifoDepth];
        fifoIndex = new long[fifoDepth];
        this.sampleAtMicros = sampleAtMicros;
        OutputDataRateMilliHz = rateHz * 1000;
    }

    public int OutputDataRateMilliHz { get; }

    public int FullScaleMilliG { get; set; } = 8000;

    /// <summary>When set, the next read fails (returns -1) and takes nothing from the FIFO.</summary>
    public bool FailNextRead { get; set; }

    /// <summary>Samples pushed out of a full FIFO, truly lost.</summary>
    public long TrulyLost { get; private set; }

    /// <summary>Every successful read: the true index of its first sample, its size, and whether it reported an overflow.</summary>
    public List<(long FirstTrueIndex, int Count, bool Overflowed)> Reads { get; } = new();

    public int ReadBurst(short[] xyzMilliG, int maxSamples, out bool fifoOverflowed)
    {
        Produce((long)clock.TrueMicros);
        if (FailNextRead)
        {
            FailNextRead = false;
            fifoOverflowed = false;
            return -1;
        }

        fifoOverflowed = overflowPending;
        overflowPending = false;
        int n = Math.Min(fifoCount, maxSamples);
        long firstIndex = n > 0 ? fifoIndex[fifoHead] : produced;
        for (int i = 0; i < n; i++)
        {
            AccelSample s = fifo[fifoHead];
            xyzMilliG[i * 3] = s.X;
            xyzMilliG[(i * 3) + 1] = s.Y;
            xyzMilliG[(i * 3) + 2] = s.Z;
            fifoHead = (fifoHead + 1) % fifo.Length;
            fifoCount--;
        }

        Reads.Add((firstIndex, n, fifoOverflowed));
        return n;
    }

    /// <summary>The true time of sample <paramref name="index"/>.</summary>
    public long SampleMicros(long index) => startMicros + ((index + 1) * periodMicros);

    private void Produce(long nowMicros)
    {
        while (SampleMicros(produced) <= nowMicros)
        {
            if (fifoCount == fifo.Length)
            {
                fifoHead = (fifoHead + 1) % fifo.Length;
                fifoCount--;
                TrulyLost++;
                overflowPending = true;
            }

            int slot = (fifoHead + fifoCount) % fifo.Length;
            fifo[slot] = sampleAtMicros(SampleMicros(produced));
            fifoIndex[slot] = produced;
            fifoCount++;
            produced++;
        }
    }
}
