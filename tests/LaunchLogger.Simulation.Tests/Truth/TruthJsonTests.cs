using System.Text.Json;
using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Truth;

namespace LaunchLogger.Simulation.Tests.Truth;

public sealed class TruthJsonTests
{
    [Fact]
    public void Writes_snake_case_si_truth_with_events_figures_and_series()
    {
        SimulationResult r = Simulator.Run(BuiltInScenarios.Get("brake-test-60"), seed: 1);
        using JsonDocument doc = JsonDocument.Parse(TruthJson.ToJson(r));
        JsonElement root = doc.RootElement;
        Assert.Equal("brake-test-60", root.GetProperty("scenario").GetString());
        Assert.Equal(1, root.GetProperty("seed").GetInt32());

        JsonElement events = root.GetProperty("events");
        Assert.Equal(r.Events.FirstMotionS!.Value, events.GetProperty("first_motion_s").GetDouble(), 1e-6);
        Assert.Equal(r.Events.StoppingDistanceM!.Value, events.GetProperty("stopping_distance_m").GetDouble(), 1e-6);
        Assert.Equal(r.Events.BrakeSwitchOnS!.Value, events.GetProperty("brake_switch_on_s").GetDouble(), 1e-6);

        JsonElement zeroTo60 = root.GetProperty("figures").GetProperty("speed_intervals").EnumerateArray()
            .Single(i => i.GetProperty("label").GetString() == "0-60 mph");
        Assert.True(zeroTo60.GetProperty("from_standstill_s").GetDouble() > zeroTo60.GetProperty("from_rollout_s").GetDouble());
        Assert.True(root.GetProperty("figures").GetProperty("mean_accel_0_to_60_mph_mps2").GetDouble() > 0);

        JsonElement series = root.GetProperty("series");
        int n = series.GetProperty("time_s").GetArrayLength();
        Assert.True(n > 1000);
        Assert.Equal(n, series.GetProperty("distance_m").GetArrayLength());
        Assert.Equal(n, series.GetProperty("speed_mps").GetArrayLength());
        Assert.Equal(n, series.GetProperty("accel_mps2").GetArrayLength());
        Assert.Equal(1, root.GetProperty("box").GetProperty("runs").GetInt32());
        Assert.Equal(0, root.GetProperty("box").GetProperty("health").GetProperty("pulse_observations_dropped").GetInt64());
    }
}
