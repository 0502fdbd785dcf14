using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Cli.Core;

/// <summary>Drives the firmware core through an idealised launch: a still car, then constant
/// acceleration with exact edge timestamps and a perfect accelerometer, then a stop. Used by the
/// self-check and the core benchmark; the simulator is the realistic generator.</summary>
public sealed class ScriptedLaunch
{
    private const double G0 = 9.80665; // standard gravity, m/s² (3rd CGPM, 1901)
    private readonly RunRecorder recorder;
    private readonly LoggerSettings settings;
    private readonly short[] burst;

    /// <summary>Prepares a launch at <paramref name="accelerationMps2"/> starting at
    /// <paramref name="launchMicros"/> after a still period from time 0.</summary>
    public ScriptedLaunch(RunRecorder recorder, LoggerSettings settings, double accelerationMps2, long launchMicros)
    {
        this.recorder = recorder;
        this.settings = settings;
        AccelerationMps2 = accelerationMps2;
        LaunchMicros = launchMicros;
        burst = new short[BurstSamples * 3];
    }

    /// <summary>Samples per accelerometer burst.</summary>
    public const int BurstSamples = 20;

    /// <summary>The constant acceleration after launch, m/s².</summary>
    public double AccelerationMps2 { get; }

    /// <summary>The true moment of first motion, µs.</summary>
    public long LaunchMicros { get; }

    /// <summary>Distance per pulse, metres.</summary>
    public double MetresPerPulse => settings.CircumferenceMicrometres * 1e-6 / settings.PulsesPerRevolution;

    /// <summary>Feeds the core from time 0 to <paramref name="endMicros"/>: accelerometer bursts
    /// every 20 samples, pulse edges of constant acceleration until
    /// <paramref name="accelerateUntilMicros"/>, then no more edges (the car is treated as stopped).
    /// Returns the number of pulse observations fed.</summary>
    public long Run(long accelerateUntilMicros, long endMicros)
    {
        long periodMicros = 1_000_000_000L / settings.AccelOutputDataRateMilliHz;
        long sampleIndex = 0;
        long nextEdge = 1;
        long fed = 0;
        recorder.SetCounterOrigin(0, 0);
        for (long t = 0; t <= endMicros; t += periodMicros * BurstSamples)
        {
            long burstEnd = t + (periodMicros * BurstSamples);
            while (true)
            {
                long edgeMicros = EdgeTimeMicros(nextEdge);
                if (edgeMicros > burstEnd || edgeMicros > accelerateUntilMicros)
                {
                    break;
                }

                recorder.OnPulse(0, nextEdge, edgeMicros - 1, edgeMicros);
                nextEdge++;
                fed++;
            }

            for (int i = 0; i < BurstSamples; i++)
            {
                long sampleMicros = t + ((i + 1) * periodMicros);
                bool accelerating = sampleMicros >= LaunchMicros && sampleMicros <= accelerateUntilMicros;
                burst[i * 3] = (short)(accelerating ? Math.Round(AccelerationMps2 / G0 * 1000) : 0);
                burst[(i * 3) + 1] = 0;
                burst[(i * 3) + 2] = 1000;
            }

            recorder.OnAccelBurst(burst, BurstSamples, sampleIndex, burstEnd);
            sampleIndex += BurstSamples;
            recorder.Tick(burstEnd);
        }

        return fed;
    }

    /// <summary>The exact time the cumulative count reaches <paramref name="count"/>, µs.</summary>
    public long EdgeTimeMicros(long count)
    {
        double distance = count * MetresPerPulse;
        return LaunchMicros + (long)Math.Round(Math.Sqrt(2 * distance / AccelerationMps2) * 1e6);
    }
}
