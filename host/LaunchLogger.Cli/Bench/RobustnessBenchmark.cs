using System.Diagnostics;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Firmware.Wire;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Box;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Cli.Bench;

/// <summary>Seeded mutations of simulated logs sent through the whole decoder — reader, runs,
/// reconstruction, figures, verdicts and the JSON report — each under a time and an allocation
/// limit. Damaged input must never crash or hang it, and every frame the damage did not touch
/// must come out of the reader.</summary>
public static class RobustnessBenchmark
{
    /// <summary>The kinds of damage, in the order cases cycle through them.</summary>
    public enum Kind
    {
        /// <summary>1–8 random bits flipped.</summary>
        BitFlips,

        /// <summary>The log cut at a random byte (power lost).</summary>
        Cut,

        /// <summary>1–300 random bytes inserted at a random place.</summary>
        Garbage,

        /// <summary>One frame written twice.</summary>
        Duplicate,

        /// <summary>Two neighbouring frames swapped.</summary>
        Swap,

        /// <summary>One frame left out.</summary>
        Drop,

        /// <summary>A log cut mid-frame with another log appended (a power cut, then the next power-up).</summary>
        Join,

        /// <summary>1–3 bytes of one frame's body changed under a correct CRC (a box fault, or a tool).</summary>
        FieldChange,
    }

    /// <summary>What one case did: <paramref name="Base"/> is the index of the log it damaged,
    /// <paramref name="Rests"/> the outcome of every bench rest the report listed ("complete",
    /// "spoiled_by_pulse", "cut_short", "unfinished").</summary>
    public sealed record Outcome(int Index, Kind Kind, int Base, string? Crash, bool Hung, long AllocatedBytes, double Seconds, long Undamaged, long Recovered, IReadOnlyList<string> Rests);

    /// <summary>Limits each case runs under.</summary>
    public sealed record Limits(TimeSpan PerCase, long AllocatedBytes)
    {
        /// <summary>10 s and 512 MB per case.</summary>
        public static Limits Default { get; } = new(TimeSpan.FromSeconds(10), 512L * 1024 * 1024);
    }

    /// <summary>The logs mutated, seeded: two built-in scenarios; bench rests written by the
    /// firmware core (<see cref="BenchRestLogs"/>) — one whole, one spoiled by a pulse, one whole,
    /// one cut short by a shutdown; and a scenario's run followed by a power-up of rests, so that
    /// damage also falls between runs and rests.</summary>
    public static IReadOnlyList<byte[]> BaseLogs(int seed) =>
    [
        Simulator.Run(BuiltInScenarios.Default, seed).LogBytes,
        Simulator.Run(BuiltInScenarios.Get("brake-test-60"), seed + 1).LogBytes,
        BenchRestLogs.Write(seed + 2, RestMicros, new(9.8), new(-9.8, PulseAtS: 1.5), new(-9.8), new(9.8, ShutdownAtS: 2.5)),
        [
            .. Simulator.Run(BuiltInScenarios.Default, seed + 3).LogBytes,
            .. BenchRestLogs.Write(seed + 4, RestMicros, new(9.8), new(-9.8, ShutdownAtS: 1)),
        ],
    ];

    /// <summary>The bench rests' set length in <see cref="BaseLogs"/>: 4 s, shorter than the box's
    /// 20 s so that a rest's log stays about the size of a run's.</summary>
    private const int RestMicros = 4_000_000;

    /// <summary>Runs case <paramref name="index"/> of the set seeded by <paramref name="seed"/>.</summary>
    public static Outcome RunCase(IReadOnlyList<byte[]> bases, int seed, int index, Limits limits)
    {
        (Kind kind, int baseIndex, byte[] original, byte[] log, List<(int Start, int End)> damaged) = Case(bases, seed, index);
        long undamaged = 0;
        long recovered = 0;
        if (kind is Kind.BitFlips or Kind.Cut or Kind.Garbage)
        {
            (undamaged, recovered) = CountRecovered(original, log, damaged);
        }

        string? crash = null;
        IReadOnlyList<string> rests = [];
        long allocated = 0;
        var clock = Stopwatch.StartNew();
        var worker = new Thread(() =>
        {
            // Process-wide, so work the decoder hands to other threads is counted too (cases run one at a time).
            long before = GC.GetTotalAllocatedBytes(precise: true);
            try
            {
                rests = Decode(log).Rests.Select(r => r.Outcome).ToList();
            }
            catch (Exception e)
            {
                crash = e.GetType().Name + ": " + e.Message.ReplaceLineEndings(" ");
            }

            allocated = GC.GetTotalAllocatedBytes(precise: true) - before;
        })
        { IsBackground = true, Name = "robustness case " + index };
        worker.Start();
        bool finished = worker.Join(limits.PerCase);
        return new Outcome(index, kind, baseIndex, crash, !finished, allocated, clock.Elapsed.TotalSeconds, undamaged, recovered, finished ? rests : []);
    }

    /// <summary>The damaged log of case <paramref name="index"/> of the set seeded by
    /// <paramref name="seed"/> (as <see cref="RunCase"/> decodes it), and its kind of damage.</summary>
    public static (byte[] Log, Kind Kind) DamagedLog(IReadOnlyList<byte[]> bases, int seed, int index)
    {
        (Kind kind, _, _, byte[] log, _) = Case(bases, seed, index);
        return (log, kind);
    }

    private static (Kind Kind, int Base, byte[] Original, byte[] Log, List<(int Start, int End)> Damaged) Case(IReadOnlyList<byte[]> bases, int seed, int index)
    {
        // Not HashCode.Combine: its seed changes with every process, so the cases would too.
        var random = new Random(unchecked((seed * 1_000_003) + (index * 7919) + 0x5eed));
        var kind = (Kind)(index % Enum.GetValues<Kind>().Length);
        int baseIndex = random.Next(bases.Count);
        byte[] original = bases[baseIndex];
        (byte[] log, List<(int Start, int End)> damaged) = Mutate(kind, original, bases, random);
        return (kind, baseIndex, original, log, damaged);
    }

    /// <summary>The whole decoder, as <c>report --json</c> runs it: the JSON, or "" when the
    /// log holds neither runs nor bench rests.</summary>
    public static string DecodeAndReport(byte[] log) => Decode(log).Json;

    private static (string Json, IReadOnlyList<BenchRestReport> Rests) Decode(byte[] log)
    {
        LogReadResult read = LogReader.Read(log, "case.log");
        SessionAnalysis session = SessionAnalyzer.Analyze(read.Runs);
        List<BenchRestReport> rests = read.BenchRests.Select(BenchRestReport.From).ToList();
        if (session.Runs.Count == 0 && rests.Count == 0)
        {
            return ("", rests);
        }

        ReportDocument document = RunReportBuilder.Document(session, ToolInfo.Version, read.Source, ReaderReport.From(read.Stats), weather: null, pairs: []) with { BenchRests = rests };
        return (ReportJson.Serialize(document), rests);
    }

    private static (byte[] Log, List<(int Start, int End)> Damaged) Mutate(Kind kind, byte[] original, IReadOnlyList<byte[]> bases, Random random)
    {
        var damaged = new List<(int Start, int End)>();
        switch (kind)
        {
            case Kind.BitFlips:
            {
                byte[] log = (byte[])original.Clone();
                int flips = random.Next(1, 9);
                for (int i = 0; i < flips; i++)
                {
                    int at = random.Next(log.Length);
                    log[at] ^= (byte)(1 << random.Next(8));
                    damaged.Add((at, at));
                }

                return (log, damaged);
            }

            case Kind.Cut:
            {
                int at = random.Next(1, original.Length);
                damaged.Add((at, original.Length - 1));
                return (original[..at], damaged);
            }

            case Kind.Garbage:
            {
                int at = random.Next(original.Length + 1);
                byte[] junk = new byte[random.Next(1, 301)];
                random.NextBytes(junk);
                damaged.Add((at, at));
                return ([.. original.AsSpan(0, at), .. junk, .. original.AsSpan(at)], damaged);
            }

            case Kind.Join:
            {
                byte[] next = bases[random.Next(bases.Count)];
                int at = random.Next(1, original.Length);
                return ([.. original.AsSpan(0, at), .. next], damaged);
            }
        }

        List<LogEditor.Piece> pieces = LogEditor.Split(original);
        int k = random.Next(1, pieces.Count - 1);
        switch (kind)
        {
            case Kind.Duplicate:
                pieces.Insert(k, pieces[k]);
                break;
            case Kind.Swap:
                (pieces[k], pieces[k + 1]) = (pieces[k + 1], pieces[k]);
                break;
            case Kind.Drop:
                pieces.RemoveAt(k);
                break;
            case Kind.FieldChange:
                LogEditor.Piece p = pieces[k];
                byte[] body = (byte[])p.Body.Clone();
                int changes = random.Next(1, 4);
                for (int i = 0; i < changes && body.Length > 0; i++)
                {
                    body[random.Next(body.Length)] = random.Next(3) switch
                    {
                        0 => 0xFF,
                        1 => 0x00,
                        _ => (byte)random.Next(256),
                    };
                }

                pieces[k] = p with { Body = body };
                break;
        }

        return (LogEditor.Join(pieces), damaged);
    }

    /// <summary>Frames of the original whose bytes (and the delimiter before them) the damage did
    /// not touch, and how many of them the reader returned from the damaged log.</summary>
    private static (long Undamaged, long Recovered) CountRecovered(byte[] original, byte[] log, List<(int Start, int End)> damaged)
    {
        var got = new Dictionary<(FrameType, int, string), int>();
        foreach (LogEditor.Piece p in LogEditor.Split(log).Where(p => p.Good))
        {
            var key = (p.Type, p.Sequence, Convert.ToHexString(p.Body));
            got[key] = got.GetValueOrDefault(key) + 1;
        }

        long undamaged = 0;
        long recovered = 0;
        foreach (LogEditor.Piece p in LogEditor.Split(original).Where(p => p.Good))
        {
            int start = p.Offset;
            int end = p.Offset + p.Length - 1;
            bool touched = damaged.Any(d => d.Start <= end && d.End >= start - 1);
            if (touched)
            {
                continue;
            }

            undamaged++;
            var key = (p.Type, p.Sequence, Convert.ToHexString(p.Body));
            if (got.TryGetValue(key, out int n) && n > 0)
            {
                recovered++;
                got[key] = n - 1;
            }
        }

        return (undamaged, recovered);
    }
}
