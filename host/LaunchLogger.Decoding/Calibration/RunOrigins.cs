using System.Buffers;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Calibration;

/// <summary>The hardware counter's value at each run's origin, read from a log's configuration
/// frames (LOG-FORMAT.md, frame 0x01): what joins the counts of runs made in one power-up, and
/// what ties a pulse to a tooth of the ring.</summary>
public sealed class RunOrigins
{
    private readonly Dictionary<(long RunNumber, long OpenedMicros), long> origins;

    private RunOrigins(Dictionary<(long RunNumber, long OpenedMicros), long> origins) => this.origins = origins;

    /// <summary>Origins of no log: every lookup misses.</summary>
    public static RunOrigins None { get; } = new([]);

    /// <summary>Number of configuration frames read.</summary>
    public int Count => origins.Count;

    /// <summary>Reads the configuration frames of a whole log held in memory; damaged frames
    /// are skipped as the log reader skips them.</summary>
    public static RunOrigins Read(ReadOnlySpan<byte> log)
    {
        var found = new Dictionary<(long, long), long>();
        var reader = default(FrameReader);
        byte[] payload = new byte[LogFormat.MaxPayloadBytes];
        int offset = 0;
        while (true)
        {
            OperationStatus status = reader.TryReadFrame(log[offset..], payload, isFinalBlock: true, out int used, out Frame frame);
            offset += used;
            if (status == OperationStatus.NeedMoreData)
            {
                return new RunOrigins(found);
            }

            if (status == OperationStatus.Done && frame.Type == FrameType.Configuration
                && FrameBodies.TryReadConfiguration(frame.Body, out ConfigurationBody c))
            {
                found[(c.RunNumber, c.OpenedMicros)] = c.OriginCount;
            }
        }
    }

    /// <summary>The hardware count at <paramref name="run"/>'s origin, or null when this log's
    /// configuration frames do not name it (a plain-text input, a different log).</summary>
    public long? OriginOf(DecodedRun run)
    {
        ArgumentNullException.ThrowIfNull(run);
        RunConfiguration c = run.Configuration;
        long opened = (long)Math.Round(c.OpenedS * 1e6);
        return origins.TryGetValue((c.RunNumber, opened), out long origin) ? origin : null;
    }
}
