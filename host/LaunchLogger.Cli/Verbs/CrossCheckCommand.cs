using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.CrossCheck;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Reporting;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Cli.Output;
using LaunchLogger.Plots;
using Spectre.Console;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger crosscheck</c>: one of our runs against another instrument's record
/// of the same drive (NMEA 0183, GPX 1.1 or a mapped CSV), figure by figure.</summary>
public static class CrossCheckCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var log = new Argument<FileInfo>("log") { Description = "Our log of the drive." };
        var with = new Option<FileInfo>("--with") { Description = "The other instrument's record.", Required = true };
        var format = new Option<string>("--format") { Description = "Its format: nmea, gpx or csv (default: from the file's extension).", DefaultValueFactory = _ => "auto" };
        var columns = new Option<string?>("--columns") { Description = "For csv: which columns hold what, e.g. time=t,speed=v_kmh or time=t,lat=lat,lon=lon." };
        var speedUnit = new Option<string>("--speed-unit") { Description = "For csv: the speed column's unit, mph, kmh, mps or knots.", DefaultValueFactory = _ => "mps" };
        var timeUnit = new Option<string>("--time-unit") { Description = "For csv: the time column's unit, s or ms.", DefaultValueFactory = _ => "s" };
        var speedSigma = new Option<double>("--speed-sigma") { Description = "The other record's speed noise, m/s (1-σ).", DefaultValueFactory = _ => CrossChecker.DefaultSpeedSigmaMps };
        var run = new Option<int>("--run") { Description = "Which of the log's runs, from 1.", DefaultValueFactory = _ => 1 };
        var json = new Option<bool>("--json") { Description = "Write the comparison as JSON." };
        var plot = new Option<FileInfo?>("--plot") { Description = "Also draw both speed traces and their difference to this file (.svg or .png)." };
        var units = new Option<DisplayUnits>("--units") { Description = "Units for the table's speeds and the plot's axes: imperial (mph) or metric (km/h).", DefaultValueFactory = _ => DisplayUnits.Imperial };
        var command = new Command("crosscheck", "Compare one of our runs with another instrument's record of it: clock offset, every figure from both, their difference and whether it lies within the combined uncertainty.")
        {
            log, with, format, columns, speedUnit, timeUnit, speedSigma, run, json, plot, units,
        };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(
            parse.GetValue(log)!, parse.GetValue(with)!, parse.GetValue(format)!, parse.GetValue(columns), parse.GetValue(speedUnit)!, parse.GetValue(timeUnit)!,
            parse.GetValue(speedSigma), parse.GetValue(run), parse.GetValue(json),
            parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error, cancel, parse.GetValue(plot)?.FullName, parse.GetValue(units))));
        return command;
    }

    /// <summary>Runs the verb. Exit 0 when every figure agrees within ±2 combined σ, 1 when some
    /// do not. With <paramref name="plot"/>, also draws both speed traces and their difference
    /// there (.svg or .png). <paramref name="units"/> picks the table's speed unit and the plot's
    /// axes, as in <c>report</c>; the JSON stays SI.</summary>
    public static ExitCode Run(FileInfo log, FileInfo with, string format, string? columns, string speedUnit, string timeUnit, double speedSigma, int runNumber, bool json, TextWriter output, TextWriter error, CancellationToken cancel = default, string? plot = null, DisplayUnits units = DisplayUnits.Imperial)
    {
        const string Verb = "launchlogger crosscheck";
        if (plot != null && ChartFormats.FromPath(plot) is null)
        {
            error.WriteLine($"{Verb}: --plot '{plot}' must end in .svg or .png (the extension picks the format)");
            return ExitCode.Usage;
        }

        if (!(speedSigma > 0 && speedSigma < 10))
        {
            error.WriteLine($"{Verb}: --speed-sigma must be more than 0 and less than 10 m/s");
            return ExitCode.Usage;
        }

        string kind = format == "auto" ? FormatFromExtension(with.Name) : format.ToLowerInvariant();
        TraceColumns? map = null;
        try
        {
            if (kind == "csv")
            {
                map = TraceColumns.Parse(columns ?? throw new FormatException("--columns is needed for a csv record, e.g. time=t,speed=v"), speedUnit, timeUnit);
            }
            else if (kind is not ("nmea" or "gpx"))
            {
                throw new FormatException($"--format '{format}' must be nmea, gpx or csv (the file's extension did not say)");
            }
        }
        catch (FormatException e)
        {
            error.WriteLine($"{Verb}: {e.Message}");
            return ExitCode.Usage;
        }

        CrossCheckResult result;
        RunAnalysis ours;
        try
        {
            IReadOnlyList<DecodedRun> runs = LogReader.ReadFile(log.FullName, cancel).Runs;
            if (runNumber < 1 || runNumber > runs.Count)
            {
                throw new InputException(log.FullName, 0, runs.Count == 0 ? "the log holds no run" : $"--run {runNumber}: the log holds runs 1 to {runs.Count}");
            }

            SpeedTrace theirs = kind switch
            {
                "nmea" => NmeaTraceReader.Read(with.FullName),
                "gpx" => GpxTraceReader.Read(with.FullName),
                _ => CsvTraceReader.Read(with.FullName, map!),
            };
            ours = RunAnalyzer.Analyze(runs[runNumber - 1]);
            result = CrossChecker.Compare(ours, theirs, speedSigma);
            if (map is not null && SpeedUnitProblem(ours, theirs, result.Alignment, map) is { } problem)
            {
                throw new InputException(with.FullName, 0, problem);
            }
        }
        catch (InputException e)
        {
            error.WriteLine($"{Verb}: {e.Message}");
            return ExitCode.BadInput;
        }
        catch (AnalysisException e)
        {
            error.WriteLine($"{Verb}: {log.FullName}: {e.Message}");
            return ExitCode.BadInput;
        }

        if (plot != null)
        {
            try
            {
                PlotFiles.Write([(plot, () => RunCharts.CrossCheck(ours, result, new ChartOptions { Units = units }))], cancel);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                error.WriteLine($"{Verb}: cannot write the plot: {e.Message}");
                return ExitCode.BadInput;
            }

            error.WriteLine($"{Verb}: wrote {plot}");
        }

        if (json)
        {
            output.WriteLine(JsonSerializer.Serialize(ToDocument(result), ReportJson.Options));
        }
        else
        {
            Write(result, output, units);
        }

        return result.Rows.All(r => r.WithinUncertainty) ? ExitCode.Ok : ExitCode.Partial;
    }

    /// <summary>The CSV speed units a user picks from, m/s per unit (as --speed-unit reads them).</summary>
    private static readonly (string Name, double MpsPer)[] SpeedUnits = new[] { "mps", "kmh", "mph", "knots" }
        .Select(name => (name, TraceColumns.Parse("time=t,speed=v", name).MpsPerSpeedUnit)).ToArray();

    /// <summary>Why a CSV record's speeds cannot be compared with ours, or null. Their top speed
    /// over our run (their samples within 5 s of it, on our clock) must lie within 15 % of ours —
    /// our own margin: a satellite receiver's or another wheel's speed over the same drive differs
    /// by a tyre's growth and slip, a few per cent (from memory), while a speed column in km/h read as m/s
    /// reads 3.6 times ours, and its "figures" are then quietly wrong by seconds. Neither the
    /// alignment's speed scale (its cubic term takes up part of the factor) nor a fit over the run
    /// (the clock offset found for wrong speeds is itself off by seconds) shows the factor; the two
    /// top speeds do.</summary>
    public static string? SpeedUnitProblem(RunAnalysis ours, SpeedTrace theirs, TraceAlignment alignment, TraceColumns map)
    {
        ArgumentNullException.ThrowIfNull(ours);
        ArgumentNullException.ThrowIfNull(theirs);
        ArgumentNullException.ThrowIfNull(alignment);
        ArgumentNullException.ThrowIfNull(map);
        const double MarginS = 5;
        Trajectory trajectory = ours.Reconstruction.Trajectory;
        double ourTop = trajectory.SpeedMps.Where(double.IsFinite).DefaultIfEmpty(0).Max();
        double theirTop = Enumerable.Range(0, theirs.Count)
            .Where(i => theirs.TimeS[i] + alignment.OffsetS >= trajectory.TimeS[0] - MarginS && theirs.TimeS[i] + alignment.OffsetS <= trajectory.TimeS[^1] + MarginS)
            .Select(i => theirs.SpeedMps[i])
            .Where(double.IsFinite)
            .DefaultIfEmpty(0)
            .Max();
        double ratio = theirTop / ourTop;
        if (!(ourTop > 3 && theirTop > 0) || (ratio > 1 / 1.15 && ratio < 1.15))
        {
            return null;
        }

        string given = SpeedUnits.MinBy(u => Math.Abs(u.MpsPer - map.MpsPerSpeedUnit)).Name;
        double implied = map.MpsPerSpeedUnit / ratio;
        (string Name, double MpsPer) nearest = SpeedUnits.MinBy(u => Math.Abs(Math.Log(implied / u.MpsPer)));
        string hint = nearest.Name != given && Math.Abs(Math.Log(implied / nearest.MpsPer)) < Math.Log(1.12)
            ? $"; they agree if the column is in {nearest.Name}: try --speed-unit {nearest.Name}"
            : "; is it the same drive, and the right --columns speed column?";
        return string.Create(CultureInfo.InvariantCulture, $"its top speed over our run, read as {given}, is {ratio:0.00} times ours (an instrument of the same drive reads within 15 %){hint}");
    }

    private static string FormatFromExtension(string name) => Path.GetExtension(name).ToLowerInvariant() switch
    {
        ".nmea" or ".nma" or ".txt" => "nmea",
        ".gpx" => "gpx",
        ".csv" => "csv",
        _ => "unknown",
    };

    private static void Write(CrossCheckResult result, TextWriter output, DisplayUnits units)
    {
        var c = CultureInfo.InvariantCulture;
        output.WriteLine(string.Create(c, $"Other record: {result.Source}, {result.SampleRateHz:0.#} Hz, speeds {(result.SpeedMeasured ? "measured" : "from positions")}, {result.RecordsRejected} of {result.RecordsRead} records refused"));
        output.WriteLine(string.Create(c, $"Clock offset: ours = theirs {(result.Alignment.OffsetS >= 0 ? "+" : "−")} {Math.Abs(result.Alignment.OffsetS):0.0000} s ± {result.Alignment.OffsetSigmaS * 1000:0.0} ms; their speeds read {(result.Alignment.SpeedScale - 1) * 100:+0.00;−0.00} % against ours; speed residual {result.Alignment.ResidualRmsMps:0.000} m/s RMS over {result.Alignment.SamplesUsed} samples"));
        foreach (string note in result.Notes)
        {
            output.WriteLine("Note: " + note);
        }

        var table = new Table().Border(TableBorder.Simple)
            .AddColumn("Figure")
            .AddColumn("Convention")
            .AddColumn(new TableColumn("Ours").RightAligned())
            .AddColumn(new TableColumn("Theirs").RightAligned())
            .AddColumn(new TableColumn("Theirs − ours").RightAligned())
            .AddColumn(new TableColumn("Within ±2σ").Centered());
        foreach (CrossCheckRow row in result.Rows)
        {
            table.AddRow(
                new Text(row.Figure),
                new Text(row.Convention == "n/a" ? "" : row.Convention == "rollout" ? "after rollout" : "from standstill"),
                new Text(Value(row.Ours, row.OursSigma, row.Unit, units)),
                new Text(Value(row.Theirs, row.TheirsSigma, row.Unit, units)),
                new Text(Value(row.Difference, row.CombinedSigma, row.Unit, units)),
                new Text(row.WithinUncertainty ? "yes" : "NO"));
        }

        var console = AnsiConsole.Create(new AnsiConsoleSettings { Out = new AnsiConsoleOutput(output), Ansi = AnsiSupport.No, ColorSystem = ColorSystemSupport.NoColors });
        console.Profile.Width = 120;
        console.Write(table);
    }

    /// <summary>A row's value with its σ: times in s with ms, speeds ("m/s" rows) in the chosen
    /// display unit, as the report and the board show them.</summary>
    private static string Value(double value, double sigma, string unit, DisplayUnits units) => unit switch
    {
        "s" => string.Create(CultureInfo.InvariantCulture, $"{value:0.000} s ± {sigma * 1000:0} ms"),
        "m/s" => $"{Format.BoardValue(unit, value, units, sigma: true)} ± {Format.BoardValue(unit, sigma, units)}",
        _ => string.Create(CultureInfo.InvariantCulture, $"{value:0.00} ± {sigma:0.00} {unit}"),
    };

    private static object ToDocument(CrossCheckResult r) => new
    {
        Source = r.Source,
        SampleRateHz = r.SampleRateHz,
        SpeedMeasured = r.SpeedMeasured,
        RecordsRead = r.RecordsRead,
        RecordsRejected = r.RecordsRejected,
        SpeedSigmaMps = r.SpeedSigmaMps,
        ClockOffsetS = r.Alignment.OffsetS,
        ClockOffsetSigmaS = r.Alignment.OffsetSigmaS,
        SpeedScale = r.Alignment.SpeedScale,
        ResidualRmsMps = r.Alignment.ResidualRmsMps,
        Notes = r.Notes,
        Figures = r.Rows.Select(row => new
        {
            row.Figure,
            row.Convention,
            row.Unit,
            row.Ours,
            row.OursSigma,
            row.Theirs,
            row.TheirsSigma,
            row.Difference,
            row.CombinedSigma,
            row.WithinUncertainty,
        }),
    };
}
