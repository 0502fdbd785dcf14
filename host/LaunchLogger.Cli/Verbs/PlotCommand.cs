using System.CommandLine;
using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Plots;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger plot</c>: pictures of runs as SVG or PNG — each run's trace (whole,
/// or close up on the launch), several runs overlaid on either convention's zero, or each run's stop.</summary>
public static class PlotCommand
{
    /// <summary>The kinds of picture, as typed.</summary>
    public static readonly string[] Kinds = ["trace", "launch", "overlay", "braking"];

    /// <summary>The overlay's zeros, as typed.</summary>
    public static readonly string[] Alignments = ["standstill", "rollout"];

    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var logs = new Argument<FileInfo[]>("log") { Description = "Log files written by the box.", Arity = ArgumentArity.OneOrMore };
        var output = new Option<FileInfo>("--out") { Description = "The picture to write; .svg or .png picks the format. With several runs (trace, launch, braking) each gets its own file: NAME-run1.svg, NAME-run2.svg…", Required = true };
        var kind = new Option<string>("--kind") { Description = "trace: speed, distance and acceleration of each run; launch: the same, close up on the start and the rollout mark; overlay: every run on one chart; braking: each run's stop against time and distance.", DefaultValueFactory = _ => "trace" };
        kind.AcceptOnlyFromAmong(Kinds);
        var align = new Option<string?>("--align") { Description = "For an overlay: zero of time at each run's first motion (standstill, the default) or at its rollout mark (rollout)." };
        align.AcceptOnlyFromAmong(Alignments);
        var run = new Option<int[]>("--run") { Description = "Only this run, by its number in the report, from 1 (repeatable; default every run).", AllowMultipleArgumentsPerToken = false };
        var units = new Option<DisplayUnits>("--units") { Description = "Units on the axes: imperial (mph, ft) or metric (km/h, m).", DefaultValueFactory = _ => DisplayUnits.Imperial };
        var size = new Option<string>("--size") { Description = "Picture size in pixels, WIDTHxHEIGHT.", DefaultValueFactory = _ => $"{ChartOptions.DefaultWidthPx}x{ChartOptions.DefaultHeightPx}" };
        var rollout = new Option<double?>("--rollout-m") { Description = "Rollout distance, m (default: the box's setting, normally 0.3048)." };
        var settings = new Option<FileInfo?>("--settings") { Description = "Calibration settings file from launchlogger calibrate." };
        var command = new Command("plot", "Draw runs as SVG or PNG: a run's speed, distance and acceleration with its start marks, several runs overlaid, or a stop.")
        {
            logs, output, kind, align, run, units, size, rollout, settings,
        };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(
            new PlotRequest
            {
                Logs = parse.GetValue(logs) ?? [],
                Out = parse.GetValue(output)!.FullName,
                Kind = parse.GetValue(kind)!,
                Align = parse.GetValue(align),
                Runs = parse.GetValue(run) ?? [],
                Units = parse.GetValue(units),
                Size = parse.GetValue(size)!,
                RolloutM = parse.GetValue(rollout),
                Settings = parse.GetValue(settings),
            },
            parse.InvocationConfiguration.Output,
            parse.InvocationConfiguration.Error,
            cancel)));
        return command;
    }

    /// <summary>Runs the verb: 0 when every picture asked for was written, 1 when some runs had
    /// nothing to draw (no stop, never reached the rollout mark), 2 for unusable input, 3 for a
    /// wrong command line.</summary>
    public static ExitCode Run(PlotRequest request, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        const string Verb = "launchlogger plot";
        ChartOptions chart;
        try
        {
            PlotFiles.FormatOf(request.Out, "--out");
            if (!Kinds.Contains(request.Kind))
            {
                throw new UsageException($"--kind '{request.Kind}' must be one of {string.Join(", ", Kinds)}");
            }

            if (request.Align is { } a && !Alignments.Contains(a))
            {
                throw new UsageException($"--align '{a}' must be standstill or rollout");
            }

            if (request.Align != null && request.Kind != "overlay")
            {
                throw new UsageException("--align is for --kind overlay (a single run's charts start at its first motion)");
            }

            if (request.RolloutM is { } r && !(r > 0 && r < 10))
            {
                throw new UsageException("--rollout-m must be more than 0 and less than 10 m");
            }

            (int w, int h) = PlotFiles.ParseSize(request.Size);
            chart = new ChartOptions { Units = request.Units, WidthPx = w, HeightPx = h };
        }
        catch (UsageException e)
        {
            error.WriteLine($"{Verb}: {e.Message}");
            return ExitCode.Usage;
        }

        // Runs are read, analysed and drawn one at a time, each picture written to its temporary
        // file as soon as it is drawn and the run let go, so a long log takes the memory of its
        // largest run (an overlay keeps the runs it overlays). The files are moved into place
        // together at the end, when their names are known (one run keeps the name as given).
        List<int>? wanted = request.Runs.Count == 0 ? null : [.. request.Runs.Distinct()];
        var skipped = new List<string>();
        var drawn = new List<int>();
        var overlaid = new List<(int Number, RunAnalysis Run)>();
        RunAlignment alignment = request.Align == "rollout" ? RunAlignment.Rollout : RunAlignment.Standstill;
        using var files = new AtomicFile.Set();
        StreamedSession<int> session;
        try
        {
            var inputRequest = new ReportRequest { Logs = request.Logs, Settings = request.Settings };
            var inputs = RunInputs.Load(inputRequest, cancel);
            var options = new AnalysisOptions { RolloutM = request.RolloutM, Calibration = RunInputs.LoadSettings(inputRequest) };
            session = SessionAnalyzer.AnalyzeEach(inputs.SelectMany(i => i.Runs), (run, n) => Draw(run, n), options, [], cancel);
        }
        catch (InputException e)
        {
            error.WriteLine($"{Verb}: {e.Message}");
            return ExitCode.BadInput;
        }
        catch (UsageException e)
        {
            error.WriteLine($"{Verb}: {e.Message}");
            return ExitCode.Usage;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            error.WriteLine($"{Verb}: cannot write the picture: {e.Message}");
            return ExitCode.BadInput;
        }

        foreach (string failure in session.Failures)
        {
            error.WriteLine($"{Verb}: {failure}");
        }

        if (session.Runs.Count == 0)
        {
            error.WriteLine($"{Verb}: no run could be analysed");
            return ExitCode.BadInput;
        }

        if (wanted?.FirstOrDefault(n => n < 1 || n > session.Runs.Count) is int bad && bad != 0)
        {
            error.WriteLine($"{Verb}: --run {bad}: the input holds runs 1 to {session.Runs.Count}");
            return ExitCode.Usage;
        }

        foreach (string note in skipped)
        {
            error.WriteLine($"{Verb}: {note}");
        }

        var targets = new List<string>();
        try
        {
            if (request.Kind == "overlay")
            {
                if (overlaid.Count > 0)
                {
                    // Each line named by the log and the run in it ("drag.log run 2"), as the
                    // reader names the run: the report's running number alone does not say which
                    // log a line came from once several are overlaid.
                    files.Write(request.Out, stream => RunCharts.Overlay(overlaid.Select(o => o.Run).ToList(), alignment, chart, overlaid.Select(o => o.Run.Run.Source).ToList())
                        .Write(stream, PlotFiles.FormatOf(request.Out, "--out")));
                    targets.Add(request.Out);
                }
            }
            else
            {
                int count = wanted?.Count ?? session.Runs.Count;
                targets.AddRange(drawn.Select(n => PlotFiles.ForRun(request.Out, n, count)));
            }

            if (targets.Count == 0)
            {
                error.WriteLine($"{Verb}: nothing to draw");
                return ExitCode.BadInput;
            }

            files.Commit(targets, cancel);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            error.WriteLine($"{Verb}: cannot write the picture: {e.Message}");
            return ExitCode.BadInput;
        }

        foreach (string path in targets)
        {
            output.WriteLine($"wrote {path}");
        }

        return skipped.Count == 0 && session.Failures.Count == 0 ? ExitCode.Ok : ExitCode.Partial;

        // Draws run n (when chosen) to its temporary file, or keeps it for the overlay.
        int Draw(RunAnalysis run, int n)
        {
            if (wanted != null && !wanted.Contains(n))
            {
                return n;
            }

            Func<Chart>? draw = null;
            switch (request.Kind)
            {
                case "overlay":
                    if (!run.Reconstruction.Staged)
                    {
                        skipped.Add($"run {n} opened while rolling (no standstill), so it is left out of the overlay");
                    }
                    else if (alignment == RunAlignment.Rollout && run.Reconstruction.RolloutTimeS == null)
                    {
                        skipped.Add($"run {n} never reached the rollout mark, so it is left out of the overlay");
                    }
                    else
                    {
                        overlaid.Add((n, run));
                    }

                    break;
                case "braking":
                    if (run.Braking == null)
                    {
                        skipped.Add($"run {n} does not end in a stop, so it has no braking picture");
                    }
                    else
                    {
                        draw = () => RunCharts.Braking(run, chart with { Title = $"Run {n}: stop from {Format.Speed(run.Braking.FromMps, request.Units)}" });
                    }

                    break;
                case "launch":
                    draw = () => RunCharts.Launch(run, chart with { Title = $"Run {n}: the launch" });
                    break;
                default:
                    draw = () => RunCharts.Trace(run, chart with { Title = $"Run {n}: speed, distance and acceleration" });
                    break;
            }

            if (draw != null)
            {
                // Named as one of several for now: the folder is the same whatever the final name.
                cancel.ThrowIfCancellationRequested();
                files.Write(PlotFiles.ForRun(request.Out, n, 2), stream => draw().Write(stream, PlotFiles.FormatOf(request.Out, "--out")));
                drawn.Add(n);
            }

            return n;
        }
    }
}
