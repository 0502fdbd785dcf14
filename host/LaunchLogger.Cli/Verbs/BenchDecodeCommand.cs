using System.Buffers;
using System.CommandLine;
using System.Diagnostics;
using System.Globalization;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Firmware.Wire;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger bench decode</c>: log throughput of the frame reader and of the
/// whole reader (with fresh and with reused buffers), and the time to reconstruct and time one
/// 30-s run with a 1 kHz accelerometer.</summary>
public static class BenchDecodeCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var megabytes = new Option<int>("--megabytes") { Description = "Size of the log to read, MB.", DefaultValueFactory = _ => 256 };
        var repeats = new Option<int>("--repeats") { Description = "Reconstructions to time.", DefaultValueFactory = _ => 30 };
        var command = new Command("decode", "Log throughput and reconstruction time per run.") { megabytes, repeats };
        command.SetAction(parse => (int)Run(parse.GetValue(megabytes), parse.GetValue(repeats), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error));
        return command;
    }

    /// <summary>Runs the benchmark.</summary>
    public static ExitCode Run(int megabytes, int repeats, TextWriter output, TextWriter error)
    {
        if (megabytes < 1 || megabytes > 4096 || repeats < 1 || repeats > 10_000)
        {
            error.WriteLine("launchlogger bench decode: --megabytes must be 1 to 4096 and --repeats 1 to 10000");
            return ExitCode.Usage;
        }

        // A 30-s run with a 1 kHz accelerometer: the default car, its sensor sampling at 1000 Hz,
        // driven 900 m, stopped and left standing.
        Scenario baseline = BuiltInScenarios.Default;
        Scenario scenario = baseline with
        {
            Accelerometer = baseline.Accelerometer with { OutputDataRateHz = 1000 },
            Plan = baseline.Plan with { TargetSpeedMps = null, TargetDistanceM = 900 },
        };
        error.WriteLine("bench decode: simulating the test log…");
        SimulationResult simulation = Simulator.Run(scenario, seed: 1);
        byte[] one = simulation.LogBytes;
        byte[] log = new byte[(long)megabytes * 1_000_000 / one.Length * one.Length];
        for (int at = 0; at < log.Length; at += one.Length)
        {
            one.CopyTo(log, at);
        }

        // Best of three passes: the first also warms the code up.
        (double frameSeconds, long frames) = TimeFrames(log);
        for (int pass = 0; pass < 2; pass++)
        {
            (double s, long f) = TimeFrames(log);
            (frameSeconds, frames) = s < frameSeconds ? (s, f) : (frameSeconds, frames);
        }

        // The whole reader into runs, two ways, best of three passes each:
        // fresh buffers — LogReader.Read keeps every run, so each run's arrays are new memory;
        // reused buffers — LogReader.ReadRuns hands each run out and lets it go (as `report`
        // does), so the collection buffers and the collector's memory serve run after run.
        Pass fresh = Best(() => LogReader.Read(log, "bench.log").Runs.Count);
        Pass reused = Best(() => LogReader.ReadRuns(new MemoryStream(log, writable: false), "bench.log").Count());
        DecodedRun run = LogReader.Read(one, "one.log").Runs.Single();

        // What the collector costs a run's data made as plain arrays (one fresh array per run and
        // kind, the sizes the reader keeps, written element by element, nothing read), kept or let
        // go as above: the reader's own allocation before it kept them in pooled chunks.
        int runsInLog = log.Length / one.Length;
        Pass floorKept = Best(() => MakeArrays(run, runsInLog, keep: true));
        Pass floorLetGo = Best(() => MakeArrays(run, runsInLog, keep: false));
        RunAnalyzer.Analyze(run);
        var clock = new Stopwatch();
        var times = new double[repeats];
        for (int i = 0; i < repeats; i++)
        {
            clock.Restart();
            RunAnalyzer.Analyze(run);
            clock.Stop();
            times[i] = clock.Elapsed.TotalMilliseconds;
        }

        Array.Sort(times);

        // The reader keeps accelerometer samples packed; reconstruction's first read of the times,
        // forward and vertical axes builds them. Timed here on freshly read runs, so that the
        // cost the reader no longer pays is shown where it is paid.
        var expand = new double[repeats];
        for (int i = 0; i < repeats; i++)
        {
            AccelSeries? fresh1 = LogReader.Read(one, "one.log").Runs.Single().Accel;
            clock.Restart();
            _ = fresh1?.TimeS;
            _ = fresh1?.ForwardMps2;
            _ = fresh1?.VerticalMps2;
            clock.Stop();
            expand[i] = clock.Elapsed.TotalMilliseconds;
        }

        Array.Sort(expand);
        double runSeconds = run.Accel is { Count: > 0 } a ? a.TimeS[^1] - a.TimeS[0] : run.Pulses[^1].HiS - run.Configuration.OpenedS;
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"bench decode: this machine, {Environment.ProcessorCount} cores (the whole reader reads frames on one thread and builds runs on the thread pool)"));
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  log                      {log.Length / 1e6,10:0.0} MB, {frames:N0} frames ({one.Length:N0}-byte run repeated)"));
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  frame reader             {log.Length / 1e6 / frameSeconds,10:0} MB/s   (goal ≥ 400 MB/s; frames checked and unstuffed, bodies not parsed)"));
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  whole reader into runs   {log.Length / 1e6 / fresh.Seconds,10:0} MB/s   fresh buffers: every run kept ({fresh.Runs:N0} runs; {log.Length / 1e6 / fresh.CpuSeconds:0} MB per CPU-second; {fresh.Allocated / 1e6:0} MB allocated; {fresh.Collections}) (goal ≥ 400 MB/s)"));
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  whole reader into runs   {log.Length / 1e6 / reused.Seconds,10:0} MB/s   reused buffers: runs streamed, each let go ({reused.Runs:N0} runs; {log.Length / 1e6 / reused.CpuSeconds:0} MB per CPU-second; {reused.Allocated / 1e6:0} MB allocated; {reused.Collections}) (goal ≥ 400 MB/s)"));
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  runs' data, plain arrays {log.Length / 1e6 / floorKept.Seconds,10:0} MB/s   kept; {log.Length / 1e6 / floorLetGo.Seconds:0} MB/s let go ({floorKept.Allocated / 1e6:0} MB: each run's packed pulses and accelerometer samples as one fresh array each, written, nothing read — the collector's cost without pooled chunks)"));
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  machine load             {Environment.ProcessorCount} cores, load average {LoadAverage()} (wall-clock rates fall with it; CPU-second rates much less)"));
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  one run                  {runSeconds,10:0.0} s logged, {run.Pulses.Count:N0} pulse observations, {run.Accel?.Count ?? 0:N0} accelerometer samples at {1 / (run.Accel?.SamplePeriodS ?? double.NaN):0} Hz"));
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  reconstruction + figures {times[times.Length / 2],10:0.0} ms median, {times[0]:0.0} ms best, {times[^1]:0.0} ms worst of {repeats}; median {times[times.Length / 2] * 30 / runSeconds:0.0} ms per 30 s logged (goal ≤ 20 ms per 30-s run)"));
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  + samples expanded       {expand[expand.Length / 2],10:0.00} ms median per run (times, forward and vertical axes built from the packed samples on reconstruction's first read; not in the line above)"));
        return ExitCode.Ok;
    }

    /// <summary>One timed pass: wall and process CPU time, runs read, bytes allocated by the
    /// process (every thread), collections of each generation.</summary>
    private readonly record struct Pass(double Seconds, double CpuSeconds, int Runs, long Allocated, int Gen0, int Gen1, int Gen2, TimeSpan Paused)
    {
        /// <summary>The collections, for people: gen 0, 1 and 2 (a gen-2 collection also counts
        /// in 0 and 1), and the time the process was paused for them.</summary>
        public string Collections => string.Create(CultureInfo.InvariantCulture, $"collections {Gen0}/{Gen1}/{Gen2} (gen 0/1/2), paused {Paused.TotalMilliseconds:0} ms");
    }

    /// <summary>The fastest of three passes (the first also warms the code up).</summary>
    private static Pass Best(Func<int> read)
    {
        Pass best = default;
        for (int pass = 0; pass < 3; pass++)
        {
            // Each pass starts from a clean heap: the last pass's runs collected, and what their
            // finalizers give back (a run's pooled chunks) handed back and its garbage collected.
            GC.Collect();
            GC.WaitForPendingFinalizers();
            GC.Collect();
            long before = GC.GetTotalAllocatedBytes(precise: true);
            int[] collections = [GC.CollectionCount(0), GC.CollectionCount(1), GC.CollectionCount(2)];
            TimeSpan paused = GC.GetTotalPauseDuration();
            TimeSpan cpu = Process.GetCurrentProcess().TotalProcessorTime;
            var clock = Stopwatch.StartNew();
            int runs = read();
            clock.Stop();
            var now = new Pass(
                clock.Elapsed.TotalSeconds,
                (Process.GetCurrentProcess().TotalProcessorTime - cpu).TotalSeconds,
                runs,
                GC.GetTotalAllocatedBytes(precise: true) - before,
                GC.CollectionCount(0) - collections[0],
                GC.CollectionCount(1) - collections[1],
                GC.CollectionCount(2) - collections[2],
                GC.GetTotalPauseDuration() - paused);
            best = pass == 0 || now.Seconds < best.Seconds ? now : best;
        }

        return best;
    }

    /// <summary>Makes <paramref name="runs"/> sets of arrays of <paramref name="like"/>'s sizes
    /// as the reader does (uninitialised, then every element written); returns how many.</summary>
    private static int MakeArrays(DecodedRun like, int runs, bool keep)
    {
        var kept = new List<object>();
        int pulses = like.Pulses.Count + like.SecondPulses.Count;
        int samples = like.Accel?.Count ?? 0;
        for (int r = 0; r < runs; r++)
        {
            // Pulse observations are kept packed, 12 bytes each (count and bracket ends as offsets).
            uint[] records = GC.AllocateUninitializedArray<uint>(3 * pulses);
            for (int i = 0; i < records.Length; i++)
            {
                records[i] = (uint)i;
            }

            // The accelerometer samples are kept packed as the box wrote them (6 bytes each);
            // their arrays of doubles are built only when reconstruction reads them.
            byte[] packed = GC.AllocateUninitializedArray<byte>(samples * 6);
            for (int i = 0; i < packed.Length; i++)
            {
                packed[i] = (byte)i;
            }

            if (keep)
            {
                kept.Add(records);
                kept.Add(packed);
            }
        }

        GC.KeepAlive(kept);
        return runs;
    }

    private static string LoadAverage()
    {
        try
        {
            return File.ReadAllText("/proc/loadavg").Split(' ')[0];
        }
        catch (IOException)
        {
            return "unknown";
        }
        catch (UnauthorizedAccessException)
        {
            return "unknown";
        }
    }

    private static (double Seconds, long Frames) TimeFrames(byte[] log)
    {
        var reader = default(FrameReader);
        byte[] payload = new byte[LogFormat.MaxPayloadBytes];
        long frames = 0;
        int offset = 0;
        var clock = Stopwatch.StartNew();
        while (true)
        {
            OperationStatus status = reader.TryReadFrame(log.AsSpan(offset), payload, isFinalBlock: true, out int consumed, out Frame frame);
            offset += consumed;
            if (status == OperationStatus.Done)
            {
                frames++;
            }
            else if (status == OperationStatus.NeedMoreData)
            {
                break;
            }
        }

        clock.Stop();
        return (clock.Elapsed.TotalSeconds, frames);
    }
}
