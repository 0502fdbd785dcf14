using System.CommandLine;
using System.Diagnostics;
using LaunchLogger.Cli.Core;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger bench core</c>: sustained observations per second through the
/// firmware core on this machine, and bytes allocated while capturing.</summary>
public static class BenchCoreCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var observations = new Option<int>("--observations") { Description = "Pulse observations to feed.", DefaultValueFactory = _ => 5_000_000 };
        var command = new Command("core", "Observations per second through the firmware core, and bytes allocated.") { observations };
        command.SetAction(parse => (int)Run(parse.GetValue(observations), parse.InvocationConfiguration.Output));
        return command;
    }

    /// <summary>Runs the benchmark.</summary>
    public static ExitCode Run(int observations, TextWriter output)
    {
        if (observations < 1000)
        {
            output.WriteLine("--observations must be at least 1000");
            return ExitCode.Usage;
        }

        var settings = new LoggerSettings();
        var sink = new MemoryByteSink { KeepBytes = false };
        var recorder = new RunRecorder(settings, sink, new HealthCounters());

        // Stage, launch and get the run open with a short scripted launch, then time the
        // steady state: a car at constant speed, one edge every 500 µs, a 20-sample burst every
        // 20 ms (1 kHz), as on the road.
        var launch = new ScriptedLaunch(recorder, settings, 4.9, launchMicros: 2_000_000);
        launch.Run(accelerateUntilMicros: 3_000_000, endMicros: 3_000_000);
        long count = recorder.RunNumber == 1 ? 1_000_000 : 0;
        long t = 3_000_000;
        var burst = new short[ScriptedLaunch.BurstSamples * 3];
        for (int i = 0; i < burst.Length; i += 3)
        {
            burst[i + 2] = 1000;
        }

        Feed(recorder, burst, 20_000, ref count, ref t); // warm the JIT
        long startFrames = sink.FrameCount;
        long startSinkBytes = sink.ByteCount;
        var clock = new Stopwatch();
        long startBytes = GC.GetAllocatedBytesForCurrentThread();
        clock.Start();
        long accelSamples = Feed(recorder, burst, observations, ref count, ref t);
        clock.Stop();
        long allocated = GC.GetAllocatedBytesForCurrentThread() - startBytes;
        double seconds = clock.Elapsed.TotalSeconds;
        output.WriteLine("bench core: firmware core on the host runtime (one thread)");
        output.WriteLine($"  observations fed        {observations,14:N0}");
        output.WriteLine($"  accelerometer samples   {accelSamples,14:N0}");
        output.WriteLine($"  frames / bytes written  {sink.FrameCount - startFrames,14:N0} / {sink.ByteCount - startSinkBytes:N0}");
        output.WriteLine($"  elapsed                 {seconds,14:F3} s");
        output.WriteLine($"  observations per second {observations / seconds,14:N0}   (goal ≥ 1,000,000)");
        output.WriteLine($"  bytes allocated         {allocated,14:N0}   (goal 0)");
        output.WriteLine($"  run still open          {(recorder.Phase == RunPhase.RolledOut ? "yes" : "no")}");
        return ExitCode.Ok;
    }

    private static long Feed(RunRecorder recorder, short[] burst, int observations, ref long count, ref long t)
    {
        const long EdgeMicros = 500;
        long samples = 0;
        long sampleIndex = 1_000_000;
        for (int i = 0; i < observations; i++)
        {
            t += EdgeMicros;
            count++;
            recorder.OnPulse(0, count, t - 1, t);
            if (i % 40 == 39)
            {
                recorder.OnAccelBurst(burst, ScriptedLaunch.BurstSamples, sampleIndex, t);
                sampleIndex += ScriptedLaunch.BurstSamples;
                samples += ScriptedLaunch.BurstSamples;
                recorder.Tick(t);
            }
        }

        return samples;
    }
}
