using System.Buffers;
using System.Text.Json;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Tests.Reading;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Wire;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Decoding.Tests.Runs;

/// <summary>Numbers from outside stay within InputLimits: a wild value under a correct CRC, a
/// plain-text file in the wrong unit, an implausible option — each is dropped or refused with a
/// message, nothing is sized from it, and no impossible figure is called valid.</summary>
public class InputBoundsTests
{
    private const long MaxAllocationBytes = 256L * 1024 * 1024;

    private static readonly Lazy<byte[]> Log = new(() => Simulator.Run(BuiltInScenarios.Default, seed: 3).LogBytes);

    [Theory]
    [InlineData(35)]
    [InlineData(40)]
    [InlineData(50)]
    public void A_pulse_time_far_beyond_the_run_under_a_good_crc_is_dropped_not_allocated_for(int powerOfTwo)
    {
        // One pulse frame replaced by a CRC-correct one whose observation lies 2^n µs after power-up.
        byte[] log = ReplaceFrame(Log.Value, FrameType.Pulses, 10, _ => new BodyBuilder().Byte(0).Varint(1).Varint(5).Varint(1L << powerOfTwo).Varint(1).ToArray());

        long before = GC.GetAllocatedBytesForCurrentThread();
        LogReadResult read = LogReader.Read(log, "wild.log");
        SessionAnalysis session = SessionAnalyzer.Analyze(read.Runs);
        long allocated = GC.GetAllocatedBytesForCurrentThread() - before;

        DecodedRun run = Assert.Single(read.Runs);
        Assert.Contains(run.Warnings, w => w.Contains("outside the run's bounds", StringComparison.Ordinal));
        Assert.All(run.Pulses, p => Assert.True(p.HiS - run.Configuration.OpenedS <= InputLimits.MaxRunSpanS));
        Assert.True(allocated < MaxAllocationBytes, $"{allocated:N0} bytes allocated");
        Assert.True(session.Runs.Count + session.Failures.Count == 1);
    }

    [Fact]
    public void A_count_jump_no_car_can_make_is_dropped_and_the_rest_of_the_run_kept()
    {
        // A CRC-correct pulse frame claiming a million pulses (40 km) within a millisecond.
        byte[] log = ReplaceFrame(Log.Value, FrameType.Pulses, 30, body =>
        {
            var list = new List<PulseObservation>();
            Assert.True(FrameBodies.TryReadPulses(body, out _, list));
            PulseObservation p = list[0];
            return new BodyBuilder().Byte(0).Varint(1).Varint(p.Count + 1_000_000).Varint(p.LoMicros).Varint(Math.Max(1, p.HiMicros - p.LoMicros)).ToArray();
        });

        DecodedRun run = Assert.Single(LogReader.Read(log, "jump.log").Runs);
        SessionAnalysis session = SessionAnalyzer.Analyze([run]);

        Assert.Contains(run.Warnings, w => w.Contains("counted faster than 300 m/s", StringComparison.Ordinal));
        Assert.DoesNotContain(run.Warnings, w => w.Contains("went back on an earlier count", StringComparison.Ordinal));
        RunAnalysis analysis = Assert.Single(session.Runs);
        Assert.Null(FigurePlausibility.Check(analysis));
        Assert.True(analysis.Figures.MaxSpeedMps < 60);
    }

    [Fact]
    public void An_impossible_or_undefined_figure_makes_the_run_invalid_with_a_reason()
    {
        RunAnalysis analysis = SessionAnalyzer.Analyze(LogReader.Read(Log.Value, "run.log").Runs).Runs.Single();
        Assert.Null(FigurePlausibility.Check(analysis));

        RunAnalysis fast = analysis with { Figures = analysis.Figures with { MaxSpeedMps = 8.9e6 } };
        RunAnalysis undefined = analysis with { Figures = analysis.Figures with { DistanceM = double.NaN } };
        foreach (RunAnalysis bad in new[] { fast, undefined })
        {
            Verdict verdict = FigurePlausibility.Apply(new Verdict([]), bad);
            Assert.Equal(VerdictLevel.Invalid, verdict.Level);
            VerdictReason reason = Assert.Single(verdict.Reasons);
            Assert.Equal("impossible_figure", reason.Code);
        }

        Assert.Contains("MaxSpeedMps", FigurePlausibility.Check(fast)!.Text);
        Assert.Contains("distance could not be computed", FigurePlausibility.Check(undefined)!.Text);
    }

    [Theory]
    [InlineData("twenty thousand pulses per revolution", 20_000, 1_960_000)]
    [InlineData("a 40 km tyre", 48, 40_000_000_000)]
    [InlineData("a 1 µm tyre", 48, 1)]
    public void A_configuration_no_box_can_have_is_rejected_naming_its_frame(string name, int pulsesPerRev, long circumferenceMicrometres)
    {
        byte[] body = new BodyBuilder()
            .Byte(LogFormat.Version).Byte(0).Byte(1).Byte(2)
            .Varint(1).Varint(12_345_678).Varint(1000)
            .Byte(LogFormat.ConfigFlagAccelerometer)
            .Varint(pulsesPerRev).Varint(circumferenceMicrometres)
            .Varint(304_800).Varint(1_000_000).Varint(8000).Byte(1).Byte(1)
            .Varint(1500).Varint(1_000_000).Varint(60).Varint(40).Varint(16).Varint(2_000_000).Varint(2000).ToArray();

        LogReadResult read = LogReader.Read(TestFrames.Encode(FrameType.Configuration, 7, body), "config.log");

        Assert.Empty(read.Runs);
        Assert.True(read.Warnings.Any(w => w.Contains("sequence number 7 was rejected", StringComparison.Ordinal)), name);
    }

    [Theory]
    [InlineData("times in microseconds", "t_s\n1000000\n1020000\n1040000\n", 3)]
    [InlineData("times in milliseconds", "t_s\n1000\n1020\n1040\n3000000\n", 5)]
    [InlineData("an edge at 1e12 s", "t_s\n1.0\n1.1\n1e12\n", 4)]
    [InlineData("an edge at 1e300 s", "t_s\n1e300\n", 2)]
    [InlineData("edges 1e-12 s apart", "t_s\n1.0\n1.000000000001\n", 3)]
    public void Edge_files_out_of_bounds_are_refused_naming_the_line(string name, string csv, int line)
    {
        var e = Assert.Throws<InputException>(() => EdgeFile.Read(new StringReader(csv), "edges.csv"));
        Assert.True(line == e.Line, $"{name}: {e.Message}");
        Assert.StartsWith($"edges.csv:{line}: ", e.Message);
        Assert.DoesNotContain('\n', e.Message);
    }

    [Theory]
    [InlineData("t_s,ax_mps2\n0,0\n0.001,1e300\n")]
    [InlineData("t_s,ax_mps2\n0,0\n7200,0\n")]
    public void Accelerometer_files_out_of_bounds_are_refused(string csv)
    {
        var e = Assert.Throws<InputException>(() => AccelFile.Read(new StringReader(csv), "accel.csv"));
        Assert.Equal(3, e.Line);
    }

    [Theory]
    [InlineData("NaN,1008,62")]
    [InlineData("18,NaN,62")]
    [InlineData("18,1008,Infinity")]
    [InlineData("1e300,1008,62")]
    public void Weather_that_is_not_a_real_reading_is_refused(string text)
    {
        Assert.Throws<FormatException>(() => Weather.Parse(text));
    }

    [Theory]
    [InlineData("NaN-60mph")]
    [InlineData("0-1e300mph")]
    [InlineData("0-5000kmh")]
    public void Speed_intervals_no_car_reaches_are_refused(string text)
    {
        Assert.Throws<FormatException>(() => SpeedInterval.Parse(text));
    }

    [Fact]
    public void Json_writes_null_for_a_number_that_is_not_finite()
    {
        // REPORT-JSON.md: "A value that could not be determined is null".
        string json = JsonSerializer.Serialize(new { a = double.NaN, b = (double?)double.PositiveInfinity, c = 1.5 }, ReportJson.Options);
        using JsonDocument doc = JsonDocument.Parse(json);
        Assert.Equal(JsonValueKind.Null, doc.RootElement.GetProperty("a").ValueKind);
        Assert.Equal(JsonValueKind.Null, doc.RootElement.GetProperty("b").ValueKind);
        Assert.Equal(1.5, doc.RootElement.GetProperty("c").GetDouble());
        Assert.DoesNotContain("NaN", json);
    }

    /// <summary>The log with the <paramref name="nth"/> frame of <paramref name="type"/> given a
    /// new body, with its own sequence number and a correct CRC.</summary>
    internal static byte[] ReplaceFrame(byte[] log, FrameType type, int nth, Func<byte[], byte[]> newBody)
    {
        var reader = default(FrameReader);
        byte[] payload = new byte[LogFormat.MaxPayloadBytes];
        int offset = 0;
        int seen = 0;
        while (true)
        {
            OperationStatus status = reader.TryReadFrame(log.AsSpan(offset), payload, true, out int used, out Frame frame);
            Assert.NotEqual(OperationStatus.NeedMoreData, status);
            if (status == OperationStatus.Done && frame.Type == type && seen++ == nth)
            {
                byte[] replaced = TestFrames.Encode(type, frame.Sequence, newBody(frame.Body.ToArray()));
                return [.. log.AsSpan(0, offset), .. replaced, .. log.AsSpan(offset + used)];
            }

            offset += used;
        }
    }
}
