using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;

namespace LaunchLogger.Firmware.Tests.Run;

/// <summary>The hot path allocates nothing once the recorder is built and a run is open: the
/// device's managed heap is small and its GC stops the world (shared/HARDWARE-FACTS.md).</summary>
public class RunRecorderAllocationTests
{
    private const int Bursts = 5000;
    private const int SamplesPerBurst = 20;
    private const int ObservationsPerBurst = 100; // per channel: 2 × 100 × 5000 = 1,000,000

    [Fact]
    public void FeedingAMillionObservationsAndAHundredThousandSamplesAllocatesNothing()
    {
        var settings = new LoggerSettings { SecondChannelEnabled = true };
        var sink = new CountingSink();
        var recorder = new RunRecorder(settings, sink, new HealthCounters());
        short[] burst = new short[SamplesPerBurst * 3];
        var feeder = new Feeder(recorder, burst);

        // Start-up: stage on a still accelerometer, open a run on the first pulse, warm up every path.
        feeder.Still(2_000_000);
        Assert.Equal(RunPhase.Staged, recorder.Phase);
        feeder.Drive(200);
        Assert.Equal(RunPhase.RolledOut, recorder.Phase);
        recorder.OnBrakeSwitch(true, feeder.NowMicros);
        recorder.OnBrakeSwitch(false, feeder.NowMicros);
        recorder.OnManualMark(feeder.NowMicros);
        recorder.OnAccelGap(3, feeder.NowMicros);
        long framesBefore = sink.FrameCount;
        long fedBefore = feeder.ObservationsFed;

        long before = GC.GetAllocatedBytesForCurrentThread();
        feeder.Drive(Bursts);
        recorder.OnBrakeSwitch(true, feeder.NowMicros);
        recorder.OnManualMark(feeder.NowMicros);
        recorder.OnAccelGap(5, feeder.NowMicros);
        long allocated = GC.GetAllocatedBytesForCurrentThread() - before;

        Assert.Equal(0, allocated);
        Assert.Equal(RunPhase.RolledOut, recorder.Phase);
        Assert.Equal(1_000_000, feeder.ObservationsFed - fedBefore);
        Assert.Equal(100_000, Bursts * SamplesPerBurst);
        Assert.True(sink.FrameCount - framesBefore > Bursts, "pulse, acceleration and health frames were written");
    }

    /// <summary>Feeds without allocating: a 20-sample burst every 20 ms with 100 observations on
    /// each of two channels (200 µs apart, a 5 kHz edge rate) and a tick.</summary>
    private sealed class Feeder
    {
        private readonly RunRecorder recorder;
        private readonly short[] burst;
        private long sampleIndex;
        private long count0;
        private long count1;

        public Feeder(RunRecorder recorder, short[] burst)
        {
            this.recorder = recorder;
            this.burst = burst;
            recorder.SetCounterOrigin(0, 0);
            recorder.SetCounterOrigin(1, 0);
        }

        public long NowMicros { get; private set; }

        public long ObservationsFed { get; private set; }

        public void Still(long untilMicros)
        {
            while (NowMicros < untilMicros)
            {
                Burst(0);
            }
        }

        public void Drive(int bursts)
        {
            for (int b = 0; b < bursts; b++)
            {
                long start = NowMicros;
                for (int k = 1; k <= ObservationsPerBurst; k++)
                {
                    long hi = start + (k * 200);
                    recorder.OnPulse(0, ++count0, hi - 3 - (k % 5), hi);
                    recorder.OnPulse(1, ++count1, hi - 7, hi + 1);
                    ObservationsFed += 2;
                }

                Burst(500);
            }
        }

        private void Burst(short forwardMilliG)
        {
            NowMicros += SamplesPerBurst * 1000;
            for (int i = 0; i < SamplesPerBurst; i++)
            {
                burst[i * 3] = forwardMilliG;
                burst[(i * 3) + 1] = (short)(i % 3);
                burst[(i * 3) + 2] = 1000;
            }

            recorder.OnAccelBurst(burst, SamplesPerBurst, sampleIndex, NowMicros);
            sampleIndex += SamplesPerBurst;
            recorder.Tick(NowMicros);
        }
    }
}
