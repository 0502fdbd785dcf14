using System.Buffers;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Tests.Runs;

/// <summary>The firmware's golden log of one fixed run, as written before and after the box
/// began writing power-up frames and configuration copies (LOG-FORMAT.md, 0x07 and 0x08), and
/// before the configuration carried the still test's block length: all read into the same run,
/// and the copy rescues the run when its configuration frame is damaged.</summary>
/// <remarks>Golden/before-onset-window holds the same run in today's format; the golden log of
/// today opens it one read later (the onset's window spans a still block since), so it is no
/// longer the same run.</remarks>
public class LogFormatCompatibilityTests
{
    /// <summary>The run in today's format as the box wrote it before its onset test took the
    /// still block's length (which opens this run one read later, 20 ms): the same run as the
    /// older copies. The golden log itself is the firmware tests' to pin.</summary>
    private static readonly string[] SameRunNow = ["before-onset-window", "loop-polled-accel.log"];

    [Fact]
    public void TheOldAndTheNewFormatOfTheSameRunReadAlike()
    {
        LogReadResult old = LogReader.Read(Golden("before-power-up", "loop-polled-accel.log"), "old.log");
        LogReadResult now = LogReader.Read(Golden(SameRunNow), "new.log");

        AssertSameRun(old, now);

        // The new log adds a power-up frame and a configuration copy after each periodic health frame.
        Assert.True(now.Stats.Frames > old.Stats.Frames, $"{now.Stats.Frames} frames against {old.Stats.Frames}");
    }

    [Fact]
    public void ALogFromBeforeTheStillBlockFieldReadsAsTheNewOne()
    {
        // The same run as written before the configuration carried the still test's block length
        // (LOG-FORMAT.md 0x01, its last field): every frame the same but the configuration and its
        // copies, each 3 bytes longer (50 000 µs as a varint).
        byte[] oldBytes = Golden("before-still-block", "loop-polled-accel.log");
        byte[] newBytes = Golden(SameRunNow);
        LogReadResult old = LogReader.Read(oldBytes, "old.log");
        LogReadResult now = LogReader.Read(newBytes, "new.log");

        AssertSameRun(old, now);
        Assert.Equal(old.Stats.Frames, now.Stats.Frames);

        List<ConfigurationBody> oldConfigurations = Configurations(oldBytes);
        List<ConfigurationBody> newConfigurations = Configurations(newBytes);
        Assert.Equal(6, newConfigurations.Count);
        Assert.All(oldConfigurations, c => Assert.Equal(0, c.StillBlockMicros));
        Assert.All(newConfigurations, c => Assert.Equal(50_000, c.StillBlockMicros));
        Assert.Equal(oldConfigurations.Select(c => c with { StillBlockMicros = 50_000 }), newConfigurations);
        Assert.Equal(oldBytes.Length + (3 * newConfigurations.Count), newBytes.Length);
    }

    [Fact]
    public void TheNewFormatOpensWithALoneDelimiterAndAPowerUpFrame()
    {
        byte[] log = Golden("loop-polled-accel.log");
        Assert.Equal(LogFormat.Delimiter, log[0]);

        var reader = default(FrameReader);
        byte[] payload = new byte[LogFormat.MaxPayloadBytes];
        Assert.Equal(OperationStatus.Done, reader.TryReadFrame(log, payload, isFinalBlock: true, out int used, out Frame first));
        Assert.Equal(FrameType.PowerUp, first.Type);
        Assert.Equal(0, first.Sequence);
        Assert.Equal(OperationStatus.Done, reader.TryReadFrame(log.AsSpan(used), payload, isFinalBlock: true, out _, out Frame second));
        Assert.Equal(FrameType.Configuration, second.Type);
    }

    [Fact]
    public void ADamagedConfigurationFrameCostsOnlyItselfWhenTheBoxWritesCopies()
    {
        byte[] log = Golden("loop-polled-accel.log");
        DecodedRun intact = LogReader.Read(log, "intact.log").Runs.Single();

        // The configuration frame is the second: after the lone delimiter and the power-up frame.
        int powerUpEnd = Array.IndexOf(log, LogFormat.Delimiter, 1);
        int configurationEnd = Array.IndexOf(log, LogFormat.Delimiter, powerUpEnd + 1);
        byte[] damaged = (byte[])log.Clone();
        int at = (powerUpEnd + configurationEnd) / 2;
        damaged[at] = (byte)(damaged[at] == 0x55 ? 0x56 : 0x55); // one byte changed, framing kept

        LogReadResult read = LogReader.Read(damaged, "damaged.log");

        DecodedRun run = Assert.Single(read.Runs);
        Assert.Equal(1, read.Stats.CrcErrors + read.Stats.MalformedFrames);
        Assert.Contains(run.Warnings, w => w.Contains("repeated copy", StringComparison.Ordinal));
        Assert.Equal(intact.Pulses, run.Pulses);
        Assert.Equal(intact.Accel!.ForwardMps2, run.Accel!.ForwardMps2);
        Assert.True(run.Complete);
    }

    /// <summary>Each log holds one whole, undamaged run, and the two runs are the same: settings,
    /// pulses, samples, events, health and warnings.</summary>
    private static void AssertSameRun(LogReadResult old, LogReadResult now)
    {
        DecodedRun a = Assert.Single(old.Runs);
        DecodedRun b = Assert.Single(now.Runs);
        Assert.False(old.Stats.HasDamage);
        Assert.False(now.Stats.HasDamage);
        Assert.Equal(0, now.Stats.OrphanFrames);
        Assert.True(a.Complete && b.Complete);
        Assert.Equal(a.Configuration, b.Configuration);
        Assert.Equal(a.Pulses, b.Pulses);
        Assert.Equal(a.Accel!.TimeS, b.Accel!.TimeS);
        Assert.Equal(a.Accel.ForwardMps2, b.Accel.ForwardMps2);
        Assert.Equal(a.Events.Select(e => (e.Kind, e.TimeS)), b.Events.Select(e => (e.Kind, e.TimeS)));
        Assert.Equal(a.Health, b.Health);
        Assert.Equal(a.Warnings, b.Warnings);
    }

    /// <summary>The bodies of every configuration frame and copy, in log order.</summary>
    private static List<ConfigurationBody> Configurations(byte[] log)
    {
        var found = new List<ConfigurationBody>();
        var reader = default(FrameReader);
        byte[] payload = new byte[LogFormat.MaxPayloadBytes];
        int at = 0;
        while (reader.TryReadFrame(log.AsSpan(at), payload, isFinalBlock: true, out int used, out Frame frame) == OperationStatus.Done)
        {
            at += used;
            if (frame.Type is FrameType.Configuration or FrameType.ConfigurationCopy)
            {
                Assert.True(FrameBodies.TryReadConfiguration(frame.Body, out ConfigurationBody c));
                found.Add(c);
            }
        }

        return found;
    }

    private static byte[] Golden(params string[] parts)
    {
        for (DirectoryInfo? dir = new(AppContext.BaseDirectory); dir != null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "LaunchLogger.sln")))
            {
                return File.ReadAllBytes(Path.Combine([dir.FullName, "tests", "LaunchLogger.Firmware.Tests", "Golden", .. parts]));
            }
        }

        throw new InvalidOperationException("LaunchLogger.sln not found above " + AppContext.BaseDirectory);
    }
}
