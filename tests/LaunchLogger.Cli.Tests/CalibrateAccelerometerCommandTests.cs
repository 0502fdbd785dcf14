using System.Globalization;
using System.Text;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Simulation.Box;

namespace LaunchLogger.Cli.Tests;

public class CalibrateAccelerometerCommandTests
{
    /// <summary>Two accelerometer CSV rests of an axis that reads 1.008 times the force plus
    /// 0.06 m/s², with seeded noise, at 51.5° N: the verb saves scale and offset within 3σ of
    /// them (r↑ = k·g + b, r↓ = −k·g + b; specific force at rest is +g upward), and report's
    /// settings file then holds them.</summary>
    [Fact]
    public void Two_csv_rests_give_the_scale_and_offset_and_save_them()
    {
        using var folder = new TempFolder();
        const double k = 1.008;
        const double b = 0.06;
        double g = AccelerometerScaleCalibration.NormalGravityMps2(51.5);
        string up = folder.Write("up.csv", Rest((k * g) + b, seed: 1));
        string down = folder.Write("down.csv", Rest((-k * g) + b, seed: 2));
        string settings = folder.File("car.json");
        var output = new StringWriter();
        var error = new StringWriter();

        ExitCode code = CalibrateAccelerometerCommand.Run(
            new CalibrateAccelerometerRequest { Rests = [new FileInfo(up), new FileInfo(down)], LatitudeDeg = 51.5, TiltDeg = 0, Settings = new FileInfo(settings) },
            output,
            error);

        Assert.True(code == ExitCode.Ok, error.ToString());
        CalibrationSettings saved = CalibrationFile.Load(settings);
        Assert.NotNull(saved.AccelForwardScale);
        Assert.True(Math.Abs(saved.AccelForwardScale!.Value - k) <= 3 * saved.AccelForwardScaleSigma!.Value, output.ToString());
        Assert.True(Math.Abs(saved.AccelForwardBiasMps2!.Value - b) <= 3 * saved.AccelForwardBiasSigmaMps2!.Value, output.ToString());
        Assert.Contains("scale", output.ToString(), StringComparison.Ordinal);
    }

    /// <summary>The box records the two rests itself (the firmware core, mark button held while
    /// staged), its forward axis reading k·(±g) + b with k = 0.991, b = −0.045 m/s² at 47.2° N
    /// (r↑ = k·g + b, r↓ = −k·g + b: specific force at rest is +g upward; common practice): the
    /// verb finds the rests in the log and gives k back within its σ, as one log or as two.</summary>
    [Fact]
    public void Bench_rests_the_box_recorded_give_the_scale_back_within_its_sigma()
    {
        using var folder = new TempFolder();
        const double k = 0.991;
        const double b = -0.045;
        double g = AccelerometerScaleCalibration.NormalGravityMps2(47.2);
        string both = folder.File("bench.bin");
        File.WriteAllBytes(both, BenchRestLogs.Write(7, new BenchRestLogs.Rest((k * g) + b), new BenchRestLogs.Rest((-k * g) + b)));
        string up = folder.File("up.bin");
        string down = folder.File("down.bin");
        File.WriteAllBytes(up, BenchRestLogs.Write(8, new BenchRestLogs.Rest((k * g) + b)));
        File.WriteAllBytes(down, BenchRestLogs.Write(9, new BenchRestLogs.Rest((-k * g) + b)));

        foreach (FileInfo[] files in new[] { new[] { new FileInfo(both) }, new[] { new FileInfo(up), new FileInfo(down) } })
        {
            string settings = folder.File($"car-{files.Length}.json");
            var output = new StringWriter();
            var error = new StringWriter();

            ExitCode code = CalibrateAccelerometerCommand.Run(
                new CalibrateAccelerometerRequest { Rests = files, LatitudeDeg = 47.2, TiltDeg = 0, Settings = new FileInfo(settings) },
                output,
                error);

            Assert.True(code == ExitCode.Ok, error.ToString());
            CalibrationSettings saved = CalibrationFile.Load(settings);
            Assert.True(Math.Abs(saved.AccelForwardScale!.Value - k) <= saved.AccelForwardScaleSigma!.Value, output.ToString());
            Assert.True(Math.Abs(saved.AccelForwardBiasMps2!.Value - b) <= 2 * saved.AccelForwardBiasSigmaMps2!.Value, output.ToString());
            Assert.Contains(files.Length == 1 ? "bench.bin rest 2" : "down.bin rest 1", output.ToString(), StringComparison.Ordinal);
        }
    }

    [Fact]
    public void A_rest_spoiled_by_a_wheel_pulse_is_refused_saying_so()
    {
        using var folder = new TempFolder();
        string log = folder.File("moved.bin");
        File.WriteAllBytes(log, BenchRestLogs.Write(10, new BenchRestLogs.Rest(9.8, PulseAtS: 6), new BenchRestLogs.Rest(-9.8)));
        var error = new StringWriter();

        ExitCode code = CalibrateAccelerometerCommand.Run(new CalibrateAccelerometerRequest { Rests = [new FileInfo(log)] }, new StringWriter(), error);

        Assert.Equal(ExitCode.BadInput, code);
        Assert.Contains("moved.bin rest 1: a wheel pulse came 6.0 s into the rest", error.ToString(), StringComparison.Ordinal);
        Assert.Contains("record it again", error.ToString(), StringComparison.Ordinal);
    }

    /// <summary>One CSV where two rests are needed: before, the CSV was read as a log ("no readable
    /// frames", "the log ends inside a frame", "holds 0 bench rest(s) … (1-0, in log order)");
    /// now one line says the second rest is missing, which way it points and how to give both.</summary>
    [Fact]
    public void One_csv_rest_says_the_down_rest_is_missing_and_how_to_give_it()
    {
        using var folder = new TempFolder();
        string up = folder.Write("up.csv", Rest(9.81, seed: 1));
        var error = new StringWriter();

        ExitCode code = CalibrateAccelerometerCommand.Run(new CalibrateAccelerometerRequest { Rests = [new FileInfo(up)] }, new StringWriter(), error);

        Assert.Equal(ExitCode.Usage, code);
        string message = Assert.Single(error.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries));
        Assert.Contains("up.csv is one accelerometer record", message, StringComparison.Ordinal);
        Assert.Contains("pointing UP and then pointing DOWN", message, StringComparison.Ordinal);
        Assert.Contains("UP.csv DOWN.csv", message, StringComparison.Ordinal);
        Assert.DoesNotContain("frame", message, StringComparison.Ordinal);
    }

    /// <summary>A log holding one bench rest, given alone: before, "give the two rests as --rest UP
    /// --rest DOWN (1-1, in log order)", a choice that cannot be made; now it says a rest is
    /// missing and to record it.</summary>
    [Fact]
    public void A_log_with_one_rest_says_a_rest_is_missing()
    {
        using var folder = new TempFolder();
        string log = folder.File("one.bin");
        File.WriteAllBytes(log, BenchRestLogs.Write(12, new BenchRestLogs.Rest(9.8)));
        var error = new StringWriter();

        Assert.Equal(ExitCode.Usage, CalibrateAccelerometerCommand.Run(new CalibrateAccelerometerRequest { Rests = [new FileInfo(log)] }, new StringWriter(), error));
        Assert.Contains("one.bin holds 1 bench rest(s); the scale needs two", error.ToString(), StringComparison.Ordinal);
        Assert.Contains("Record the missing rest(s)", error.ToString(), StringComparison.Ordinal);
        Assert.DoesNotContain("(1-1, in log order)", error.ToString(), StringComparison.Ordinal);
    }

    [Fact]
    public void Several_rests_in_a_log_need_rest_numbers()
    {
        using var folder = new TempFolder();
        string log = folder.File("three.bin");
        File.WriteAllBytes(log, BenchRestLogs.Write(11, new BenchRestLogs.Rest(9.8, PulseAtS: 2), new BenchRestLogs.Rest(9.81), new BenchRestLogs.Rest(-9.8)));
        var error = new StringWriter();
        var output = new StringWriter();

        Assert.Equal(ExitCode.Usage, CalibrateAccelerometerCommand.Run(new CalibrateAccelerometerRequest { Rests = [new FileInfo(log)] }, new StringWriter(), error));
        Assert.Contains("holds 3 bench rest(s)", error.ToString(), StringComparison.Ordinal);
        Assert.Equal(ExitCode.Ok, CalibrateAccelerometerCommand.Run(new CalibrateAccelerometerRequest { Rests = [new FileInfo(log)], BenchRests = ["2", "3"] }, output, error));
        Assert.Contains("three.bin rest 2", output.ToString(), StringComparison.Ordinal);
        Assert.Equal(ExitCode.Usage, CalibrateAccelerometerCommand.Run(new CalibrateAccelerometerRequest { Rests = [new FileInfo(log)], BenchRests = ["4", "3"] }, new StringWriter(), error));
        Assert.Contains("--rest 4: three.bin holds 3 bench rest(s)", error.ToString(), StringComparison.Ordinal);
    }

    [Fact]
    public void One_rest_or_a_wrong_order_is_refused()
    {
        using var folder = new TempFolder();
        string up = folder.Write("up.csv", Rest(9.81, seed: 3));
        string down = folder.Write("down.csv", Rest(-9.81, seed: 4));
        var error = new StringWriter();

        Assert.Equal(ExitCode.Usage, CalibrateAccelerometerCommand.Run(new CalibrateAccelerometerRequest { Rests = [new FileInfo(up)] }, new StringWriter(), error));
        Assert.Equal(ExitCode.BadInput, CalibrateAccelerometerCommand.Run(new CalibrateAccelerometerRequest { Rests = [new FileInfo(down), new FileInfo(up)] }, new StringWriter(), error));
        Assert.Contains("up in the first rest", error.ToString(), StringComparison.Ordinal);
    }

    /// <summary>20 s at 200 Hz, Gaussian-like noise of 0.02 m/s² (seeded).</summary>
    private static string Rest(double level, int seed)
    {
        var random = new Random(seed);
        var text = new StringBuilder("t_s,ax_mps2\n");
        for (int i = 0; i < 4000; i++)
        {
            double noise = 0.02 * (random.NextDouble() + random.NextDouble() + random.NextDouble() - 1.5) * 2;
            text.Append(CultureInfo.InvariantCulture, $"{i * 0.005:0.000},{level + noise:0.00000}\n");
        }

        return text.ToString();
    }
}
