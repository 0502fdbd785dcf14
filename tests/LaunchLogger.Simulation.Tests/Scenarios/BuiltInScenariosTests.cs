using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Simulation.Tests.Scenarios;

public sealed class BuiltInScenariosTests
{
    [Fact]
    public void Names_are_unique_and_the_default_is_first()
    {
        Assert.Equal(BuiltInScenarios.Names.Count, BuiltInScenarios.Names.Distinct().Count());
        Assert.Equal(BuiltInScenarios.DefaultName, BuiltInScenarios.Names[0]);
        Assert.Contains("club-hatch", BuiltInScenarios.Names);
        Assert.Contains("coupe-wheelspin", BuiltInScenarios.Names);
        Assert.Contains("electric-saloon", BuiltInScenarios.Names);
        Assert.Contains("brake-test-60", BuiltInScenarios.Names);
    }

    [Fact]
    public void Every_one_is_valid_and_found_by_name_in_any_case()
    {
        foreach (string name in BuiltInScenarios.Names)
        {
            Assert.Null(BuiltInScenarios.Get(name).Validate());
            Assert.Same(BuiltInScenarios.Get(name), BuiltInScenarios.Get(name.ToUpperInvariant()));
        }
    }

    [Fact]
    public void An_unknown_name_lists_the_known_ones()
    {
        var e = Assert.Throws<KeyNotFoundException>(() => BuiltInScenarios.Get("lorry"));
        Assert.Contains("club-hatch", e.Message);
    }

    [Fact]
    public void The_box_settings_follow_the_sensors()
    {
        Scenario s = BuiltInScenarios.Get("club-hatch");
        var settings = Simulator.SettingsFor(s);
        Assert.Null(settings.Validate());
        Assert.Equal(12, settings.PulsesPerRevolution);
        Assert.Equal((int)Math.Round(2 * Math.PI * s.Tyre.RollingRadiusM * 1e6), settings.CircumferenceMicrometres);
        Assert.Equal(400_000, settings.AccelOutputDataRateMilliHz);
        Assert.Equal(304_800, settings.RolloutMicrometres);
    }
}
