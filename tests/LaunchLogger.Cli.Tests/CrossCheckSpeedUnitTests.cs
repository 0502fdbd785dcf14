using System.Globalization;
using LaunchLogger.Cli.Verbs;

namespace LaunchLogger.Cli.Tests;

/// <summary>Another instrument's CSV export read with the wrong --speed-unit: before, the check ran
/// on and tabled every figure seconds off ("NO" in every row, exit 1) without saying why; now it
/// stops with exit 2 and names the unit under which the two records agree.</summary>
public sealed class CrossCheckSpeedUnitTests
{
    [Fact]
    public void A_speed_column_in_kmh_read_as_mps_is_named_and_refused()
    {
        string folder = Directory.CreateTempSubdirectory("crosscheck-unit").FullName;
        string log = Path.Combine(folder, "run.log");
        string nmea = Path.Combine(folder, "receiver.nmea");
        var sink = new StringWriter();
        Assert.Equal(ExitCode.Ok, SimulateCommand.Run("brake-test-60", 4, log, null, false, sink, sink, default, nmea, 10));

        // The receiver's record as a CSV of time (s of day) and speed in km/h: RMC's speed is in
        // knots (NMEA 0183), 1 knot = 1.852 km/h exactly (international nautical mile).
        var csv = new System.Text.StringBuilder("t,v\n");
        foreach (string line in File.ReadLines(nmea).Where(l => l.Length > 6 && l[3..6] == "RMC"))
        {
            string[] f = line.Split(',');
            double t = (int.Parse(f[1][..2], CultureInfo.InvariantCulture) * 3600) + (int.Parse(f[1][2..4], CultureInfo.InvariantCulture) * 60) + double.Parse(f[1][4..], CultureInfo.InvariantCulture);
            double kmh = double.Parse(f[7], CultureInfo.InvariantCulture) * 1.852;
            csv.Append(CultureInfo.InvariantCulture, $"{t:0.00},{kmh:0.000}\n");
        }

        string other = Path.Combine(folder, "other.csv");
        File.WriteAllText(other, csv.ToString());

        var right = new StringWriter();
        ExitCode ok = CrossCheckCommand.Run(new FileInfo(log), new FileInfo(other), "auto", "time=t,speed=v", "kmh", "s", 0.1, 1, json: false, new StringWriter(), right);
        Assert.True(ok == ExitCode.Ok, $"exit {ok}: {right}");

        var output = new StringWriter();
        var error = new StringWriter();
        ExitCode wrong = CrossCheckCommand.Run(new FileInfo(log), new FileInfo(other), "auto", "time=t,speed=v", "mps", "s", 0.1, 1, json: false, output, error);
        Assert.Equal(ExitCode.BadInput, wrong);
        Assert.Contains("read as mps, is 3.", error.ToString());
        Assert.Contains("try --speed-unit kmh", error.ToString());
        Assert.Equal("", output.ToString());
    }
}
