using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Simulation.Box;

/// <summary>Logs holding bench rests, written by the firmware core itself: a box standing on its
/// end, its forward axis (x) reading k·(±g) + b (specific force at rest is +g upward), driven
/// through <see cref="RunRecorder"/> as the capture loop drives it — a 1 kHz burst every 20 ms,
/// the mark button held 3.5 s while staged, then let go. For tests and the robustness bench.</summary>
public static class BenchRestLogs
{
    /// <summary>Standard gravity, m/s² (3rd CGPM, 1901; ISO 80000-3).</summary>
    private const double G0 = 9.80665;

    /// <summary>One rest to record.</summary>
    /// <param name="ForwardMps2">The forward axis' true reading, m/s² (before noise and rounding to milli-g).</param>
    /// <param name="PulseAtS">A wheel pulse this long after the release (the car moved), or null.</param>
    /// <param name="ShutdownAtS">The box shut down this long after the release (the rest cut
    /// short), or null; only the last rest of a power-up.</param>
    public sealed record Rest(double ForwardMps2, double? PulseAtS = null, double? ShutdownAtS = null);

    /// <summary>The bytes of one power-up holding <paramref name="rests"/> in order, each from a
    /// fresh stillness (the box turned over between them), with seeded noise of about 5 milli-g
    /// per axis.</summary>
    public static byte[] Write(int seed, params Rest[] rests) => Write(seed, new LoggerSettings().BenchRestMicros, rests);

    /// <summary>As <see cref="Write(int, Rest[])"/>, each rest set to record for
    /// <paramref name="restMicros"/> (<see cref="LoggerSettings.BenchRestMicros"/>).</summary>
    public static byte[] Write(int seed, int restMicros, params Rest[] rests)
    {
        var settings = new LoggerSettings { BenchRestMicros = restMicros };
        var sink = new Sink();
        var recorder = new RunRecorder(settings, sink, new HealthCounters());
        var random = new Random(seed);
        short[] burst = new short[20 * 3];
        long now = 0;
        long index = 0;
        long pulses = 0;
        recorder.PowerUp(0);
        recorder.SetCounterOrigin(0, 0);
        for (int r = 0; r < rests.Length; r++)
        {
            Rest rest = rests[r];
            if (rest.ShutdownAtS != null && r != rests.Length - 1)
            {
                throw new ArgumentException("only the last rest can end in a shutdown", nameof(rests));
            }

            double forwardMilliG = rest.ForwardMps2 / G0 * 1000;
            long pulseAt = long.MaxValue;
            void Feed(long untilMicros)
            {
                while (now < untilMicros)
                {
                    now += 20_000;
                    for (int i = 0; i < 20; i++)
                    {
                        burst[i * 3] = (short)Math.Round(forwardMilliG + Noise(random));
                        burst[(i * 3) + 1] = (short)Math.Round(Noise(random));
                        burst[(i * 3) + 2] = (short)Math.Round(Noise(random));
                    }

                    recorder.OnAccelBurst(burst, 20, index, now);
                    index += 20;
                    if (now >= pulseAt)
                    {
                        pulses++;
                        recorder.OnPulse(0, pulses, now - 500, now);
                        pulseAt = long.MaxValue;
                    }

                    recorder.Tick(now);
                }
            }

            // Turned over: let it settle and stage, hold the button, let go, wait for the end.
            Feed(now + 2_000_000);
            if (recorder.Phase != RunPhase.Staged)
            {
                throw new InvalidOperationException("the box did not stage on the bench");
            }

            recorder.OnMarkButton(true, now);
            Feed(now + 3_500_000);
            recorder.OnMarkButton(false, now);
            if (rest.PulseAtS is { } p)
            {
                pulseAt = now + (long)(p * 1e6);
            }

            if (rest.ShutdownAtS is { } off)
            {
                Feed(now + (long)(off * 1e6));
                recorder.Shutdown(now);
                break;
            }

            Feed(now + settings.BenchRestMicros + 100_000);
            if (recorder.BenchRestRecording)
            {
                throw new InvalidOperationException("the rest did not end");
            }
        }

        return sink.Bytes.ToArray();
    }

    private sealed class Sink : IByteSink
    {
        public MemoryStream Bytes { get; } = new();

        public bool Write(byte[] buffer, int offset, int count)
        {
            Bytes.Write(buffer, offset, count);
            return true;
        }
    }

    /// <summary>Sum of three uniforms: zero mean, σ 5 milli-g.</summary>
    private static double Noise(Random random) => (random.NextDouble() + random.NextDouble() + random.NextDouble() - 1.5) * 10;
}
