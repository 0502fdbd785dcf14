using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.NanoHarness
{
    /// <summary>A 32-bit microsecond counter the harness sets by hand (it wraps like the device's).</summary>
    public sealed class HandClock : IMicrosecondCounter
    {
        /// <summary>Microseconds since power-up; the counter shows the low 32 bits.</summary>
        public long Micros;

        /// <inheritdoc/>
        public uint ReadMicros32()
        {
            return (uint)(Micros & 0xFFFFFFFFL);
        }
    }

    /// <summary>A hardware edge counter with one channel, set by the harness.</summary>
    public sealed class HandPulseCounter : IPulseCounter
    {
        /// <summary>The count the counter shows.</summary>
        public long Count;

        /// <inheritdoc/>
        public int ChannelCount
        {
            get { return 1; }
        }

        /// <inheritdoc/>
        public long ReadCount(int channel)
        {
            return Count;
        }
    }

    /// <summary>A raw switch input (brake switch, mark button) whose level follows a script of
    /// change times: active after an odd number of them, so a bouncing contact is a few changes
    /// close together. The loop debounces it, as it does the boards' inputs.</summary>
    public sealed class ScriptedSwitch : IDigitalInput
    {
        private readonly long[] changesMicros;
        private int passed;

        /// <summary>A switch that starts inactive and changes at each of
        /// <paramref name="changesMicros"/> (ascending).</summary>
        public ScriptedSwitch(long[] changesMicros)
        {
            this.changesMicros = changesMicros;
        }

        /// <summary>Sets the level for <paramref name="nowMicros"/> (times never go back).</summary>
        public void MoveTo(long nowMicros)
        {
            while (passed < changesMicros.Length && changesMicros[passed] <= nowMicros)
            {
                passed++;
            }
        }

        /// <inheritdoc/>
        public bool IsActive()
        {
            return (passed & 1) == 1;
        }
    }

    /// <summary>An accelerometer whose FIFO fills at its data rate from a constant forward
    /// acceleration the harness sets; at most <see cref="Depth"/> samples are kept.</summary>
    public sealed class HandAccelerometer : IAccelerometer
    {
        /// <summary>FIFO depth, like the LIS3DH's.</summary>
        public const int Depth = 32;

        private readonly HandClock clock;
        private readonly long periodMicros;
        private long nextSampleMicros;
        private int stored;
        private bool overflowed;

        /// <summary>Forward acceleration now (mg); x is forward, z carries gravity.</summary>
        public int ForwardMilliG;

        /// <summary>Samples handed out so far.</summary>
        public long SamplesRead;

        /// <summary>Samples at <paramref name="rateHz"/> from <paramref name="clock"/>'s time.</summary>
        public HandAccelerometer(HandClock clock, int rateHz)
        {
            this.clock = clock;
            periodMicros = 1000000 / rateHz;
            OutputDataRateMilliHz = rateHz * 1000;
            nextSampleMicros = clock.Micros + periodMicros;
        }

        /// <inheritdoc/>
        public int OutputDataRateMilliHz { get; private set; }

        /// <inheritdoc/>
        public int FullScaleMilliG
        {
            get { return 8000; }
        }

        /// <inheritdoc/>
        public int ReadBurst(short[] xyzMilliG, int maxSamples, out bool fifoOverflowed)
        {
            while (nextSampleMicros <= clock.Micros)
            {
                if (stored == Depth)
                {
                    overflowed = true;
                }
                else
                {
                    stored++;
                }

                nextSampleMicros += periodMicros;
            }

            fifoOverflowed = overflowed;
            overflowed = false;
            int take = stored < maxSamples ? stored : maxSamples;
            for (int i = 0; i < take; i++)
            {
                xyzMilliG[i * 3] = (short)ForwardMilliG;
                xyzMilliG[(i * 3) + 1] = 2;
                xyzMilliG[(i * 3) + 2] = 1000;
            }

            stored -= take;
            SamplesRead += take;
            return take;
        }
    }

    /// <summary>Keeps everything written (as a card's write buffer would: one native copy per
    /// frame), so the harness can report the log's length, frames and CRC-32 at the end without
    /// adding work to the measured passes.</summary>
    public sealed class KeepingSink : IByteSink
    {
        private readonly byte[] log;
        private int length;

        /// <summary>Room for <paramref name="capacity"/> bytes; more is refused.</summary>
        public KeepingSink(int capacity)
        {
            log = new byte[capacity];
        }

        /// <summary>Bytes kept.</summary>
        public int Bytes
        {
            get { return length; }
        }

        /// <summary>Byte <paramref name="index"/> of the log kept (below <see cref="Bytes"/>).</summary>
        public byte At(int index)
        {
            return log[index];
        }

        /// <summary>Frames kept (delimiters seen).</summary>
        public int CountFrames()
        {
            int frames = 0;
            for (int i = 0; i < length; i++)
            {
                if (log[i] == LogFormat.Delimiter)
                {
                    frames++;
                }
            }

            return frames;
        }

        /// <summary>The CRC-32 of every byte kept.</summary>
        public uint Crc()
        {
            return Crc32.Compute(log, 0, length);
        }

        /// <inheritdoc/>
        public bool Write(byte[] buffer, int offset, int count)
        {
            if (length + count > log.Length)
            {
                return false;
            }

            System.Array.Copy(buffer, offset, log, length, count);
            length += count;
            return true;
        }
    }

    /// <summary>The core wired as the ESP32 box runs it: a 400 Hz accelerometer with a 32-sample
    /// FIFO, the step budget's bounds, the switches read raw and debounced by the loop.</summary>
    public sealed class HarnessBox
    {
        /// <summary>Wires the parts; <paramref name="benchRestMicros"/> and <paramref name="stillBlockMicros"/>
        /// 0 keep the default rest length and still block.</summary>
        public HarnessBox(ScriptedSwitch brake, ScriptedSwitch mark, int switchHoldMicros, int benchRestMicros, int stillBlockMicros)
        {
            Counter = new HandClock();
            Pulses = new HandPulseCounter();
            Health = new HealthCounters();
            Sink = new KeepingSink(131072);
            MonotonicClock clock = new MonotonicClock(Counter, Health);
            Accelerometer = new HandAccelerometer(Counter, 400);
            Settings = new LoggerSettings();
            Settings.AccelOutputDataRateMilliHz = Accelerometer.OutputDataRateMilliHz;
            if (benchRestMicros > 0)
            {
                Settings.BenchRestMicros = benchRestMicros;
            }

            if (stillBlockMicros > 0)
            {
                Settings.StillBlockMicros = stillBlockMicros;
            }

            StepBudget.Apply(Settings);
            Recorder = new RunRecorder(Settings, Sink, Health);
            Recorder.SetCounterOrigin(0, 0);
            Source = new PolledPulseSource(Pulses, clock);
            Loop = new CaptureLoop(clock, Source, Accelerometer, brake, mark, null, Recorder, HandAccelerometer.Depth, StepBudget.AccelIntervalMicros);
            Loop.SwitchHoldMicros = switchHoldMicros;
            StepBudget.Apply(Loop);
        }

        /// <summary>The clock the harness moves.</summary>
        public HandClock Counter { get; private set; }

        /// <summary>The pulse counter the harness sets.</summary>
        public HandPulseCounter Pulses { get; private set; }

        /// <summary>The health counters.</summary>
        public HealthCounters Health { get; private set; }

        /// <summary>The log written.</summary>
        public KeepingSink Sink { get; private set; }

        /// <summary>The accelerometer.</summary>
        public HandAccelerometer Accelerometer { get; private set; }

        /// <summary>The recorder's settings.</summary>
        public LoggerSettings Settings { get; private set; }

        /// <summary>The run recorder.</summary>
        public RunRecorder Recorder { get; private set; }

        /// <summary>The polled pulse source.</summary>
        public PolledPulseSource Source { get; private set; }

        /// <summary>The capture loop.</summary>
        public CaptureLoop Loop { get; private set; }
    }
}
