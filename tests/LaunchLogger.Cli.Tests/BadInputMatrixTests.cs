namespace LaunchLogger.Cli.Tests;

/// <summary>Bad input, verb by verb and option by option: each gives one line naming what is wrong
/// (no stack trace), the documented exit code, and writes nothing.</summary>
public class BadInputMatrixTests
{
    public static TheoryData<string, string[], ExitCode> Cases()
    {
        var data = new TheoryData<string, string[], ExitCode>();
        void Add(string name, ExitCode code, params string[] args) => data.Add(name, args, code);
        Add("weather not a number", ExitCode.Usage, "report", "{log}", "--weather", "NaN,1008,62");
        Add("weather out of range", ExitCode.Usage, "report", "{log}", "--weather", "18,5000,62");
        Add("interval faster than any car", ExitCode.Usage, "report", "{log}", "--interval", "0-1e300mph");
        Add("interval NaN", ExitCode.Usage, "report", "{log}", "--interval", "NaN-60mph");
        Add("stop-from NaN", ExitCode.Usage, "report", "{log}", "--stop-from", "NaNmph");
        Add("rollout NaN", ExitCode.Usage, "report", "{log}", "--rollout-m", "NaN");
        Add("pair out of range", ExitCode.Usage, "report", "{log}", "--pair", "1,9");
        Add("metres per pulse 1e308", ExitCode.BadInput, "report", "--edges", "{edges}", "--metres-per-pulse", "1e308");
        Add("metres per pulse 1e-300", ExitCode.BadInput, "report", "--edges", "{edges}", "--metres-per-pulse", "1e-300");
        Add("metres per pulse NaN", ExitCode.BadInput, "report", "--edges", "{edges}", "--metres-per-pulse", "NaN");
        Add("edges in microseconds", ExitCode.BadInput, "report", "--edges", "{edges-us}", "--metres-per-pulse", "0.04");
        Add("edges at 1e300 s", ExitCode.BadInput, "report", "--edges", "{edges-huge}", "--metres-per-pulse", "0.04");
        Add("edges 1e-12 s apart", ExitCode.BadInput, "report", "--edges", "{edges-close}", "--metres-per-pulse", "0.04");
        Add("log and edges together", ExitCode.Usage, "report", "{log}", "--edges", "{edges}");
        Add("pickup wheel neither driven nor undriven", ExitCode.Usage, "report", "--edges", "{edges}", "--metres-per-pulse", "0.04", "--pickup-wheel", "rear");
        Add("settings file missing", ExitCode.BadInput, "report", "{log}", "--settings", "{missing}");
        Add("brake reference not a log", ExitCode.BadInput, "report", "{log}", "--brake-reference", "{text}");
        Add("a folder as the log", ExitCode.BadInput, "report", "{folder}");
        Add("scenario with a null vehicle", ExitCode.BadInput, "simulate", "--scenario", "{null-vehicle}", "--out", "{out}");
        Add("scenario not JSON", ExitCode.BadInput, "simulate", "--scenario", "{text-json}", "--out", "{out}");
        Add("simulate into a missing folder", ExitCode.BadInput, "simulate", "--out", "{missing}/x.log");
        Add("calibrate a log that is not a log", ExitCode.BadInput, "calibrate", "distance", "{text}", "--metres", "100", "--settings", "{out}");
        return data;
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public async Task Bad_input_gives_one_line_the_documented_code_and_no_output_file(string name, string[] args, ExitCode expected)
    {
        using var folder = new TempFolder();
        var files = new Dictionary<string, string>
        {
            ["{log}"] = Write(folder, "run.log", SimulatedLogs.Default.LogBytes),
            ["{edges}"] = folder.Write("edges.csv", "t_s\n" + string.Join("\n", Enumerable.Range(0, 50).Select(i => (1 + Math.Sqrt(i) * 0.1).ToString("R", System.Globalization.CultureInfo.InvariantCulture))) + "\n"),
            ["{edges-us}"] = folder.Write("edges-us.csv", "t_s\n1000000\n1020000\n1040000\n"),
            ["{edges-huge}"] = folder.Write("edges-huge.csv", "t_s\n1\n2\n1e300\n"),
            ["{edges-close}"] = folder.Write("edges-close.csv", "t_s\n1\n1.000000000001\n"),
            ["{missing}"] = folder.File("missing"),
            ["{text}"] = folder.Write("notes.log", "not a log at all\n"),
            ["{folder}"] = folder.Path,
            ["{null-vehicle}"] = folder.Write("null-vehicle.json", "{\"vehicle\": null}"),
            ["{text-json}"] = folder.Write("broken.json", "{ vehicle: "),
            ["{out}"] = folder.File("out.file"),
        };
        string[] resolved = args.Select(a => files.Aggregate(a, (s, kv) => s.Replace(kv.Key, kv.Value))).ToArray();
        var output = new StringWriter();
        var error = new StringWriter();

        int code = await LaunchLoggerCommand.InvokeAsync(resolved, output, error);

        string errors = error.ToString();
        Assert.True((int)expected == code, $"{name}: exit {code}, expected {(int)expected}: {errors}");
        Assert.DoesNotContain("   at ", errors);
        Assert.DoesNotContain("Exception", errors);
        Assert.False(File.Exists(folder.File("out.file")), name);
        Assert.Empty(Directory.GetFiles(folder.Path, "*.part"));
        Assert.NotEqual("", errors.Trim());
    }

    private static string Write(TempFolder folder, string name, byte[] bytes)
    {
        string path = folder.File(name);
        File.WriteAllBytes(path, bytes);
        return path;
    }
}
