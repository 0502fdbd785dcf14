using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>A byte sink that allocates nothing: it counts frames and bytes and folds every byte
/// into a running sum, so the bytes are really read.</summary>
public sealed class CountingSink : IByteSink
{
    public long FrameCount { get; private set; }

    public long ByteCount { get; private set; }

    public long ByteSum { get; private set; }

    public bool Write(byte[] buffer, int offset, int count)
    {
        FrameCount++;
        ByteCount += count;
        long sum = 0;
        for (int i = offset; i < offset + count; i++)
        {
            sum += buffer[i];
        }

        ByteSum += sum;
        return true;
    }
}
