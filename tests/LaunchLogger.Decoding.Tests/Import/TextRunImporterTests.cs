using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Import;

public sealed class TextRunImporterTests : IDisposable
{
    private readonly string folder = Directory.CreateTempSubdirectory("llimport").FullName;

    public void Dispose() => Directory.Delete(folder, recursive: true);

    [Fact]
    public void EdgesAndAccelMakeOneRun()
    {
        string edges = Write("edges.csv", "t_s\n2.10\n2.18\n2.24\n");
        string accel = Write("accel.csv", "t_s,ax_mps2\n2.00,0.0\n2.01,4.9\n2.02,4.9\n");

        DecodedRun run = TextRunImporter.Import(new TextImportRequest { EdgesPath = edges, AccelPath = accel, Scale = PulseScale.FromOptions(null, 48, 1.96) });

        Assert.Equal("edges.csv + accel.csv", run.Source);
        Assert.Equal(3, run.Pulses.Count);
        Assert.Equal(3, run.Accel!.Count);
        Assert.Equal(1.96 / 48, run.Configuration.MetresPerPulse, 1e-15);
        Assert.Equal(48, run.Configuration.PulsesPerRevolution);
        Assert.Equal(2.00, run.Configuration.OpenedS);
        Assert.Equal(100, run.Configuration.AccelNominalRateHz, 1e-9);
        Assert.True(run.Configuration.HasAccelerometer);
        Assert.Equal(0, run.Configuration.FormatVersion);
        Assert.True(run.Complete);
        Assert.Empty(run.Warnings);
    }

    [Fact]
    public void CountsAlone()
    {
        string counts = Write("counts.csv", "t_lo_s,t_hi_s,count\n1.0,1.002,10\n1.1,1.102,11\n");

        DecodedRun run = TextRunImporter.Import(new TextImportRequest { CountsPath = counts, Scale = PulseScale.FromOptions(0.05, null, null) });

        Assert.Equal(new[] { 1L, 2L }, run.Pulses.Select(p => p.Count));
        Assert.Null(run.Accel);
        Assert.False(run.Configuration.HasAccelerometer);
        Assert.Equal(0.05, run.Configuration.MetresPerPulse);
    }

    [Fact]
    public void AccelAloneIsWarnedAboutDrift()
    {
        string accel = Write("accel.csv", "t_s,ax_mps2\n0,1\n1,1\n");

        DecodedRun run = TextRunImporter.Import(new TextImportRequest { AccelPath = accel });

        Assert.Empty(run.Pulses);
        Assert.Contains(run.Warnings, w => w.StartsWith("accelerometer only", StringComparison.Ordinal));
    }

    [Fact]
    public void EdgesAndCountsTogetherAreRefused()
    {
        var e = Assert.Throws<InputException>(() => TextRunImporter.Import(new TextImportRequest { EdgesPath = "a.csv", CountsPath = "b.csv", Scale = new PulseScale(0.04, 0, 0) }));

        Assert.Equal("--counts: give --edges or --counts, not both", e.Message);
    }

    [Fact]
    public void NothingToImport()
    {
        var e = Assert.Throws<InputException>(() => TextRunImporter.Import(new TextImportRequest()));

        Assert.StartsWith("--edges: nothing to import", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void PulsesWithoutAScale()
    {
        var e = Assert.Throws<InputException>(() => TextRunImporter.Import(new TextImportRequest { EdgesPath = Write("edges.csv", "t_s\n1\n2\n") }));

        Assert.Equal("--metres-per-pulse: needed with --edges: give it, or --pulses-per-rev with --circumference-m", e.Message);
    }

    [Fact]
    public void BadFileStopsTheImportWithItsLine()
    {
        string edges = Write("edges.csv", "t_s\n1\n2\n");
        string accel = Write("accel.csv", "t_s,ax_mps2\n0,1\n1,x\n");

        var e = Assert.Throws<InputException>(() => TextRunImporter.Import(new TextImportRequest { EdgesPath = edges, AccelPath = accel, Scale = new PulseScale(0.04, 0, 0) }));

        Assert.Equal($"{accel}:3: column 'ax_mps2': 'x' is not a number", e.Message);
    }

    private string Write(string name, string text)
    {
        string path = Path.Combine(folder, name);
        File.WriteAllText(path, text);
        return path;
    }
}
