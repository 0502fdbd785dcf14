using System.Buffers.Binary;
using LaunchLogger.Decoding.Reading;

namespace LaunchLogger.Decoding.Runs;

/// <summary>A log's accelerometer samples as the box wrote them — x, y, z as i16 little-endian,
/// 6 bytes a sample — with what it takes to expand them: the stretches of unbroken sample
/// numbering, each with its clock origin, the sample period and the axis mapping.</summary>
/// <remarks>The reader keeps a run's samples in this form (a sixth of five arrays of doubles and
/// longs) and <see cref="AccelSeries"/> expands an array only when it is first asked for, so a
/// run whose lateral axis or sample indices nobody reads never has them built. Each expansion
/// computes exactly what the reader computed before it kept samples packed:
/// time = origin + period × index, and value = sign × <see cref="LogUnits.SampleMps2"/>.</remarks>
internal sealed class PackedAccelSamples
{
    private readonly RecordChunks<byte> samples;
    private readonly int[] stretchStart;
    private readonly long[] stretchFirstIndex;
    private readonly double[] stretchOriginS;
    private readonly double periodS;
    private readonly AxisMapping axes;

    /// <param name="samples">The samples, 6 bytes each.</param>
    /// <param name="stretchStart">Where each stretch starts among the samples, ascending, the first 0.</param>
    /// <param name="stretchFirstIndex">The sensor's index of each stretch's first sample.</param>
    /// <param name="stretchOriginS">Each stretch's clock origin, seconds.</param>
    /// <param name="periodS">The sample period, seconds.</param>
    /// <param name="axes">Which sensor axes are forward, lateral and vertical.</param>
    public PackedAccelSamples(RecordChunks<byte> samples, int[] stretchStart, long[] stretchFirstIndex, double[] stretchOriginS, double periodS, AxisMapping axes)
    {
        this.samples = samples;
        Count = samples.Count;
        this.stretchStart = stretchStart;
        this.stretchFirstIndex = stretchFirstIndex;
        this.stretchOriginS = stretchOriginS;
        this.periodS = periodS;
        this.axes = axes;
    }

    /// <summary>Samples held.</summary>
    public int Count { get; }

    /// <summary>Each sample's time on the box's clock, seconds.</summary>
    public double[] Times()
    {
        double[] time = GC.AllocateUninitializedArray<double>(Count);
        for (int s = 0; s < stretchStart.Length; s++)
        {
            double originS = stretchOriginS[s];
            long first = stretchFirstIndex[s];
            int end = StretchEnd(s);
            for (int i = stretchStart[s]; i < end; i++)
            {
                time[i] = originS + (periodS * (first + (i - stretchStart[s])));
            }
        }

        return time;
    }

    /// <summary>Each sample's index as the sensor numbered it.</summary>
    public long[] Indices()
    {
        long[] index = GC.AllocateUninitializedArray<long>(Count);
        for (int s = 0; s < stretchStart.Length; s++)
        {
            long first = stretchFirstIndex[s];
            int end = StretchEnd(s);
            for (int i = stretchStart[s]; i < end; i++)
            {
                index[i] = first + (i - stretchStart[s]);
            }
        }

        return index;
    }

    /// <summary>Specific force along the car's forward axis, m/s².</summary>
    public double[] Forward() => Axis(axes.ForwardAxis, axes.ForwardSign);

    /// <summary>Specific force along the car's lateral axis, m/s².</summary>
    public double[] Lateral() => Axis(axes.LateralAxis, axes.LateralSign);

    /// <summary>Specific force along the car's vertical axis, m/s².</summary>
    public double[] Vertical() => Axis(axes.VerticalAxis, axes.VerticalSign);

    private int StretchEnd(int stretch) => stretch + 1 < stretchStart.Length ? stretchStart[stretch + 1] : Count;

    private double[] Axis(int sensorAxis, double sign)
    {
        double[] values = GC.AllocateUninitializedArray<double>(Count);
        ReadOnlySpan<double> mps2 = LogUnits.SampleMps2;
        int at = 2 * sensorAxis;
        int i = 0;
        for (int c = 0; c < samples.Chunks; c++)
        {
            ReadOnlySpan<byte> bytes = samples.Chunk(c);
            for (int b = at; b < bytes.Length; b += AccelerationBody.BytesPerSample)
            {
                values[i++] = sign * mps2[BinaryPrimitives.ReadInt16LittleEndian(bytes.Slice(b, 2)) - short.MinValue];
            }
        }

        // The chunks stay this run's until the last sample is read (RecordChunks).
        GC.KeepAlive(samples);
        return values;
    }
}
