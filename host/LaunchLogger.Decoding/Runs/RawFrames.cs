using System.Buffers.Binary;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Runs;

/// <summary>The bodies of a run's pulse and acceleration frames as the log gave them, copied
/// into pooled chunks, so that parsing them waits until the run is built — on another thread,
/// while the reader goes on with the frames after the run (<see cref="RunPipeline"/>).</summary>
/// <remarks>Each body is kept whole in one chunk as its type byte, its length (u16 little-endian)
/// and its bytes; the chunks come from <see cref="ScratchArrays"/> and go back on
/// <see cref="Dispose"/>. A run's raw bodies take about the bytes of its frames in the log:
/// less than the observations and samples they parse into.</remarks>
internal sealed class RawFrames : IDisposable
{
    /// <summary>Chunk size: pooled (below <see cref="ScratchArrays.MaxPooledBytes"/>) and well
    /// above the largest body (<see cref="LogFormat.MaxPayloadBytes"/>).</summary>
    private const int ChunkBytes = 64 * 1024;

    private const int HeaderBytes = 3;

    private readonly List<byte[]> chunks = [];
    private readonly List<int> chunkUsed = [];
    private byte[] current = [];
    private int used;

    /// <summary>Bytes kept so far, headers included (about the bytes of the frames in the log).</summary>
    public long KeptBytes { get; private set; }

    /// <summary>Keeps a copy of one frame's body.</summary>
    public void Add(FrameType type, ReadOnlySpan<byte> body)
    {
        int size = HeaderBytes + body.Length;
        if (current.Length - used < size)
        {
            NewChunk(size);
        }

        Span<byte> into = current.AsSpan(used, size);
        into[0] = (byte)type;
        BinaryPrimitives.WriteUInt16LittleEndian(into[1..], checked((ushort)body.Length));
        body.CopyTo(into[HeaderBytes..]);
        used += size;
        KeptBytes += size;
    }

    /// <summary><paramref name="length"/> kept bytes from <paramref name="offset"/> in chunk
    /// <paramref name="chunk"/> (a place a <see cref="Reader"/> gave).</summary>
    public ReadOnlySpan<byte> Bytes(int chunk, int offset, int length) => chunks[chunk].AsSpan(offset, length);

    /// <summary>The bodies in the order they were added.</summary>
    public Reader Read()
    {
        if (chunks.Count > 0)
        {
            chunkUsed[^1] = used;
        }

        return new Reader(this);
    }

    /// <summary>Gives the chunks back; nothing may be read afterwards.</summary>
    public void Dispose()
    {
        foreach (byte[] chunk in chunks)
        {
            ScratchArrays.Return(chunk);
        }

        chunks.Clear();
        chunkUsed.Clear();
        current = [];
        used = 0;
        KeptBytes = 0;
    }

    private void NewChunk(int atLeast)
    {
        if (chunks.Count > 0)
        {
            chunkUsed[^1] = used;
        }

        current = ScratchArrays.Rent<byte>(Math.Max(ChunkBytes, atLeast));
        used = 0;
        chunks.Add(current);
        chunkUsed.Add(0);
    }

    /// <summary>Walks the kept bodies, oldest first.</summary>
    public ref struct Reader(RawFrames frames)
    {
        private int chunk;
        private int offset;

        /// <summary>The chunk of the body <see cref="TryNext"/> gave last.</summary>
        public int Chunk { get; private set; }

        /// <summary>Where in its chunk the body <see cref="TryNext"/> gave last starts.</summary>
        public int BodyOffset { get; private set; }

        /// <summary>The next body and its frame type; false after the last.</summary>
        public bool TryNext(out FrameType type, out ReadOnlySpan<byte> body)
        {
            while (chunk < frames.chunks.Count)
            {
                if (offset < frames.chunkUsed[chunk])
                {
                    byte[] bytes = frames.chunks[chunk];
                    type = (FrameType)bytes[offset];
                    int length = BinaryPrimitives.ReadUInt16LittleEndian(bytes.AsSpan(offset + 1));
                    body = bytes.AsSpan(offset + HeaderBytes, length);
                    Chunk = chunk;
                    BodyOffset = offset + HeaderBytes;
                    offset += HeaderBytes + length;
                    return true;
                }

                chunk++;
                offset = 0;
            }

            type = default;
            body = default;
            return false;
        }
    }
}
