using System.Buffers;
using System.Buffers.Binary;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Tests.Reading;

/// <summary>Builds frames with the firmware's own CRC and stuffing, and reads logs back whole or
/// in pieces the way a streaming caller does.</summary>
internal static class TestFrames
{
    public sealed record ReadFrame(FrameType Type, ushort Sequence, byte[] Body);

    public sealed record ReadResult(List<ReadFrame> Frames, ReaderStats Stats, int InvalidCount, int MostPending);

    public static byte[] Encode(FrameType type, int sequence, params byte[] body)
    {
        var payload = new byte[LogFormat.HeaderBytes + body.Length + LogFormat.CrcBytes];
        payload[0] = (byte)type;
        payload[1] = (byte)sequence;
        payload[2] = (byte)(sequence >> 8);
        body.CopyTo(payload, LogFormat.HeaderBytes);
        uint crc = Crc32.Compute(payload, 0, payload.Length - LogFormat.CrcBytes);
        BinaryPrimitives.WriteUInt32LittleEndian(payload.AsSpan(payload.Length - LogFormat.CrcBytes), crc);
        return Stuff(payload);
    }

    /// <summary>Stuffs any payload (even an invalid one) and adds the delimiter.</summary>
    public static byte[] Stuff(byte[] payload)
    {
        var wire = new byte[Cobs.MaxEncodedLength(payload.Length) + 1];
        int n = Cobs.Encode(payload, 0, payload.Length, wire, 0);
        wire[n++] = LogFormat.Delimiter;
        return wire[..n];
    }

    /// <summary>A Mark event at <paramref name="micros"/>: a small valid frame.</summary>
    public static byte[] Mark(int sequence, long micros = 1_000_000)
    {
        var body = new byte[1 + Varint.MaxBytes];
        body[0] = (byte)EventKind.Mark;
        int n = 1 + Varint.Write(body, 1, (ulong)micros);
        return Encode(FrameType.Event, sequence, body[..n]);
    }

    public static byte[] Concat(params byte[][] parts) => parts.SelectMany(p => p).ToArray();

    public static ReadResult ReadWhole(ReadOnlySpan<byte> log)
    {
        var reader = default(FrameReader);
        var payload = new byte[LogFormat.MaxPayloadBytes];
        var frames = new List<ReadFrame>();
        int invalid = 0;
        int offset = 0;
        while (true)
        {
            OperationStatus status = reader.TryReadFrame(log[offset..], payload, true, out int used, out Frame frame);
            offset += used;
            if (status == OperationStatus.Done)
            {
                frames.Add(new ReadFrame(frame.Type, frame.Sequence, frame.Body.ToArray()));
            }
            else if (status == OperationStatus.InvalidData)
            {
                invalid++;
            }
            else
            {
                Assert.Equal(log.Length, offset);
                return new ReadResult(frames, reader.Stats, invalid, 0);
            }
        }
    }

    /// <summary>Feeds the log in pieces of the given sizes (the last piece takes the rest),
    /// keeping unconsumed bytes and appending each new piece to them.</summary>
    public static ReadResult ReadInPieces(byte[] log, IEnumerable<int> pieceSizes)
    {
        var reader = default(FrameReader);
        var payload = new byte[LogFormat.MaxPayloadBytes];
        var frames = new List<ReadFrame>();
        var pending = new List<byte>();
        int invalid = 0;
        int mostPending = 0;
        int at = 0;
        var sizes = new Queue<int>(pieceSizes);
        while (true)
        {
            int size = sizes.Count > 0 ? Math.Min(sizes.Dequeue(), log.Length - at) : log.Length - at;
            pending.AddRange(log.AsSpan(at, size).ToArray());
            at += size;
            bool final = at == log.Length;
            byte[] input = pending.ToArray();
            int offset = 0;
            OperationStatus status;
            do
            {
                status = reader.TryReadFrame(input.AsSpan(offset), payload, final, out int used, out Frame frame);
                offset += used;
                if (status == OperationStatus.Done)
                {
                    frames.Add(new ReadFrame(frame.Type, frame.Sequence, frame.Body.ToArray()));
                }
                else if (status == OperationStatus.InvalidData)
                {
                    invalid++;
                }
            }
            while (status != OperationStatus.NeedMoreData);
            pending.RemoveRange(0, offset);
            mostPending = Math.Max(mostPending, pending.Count);
            if (final)
            {
                Assert.Empty(pending);
                return new ReadResult(frames, reader.Stats, invalid, mostPending);
            }
        }
    }
}
