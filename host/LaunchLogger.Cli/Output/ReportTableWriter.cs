using LaunchLogger.Decoding.Braking;
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

        if (document.Weather is { } w)
        {
            console.MarkupLine(Markup.Escape(FormattableString.Invariant(
                $"Weather: {w.TemperatureC:0.0} °C, {w.PressureHpa:0.0} hPa, {w.RelativeHumidityPct:0} % RH → air {w.DensityKgPerM3:0.000} kg/m³, density altitude {Format.Distance(w.DensityAltitudeM, units)}, SAE J1349 CF {w.CorrectionFactor:0.000}")));
        }

        foreach (RunReport run in document.Runs)
        {
            WriteRun(console, run, units);
        }

        foreach (PairReport pair in document.Pairs)
        {
            console.WriteLine();
            console.Write(new Rule($"[bold]Runs {pair.Runs[0]} and {pair.Runs[1]}, averaged[/] · {Markup.Escape(pair.Method)}").LeftJustified());
            console.Write(FigureTables.Intervals(pair.SpeedIntervals));
            console.Write(FigureTables.Marks(pair.DistanceMarks, units));
        }

        if (document.BenchRests.Count > 0)
        {
            console.WriteLine();
            console.Write(new Rule("[bold]Bench rests[/] · not runs: the box standing still, for launchlogger calibrate accelerometer").LeftJustified());
            foreach (BenchRestReport rest in document.BenchRests)
            {
                string outcome = rest.Outcome switch
                {
                    "complete" => "complete",
                    "spoiled_by_pulse" => "spoiled: a wheel pulse came (the car moved), not usable",
                    "cut_short" => "cut short: the box shut down",
                    _ => "unfinished: its end is missing",
                };
                console.MarkupLine(Markup.Escape($"{rest.Source}: {outcome}"));
                console.MarkupLine(Markup.Escape(FormattableString.Invariant(
                    $"  opened at {rest.OpenedS:0.000} s, {(rest.DurationS is { } d ? $"{d:0.0} s" : "length not known")}, {rest.Samples} samples, forward mean {(rest.ForwardMeanMps2 is { } m ? $"{m:+0.000;-0.000} m/s²" : "none")}")));
                foreach (string warning in rest.Warnings)
                {
                    console.MarkupLine("[dim]" + Markup.Escape("  " + warning) + "[/]");
                }
            }
        }

        if (document.TractionBound is { } b)
        {
            console.WriteLine();
            console.MarkupLine(Markup.Escape(FormattableString.Invariant(
                $"Braking grip bound: the stop at the grip limit ({b.Source}, mean {Format.Accel(b.MeanDecelMps2)}; {b.Why}) allows 0-60 mph in no less than {b.Bound060S:0.000} s and 0-100 km/h in no less than {b.Bound0100KmhS:0.000} s.")));
            console.MarkupLine("[dim]" + Markup.Escape("Caveats: " + b.Caveats + ".") + "[/]");
        }
        else if (document.Runs.Any(r => r.Braking is not null))
        {
            console.WriteLine();
            console.MarkupLine(Markup.Escape("Braking grip bound: none. No stop was at the grip limit (no wheel seen sliding, no deceleration plateau, none named with --brake-reference), so the stops are reported but bound no launch."));
        }
    }

    private static void WriteRun(IAnsiConsole console, RunReport run, DisplayUnits units)
    {
        console.WriteLine();
        string verdictMark = run.Verdict is { } v ? $" · {VerdictMarkup(v.Level)}" : "";
        console.Write(new Rule($"[bold]#{run.Index}: run {run.Run}[/] · {Markup.Escape(Path.GetFileName(run.Source))} · {Markup.Escape(run.Method)}{(run.Staged ? "" : " · rolling start")}{verdictMark}").LeftJustified());
        var facts = new Grid().AddColumn().AddColumn();
        facts.AddRow("First motion", run.FirstMotionS switch
        {
            { } firstMotion when double.IsFinite(firstMotion) => $"{Format.SecondsWithSigma(firstMotion, run.FirstMotionUncertaintyS)} on the input's clock",
            { } => "not found",
            null => "none: the run opened moving",
        });
        RolloutReport r = run.Rollout;
        facts.AddRow(
            $"Rollout ({Format.Distance(r.DistanceM, units)})",
            r.AfterFirstMotionS is { } after
                ? $"{Format.SecondsWithSigma(after, r.AfterFirstMotionUncertaintyS)} after first motion, at {Format.Speed(r.SpeedMps, units)} {Format.SpeedSigma(r.SpeedUncertaintyMps, units)}"
                : "not reached");
        facts.AddRow("Peak acceleration", Format.Accel(run.PeakAccelMps2));
        facts.AddRow("Top speed, distance", $"{Format.Speed(run.MaxSpeedMps, units)}, {Format.Distance(run.DistanceM, units)}");
        if (run.Grade is { } g)
        {
            facts.AddRow("Grade at staging", FormattableString.Invariant($"{g.Percent:+0.00;-0.00} % ± {g.UncertaintyPercent:0.00} %{(g.MountingCalibrated ? "" : " (box mounting not calibrated)")}"));
        }

        console.Write(facts);

        console.Write(FigureTables.Intervals(run.SpeedIntervals));
        console.Write(FigureTables.Marks(run.DistanceMarks, units));
        foreach (CorrectedFiguresReport correction in run.Corrections)
        {
            string title = correction.Kind == "level" ? "Corrected to level ground" : "Corrected to standard air (SAE J1349)";
            console.MarkupLine($"[bold]{title}[/] [dim]({Markup.Escape(correction.Method)})[/]");
            console.Write(FigureTables.Intervals(correction.SpeedIntervals.Where(i => i.FromMps == 0).ToList()));
        }

        if (run.Braking is { } brake)
        {
            WriteBraking(console, brake, units);
        }

        if (run.Verdict is { Reasons.Count: > 0 } verdict)
        {
            foreach (VerdictReasonReport reason in verdict.Reasons)
            {
                console.MarkupLine($"{VerdictMarkup(reason.Level)}: {Markup.Escape(reason.Text)} [dim]({reason.Code})[/]");
            }
        }

        foreach (string warning in run.Warnings)
        {
            console.MarkupLine($"[yellow]warning:[/] {Markup.Escape(warning)}");
        }
    }

    private static void WriteBraking(IAnsiConsole console, BrakingReport b, DisplayUnits units)
    {
        console.MarkupLine("[bold]Stop[/]");
        var grid = new Grid().AddColumn().AddColumn();
        grid.AddRow("Brake onset", FormattableString.Invariant($"{Format.SecondsWithSigma(b.OnsetS, b.OnsetUncertaintyS)} on the input's clock, from {Format.Speed(b.FromMps, units)} ({b.OnsetMethod})"));
        grid.AddRow("Stopping distance", FormattableString.Invariant($"{Format.Distance(b.StoppingDistanceM, units)} ± {Format.Distance(b.StoppingDistanceUncertaintyM, units)}"));
        foreach (CorrectedStopReport c in b.CorrectedStops)
        {
            grid.AddRow($"  {c.Label}", c.CorrectedDistanceM is { } d ? $"{Format.Distance(d, units)} [dim](scaled by (nominal/actual speed)²)[/]" : $"[dim]{Markup.Escape(Format.StopNotCorrected(b.FromMps, c.NominalMps, units))}[/]");
        }

        grid.AddRow("Mean deceleration", Format.Accel(b.MeanDecelMps2));
        grid.AddRow(BrakingFormulas.MfddLabel, Format.Accel(b.MfddMps2));
        grid.AddRow("Peak deceleration", Format.Accel(b.PeakDecelMps2));
        grid.AddRow("Grip bound", b.GripLimit is { } grip
            ? Markup.Escape(FormattableString.Invariant($"0-60 mph ≥ {b.TractionBound060S:0.000} s, 0-100 km/h ≥ {b.TractionBound0100KmhS:0.000} s (at the grip limit: {grip.Why})"))
            : "[dim]none: nothing shows this stop was at the grip limit, so it bounds no launch[/]");
        console.Write(grid);
    }

    private static string VerdictMarkup(string level) => level switch
    {
        "valid" => "[green]valid[/]",
        "doubtful" => "[yellow]doubtful[/]",
        _ => "[red]invalid[/]",
    };
}
