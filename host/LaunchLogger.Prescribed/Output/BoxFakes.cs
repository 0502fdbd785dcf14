using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Prescribed.Sensors;

namespace LaunchLogger.Prescribed.Output;

/// <summary>The box's microsecond counter, set by the generator's loop.</summary>
internal sealed class SetMicrosecondCounter : IMicrosecondCounter
{
    public long NowMicros { get; set; }

    public uint ReadMicros32() => unchecked((uint)NowMicros);
}

/// <summary>A hardware pulse counter over a list of exact edge times.</summary>
internal sealed class EdgeListCounter(IReadOnlyList<double> edgesS, long origin) : IPulseCounter
{
    private int seen;

    public double NowS { get; set; }

    public int ChannelCount => 1;

    public long ReadCount(int channel)
    {
        while (seen < edgesS.Count && edgesS[seen] <= NowS)
        {
            seen++;
        }

        return origin + seen;
    }
}

/// <summary>An accelerometer with a FIFO of <paramref name="depth"/> samples over a list of
/// generated samples: a read returns those taken (on their true times) since the last read,
/// the oldest lost when more were taken than the FIFO holds.</summary>
internal sealed class ListAccelerometer(AccelSample[] samples, int rateMilliHz, int fullScaleMilliG, int depth) : IAccelerometer
{
    private const double MilliGPerMps2 = 1000 / 9.80665; // standard gravity (3rd CGPM, 1901)
    private int next;

    public double NowS { get; set; }

    public int OutputDataRateMilliHz => rateMilliHz;

    public int FullScaleMilliG => fullScaleMilliG;

    public int ReadBurst(short[] xyzMilliG, int maxSamples, out bool fifoOverflowed)
    {
        int available = 0;
        while (next + available < samples.Length && samples[next + available].TrueS <= NowS)
        {
            available++;
        }

        fifoOverflowed = available > depth;
        if (fifoOverflowed)
        {
            next += available - depth;
            available = depth;
        }

        int n = Math.Min(available, maxSamples);
        for (int i = 0; i < n; i++)
        {
            AccelSample s = samples[next + i];
            xyzMilliG[3 * i] = ToMilliG(s.XMps2);
            xyzMilliG[(3 * i) + 1] = ToMilliG(s.YMps2);
            xyzMilliG[(3 * i) + 2] = ToMilliG(s.ZMps2);
        }

        next += n;
        return n;
    }

    private short ToMilliG(double mps2) => (short)Math.Clamp(Math.Round(mps2 * MilliGPerMps2), -fullScaleMilliG, fullScaleMilliG);
}

/// <summary>A brake switch on over given spans of time.</summary>
internal sealed class SpanSwitch(IReadOnlyList<(double OnS, double OffS)> spans) : IDigitalInput
{
    public double NowS { get; set; }

    public bool IsActive() => spans.Any(s => NowS >= s.OnS && NowS < s.OffS);
}

/// <summary>Collects the box's bytes.</summary>
internal sealed class MemorySink : IByteSink
{
    public MemoryStream Bytes { get; } = new();

    public bool Write(byte[] buffer, int offset, int count)
    {
        Bytes.Write(buffer, offset, count);
        return true;
    }
}
