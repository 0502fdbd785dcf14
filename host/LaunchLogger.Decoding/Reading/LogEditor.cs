using System.Buffers;
using System.Buffers.Binary;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Reading;

/// <summary>Takes a log apart into its frames and puts frames back together with a correct CRC
/// and stuffing: for the robustness benchmark's mutations and for tests that need a log with one
/// field changed under a good CRC, a frame repeated, swapped or left out.</summary>
public static class LogEditor
{
    /// <summary>One frame of a log: where it lies, and its content when it reads as good.</summary>
    /// <param name="Offset">First byte on the wire.</param>
    /// <param name="Length">Bytes on the wire, the delimiter included.</param>
    /// <param name="Good">True when the frame read as good; <paramref name="Type"/>,
    /// <paramref name="Sequence"/> and <paramref name="Body"/> are set only then.</param>
    /// <param name="Type">Frame type.</param>
    /// <param name="Sequence">Sequence number.</param>
    /// <param name="Body">Body bytes (between the header and the CRC).</param>
    public sealed record Piece(int Offset, int Length, bool Good, FrameType Type, int Sequence, byte[] Body);

    /// <summary>Splits <paramref name="log"/> into the pieces a reader sees, in order.</summary>
    public static List<Piece> Split(ReadOnlySpan<byte> log)
    {
        var pieces = new List<Piece>();
        var reader = default(FrameReader);
        byte[] payload = new byte[LogFormat.MaxPayloadBytes];
        int offset = 0;
        while (true)
        {
            OperationStatus status = reader.TryReadFrame(log[offset..], payload, true, out int used, out Frame frame);
            if (used > 0)
            {
                pieces.Add(status == OperationStatus.Done
                    ? new Piece(offset, used, true, frame.Type, frame.Sequence, frame.Body.ToArray())
                    : new Piece(offset, used, false, 0, -1, []));
            }

            offset += used;
            if (status == OperationStatus.NeedMoreData)
            {
                return pieces;
            }
        }
    }

    /// <summary>One frame on the wire: payload with a correct CRC-32, stuffed, with its delimiter.</summary>
    public static byte[] Encode(FrameType type, int sequence, ReadOnlySpan<byte> body)
    {
        byte[] payload = new byte[LogFormat.HeaderBytes + body.Length + LogFormat.CrcBytes];
        payload[0] = (byte)type;
        payload[1] = (byte)sequence;
        payload[2] = (byte)(sequence >> 8);
        body.CopyTo(payload.AsSpan(LogFormat.HeaderBytes));
        uint crc = System.IO.Hashing.Crc32.HashToUInt32(payload.AsSpan(0, payload.Length - LogFormat.CrcBytes));
        BinaryPrimitives.WriteUInt32LittleEndian(payload.AsSpan(payload.Length - LogFormat.CrcBytes), crc);
        byte[] wire = new byte[Cobs.MaxEncodedLength(payload.Length) + 1];
        int n = Cobs.Encode(payload, 0, payload.Length, wire, 0);
        wire[n++] = LogFormat.Delimiter;
        return wire[..n];
    }

    /// <summary>Puts good frames back together, numbered on from <paramref name="firstSequence"/>
    /// (as a box would have written them), or with their own numbers when it is null.</summary>
    public static byte[] Join(IEnumerable<Piece> pieces, int? firstSequence = null)
    {
        var output = new MemoryStream();
        int next = firstSequence ?? 0;
        foreach (Piece p in pieces.Where(p => p.Good))
        {
            output.Write(Encode(p.Type, firstSequence.HasValue ? next : p.Sequence, p.Body));
            next = (next + 1) & 0xFFFF;
        }

        return output.ToArray();
    }
}
