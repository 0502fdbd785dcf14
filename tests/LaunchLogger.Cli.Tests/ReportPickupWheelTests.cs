using System.Globalization;
using System.Text.Json;
using LaunchLogger.Cli.Verbs;

namespace LaunchLogger.Cli.Tests;

/// <summary><c>report --pickup-wheel</c> and the settings' <c>pickup_wheel</c> reach the
/// reconstruction of a pulses-only standing start.</summary>
public class ReportPickupWheelTests
{
    [Fact]
    public void The_pickup_wheel_told_moves_and_narrows_a_pulses_only_rollout_mark_and_the_option_overrides_the_settings()
    {
        using var folder = new TempFolder();

        // A standing start at 4 m/s² from t = 1 s, edges every 0.04 m: x = 2·(t − 1)².
        string edges = folder.Write("edges.csv", "t_s\n" + string.Join("\n", Enumerable.Range(1, 400).Select(i => (1 + Math.Sqrt(0.04 * i / 2)).ToString("R", CultureInfo.InvariantCulture))) + "\n");
        string undrivenSettings = folder.Write("car.json", "{ \"pickup_wheel\": \"undriven\" }");
        ReportRequest Request(string? settings, string? wheel) => new()
        {
            Edges = new FileInfo(edges),
            MetresPerPulse = 0.04,
            Json = true,
            Settings = settings is null ? null : new FileInfo(settings),
            PickupWheel = PickupWheels.Parse(wheel),
        };

        (double notSaid, double notSaidSigma) = Rollout(Request(null, null));
        (double driven, double drivenSigma) = Rollout(Request(null, "driven"));
        (double undriven, double undrivenSigma) = Rollout(Request(undrivenSettings, null));
        (double overridden, _) = Rollout(Request(undrivenSettings, "driven"));

        // Driven: the wheel counted ahead of the car, so the car reached the first foot later.
        Assert.True(driven > notSaid + 1e-3, $"driven {driven:F4} s against not said {notSaid:F4} s");
        Assert.Equal(notSaid, undriven, 9);
        Assert.True(undrivenSigma < notSaidSigma && drivenSigma < notSaidSigma, $"σ undriven {undrivenSigma:F4}, driven {drivenSigma:F4}, not said {notSaidSigma:F4} s");
        Assert.Equal(driven, overridden, 9);
    }

    private static (double TimeS, double SigmaS) Rollout(ReportRequest request)
    {
        var output = new StringWriter();
        var error = new StringWriter();
        ExitCode code = ReportCommand.Run(request, output, error);
        // Partial: the run never reaches 60 mph, so its verdict is doubtful; the figures are there.
        Assert.True(code is ExitCode.Ok or ExitCode.Partial, $"exit {code}: {error}");
        using JsonDocument json = JsonDocument.Parse(output.ToString());
        JsonElement rollout = json.RootElement.GetProperty("runs")[0].GetProperty("rollout");
        return (rollout.GetProperty("time_s").GetDouble(), rollout.GetProperty("time_uncertainty_s").GetDouble());
    }
}
