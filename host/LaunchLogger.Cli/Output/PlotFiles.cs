using System.Globalization;
using LaunchLogger.Plots;

namespace LaunchLogger.Cli.Output;

/// <summary>Plot files named on the command line: their format from the extension, the names of
/// one file per run, the picture size, and writing them all or none.</summary>
public static class PlotFiles
{
    /// <summary>The format the file's extension names.</summary>
    /// <exception cref="UsageException">The name ends in neither .svg nor .png.</exception>
    public static ChartFormat FormatOf(string path, string option) =>
        ChartFormats.FromPath(path) ?? throw new UsageException($"{option} '{path}' must end in .svg or .png (the extension picks the format)");

    /// <summary>The file for one of several runs: the name's stem, "-run", the run's number, the
    /// extension (e.g. launch.svg → launch-run2.svg). One run keeps the name as given.</summary>
    public static string ForRun(string path, int runNumber, int runCount) => runCount == 1
        ? path
        : Path.Combine(Path.GetDirectoryName(path) ?? "", Path.GetFileNameWithoutExtension(path) + "-run" + runNumber.ToString(CultureInfo.InvariantCulture) + Path.GetExtension(path));

    /// <summary>Parses a picture size "WIDTHxHEIGHT" in pixels, e.g. 1200x800.</summary>
    /// <exception cref="UsageException">Not two whole numbers, or outside 200 to 8000.</exception>
    public static (int Width, int Height) ParseSize(string text)
    {
        string[] parts = text.ToLowerInvariant().Split('x');
        if (parts.Length != 2
            || !int.TryParse(parts[0], NumberStyles.None, CultureInfo.InvariantCulture, out int w)
            || !int.TryParse(parts[1], NumberStyles.None, CultureInfo.InvariantCulture, out int h))
        {
            throw new UsageException($"--size '{text}' must be WIDTHxHEIGHT in pixels, e.g. 1200x800");
        }

        if (w is < ChartOptions.MinSizePx or > ChartOptions.MaxSizePx || h is < ChartOptions.MinSizePx or > ChartOptions.MaxSizePx)
        {
            throw new UsageException($"--size '{text}': width and height must each be {ChartOptions.MinSizePx} to {ChartOptions.MaxSizePx} pixels");
        }

        return (w, h);
    }

    /// <summary>Draws and writes every chart, all or none (<see cref="AtomicFile"/>).</summary>
    /// <exception cref="IOException">A file could not be written (nothing was).</exception>
    /// <exception cref="UnauthorizedAccessException">A folder cannot be written to.</exception>
    /// <exception cref="OperationCanceledException">Cancelled before the files were moved.</exception>
    public static void Write(IReadOnlyList<(string Path, Func<Chart> Draw)> charts, CancellationToken cancel = default) =>
        AtomicFile.WriteAll(
            charts.Select(c => (c.Path, (Action<Stream>)(stream => c.Draw().Write(stream, FormatOf(c.Path, "plot"))))).ToList(),
            cancel);
}
