using System.Buffers;
using System.Buffers.Binary;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Reading;

/// <summary>Reads log frames (LOG-FORMAT.md, section 1) out of bytes that may arrive whole or in
/// pieces, allocation-free: finds the delimiter, unstuffs into the caller's buffer, checks size
/// and CRC, tracks sequence gaps and counts all damage in <see cref="Stats"/>.</summary>
/// <remarks>
/// <para>Shaped like <c>Utf8JsonReader</c> and <c>Base64.DecodeFromUtf8</c>: each call looks at
/// the caller's input, reports through an <see cref="OperationStatus"/> and how many bytes it
/// consumed; the caller drops those and calls again (appending newly arrived bytes to the rest
/// when streaming). The struct carries only a few fields over from call to call: the next
/// expected sequence number, whether it is skipping an over-long frame, and the counters.
/// It is a mutable struct: keep it in a local or a field and call it there (a copy forks it).</para>
/// <para>Statuses: <see cref="OperationStatus.Done"/> — a good frame was read;
/// <see cref="OperationStatus.InvalidData"/> — a damaged frame was consumed and counted (carry
/// on); <see cref="OperationStatus.NeedMoreData"/> — no whole frame is left in the input: keep
/// the unconsumed bytes and call again with more, or stop if the input was the final block.</para>
/// <para>Bounds: a frame whose delimiter is not found within
/// <see cref="LogFormat.MaxEncodedFrameBytes"/> bytes is corrupt; it is consumed and skipped up to
/// the next delimiter without being buffered, so a streaming caller never holds more than that
/// many unconsumed bytes. Empty frames (two zeros in a row) are ignored. Frames of unknown types
/// are returned (the caller skips them) and counted.</para>
/// <para>CRC-32/ISO-HDLC is computed with <see cref="System.IO.Hashing.Crc32"/>, whose
/// vectorised implementation keeps the check far from the bottleneck.</para>
/// </remarks>
public struct FrameReader
{
    /// <summary>The longest a stuffed frame can be without its delimiter.</summary>
    private const int MaxStuffedBytes = LogFormat.MaxEncodedFrameBytes - 1;

    /// <summary>How many sequence numbers before the next expected one are remembered, to tell a
    /// late (swapped) frame from a repeat of one already read.</summary>
    private const int SequenceWindow = 64;

    /// <summary>A jump back to a sequence number below this, farther than the window, is taken
    /// as a restart of the box whose power-up and configuration frames were lost.</summary>
    private const int RestartSequenceLimit = 64;

    private ReaderStats stats;
    private int expectedSequence;
    private bool sequenceKnown;
    private bool skippingOverlong;

    // Bit i set: the frame with sequence number expectedSequence - 1 - i has been read.
    private ulong seenWindow;
    private uint lastCrc;

    /// <summary>What has been read so far.</summary>
    public readonly ReaderStats Stats => stats;

    /// <summary>The sequence number the next frame should carry, or -1 before the first frame.</summary>
    public readonly int ExpectedSequence => sequenceKnown ? expectedSequence : -1;

    /// <summary>Reads the next frame from the start of <paramref name="input"/>.</summary>
    /// <param name="input">Unconsumed bytes: the rest of a whole log, or what has arrived so far.</param>
    /// <param name="payloadBuffer">Where the payload is unstuffed; the returned frame's body
    /// points into it. At least <see cref="LogFormat.MaxPayloadBytes"/> bytes.</param>
    /// <param name="isFinalBlock">True when no bytes will follow <paramref name="input"/>: an
    /// unfinished frame at its end is then counted as cut off and consumed.</param>
    /// <param name="consumed">Bytes of <paramref name="input"/> used, whatever the status.</param>
    /// <param name="frame">The frame when the status is <see cref="OperationStatus.Done"/>.</param>
    /// <returns>Done, InvalidData or NeedMoreData (see the remarks on the type).</returns>
    /// <exception cref="ArgumentException"><paramref name="payloadBuffer"/> is shorter than
    /// <see cref="LogFormat.MaxPayloadBytes"/>.</exception>
    public OperationStatus TryReadFrame(ReadOnlySpan<byte> input, Span<byte> payloadBuffer, bool isFinalBlock, out int consumed, out Frame frame)
    {
        if (payloadBuffer.Length < LogFormat.MaxPayloadBytes)
        {
            throw new ArgumentException($"the payload buffer must hold at least {LogFormat.MaxPayloadBytes} bytes", nameof(payloadBuffer));
        }

        frame = default;
        int position = 0;
        OperationStatus status;
        while (true)
        {
            ReadOnlySpan<byte> rest = input[position..];
            if (skippingOverlong)
            {
                int end = rest.IndexOf(LogFormat.Delimiter);
                if (end < 0)
                {
                    stats.BytesSkipped += rest.Length;
                    position = input.Length;
                    status = OperationStatus.NeedMoreData;
                    break;
                }

                stats.BytesSkipped += end + 1;
                skippingOverlong = false;
                position += end + 1;
                status = OperationStatus.InvalidData;
                break;
            }

            int start = rest.IndexOfAnyExcept(LogFormat.Delimiter);
            if (start != 0)
            {
                // Delimiters with nothing before them end empty frames: ignore them.
                int zeros = start < 0 ? rest.Length : start;
                stats.EmptyFrames += zeros;
                position += zeros;
                if (start < 0)
                {
                    status = OperationStatus.NeedMoreData;
                    break;
                }

                rest = rest[zeros..];
            }

            int window = Math.Min(rest.Length, MaxStuffedBytes + 1);
            int delimiter = rest[..window].IndexOf(LogFormat.Delimiter);
            if (delimiter < 0)
            {
                if (rest.Length > MaxStuffedBytes)
                {
                    // Too long to be a frame: count it once, drop what we have seen of it and
                    // skip the rest up to the next delimiter, wherever it is.
                    stats.MalformedFrames++;
                    stats.BytesSkipped += window;
                    position += window;
                    skippingOverlong = true;
                    continue;
                }

                if (isFinalBlock && rest.Length > 0)
                {
                    stats.TruncatedBytes += rest.Length;
                    stats.BytesSkipped += rest.Length;
                    position += rest.Length;
                }

                status = OperationStatus.NeedMoreData;
                break;
            }

            position += delimiter + 1;
            status = Check(rest[..delimiter], payloadBuffer, out frame);
            break;
        }

        if (isFinalBlock && skippingOverlong && position == input.Length)
        {
            // The log ended inside an over-long frame: it has been counted already.
            skippingOverlong = false;
        }

        consumed = position;
        stats.Bytes += position;
        return status;
    }

    /// <summary>Unstuffs one frame, checks its size and CRC, and follows its sequence number.</summary>
    private OperationStatus Check(ReadOnlySpan<byte> stuffed, Span<byte> payloadBuffer, out Frame frame)
    {
        frame = default;
        Span<byte> limit = payloadBuffer[..LogFormat.MaxPayloadBytes];
        if (!CobsDecoder.TryDecodeNonZero(stuffed, limit, out int length) || length < LogFormat.MinPayloadBytes)
        {
            stats.MalformedFrames++;
            stats.BytesSkipped += stuffed.Length + 1;
            return OperationStatus.InvalidData;
        }

        ReadOnlySpan<byte> payload = limit[..length];
        int covered = length - LogFormat.CrcBytes;
        uint written = BinaryPrimitives.ReadUInt32LittleEndian(payload[covered..]);
        if (System.IO.Hashing.Crc32.HashToUInt32(payload[..covered]) != written)
        {
            stats.CrcErrors++;
            stats.BytesSkipped += stuffed.Length + 1;
            return OperationStatus.InvalidData;
        }

        var type = (FrameType)payload[0];
        int sequence = payload[1] | (payload[2] << 8);
        if (!FollowSequence(type, sequence, written))
        {
            stats.DuplicateFrames++;
            return OperationStatus.InvalidData;
        }

        stats.Frames++;
        if (type < FrameType.Configuration || type > FrameType.ConfigurationCopy)
        {
            stats.UnknownFrameTypes++;
        }

        frame = new Frame(type, (ushort)sequence, payload[LogFormat.HeaderBytes..covered]);
        return OperationStatus.Done;
    }

    /// <summary>Classifies a good frame by its sequence number (LOG-FORMAT.md, section 1,
    /// "Sequence numbers"): in order, after a gap (counted lost), late (a swap: it fills a gap
    /// counted before), a repeat of a frame already read (false: drop it), or a restart.</summary>
    private bool FollowSequence(FrameType type, int sequence, uint crc)
    {
        bool restart = type == FrameType.PowerUp || (sequence == 0 && type == FrameType.Configuration);
        if (!sequenceKnown || (restart && sequence != expectedSequence))
        {
            if (sequenceKnown)
            {
                stats.Restarts++;
            }

            StartSequence(sequence, crc);
            return true;
        }

        int ahead = (sequence - expectedSequence) & 0xFFFF;
        if (ahead < 0x8000)
        {
            // In order (ahead 0) or after a gap of `ahead` lost frames.
            stats.FramesLost += ahead;
            seenWindow = ahead + 1 >= SequenceWindow ? 1UL : (seenWindow << (ahead + 1)) | 1UL;
            expectedSequence = (sequence + 1) & 0xFFFF;
            lastCrc = crc;
            return true;
        }

        int behind = (expectedSequence - 1 - sequence) & 0xFFFF;
        if (behind < SequenceWindow)
        {
            ulong bit = 1UL << behind;
            if (behind == 0 && crc != lastCrc)
            {
                // The last number again with other content: not a copy but another sequence.
                stats.SequenceBreaks++;
                StartSequence(sequence, crc);
                return true;
            }

            if ((seenWindow & bit) != 0)
            {
                // A number already read: a duplicated or replayed frame.
                return false;
            }

            // A frame that was counted lost arrives late (frames swapped): it is not lost.
            seenWindow |= bit;
            stats.FramesLost--;
            stats.LateFrames++;
            return true;
        }

        // Far back: a new power-up whose first frames were cut away, or another log joined on.
        if (sequence < RestartSequenceLimit)
        {
            stats.Restarts++;
        }
        else
        {
            stats.SequenceBreaks++;
        }

        StartSequence(sequence, crc);
        return true;
    }

    private void StartSequence(int sequence, uint crc)
    {
        sequenceKnown = true;
        expectedSequence = (sequence + 1) & 0xFFFF;
        seenWindow = 1UL;
        lastCrc = crc;
    }
}
