using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.NanoHarness
{
    /// <summary>Exercises the firmware core and prints what it computed, line by line, the same
    /// on CoreCLR and on nanoFramework's interpreter (compared by a test). Lines starting with '#'
    /// are step markers: an instrumented interpreter appends its instruction and allocation
    /// counters to them; they are not compared.</summary>
    /// <remarks>Written to the device's rules (no generics, no Math, no interpolation): it is
    /// converted by the metadata processor and run on the interpreter as it is.</remarks>
    public static class Harness
    {
        /// <summary>Simulated time between two passes of the loop (µs).</summary>
        public const int StepMicros = 1000;

        /// <summary>How long a switch level must hold before it counts (µs), as on both boards.</summary>
        public const int SwitchHoldMicros = 20000;

        /// <summary>Runs every section.</summary>
        public static void Main()
        {
            Out.Line("harness 1");
            Checksums();
            Stuffing();
            Varints();
            ClockWrap();
            Launch();
            BenchRest();
            SlowLaunch();
            Out.Line("done");
        }

        private static void Checksums()
        {
            byte[] check = { 0x31, 0x32, 0x33, 0x34, 0x35, 0x36, 0x37, 0x38, 0x39 };
            Out.Line("crc32 123456789 " + Crc32.Compute(check, 0, check.Length).ToString());
            uint r = Crc32.Append(Crc32.Seed, check, 0, 4);
            r = Crc32.Append(r, check, 4, 5);
            Out.Line("crc32 in two parts " + Crc32.Finish(r).ToString());
        }

        private static void Stuffing()
        {
            byte[] a = { 0 };
            byte[] b = { 0x11, 0x22, 0x00, 0x33 };
            byte[] c = new byte[254];
            byte[] d = new byte[255];
            for (int i = 0; i < c.Length; i++)
            {
                c[i] = (byte)(1 + (i % 255));
            }

            for (int i = 0; i < d.Length; i++)
            {
                d[i] = (byte)(1 + (i % 255));
            }

            Encoded("cobs 00", a);
            Encoded("cobs 11 22 00 33", b);
            Encoded("cobs 254 non-zero", c);
            Encoded("cobs 255 non-zero", d);
        }

        private static void Encoded(string label, byte[] payload)
        {
            byte[] output = new byte[Cobs.MaxEncodedLength(payload.Length)];
            int n = Cobs.Encode(payload, 0, payload.Length, output, 0);
            byte[] back = new byte[payload.Length + 1];
            int m = Cobs.Decode(output, 0, n, back, 0);
            string head = "";
            for (int i = 0; i < n && i < 6; i++)
            {
                head += " " + output[i].ToString();
            }

            Out.Line(label + ": " + n.ToString() + " bytes," + head + " ... last " + output[n - 1].ToString() + ", decodes to " + m.ToString());
        }

        private static void Varints()
        {
            byte[] buffer = new byte[Varint.MaxBytes];
            long[] values = { 0, 1, 127, 128, 300, 16384, -1, -64, 4294967296L, 9223372036854775807L };
            for (int i = 0; i < values.Length; i++)
            {
                int n = Varint.WriteSigned(buffer, 0, values[i]);
                ulong raw;
                Varint.Read(buffer, 0, n, out raw);
                string bytes = "";
                for (int k = 0; k < n; k++)
                {
                    bytes += " " + buffer[k].ToString();
                }

                Out.Line("varint " + values[i].ToString() + ":" + bytes + " -> " + Varint.UnZigZag(raw).ToString());
            }
        }

        private static void ClockWrap()
        {
            HandClock counter = new HandClock();
            counter.Micros = 0xFFFFFF00L;
            HealthCounters health = new HealthCounters();
            MonotonicClock clock = new MonotonicClock(counter, health);
            long before = clock.NowMicros();
            counter.Micros += 0x200;
            long after = clock.NowMicros();
            counter.Micros += 0x100000000L;
            counter.Micros -= 1;
            long later = clock.NowMicros();
            Out.Line("clock " + before.ToString() + " " + after.ToString() + " " + later.ToString() + " wraps " + health.ClockWraps.ToString());
        }

        /// <summary>Raw changes of the mark button (µs): a bouncing press and release before the
        /// run (not logged: no run is open), a bouncing press during the run (logged once, dated
        /// 4 304 000, the pass that first read its last closing), and a 10 ms touch (no press).</summary>
        private static readonly long[] MarkChanges =
        {
            1500000, 1502000, 1503000, 1600000,
            4300000, 4301000, 4304000, 4500000, 4501000, 4502000,
            5200000, 5210000,
        };

        /// <summary>Raw changes of the brake switch (µs): a 5 ms spike (noise, no event), a
        /// bouncing closing as braking starts (BrakeOn dated 6 499 000, gap 1 000), and an opening
        /// after a bounce, made while a slow pass skips 9 300 000-9 306 000 (BrakeOff dated
        /// 9 306 000, the first pass to read it, gap 7 000 from the pass before).</summary>
        private static readonly long[] BrakeChanges =
        {
            5000000, 5005000,
            6496000, 6497000, 6499000,
            9290000, 9292000, 9302000,
        };

        /// <summary>A car stands, launches at 4 m/s² for 4 s, brakes at 8 m/s² to a stop and
        /// stands again; the loop is stepped every <see cref="StepMicros"/>, as on the box, with
        /// the brake switch and mark button read raw and debounced by the loop.</summary>
        private static void Launch()
        {
            ScriptedSwitch brake = new ScriptedSwitch(BrakeChanges);
            ScriptedSwitch mark = new ScriptedSwitch(MarkChanges);
            HarnessBox box = new HarnessBox(brake, mark, SwitchHoldMicros, 0, 0);
            HandClock counter = box.Counter;
            HandPulseCounter pulses = box.Pulses;
            HealthCounters health = box.Health;
            KeepingSink sink = box.Sink;
            HandAccelerometer accelerometer = box.Accelerometer;
            LoggerSettings settings = box.Settings;
            RunRecorder recorder = box.Recorder;
            PolledPulseSource source = box.Source;
            CaptureLoop loop = box.Loop;
            RunPhase shown = recorder.Phase;
            Out.Line("phase " + PhaseName(shown) + " at 0");

            // Calibrates the step markers: nothing runs between these two.
            Out.Line("#a");
            Out.Line("#b");
            Out.Line("#a");
            Out.Line("#b");
            for (long t = StepMicros; t <= 12000000; t += StepMicros)
            {
                if (t == 4000000)
                {
                    // One 100 ms stall (a slow card write): the FIFO overflows and is then
                    // emptied a few samples per pass.
                    t += 100000;
                }

                if (t == 9300000)
                {
                    // One slow pass: the brake switch opens while it runs.
                    t += 6000;
                }

                counter.Micros = t;
                long count = DistanceMicrometres(t) * settings.PulsesPerRevolution / settings.CircumferenceMicrometres;
                bool changed = count != pulses.Count;
                pulses.Count = count;
                accelerometer.ForwardMilliG = ForwardMilliG(t);
                brake.MoveTo(t);
                mark.MoveTo(t);
                Pass(source, loop, accelerometer, sink, changed);
                shown = ShowPhase("phase ", recorder, shown, t);
            }

            Out.Line("run " + recorder.RunNumber.ToString() + " motion " + recorder.MotionMicros.ToString() + " rollout " + recorder.RolloutMicros.ToString());
            Out.Line("rest " + recorder.RestX.ToString() + " " + recorder.RestY.ToString() + " " + recorder.RestZ.ToString());
            Out.Line("log " + sink.Bytes.ToString() + " bytes " + sink.CountFrames().ToString() + " frames crc " + sink.Crc().ToString());
            string counters = "";
            for (int i = 0; i < LogFormat.HealthCounterCount; i++)
            {
                counters += " " + health.Get(i).ToString();
            }

            Out.Line("health" + counters);
            Events(sink);
        }

        /// <summary>One pass of the loop between the step markers, then what it did: an
        /// observation, an accelerometer read, frames written (for run-on-nanoclr.sh --counts).</summary>
        private static void Pass(PolledPulseSource source, CaptureLoop loop, HandAccelerometer accelerometer, KeepingSink sink, bool changed)
        {
            int bytesBefore = sink.Bytes;
            long samplesBefore = accelerometer.SamplesRead;
            Out.Line("#a");
            source.Poll();
            loop.Step();
            Out.Line("#b");
            Out.Line(changed ? "#k o" : "#k -");
            Out.Line(accelerometer.SamplesRead != samplesBefore ? "#k a" : "#k -");
            Out.Line(sink.Bytes != bytesBefore ? "#k f" : "#k -");
        }

        /// <summary>Raw changes of the mark button on the bench (µs): a bouncing press held from
        /// 2 000 000 and let go at 5 200 000 (a rest recorded from the pass that first read the
        /// release, 5 203 000, for 5 s); a 1 s press once staged again (arms nothing); a press at 13 500 000 let go at
        /// 16 600 000 (a second rest, which a pulse at 18 000 000 spoils).</summary>
        private static readonly long[] BenchMarkChanges =
        {
            2000000, 2001000, 2002000, 5200000, 5201000, 5203000,
            12000000, 13000000,
            13500000, 16600000,
        };

        /// <summary>The box on the bench, standing on its end (x, its forward axis, up: +1 g): the
        /// mark button held while staged records bench rests (LOG-FORMAT.md, 0x09 and 0x0A). A
        /// 5-s rest instead of the default 20 s keeps the run on the interpreter short.</summary>
        private static void BenchRest()
        {
            ScriptedSwitch mark = new ScriptedSwitch(BenchMarkChanges);
            HarnessBox box = new HarnessBox(null, mark, SwitchHoldMicros, 5000000, 0);
            box.Accelerometer.ForwardMilliG = 1000;
            HandClock counter = box.Counter;
            HandPulseCounter pulses = box.Pulses;
            KeepingSink sink = box.Sink;
            HandAccelerometer accelerometer = box.Accelerometer;
            RunRecorder recorder = box.Recorder;
            PolledPulseSource source = box.Source;
            CaptureLoop loop = box.Loop;
            RunPhase shown = recorder.Phase;
            Out.Line("bench phase " + PhaseName(shown) + " at 0");
            for (long t = StepMicros; t <= 19000000; t += StepMicros)
            {
                counter.Micros = t;
                bool changed = t == 18000000;
                if (changed)
                {
                    pulses.Count = 1;
                }

                mark.MoveTo(t);
                Pass(source, loop, accelerometer, sink, changed);
                shown = ShowPhase("bench phase ", recorder, shown, t);
            }

            Out.Line("bench rests " + recorder.BenchRestNumber.ToString() + " runs " + recorder.RunNumber.ToString());
            Out.Line("bench log " + sink.Bytes.ToString() + " bytes " + sink.CountFrames().ToString() + " frames crc " + sink.Crc().ToString());
            Events(sink);
        }

        /// <summary>A launch only just over the motion threshold (42 mg, the threshold 40 mg) at
        /// 2 500 000 under the longest still block (500 ms: 200 samples at 400 Hz): the first pulse
        /// (40.8 mm on, at about 2 945 000) comes before the onset window's mean passes (191 samples
        /// of the launch, 2 977 500) and opens the run, whose first motion comes from the
        /// accelerometer's stretch over the threshold: the launch.</summary>
        private static void SlowLaunch()
        {
            HarnessBox box = new HarnessBox(null, null, SwitchHoldMicros, 0, LoggerSettings.MaxStillBlockMs * 1000);
            RunPhase shown = box.Recorder.Phase;
            Out.Line("slow phase " + PhaseName(shown) + " at 0");
            for (long t = StepMicros; t <= 4200000; t += StepMicros)
            {
                box.Counter.Micros = t;
                long dt = t > 2500000 ? t - 2500000 : 0;
                long count = (412 * dt * dt / 2000000000L) * box.Settings.PulsesPerRevolution / box.Settings.CircumferenceMicrometres;
                bool changed = count != box.Pulses.Count;
                box.Pulses.Count = count;
                box.Accelerometer.ForwardMilliG = t > 2500000 ? 42 : 0;
                Pass(box.Source, box.Loop, box.Accelerometer, box.Sink, changed);
                shown = ShowPhase("slow phase ", box.Recorder, shown, t);
            }

            Out.Line("slow run " + box.Recorder.RunNumber.ToString() + " motion " + box.Recorder.MotionMicros.ToString() + " rollout " + box.Recorder.RolloutMicros.ToString());
            Out.Line("slow log " + box.Sink.Bytes.ToString() + " bytes " + box.Sink.CountFrames().ToString() + " frames crc " + box.Sink.Crc().ToString());
            Events(box.Sink);
        }

        /// <summary>Prints the recorder's phase, after <paramref name="label"/>, when it is no longer
        /// <paramref name="shown"/>; returns the phase now shown.</summary>
        private static RunPhase ShowPhase(string label, RunRecorder recorder, RunPhase shown, long t)
        {
            if (recorder.Phase != shown)
            {
                Out.Line(label + PhaseName(recorder.Phase) + " at " + t.ToString());
            }

            return recorder.Phase;
        }

        /// <summary>Reads the log back: every event frame with its kind, time and extra fields,
        /// and the frames whose CRC-32 does not match (LOG-FORMAT.md).</summary>
        private static void Events(KeepingSink sink)
        {
            byte[] encoded = new byte[Cobs.MaxEncodedLength(LogFormat.MaxPayloadBytes)];
            byte[] payload = new byte[LogFormat.MaxPayloadBytes + 1];
            int badFrames = 0;
            int start = 0;
            for (int i = 0; i < sink.Bytes; i++)
            {
                if (sink.At(i) != LogFormat.Delimiter)
                {
                    continue;
                }

                int count = i - start;
                if (count > 0 && count <= encoded.Length)
                {
                    for (int k = 0; k < count; k++)
                    {
                        encoded[k] = sink.At(start + k);
                    }

                    int n = Cobs.Decode(encoded, 0, count, payload, 0);
                    if (n < 7 || Crc32.Compute(payload, 0, n - 4) != LittleEndian32(payload, n - 4))
                    {
                        badFrames++;
                    }
                    else if (payload[0] == (byte)FrameType.Event)
                    {
                        Event(payload, n - 4);
                    }
                    else if (payload[0] == (byte)FrameType.BenchRest || payload[0] == (byte)FrameType.BenchRestEnd)
                    {
                        BenchRestFrame(payload, n - 4);
                    }
                }

                start = i + 1;
            }

            Out.Line("frames with a bad crc " + badFrames.ToString());
        }

        private static void Event(byte[] payload, int end)
        {
            ulong time;
            int at = 4 + Varint.Read(payload, 4, end, out time);
            string line = "event " + EventName(payload[3]) + " at " + time.ToString();
            ulong extra;
            switch (payload[3])
            {
                case (byte)EventKind.BrakeOn:
                case (byte)EventKind.BrakeOff:
                    line += at < end && Varint.Read(payload, at, end, out extra) > 0 ? " gap " + extra.ToString() : " no gap";
                    break;
                case (byte)EventKind.Rollout:
                case (byte)EventKind.AccelGap:
                    Varint.Read(payload, at, end, out extra);
                    line += " " + extra.ToString();
                    break;
                case (byte)EventKind.Motion:
                    line += " cause " + payload[at].ToString();
                    break;
            }

            Out.Line(line);
        }

        /// <summary>A bench rest's frame with its fields (LOG-FORMAT.md, 0x09 and 0x0A).</summary>
        private static void BenchRestFrame(byte[] payload, int end)
        {
            bool opening = payload[0] == (byte)FrameType.BenchRest;
            string line = opening ? "bench-rest" : "bench-rest-end";
            int at = 3;
            ulong value;
            for (int field = 0; field < 7 && at < end; field++)
            {
                if (opening ? field >= 5 : field == 2)
                {
                    // The forward axis and sign, and the end's outcome, are single bytes.
                    line += " " + payload[at].ToString();
                    at++;
                }
                else
                {
                    at += Varint.Read(payload, at, end, out value);
                    line += " " + value.ToString();
                }
            }

            Out.Line(line);
        }

        private static uint LittleEndian32(byte[] buffer, int offset)
        {
            return buffer[offset] | ((uint)buffer[offset + 1] << 8) | ((uint)buffer[offset + 2] << 16) | ((uint)buffer[offset + 3] << 24);
        }

        private static string EventName(byte kind)
        {
            switch (kind)
            {
                case (byte)EventKind.Staged: return "staged";
                case (byte)EventKind.Motion: return "motion";
                case (byte)EventKind.Rollout: return "rollout";
                case (byte)EventKind.Stopped: return "stopped";
                case (byte)EventKind.BrakeOn: return "brake-on";
                case (byte)EventKind.BrakeOff: return "brake-off";
                case (byte)EventKind.Mark: return "mark";
                case (byte)EventKind.AccelGap: return "accel-gap";
                default: return "kind-" + kind.ToString();
            }
        }

        /// <summary>Distance rolled at <paramref name="t"/> µs, in µm (integer kinematics).</summary>
        private static long DistanceMicrometres(long t)
        {
            const long Start = 2500000, BrakeAt = 6500000, AccelMmS2 = 4000, BrakeMmS2 = 8000;
            if (t <= Start)
            {
                return 0;
            }

            if (t <= BrakeAt)
            {
                long dt = t - Start;
                return AccelMmS2 * dt * dt / 2000000000L;
            }

            long d1 = AccelMmS2 * (BrakeAt - Start) * (BrakeAt - Start) / 2000000000L;
            long v1 = AccelMmS2 * (BrakeAt - Start) / 1000000L;
            long stopAfter = v1 * 1000000L / BrakeMmS2;
            long dt2 = t - BrakeAt;
            if (dt2 > stopAfter)
            {
                dt2 = stopAfter;
            }

            return d1 + (v1 * dt2 / 1000) - (BrakeMmS2 * dt2 * dt2 / 2000000000L);
        }

        private static int ForwardMilliG(long t)
        {
            if (t > 2500000 && t <= 6500000)
            {
                return 408;
            }

            return t > 6500000 && t <= 8500000 ? -816 : 0;
        }

        private static string PhaseName(RunPhase phase)
        {
            switch (phase)
            {
                case RunPhase.Idle: return "idle";
                case RunPhase.Staged: return "staged";
                case RunPhase.Moving: return "moving";
                case RunPhase.RolledOut: return "rolled-out";
                case RunPhase.Stopped: return "stopped";
                case RunPhase.BenchRest: return "bench-rest";
                default: return "other";
            }
        }
    }

    /// <summary>One line of output: the debug channel on the device, the console elsewhere.</summary>
    public static class Out
    {
        /// <summary>Writes <paramref name="text"/> and a line end.</summary>
        public static void Line(string text)
        {
#if NANOFRAMEWORK_1_0
            System.Diagnostics.Debug.WriteLine(text);
#else
            System.Console.WriteLine(text);
#endif
        }
    }
}
