namespace LaunchLogger.Decoding.Reading;

/// <summary>What reading a log met, counted: good frames, damage, gaps. Damaged input is data,
/// not an exception; these counters are how it is reported.</summary>
/// <remarks>
/// <see cref="FrameReader"/> fills the frame-level counters; the run assembler adds
/// <see cref="CorruptBodies"/> and <see cref="OrphanFrames"/>. Every damaged or cut-off frame is
/// counted once, in <see cref="CrcErrors"/>, <see cref="MalformedFrames"/> or
/// <see cref="TruncatedBytes"/>, and its bytes (delimiter included) in <see cref="BytesSkipped"/>.
/// </remarks>
public record struct ReaderStats
{
    /// <summary>Bytes consumed, delimiters included.</summary>
    public long Bytes { get; internal set; }

    /// <summary>Frames whose stuffing, size and CRC were good (empty frames not counted).</summary>
    public long Frames { get; internal set; }

    /// <summary>Frames that unstuffed to a plausible payload whose CRC did not match.</summary>
    public long CrcErrors { get; internal set; }

    /// <summary>Frames that could not be unstuffed, were shorter than the smallest payload or
    /// longer than <see cref="LaunchLogger.Firmware.Wire.LogFormat.MaxPayloadBytes"/>.</summary>
    public long MalformedFrames { get; internal set; }

    /// <summary>Bytes of frames thrown away: damaged, too long, or cut off at the end.</summary>
    public long BytesSkipped { get; internal set; }

    /// <summary>Bytes of an unfinished last frame (a log cut off by power loss); 0 when the log
    /// ends on a delimiter.</summary>
    public long TruncatedBytes { get; internal set; }

    /// <summary>Frames missing by their sequence numbers (gaps other than +1 mod 65536 between
    /// good frames), whatever the cause: refused by the box's sink, damaged, cut out.</summary>
    public long FramesLost { get; internal set; }

    /// <summary>Times the box restarted: a power-up frame, a return to 0 with a configuration
    /// frame, or a jump back to a small sequence number whose first frames were cut away. Such a
    /// jump is not counted in <see cref="FramesLost"/>.</summary>
    public long Restarts { get; internal set; }

    /// <summary>Good frames whose sequence number had been read already (a duplicated or
    /// replayed frame): dropped, not counted in <see cref="Frames"/>.</summary>
    public long DuplicateFrames { get; internal set; }

    /// <summary>Good frames that came after a later one (swapped): counted lost when the later
    /// one came, and taken back out of <see cref="FramesLost"/> when they arrived.</summary>
    public long LateFrames { get; internal set; }

    /// <summary>Jumps back in sequence number that are neither a repeat nor a late frame nor a
    /// recognisable restart: another log or a replayed stretch joined on. Runs are cut there.</summary>
    public long SequenceBreaks { get; internal set; }

    /// <summary>Good frames of a type this reader does not know (skipped).</summary>
    public long UnknownFrameTypes { get; internal set; }

    /// <summary>Empty frames (two delimiters in a row), ignored.</summary>
    public long EmptyFrames { get; internal set; }

    /// <summary>Good frames whose body did not parse (counted as corrupt, not thrown).</summary>
    public long CorruptBodies { get; internal set; }

    /// <summary>Good frames outside any run: before the first configuration frame, or between a
    /// run's summary and the next configuration.</summary>
    public long OrphanFrames { get; internal set; }

    /// <summary>True when anything was damaged, lost, cut off or unreadable.</summary>
    public readonly bool HasDamage => CrcErrors + MalformedFrames + TruncatedBytes + FramesLost + CorruptBodies > 0;
}
