using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Reading;

/// <summary>One good frame (its CRC matched): the type byte, the sequence number and the body,
/// which is a view into the payload buffer the caller gave <see cref="FrameReader.TryReadFrame"/>.</summary>
/// <remarks>A ref struct because the body points into the caller's buffer: it is valid only until
/// the next call that writes that buffer. Copy what must outlive it (the body parsers in
/// <see cref="FrameBodies"/> do).</remarks>
public readonly ref struct Frame
{
    /// <summary>Wraps the parts of a checked payload.</summary>
    public Frame(FrameType type, ushort sequence, ReadOnlySpan<byte> body)
    {
        Type = type;
        Sequence = sequence;
        Body = body;
    }

    /// <summary>The frame type; may be a value this reader does not know (newer writers).</summary>
    public FrameType Type { get; }

    /// <summary>The writer's sequence number (+1 per frame since power-up, wrapping at 65536).</summary>
    public ushort Sequence { get; }

    /// <summary>The body: the payload without type, sequence and CRC.</summary>
    public ReadOnlySpan<byte> Body { get; }

    /// <summary>True for the frame types of log format version 1.</summary>
    public bool IsKnownType => Type >= FrameType.Configuration && Type <= FrameType.ConfigurationCopy;
}
