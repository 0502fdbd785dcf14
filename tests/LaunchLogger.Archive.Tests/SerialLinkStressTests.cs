using LaunchLogger.Cli.Capture;
using LaunchLogger.Tests.Support;
using Xunit.Abstractions;

namespace LaunchLogger.Archive.Tests;

/// <summary>`capture`'s serial link over an in-process pseudo-terminal, streamed the way that
/// lost a block once: idle gaps about as long as the read timeout (so reads time out just as
/// bytes arrive), block sizes around and across the reader's 4096, several ports at once, and
/// every core kept busy by threads that compute or allocate. Every byte must come out once, in
/// order.</summary>
/// <remarks>A longer soak: <c>LAUNCHLOGGER_SERIAL_SOAK_ROUNDS=N</c> runs N rounds (seeds 1..N)
/// and prints how many lost or reordered bytes (DEVELOPERS.md, "Serial capture soak").</remarks>
public class SerialLinkStressTests(ITestOutputHelper log)
{
    // The shortest read timeout System.IO.Ports' Unix stream honours (it rounds shorter ones up
    // to 30 ms): the most reads that time out per second of streaming.
    private const int ReadTimeoutMs = 30;

    // Once every byte is written, this many empty reads in a row (each waits the read timeout,
    // so 3 s or more) mean what is missing never comes.
    private const int EmptyReadsMeaningLost = 100;
    private const int ReaderBlockBytes = 4096;
    private const int StreamsAtOnce = 4;
    private const int WritesPerStream = 60;
    private static readonly TimeSpan Patience = TimeSpan.FromSeconds(30);

    [Fact]
    public void Every_byte_arrives_once_and_in_order_through_timed_out_reads_on_a_busy_machine()
    {
        int rounds = int.TryParse(Environment.GetEnvironmentVariable("LAUNCHLOGGER_SERIAL_SOAK_ROUNDS"), out int n) && n > 0 ? n : 1;

        // One loading thread per core, half of them allocating (so the collector stops every
        // thread now and then, the port's I/O thread too), the other half computing.
        var failures = new List<string>();
        long bytes = 0;
        using var busy = new CancellationTokenSource();
        Thread[] hogs = Enumerable.Range(0, Environment.ProcessorCount).Select(i => new Thread(() => Load(allocate: i % 2 == 0, busy.Token)) { IsBackground = true }).ToArray();
        foreach (Thread hog in hogs)
        {
            hog.Start();
        }

        try
        {
            for (int round = 0; round < rounds; round++)
            {
                // Several ports at once: more reads time out per second, on more threads.
                var outcomes = new (long Sent, string? Failure)[StreamsAtOnce];
                Thread[] streams = Enumerable.Range(0, StreamsAtOnce).Select(i => new Thread(() => outcomes[i] = Guarded((round * StreamsAtOnce) + i + 1)) { IsBackground = true }).ToArray();
                foreach (Thread stream in streams)
                {
                    stream.Start();
                }

                foreach (Thread stream in streams)
                {
                    Assert.True(stream.Join(Patience * 4), "a stream never finished");
                }

                bytes += outcomes.Sum(o => o.Sent);
                string[] failed = outcomes.Select(o => o.Failure).OfType<string>().ToArray();
                foreach (string failure in failed)
                {
                    log.WriteLine($"round {round + 1}: {failure}");
                }

                if (failed.Length > 0)
                {
                    failures.Add($"round {round + 1}: {string.Join("; ", failed)}");
                }
            }
        }
        finally
        {
            busy.Cancel();
            foreach (Thread hog in hogs)
            {
                hog.Join();
            }
        }

        log.WriteLine($"{failures.Count} of {rounds} round(s) of {StreamsAtOnce} streams lost or reordered bytes; {bytes:N0} bytes sent");
        Assert.True(failures.Count == 0, string.Join(Environment.NewLine, failures));
    }

    /// <summary>One stream: <see cref="WritesPerStream"/> writes with gaps, read through
    /// <see cref="SerialLink"/>; null when what came out equals what went in.</summary>
    private static (long Sent, string? Failure) StreamOnce(int seed)
    {
        var random = new Random(seed);
        using var pair = PseudoTerminalPair.Open();
        var link = new SerialLink(pair.PortName, 115200, ReadTimeoutMs);
        var received = new MemoryStream();
        var sent = new MemoryStream();
        long total = -1;
        Exception? readFailure = null;
        using (ILinkConnection connection = link.Open())
        {
            var reader = new Thread(() =>
            {
                byte[] block = new byte[ReaderBlockBytes];
                try
                {
                    // Read until every byte written has come (or more), or writing has ended and
                    // nothing has come for long enough.
                    int emptyAfterWriting = 0;
                    while (true)
                    {
                        long written = Volatile.Read(ref total);
                        if (written >= 0 && (received.Length >= written || emptyAfterWriting >= EmptyReadsMeaningLost))
                        {
                            break;
                        }

                        int got = connection.Read(block);
                        if (got == 0)
                        {
                            emptyAfterWriting += written >= 0 ? 1 : 0;
                            continue;
                        }

                        emptyAfterWriting = 0;
                        received.Write(block, 0, got);
                    }
                }
                catch (Exception e)
                {
                    readFailure = e;
                }
            }) { IsBackground = true };
            reader.Start();
            try
            {
                for (int write = 0; write < WritesPerStream; write++)
                {
                    byte[] chunk = new byte[ChunkLength(random)];
                    random.NextBytes(chunk);
                    pair.Write(chunk, Patience);
                    sent.Write(chunk);

                    // Mostly a gap within a few ms of the read timeout, so the reader's wait runs
                    // out about when the next bytes come; sometimes none, sometimes a long one.
                    int gap = random.Next(10) switch
                    {
                        0 => 0,
                        1 => ReadTimeoutMs * 3,
                        _ => ReadTimeoutMs + random.Next(-6, 7),
                    };
                    if (gap > 0)
                    {
                        Thread.Sleep(gap);
                    }
                }
            }
            finally
            {
                Volatile.Write(ref total, sent.Length);
                if (!reader.Join(Patience))
                {
                    readFailure ??= new TimeoutException("the reader never stopped");
                }
            }
        }

        if (readFailure != null)
        {
            return (sent.Length, $"seed {seed}: the read failed: {readFailure}");
        }

        byte[] want = sent.ToArray();
        byte[] got = received.ToArray();
        int same = want.AsSpan().CommonPrefixLength(got);
        return (want.Length, same == want.Length && got.Length == want.Length
            ? null
            : $"seed {seed}: received {got.Length:N0} of {want.Length:N0} bytes; the first {same:N0} match, then a {(got.Length < want.Length ? "hole" : "surplus")} of {Math.Abs(want.Length - got.Length):N0}");
    }

    private static (long Sent, string? Failure) Guarded(int seed)
    {
        try
        {
            return StreamOnce(seed);
        }
        catch (Exception e)
        {
            return (0, $"seed {seed}: {e}");
        }
    }

    private static int ChunkLength(Random random) => random.Next(8) switch
    {
        0 => 1,
        1 => ReaderBlockBytes - 1,
        2 => ReaderBlockBytes,
        3 => ReaderBlockBytes + 1,
        4 => random.Next(2 * ReaderBlockBytes, 3 * ReaderBlockBytes),
        _ => random.Next(2, 768),
    };

    /// <summary>Keeps a core busy: computing, or allocating and dropping arrays, as `capture`'s
    /// analysis of a closed run does while the port is read.</summary>
    private static void Load(bool allocate, CancellationToken stop)
    {
        double x = 1;
        var kept = new byte[64][];
        int next = 0;
        while (!stop.IsCancellationRequested)
        {
            if (allocate)
            {
                for (int i = 0; i < 64; i++)
                {
                    kept[next++ % kept.Length] = new byte[(i % 8) == 0 ? 200_000 : 2_000];
                }
            }
            else
            {
                for (int i = 0; i < 10_000; i++)
                {
                    x = Math.Sqrt(x + i);
                }
            }
        }

        GC.KeepAlive(x);
        GC.KeepAlive(kept);
    }
}
