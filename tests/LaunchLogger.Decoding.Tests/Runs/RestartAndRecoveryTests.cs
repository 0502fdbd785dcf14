using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Tests.Runs.Support;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Wire;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Decoding.Tests.Runs;

/// <summary>Duplicates, power cuts, joined logs and damaged configuration frames cost only what
/// they destroy: runs are neither merged nor thrown away, and figures stay finite.</summary>
public class RestartAndRecoveryTests
{
    private static readonly Lazy<byte[]> Log = new(() => Simulator.Run(BuiltInScenarios.Default, seed: 3).LogBytes);

    [Fact]
    public void A_duplicated_frame_reports_no_loss_and_the_same_figures()
    {
        List<LogEditor.Piece> pieces = LogEditor.Split(Log.Value);
        int at = pieces.FindIndex(p => p.Type == FrameType.Pulses) + 20;
        byte[] log = [.. Log.Value.AsSpan(0, pieces[at].Offset + pieces[at].Length), .. Log.Value.AsSpan(pieces[at].Offset)];

        LogReadResult read = LogReader.Read(log, "dup.log");

        Assert.Equal(0, read.Stats.FramesLost);
        Assert.Equal(1, read.Stats.DuplicateFrames);
        DecodedRun run = Assert.Single(read.Runs);
        Assert.Equal(0, run.FramesLost);
        Assert.Equal(Figures(Log.Value).MaxSpeedMps, Figures(log).MaxSpeedMps);
    }

    [Fact]
    public void Two_swapped_frames_report_no_loss_and_keep_every_observation()
    {
        List<LogEditor.Piece> pieces = LogEditor.Split(Log.Value);
        int at = pieces.FindIndex(p => p.Type == FrameType.Pulses) + 20;
        (pieces[at], pieces[at + 1]) = (pieces[at + 1], pieces[at]);
        byte[] log = LogEditor.Join(pieces);

        LogReadResult read = LogReader.Read(log, "swap.log");
        LogReadResult original = LogReader.Read(Log.Value, "run.log");

        Assert.Equal(0, read.Stats.FramesLost);
        Assert.Equal(1, read.Stats.LateFrames);
        Assert.Equal(original.Runs[0].Pulses.Count, read.Runs[0].Pulses.Count);
    }

    [Fact]
    public void A_power_cut_mid_frame_then_a_new_power_up_is_two_runs_not_one()
    {
        // The first log is cut in the middle of a frame; the next power-up's log is appended.
        // The cut frame swallows the second log's configuration frame.
        LaunchDriver first = new(new LoggerSettings());
        first.Run(6_000_000, 10_000_000);
        byte[] a = first.Sink.ToArray();
        List<LogEditor.Piece> pieces = LogEditor.Split(a);
        LogEditor.Piece cut = pieces[pieces.Count / 2];
        LaunchDriver second = new(new LoggerSettings());
        second.Run(6_000_000, 10_000_000);
        byte[] log = [.. a.AsSpan(0, cut.Offset + (cut.Length / 2)), .. second.Sink.ToArray()];

        LogReadResult read = LogReader.Read(log, "cut.log");

        Assert.Equal(1, read.Stats.Restarts);
        Assert.True(read.Stats.FramesLost < 10, $"{read.Stats.FramesLost} lost");
        DecodedRun run = read.Runs[0];
        Assert.False(run.Complete);
        Assert.Contains(run.Warnings, w => w.StartsWith("cut off: the box restarted", StringComparison.Ordinal));
        Assert.All(run.Pulses, p => Assert.True(p.LoS <= first.FedPulses[^1].HiMicros / 1e6));
    }

    [Fact]
    public void A_damaged_configuration_costs_that_frame_when_a_copy_follows()
    {
        // A log as the firmware now writes it: a configuration copy after each health frame.
        List<LogEditor.Piece> pieces = WithConfigurationCopies(LogEditor.Split(Log.Value));
        byte[] intact = LogEditor.Join(pieces, firstSequence: 0);
        byte[] damaged = (byte[])intact.Clone();
        LogEditor.Piece configuration = LogEditor.Split(intact).First(p => p.Type == FrameType.Configuration);
        damaged[configuration.Offset + 5] ^= 0x10;

        LogReadResult read = LogReader.Read(damaged, "damaged.log");

        DecodedRun run = Assert.Single(read.Runs);
        Assert.Contains(run.Warnings, w => w.Contains("decoded from its repeated copy", StringComparison.Ordinal));
        Assert.Equal(1, read.Stats.CrcErrors + read.Stats.MalformedFrames);
        Assert.Equal(0, read.Stats.OrphanFrames);
        Assert.Equal(LogReader.Read(intact, "intact.log").Runs[0].Pulses.Count, run.Pulses.Count);
        Assert.Equal(Figures(intact).MaxSpeedMps, Figures(damaged).MaxSpeedMps);
    }

    [Fact]
    public void An_old_log_recovers_a_run_whose_configuration_is_damaged_from_the_run_before()
    {
        var settings = new LoggerSettings();
        var first = new LaunchDriver(settings);
        first.Run(accelerateUntilMicros: 6_000_000, endMicros: 11_000_000);
        LaunchDriver second = first.Next(launchMicros: 14_000_000, startMicros: 11_000_000);
        second.Run(accelerateUntilMicros: 18_000_000, endMicros: 22_000_000);
        // As a box wrote it before configuration copies and power-up frames existed.
        byte[] intact = LogEditor.Join(LogEditor.Split(first.Sink.ToArray()).Where(p => p.Type is not (FrameType.ConfigurationCopy or FrameType.PowerUp)), firstSequence: 0);
        LogEditor.Piece config2 = LogEditor.Split(intact).Where(p => p.Type == FrameType.Configuration).ElementAt(1);
        byte[] damaged = (byte[])intact.Clone();
        damaged[config2.Offset + 3] ^= 0x01;

        LogReadResult read = LogReader.Read(damaged, "old.log");

        Assert.Equal(2, read.Runs.Count);
        Assert.Contains(read.Runs[1].Warnings, w => w.Contains("decoded with run 1's settings", StringComparison.Ordinal));
        Assert.Equal(LogReader.Read(intact, "x").Runs[1].Pulses.Select(p => p.Count), read.Runs[1].Pulses.Select(p => p.Count));
        Assert.Equal(2, read.Runs[1].Configuration.RunNumber);
    }

    private static List<LogEditor.Piece> WithConfigurationCopies(List<LogEditor.Piece> pieces)
    {
        LogEditor.Piece configuration = pieces.First(p => p.Type == FrameType.Configuration);
        var result = new List<LogEditor.Piece>();
        foreach (LogEditor.Piece p in pieces)
        {
            result.Add(p);
            if (p.Type == FrameType.Health && result.Count < pieces.Count)
            {
                result.Add(configuration with { Type = FrameType.ConfigurationCopy });
            }
        }

        return result;
    }

    private static LaunchLogger.Decoding.Metrics.FigureSet Figures(byte[] log) =>
        SessionAnalyzer.Analyze(LogReader.Read(log, "x.log").Runs).Runs.Single().Figures;
}
