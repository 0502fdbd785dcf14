using System.Runtime.CompilerServices;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Tests.Memory;

namespace LaunchLogger.Decoding.Tests.Runs;

/// <summary>A run's records in chunks: what is written reads back, across chunk boundaries; a
/// large run's chunks go back to the pool when the run is let go, and the next run takes them,
/// while a run still held keeps its own. Run alone (the pool is shared by the process).</summary>
[Collection(MemoryCollection.Name)]
public class RecordChunksTests
{
    // Record r holds (3r, 3r + 1, 3r + 2) as unsigned 32-bit values: a closed form to read back.
    private static uint Expected(int record, int field) => (uint)((3 * record) + field);

    [Theory]
    [InlineData("small: one exact array", 1_000)]
    [InlineData("just below the large-object threshold", 7_083)]
    [InlineData("one whole chunk", 8_192)]
    [InlineData("three chunks and a small part", (3 * 8_192) + 17)]
    [InlineData("a chunk and a part above the threshold", 8_192 + 7_100)]
    public void Records_read_back_as_written_one_by_one_and_a_stretch_at_a_time(string because, int records)
    {
        var byRecord = new RecordChunks<uint>(3, records);
        var byStretch = new RecordChunks<uint>(3, records);
        for (int r = 0; r < records; r++)
        {
            Span<uint> into = byRecord.Record(r);
            into[0] = Expected(r, 0);
            into[1] = Expected(r, 1);
            into[2] = Expected(r, 2);
        }

        // Stretches of 1,000 records: several straddle a chunk boundary.
        for (int from = 0; from < records; from += 1_000)
        {
            int count = Math.Min(1_000, records - from);
            uint[] values = [.. Enumerable.Range(3 * from, 3 * count).Select(v => (uint)v)];
            byStretch.Write(from, values);
        }

        Assert.Equal(records, byRecord.Count);
        Assert.Equal(8_192, byRecord.RecordsPerChunk); // 98,304 bytes ÷ 12 bytes a record
        foreach (RecordChunks<uint> chunks in new[] { byRecord, byStretch })
        {
            int read = 0;
            for (int c = 0; c < chunks.Chunks; c++)
            {
                ReadOnlySpan<uint> chunk = chunks.Chunk(c);
                for (int i = 0; i < chunk.Length; i++)
                {
                    Assert.True(chunk[i] == (uint)((3 * read) + i), because);
                }

                read += chunk.Length / 3;
            }

            Assert.Equal(records, read);
            Assert.Equal(Expected(records - 1, 2), chunks.Record(records - 1)[2]);
        }
    }

    [Fact]
    public void A_record_that_does_not_divide_a_chunk_into_a_power_of_two_is_refused()
    {
        // 98,304 = 3 × 2^15: records of 1, 2, 3, 6 or 12 bytes fit a power of two; 5 or 7 do not.
        Assert.Throws<ArgumentOutOfRangeException>(() => new RecordChunks<byte>(5, 10));
        Assert.Throws<ArgumentOutOfRangeException>(() => new RecordChunks<byte>(7, 10));
        Assert.Throws<ArgumentOutOfRangeException>(() => new RecordChunks<byte>(6, -1));
        Assert.Equal(16_384, new RecordChunks<byte>(6, 10).RecordsPerChunk);
    }

    [Fact]
    public void A_let_go_run_gives_its_chunks_to_the_next_and_a_held_run_keeps_its_own()
    {
        const int records = 5 * 8_192;
        RecordChunks<uint> held = Filled(records, offset: 0);
        DropFilled(records, offset: 1_000_000);
        CollectAndFinalize();
        int pooledBefore = RecordChunks<uint>.PooledChunks;
        Assert.True(pooledBefore >= 5, $"the let-go run's five chunks should be pooled ({pooledBefore} are)");

        RecordChunks<uint> next = Filled(records, offset: 2_000_000);

        Assert.Equal(pooledBefore - 5, RecordChunks<uint>.PooledChunks);
        for (int r = 0; r < records; r++)
        {
            Assert.Equal(Expected(r, 1), held.Record(r)[1]);
            Assert.Equal(2_000_000 + Expected(r, 1), next.Record(r)[1]);
        }

        GC.KeepAlive(held);
        GC.KeepAlive(next);
    }

    [Fact]
    public void Shrinking_gives_back_the_chunks_past_the_records_kept_and_keeps_the_rest()
    {
        var chunks = Filled(4 * 8_192, offset: 0);
        CollectAndFinalize();
        int pooledBefore = RecordChunks<uint>.PooledChunks;

        chunks.Shrink(8_192 + 1);

        Assert.Equal(8_193, chunks.Count);
        Assert.Equal(2, chunks.Chunks);
        Assert.Equal(Math.Min(pooledBefore + 2, (int)(RecordChunks<uint>.MaxPooledBytes / RecordChunks<uint>.ChunkBytes)), RecordChunks<uint>.PooledChunks);
        Assert.Equal(3, chunks.Chunk(1).Length);
        Assert.Equal(Expected(8_192, 2), chunks.Record(8_192)[2]);
        Assert.Throws<ArgumentOutOfRangeException>(() => chunks.Shrink(8_194));
    }

    private static RecordChunks<uint> Filled(int records, uint offset)
    {
        var chunks = new RecordChunks<uint>(3, records);
        for (int r = 0; r < records; r++)
        {
            Span<uint> into = chunks.Record(r);
            for (int f = 0; f < 3; f++)
            {
                into[f] = offset + Expected(r, f);
            }
        }

        return chunks;
    }

    [MethodImpl(MethodImplOptions.NoInlining)]
    private static void DropFilled(int records, uint offset) => Filled(records, offset);

    private static void CollectAndFinalize()
    {
        GC.Collect();
        GC.WaitForPendingFinalizers();
        GC.Collect();
    }
}
