using LaunchLogger.Decoding.Reporting;
using Spectre.Console;
using Spectre.Console.Rendering;

namespace LaunchLogger.Cli.Output;

/// <summary>Renders a report as tables for people: per run, the first-motion and rollout facts,
/// then the speed intervals and the distance marks with both conventions in adjacent columns.</summary>
public static class ReportTableWriter
{
    /// <summary>Writes <paramref name="document"/> to <paramref name="output"/>, with colour
    /// only when <paramref name="colour"/> is true.</summary>
    public static void Write(ReportDocument document, TextWriter output, DisplayUnits units, bool colour = false)
    {
        IAnsiConsole console = AnsiConsole.Create(new AnsiConsoleSettings
        {
            Ansi = colour ? AnsiSupport.Detect : AnsiSupport.No,
            ColorSystem = colour ? ColorSystemSupport.Detect : ColorSystemSupport.NoColors,
            Out = new AnsiConsoleOutput(output),
            Interactive = InteractionSupport.No,
        });
        console.Profile.Width = 110;
        if (document.Reader is { HasDamage: true } reader)
        {
            console.MarkupLine($"[yellow]Log damage:[/] {reader.CrcErrors} CRC errors, {reader.MalformedFrames} malformed frames, {reader.FramesLost} frames lost, {reader.BytesSkipped} bytes skipped, {reader.TruncatedBytes} bytes cut off at the end");
        }

        foreach (RunReport run in document.Runs)
        {
            WriteRun(console, document.Source, run, units);
        }
    }

    private static void WriteRun(IAnsiConsole console, string source, RunReport run, DisplayUnits units)
    {
        console.WriteLine();
        console.Write(new Rule($"[bold]Run {run.Run}[/] · {Markup.Escape(Path.GetFileName(source))} · {Markup.Escape(run.Method)}{(run.Staged ? "" : " · rolling start")}").LeftJustified());
        var facts = new Grid().AddColumn().AddColumn();
        facts.AddRow("First motion", $"{Format.SecondsWithSigma(run.FirstMotionS, run.FirstMotionUncertaintyS)} on the input's clock");
        RolloutReport r = run.Rollout;
        facts.AddRow(
            $"Rollout ({Format.Distance(r.DistanceM, units)})",
            r.AfterFirstMotionS is { } after
                ? $"{Format.SecondsWithSigma(after, r.TimeUncertaintyS)} after first motion, at {Format.Speed(r.SpeedMps, units)} {Format.SpeedSigma(r.SpeedUncertaintyMps, units)}"
                : "not reached");
        facts.AddRow("Peak acceleration", Format.Accel(run.PeakAccelMps2));
        facts.AddRow("Top speed, distance", $"{Format.Speed(run.MaxSpeedMps, units)}, {Format.Distance(run.DistanceM, units)}");
        console.Write(facts);

        var intervals = new Table().Border(TableBorder.Simple)
            .AddColumn("Speed interval")
            .AddColumn(new TableColumn("From standstill").RightAligned())
            .AddColumn(new TableColumn("After rollout").RightAligned());
        foreach (SpeedIntervalReport i in run.SpeedIntervals)
        {
            bool standing = i.FromMps == 0;
            intervals.AddRow(
                new Text(i.Label),
                new Text(Format.SecondsWithSigma(i.FromStandstillS, i.UncertaintyS)),
                standing ? new Text(Format.SecondsWithSigma(i.FromRolloutS, i.FromRolloutUncertaintyS)) : new Text("same", new Style(decoration: Decoration.Dim)));
        }

        var marks = new Table().Border(TableBorder.Simple)
            .AddColumn("Distance")
            .AddColumn(new TableColumn("From standstill").RightAligned())
            .AddColumn(new TableColumn("After rollout").RightAligned())
            .AddColumn(new TableColumn("Speed").RightAligned())
            .AddColumn(new TableColumn("Trap speed").RightAligned());
        foreach (DistanceMarkReport m in run.DistanceMarks)
        {
            marks.AddRow(
                m.Label,
                Format.SecondsWithSigma(m.FromStandstillS, m.UncertaintyS),
                Format.SecondsWithSigma(m.FromRolloutS, m.FromRolloutUncertaintyS),
                Format.Speed(m.SpeedMps, units),
                m.TrapSpeedMps is { } trap ? $"{Format.Speed(trap, units)} {Format.SpeedSigma(m.TrapSpeedUncertaintyMps, units)}" : "");
        }

        console.Write(intervals);
        console.Write(marks);
        foreach (string warning in run.Warnings)
        {
            console.MarkupLine($"[yellow]warning:[/] {Markup.Escape(warning)}");
        }
    }
}
