using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.LinuxBoard.Accelerometers.Lis3dh;
using LaunchLogger.Firmware.LinuxBoard.Configuration;
using LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;
using LaunchLogger.Firmware.LinuxBoard.Sinks;
using LaunchLogger.Firmware.LinuxBoard.Tests.Fakes;
using LaunchLogger.Firmware.LinuxBoard.Timing;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.LinuxBoard.Tests;

/// <summary>The whole program loop on emulated hardware: kernel line-event records through the
/// parser and tracker, an emulated LIS3DH through the real binding and FIFO reader, the real file
/// sink; stopped as Ctrl+C would stop it, in the middle of a run.</summary>
public sealed class BoardAppTests : IDisposable
{
    private const int PickupLine = 17;
    private const double G0 = 9.80665; // m/s², standard gravity (3rd CGPM, 1901)
    private const double AccelerationMps2 = 0.5 * G0;
    private const long LaunchMicros = 2_000_000;
    private const long PulsesEndMicros = 4_500_000;
    private const long CtrlCMicros = 5_000_000;
    private const double OdrHz = 1344;

    private readonly string folder = Path.Combine(Path.GetTempPath(), "llboard-app-" + Guid.NewGuid().ToString("N"));

    public void Dispose()
    {
        if (Directory.Exists(folder))
        {
            Directory.Delete(folder, recursive: true);
        }
    }

    [Fact]
    public void A_run_stopped_by_ctrl_c_leaves_a_log_whose_frames_all_verify()
    {
        (int exit, string output, byte[] log, int samplesLost, uint edges) = RunLaunch(brakeClosedAt: null, switchHoldMicros: 0);

        Assert.Equal(BoardApp.ExitOk, exit);
        Assert.Contains("stopped after 1 run(s)", output);
        List<LogFrames.Frame> frames = LogFrames.Decode(log);

        Assert.Equal(0, LogFrames.TrailingBytes(log));
        Assert.NotEmpty(frames);
        Assert.All(frames, f => Assert.True(f.CrcOk));
        Assert.Equal(Enumerable.Range(0, frames.Count), frames.Select(f => f.Sequence));
        Assert.Single(frames, f => f.Type == FrameType.Configuration);
        Assert.Single(frames, f => f.Type == FrameType.Summary);
        Assert.Equal(LogFormat.Delimiter, log[0]); // the lone delimiter before the power-up frame (LOG-FORMAT.md, 0x07)
        Assert.Equal(FrameType.PowerUp, frames[0].Type);
        Assert.Equal(FrameType.Configuration, frames[1].Type);
        Assert.Equal(FrameType.Summary, frames[^1].Type);
        Assert.Contains(frames, f => f.Type == FrameType.Pulses);
        Assert.Contains(frames, f => f.Type == FrameType.Acceleration);

        // Summary flags (LOG-FORMAT.md 0x06, last byte before the CRC): staged start, rollout
        // reached, and not closed by a stop — Ctrl+C came while the car was still rolling.
        byte flags = frames[^1].Payload[^5];
        Assert.Equal(LogFormat.SummaryFlagStaged | LogFormat.SummaryFlagRolloutReached, flags);
        Assert.Equal(0, samplesLost);
        Assert.True(edges > 300);
    }

    [Theory]
    [InlineData("", 50_000)]
    [InlineData(", \"still_block_ms\": 80", 80_000)]
    public void The_still_block_from_the_settings_file_is_written_in_the_runs_configuration(string keys, long expectedMicros)
    {
        (int exit, _, byte[] log, _, _) = RunLaunch(brakeClosedAt: null, switchHoldMicros: 0, accelerometerKeys: keys);

        Assert.Equal(BoardApp.ExitOk, exit);
        LogFrames.Frame configuration = Assert.Single(LogFrames.Decode(log), f => f.Type == FrameType.Configuration);
        Assert.Equal(expectedMicros, LogFrames.LastVarint(configuration.Payload)); // LOG-FORMAT.md 0x01: its last field

        // Staged under the file's block: flag bit 2, after the version, firmware version and the
        // run number, opening and origin count (three varints from offset 7).
        int at = 7;
        for (int v = 0; v < 3; v++)
        {
            at += Varint.Read(configuration.Payload, at, configuration.Payload.Length - 4, out _);
        }

        Assert.True((configuration.Payload[at] & LogFormat.ConfigFlagStaged) != 0, "not staged");
    }

    [Theory]
    [InlineData(20_000, new long[] { 4_008_000 })]
    [InlineData(0, new long[] { 4_001_000, 4_008_000 })]
    public void The_board_hands_its_switch_hold_time_to_the_loop(long holdMicros, long[] brakeOnMicros)
    {
        // The switch closes for 4 ms, bounces open for 3 ms, then stays closed. The loop passes
        // every 1 ms; with the board's 20 ms hold only the lasting closing is an event, dated to
        // the pass that first read it (LOG-FORMAT.md, event kind 5), with the 1 ms gap to the
        // pass before; with no hold (the control) the bounce is an event too.
        (int exit, _, byte[] log, _, _) = RunLaunch(now => (now >= 4_000_500 && now < 4_004_500) || now >= 4_007_500, holdMicros);

        Assert.Equal(BoardApp.ExitOk, exit);
        var closings = LogFrames.Decode(log)
            .Where(f => f.Type == FrameType.Event && f.Payload[3] == (byte)EventKind.BrakeOn)
            .Select(f =>
            {
                int end = f.Payload.Length - 4;
                int at = 4 + Varint.Read(f.Payload, 4, end, out ulong time);
                Varint.Read(f.Payload, at, end, out ulong gap);
                return (Time: (long)time, Gap: (long)gap);
            })
            .ToList();
        Assert.Equal(brakeOnMicros, closings.Select(c => c.Time));
        Assert.All(closings, c => Assert.Equal(1_000, c.Gap));
    }

    [Fact]
    public void A_device_that_cannot_be_opened_is_reported_with_its_own_message()
    {
        BoardSettings settings = BoardSettingsFile.Parse(
            """{ "car": { "pulses_per_revolution": 48, "circumference_millimetres": 1960 }, "pulses": { "line": 17 }, "log": { "folder": "x" } }""",
            "test");
        var output = new StringWriter();

        int exit = BoardApp.Run(settings, _ => throw new IOException("cannot open /dev/gpiochip9: No such file or directory (errno 2)"), CancellationToken.None, output);

        Assert.Equal(BoardApp.ExitHardware, exit);
        Assert.Contains("/dev/gpiochip9", output.ToString());
    }

    private (int Exit, string Output, byte[] Log, int SamplesLost, uint Edges) RunLaunch(Func<long, bool>? brakeClosedAt, long switchHoldMicros, string accelerometerKeys = "")
    {
        BoardSettings settings = BoardSettingsFile.Parse(
            """
            {
              "car": { "pulses_per_revolution": 48, "circumference_millimetres": 1960 },
              "pulses": { "line": 17 },
              "accelerometer": { "chip": "lis3dh", "rate_hz": 1344, "range_g": 8, "forward_axis": "x"
            """ + accelerometerKeys + """
             },
              "log": { "folder": "unused" }
            }
            """,
            "test");
        var counter = new ManualMicrosecondCounter();
        var chip = new EmulatedLis3dh();
        string logPath = Path.Combine(folder, "run.log");
        Directory.CreateDirectory(folder);
        LineEdgeTracker? tracker = null;
        using var stop = new CancellationTokenSource();
        var output = new StringWriter();
        long samplesMade = 0;
        uint edges = 0;
        double metresPerPulse = 1.960 / 48;

        int exit = BoardApp.Run(
            settings,
            health =>
            {
                var queue = new EdgeObservationQueue(4096, health);
                tracker = new LineEdgeTracker(new[] { PickupLine }, new MonotonicMicrosecondCounter(originMicros: 0), queue, health, requestedAtMicros: 0);
                var hardware = new BoardHardware
                {
                    Counter = counter,
                    Pulses = queue,
                    Accelerometer = new Lis3dhFifoAccelerometer(chip, 1344, 8),
                    AccelFifoDepth = Lis3dhFifoAccelerometer.FifoDepth,
                    Sink = new FileByteSink(logPath),
                    BrakeSwitch = brakeClosedAt is null ? null : new ScriptedSwitch(() => brakeClosedAt(counter.NowMicros)),
                    SwitchHoldMicros = switchHoldMicros,
                };
                hardware.Own((Lis3dhFifoAccelerometer)hardware.Accelerometer);
                hardware.Own((FileByteSink)hardware.Sink);
                return hardware;
            },
            stop.Token,
            output,
            betweenSteps: () =>
            {
                long now = counter.NowMicros + 1000;
                counter.NowMicros = now;

                // The sensor samples at its own rate: 1 g down, and 0.5 g forward once launched.
                while ((long)((samplesMade + 1) * 1e6 / OdrHz) <= now)
                {
                    samplesMade++;
                    long t = (long)(samplesMade * 1e6 / OdrHz);
                    bool launched = t >= LaunchMicros && t < PulsesEndMicros;
                    chip.Produce(Raw8g(launched ? 500 : 0), 0, Raw8g(1000));
                }

                // Wheel edges of constant acceleration, as kernel records read from the line fd.
                while (true)
                {
                    long edgeMicros = LaunchMicros + (long)(Math.Sqrt(2 * (edges + 1) * metresPerPulse / AccelerationMps2) * 1e6);
                    if (edgeMicros > now || edgeMicros > PulsesEndMicros)
                    {
                        break;
                    }

                    edges++;
                    byte[] record = LineEventRecords.Build((ulong)((edgeMicros * 1000) - 250), GpioLineEvent.RisingEdge, PickupLine, edges, edges);
                    tracker!.OnEvent(GpioLineEventParser.Parse(record));
                }

                if (now >= CtrlCMicros)
                {
                    stop.Cancel();
                }
            });

        return (exit, output.ToString(), File.ReadAllBytes(logPath), chip.SamplesLost, edges);
    }

    /// <summary>The body's last varint, just before the CRC: its final byte has the high bit clear,
    /// and so has the byte before its first (LOG-FORMAT.md, section 2).</summary>
    private static short Raw8g(int milliG)
    {
        // ±8 g: 4096 counts per g, 12-bit data left-justified (low 4 bits zero).
        return (short)((milliG * 4096 / 1000) & ~0xF);
    }

    /// <summary>A raw input whose level follows the board's clock.</summary>
    private sealed class ScriptedSwitch(Func<bool> active) : IDigitalInput
    {
        public bool IsActive() => active();
    }
}
