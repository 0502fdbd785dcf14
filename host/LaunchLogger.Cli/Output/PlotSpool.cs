using LaunchLogger.Pages;

namespace LaunchLogger.Cli.Output;

/// <summary>Run plots drawn while a log is streamed, kept in a temporary file until the page that
/// shows them is written, so that a long log's pictures are never held in memory together.</summary>
/// <remarks>On Unix the file's name is removed as soon as it is open, so nothing is left behind
/// even if the process is killed; elsewhere it is deleted when the spool is disposed.</remarks>
public sealed class PlotSpool : IDisposable
{
    private readonly FileStream file;
    private readonly BinaryWriter writer;
    private readonly BinaryReader reader;
    private readonly Dictionary<int, long> offsets = [];

    /// <summary>Opens an empty spool in the system's temporary folder.</summary>
    /// <exception cref="IOException">The temporary file cannot be made.</exception>
    public PlotSpool()
    {
        string path = Path.Combine(Path.GetTempPath(), $"launchlogger-plots-{Environment.ProcessId}-{Guid.NewGuid():N}.tmp");
        file = new FileStream(path, FileMode.CreateNew, FileAccess.ReadWrite, FileShare.Delete, 65536, FileOptions.DeleteOnClose);
        if (!OperatingSystem.IsWindows())
        {
            File.Delete(path);
        }

        writer = new BinaryWriter(file, System.Text.Encoding.UTF8, leaveOpen: true);
        reader = new BinaryReader(file, System.Text.Encoding.UTF8, leaveOpen: true);
    }

    /// <summary>Keeps the plots of the run at <paramref name="position"/> (replacing any kept before).</summary>
    public void Add(int position, IReadOnlyList<PlotFigure> plots)
    {
        ArgumentNullException.ThrowIfNull(plots);
        file.Seek(0, SeekOrigin.End);
        offsets[position] = file.Position;
        writer.Write(plots.Count);
        foreach (PlotFigure plot in plots)
        {
            writer.Write(plot.Caption);
            writer.Write(plot.Svg);
        }

        writer.Flush();
    }

    /// <summary>The plots kept for the run at <paramref name="position"/>; none when none were kept.</summary>
    public IReadOnlyList<PlotFigure> Read(int position)
    {
        if (!offsets.TryGetValue(position, out long offset))
        {
            return [];
        }

        file.Seek(offset, SeekOrigin.Begin);
        int count = reader.ReadInt32();
        var plots = new List<PlotFigure>(count);
        for (int i = 0; i < count; i++)
        {
            string caption = reader.ReadString();
            plots.Add(new PlotFigure(caption, reader.ReadString()));
        }

        return plots;
    }

    /// <summary>Deletes the temporary file.</summary>
    public void Dispose()
    {
        reader.Dispose();
        writer.Dispose();
        file.Dispose();
    }
}
