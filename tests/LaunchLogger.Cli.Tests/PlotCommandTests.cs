using System.Text.Json;
using System.Xml.Linq;
using LaunchLogger.Cli.Verbs;
using SkiaSharp;

namespace LaunchLogger.Cli.Tests;

public sealed class PlotCommandTests
{
    /// <summary>The SVG namespace (W3C SVG 1.1, section 5.1.1).</summary>
    private static readonly XNamespace Svg = "http://www.w3.org/2000/svg";

    [Fact]
    public void Report_plot_writes_one_trace_for_one_run()
    {
        using var folder = new TempFolder();
        string log = Log(folder, "run.log", SimulatedLogs.Default.LogBytes);
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode code = ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(log)], Json = true, Plot = folder.File("run.svg") }, output, error);

        Assert.True(code == ExitCode.Ok, $"exit {code}: {error}");
        XDocument svg = XDocument.Load(folder.File("run.svg"));
        Assert.Equal(Svg + "svg", svg.Root!.Name);
        Assert.Contains("Run 1: speed, distance and acceleration", svg.Descendants(Svg + "text").Select(t => t.Value.Trim()));
        using JsonDocument json = JsonDocument.Parse(output.ToString()); // the report on stdout stays plain JSON
        Assert.Contains("wrote", error.ToString(), StringComparison.Ordinal);
    }

    [Fact]
    public void Report_plot_names_one_file_per_run_when_there_are_several()
    {
        using var folder = new TempFolder();
        string log = Log(folder, "two.log", [.. SimulatedLogs.Default.LogBytes, .. SimulatedLogs.BrakeTest.LogBytes]);

        ExitCode code = ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(log)], Plot = folder.File("runs.png") }, new StringWriter(), new StringWriter());

        Assert.Equal(ExitCode.Ok, code);
        Assert.False(File.Exists(folder.File("runs.png")));
        Assert.Equal((960, 720), PngSize(folder.File("runs-run1.png")));
        Assert.Equal((960, 720), PngSize(folder.File("runs-run2.png")));
    }

    [Fact]
    public void Report_plot_with_another_extension_is_a_usage_error_and_writes_nothing()
    {
        using var folder = new TempFolder();
        string log = Log(folder, "run.log", SimulatedLogs.Default.LogBytes);
        var error = new StringWriter();

        ExitCode code = ReportCommand.Run(new ReportRequest { Logs = [new FileInfo(log)], Plot = folder.File("run.jpg") }, new StringWriter(), error);

        Assert.Equal(ExitCode.Usage, code);
        Assert.Contains(".svg or .png", error.ToString(), StringComparison.Ordinal);
        Assert.Equal(["run.log"], Directory.GetFiles(folder.Path).Select(Path.GetFileName));
    }

    [Fact]
    public async Task Plot_overlay_aligned_on_the_rollout_writes_one_png_of_the_asked_size()
    {
        using var folder = new TempFolder();
        string log = Log(folder, "two.log", [.. SimulatedLogs.Default.LogBytes, .. SimulatedLogs.BrakeTest.LogBytes]);
        var output = new StringWriter();
        var error = new StringWriter();

        int code = await LaunchLoggerCommand.InvokeAsync(["plot", log, "--out", folder.File("both.png"), "--kind", "overlay", "--align", "rollout", "--units", "metric", "--size", "1200x500"], output, error);

        Assert.Equal((int)ExitCode.Ok, code);
        Assert.Equal((1200, 500), PngSize(folder.File("both.png")));
        Assert.Contains("both.png", output.ToString(), StringComparison.Ordinal);
    }

    [Fact]
    public void Plot_overlay_of_two_logs_names_each_line_by_its_log_and_run()
    {
        using var folder = new TempFolder();
        string first = Log(folder, "morning.log", SimulatedLogs.Default.LogBytes);
        string second = Log(folder, "evening.log", SimulatedLogs.BrakeTest.LogBytes);
        var error = new StringWriter();

        ExitCode code = PlotCommand.Run(new PlotRequest { Logs = [new FileInfo(first), new FileInfo(second)], Out = folder.File("both.svg"), Kind = "overlay" }, new StringWriter(), error);

        // Before, the legend read "run 1" and "run 2": nothing said which log either line was.
        Assert.True(code == ExitCode.Ok, $"exit {code}: {error}");
        string[] texts = XDocument.Load(folder.File("both.svg")).Descendants(Svg + "text").Select(t => t.Value.Trim()).ToArray();
        Assert.Contains("morning.log run 1", texts);
        Assert.Contains("evening.log run 1", texts);
        Assert.DoesNotContain("run 2", texts);
    }

    [Fact]
    public void Plot_braking_draws_the_stop_and_trace_draws_the_chosen_run()
    {
        using var folder = new TempFolder();
        string log = Log(folder, "brake.log", SimulatedLogs.BrakeTest.LogBytes);

        Assert.Equal(ExitCode.Ok, PlotCommand.Run(new PlotRequest { Logs = [new FileInfo(log)], Out = folder.File("stop.svg"), Kind = "braking" }, new StringWriter(), new StringWriter()));
        Assert.Equal(ExitCode.Ok, PlotCommand.Run(new PlotRequest { Logs = [new FileInfo(log)], Out = folder.File("trace.svg"), Runs = [1] }, new StringWriter(), new StringWriter()));

        string[] stopTexts = XDocument.Load(folder.File("stop.svg")).Descendants(Svg + "text").Select(t => t.Value.Trim()).ToArray();
        Assert.Contains("time from brake onset (s)", stopTexts);
        string[] traceTexts = XDocument.Load(folder.File("trace.svg")).Descendants(Svg + "text").Select(t => t.Value.Trim()).ToArray();
        Assert.Contains("rollout 1 ft", traceTexts);

        Assert.Equal(ExitCode.Ok, PlotCommand.Run(new PlotRequest { Logs = [new FileInfo(log)], Out = folder.File("launch.svg"), Kind = "launch" }, new StringWriter(), new StringWriter()));
        string[] launchTexts = XDocument.Load(folder.File("launch.svg")).Descendants(Svg + "text").Select(t => t.Value.Trim()).ToArray();
        Assert.Contains("Run 1: the launch", launchTexts);
        Assert.DoesNotContain("brake onset", launchTexts);
    }

    [Theory]
    [InlineData("--kind", "pie")]
    [InlineData("--align", "finish")]
    [InlineData("--align", "rollout")]
    [InlineData("--size", "10x10")]
    [InlineData("--size", "wide")]
    [InlineData("--run", "9")]
    [InlineData("--rollout-m", "-1")]
    [InlineData("--out", "picture.gif")]
    public async Task Bad_plot_options_give_the_usage_exit_code_and_write_nothing(string option, string value)
    {
        using var folder = new TempFolder();
        string log = Log(folder, "run.log", SimulatedLogs.Default.LogBytes);
        string[] args = option == "--out"
            ? ["plot", log, "--out", folder.File(value)]
            : ["plot", log, "--out", folder.File("p.svg"), option, value];

        int code = await LaunchLoggerCommand.InvokeAsync(args, new StringWriter(), new StringWriter());

        Assert.Equal((int)ExitCode.Usage, code);
        Assert.Equal(["run.log"], Directory.GetFiles(folder.Path).Select(Path.GetFileName));
    }

    [Fact]
    public async Task Plot_without_an_output_file_is_a_usage_error()
    {
        using var folder = new TempFolder();
        string log = Log(folder, "run.log", SimulatedLogs.Default.LogBytes);
        Assert.Equal((int)ExitCode.Usage, await LaunchLoggerCommand.InvokeAsync(["plot", log], new StringWriter(), new StringWriter()));
    }

    [Fact]
    public void Plot_of_a_missing_log_is_bad_input()
    {
        using var folder = new TempFolder();
        ExitCode code = PlotCommand.Run(new PlotRequest { Logs = [new FileInfo(folder.File("none.log"))], Out = folder.File("p.svg") }, new StringWriter(), new StringWriter());
        Assert.Equal(ExitCode.BadInput, code);
        Assert.False(File.Exists(folder.File("p.svg")));
    }

    [Fact]
    public void Plot_onto_a_folder_is_bad_input_and_leaves_the_folder_alone()
    {
        using var folder = new TempFolder();
        string log = Log(folder, "run.log", SimulatedLogs.Default.LogBytes);
        Directory.CreateDirectory(folder.File("taken.svg"));
        var error = new StringWriter();

        ExitCode code = PlotCommand.Run(new PlotRequest { Logs = [new FileInfo(log)], Out = folder.File("taken.svg") }, new StringWriter(), error);

        Assert.Equal(ExitCode.BadInput, code);
        Assert.Contains("folder", error.ToString(), StringComparison.Ordinal);
        Assert.True(Directory.Exists(folder.File("taken.svg")));
    }

    [Fact]
    public void Crosscheck_plot_draws_both_traces_and_a_bad_extension_is_a_usage_error()
    {
        using var folder = new TempFolder();
        string log = folder.File("run.log");
        string nmea = folder.File("receiver.nmea");
        var sink = new StringWriter();
        Assert.Equal(ExitCode.Ok, SimulateCommand.Run("brake-test-60", 4, log, null, false, sink, sink, default, nmea, 10));

        ExitCode code = CrossCheckCommand.Run(new FileInfo(log), new FileInfo(nmea), "auto", null, "mps", "s", 0.05, 1, json: false, new StringWriter(), new StringWriter(), default, folder.File("cc.svg"));
        Assert.Equal(ExitCode.Ok, code);
        string[] texts = XDocument.Load(folder.File("cc.svg")).Descendants(Svg + "text").Select(t => t.Value.Trim()).ToArray();
        Assert.Contains("ours", texts);
        Assert.Contains("theirs", texts);
        Assert.Contains("theirs − ours", texts);

        ExitCode bad = CrossCheckCommand.Run(new FileInfo(log), new FileInfo(nmea), "auto", null, "mps", "s", 0.05, 1, json: false, new StringWriter(), new StringWriter(), default, folder.File("cc.bmp"));
        Assert.Equal(ExitCode.Usage, bad);
        Assert.False(File.Exists(folder.File("cc.bmp")));
    }

    private static string Log(TempFolder folder, string name, byte[] bytes)
    {
        string path = folder.File(name);
        File.WriteAllBytes(path, bytes);
        return path;
    }

    private static (int Width, int Height) PngSize(string path)
    {
        using SKBitmap bitmap = SKBitmap.Decode(path);
        Assert.NotNull(bitmap);
        return (bitmap.Width, bitmap.Height);
    }
}
