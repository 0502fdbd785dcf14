using LaunchLogger.Esp32.Glue;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;
using LaunchLogger.Firmware.Run;

namespace LaunchLogger.Firmware.LinuxBoard.Tests.Esp32;

/// <summary>The ESP32 firmware's portable glue, compiled here from firmware/esp32 (the rest of
/// its logic lives in the firmware core and is tested in LaunchLogger.Firmware.Tests).</summary>
public class Esp32PortableTests
{
    [Fact]
    public void Each_capture_step_polls_the_counter_exactly_once()
    {
        var health = new HealthCounters();
        var time = new ManualMicrosecondCounter { NowMicros = 1000 };
        var clock = new MonotonicClock(time, health);
        var counter = new SteppingCounter();
        var source = new PollOnEachStep(new PolledPulseSource(counter, clock));
        var recorder = new RunRecorder(new LoggerSettings { AccelPresent = false }, new MemorySink(), health);
        recorder.SetCounterOrigin(0, 0);
        var loop = new CaptureLoop(clock, source, null, null, null, null, recorder, 1, 0);

        for (int step = 1; step <= 5; step++)
        {
            time.NowMicros += 100;
            counter.Count += 2;
            loop.Step();
            Assert.Equal(step, source.Polls);
        }

        Assert.Equal(10, counter.Count);
    }

    private sealed class SteppingCounter : IPulseCounter
    {
        public long Count { get; set; }

        public int ChannelCount => 1;

        public long ReadCount(int channel) => Count;
    }
}
