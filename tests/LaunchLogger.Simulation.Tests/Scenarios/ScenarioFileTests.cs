using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Simulation.Tests.Scenarios;

public sealed class ScenarioFileTests
{
    [Fact]
    public void A_file_overrides_fields_of_its_base()
    {
        Scenario s = ScenarioFile.Parse("""
            {
              // comments are allowed
              "base": "club-hatch",
              "name": "hatch-24",
              "pickup": { "teeth": 24 },
              "capture": { "kind": "exact_edges" },
              "environment": { "grade_percent": 2.5 },
            }
            """);
        Scenario hatch = BuiltInScenarios.Get("club-hatch");
        Assert.Equal("hatch-24", s.Name);
        Assert.Equal(24, s.Pickup.Teeth);
        Assert.Equal(hatch.Pickup.Axle, s.Pickup.Axle);
        Assert.Equal(CaptureKind.ExactEdges, s.Capture.Kind);
        Assert.Equal(hatch.Capture.LoopPeriodMicros, s.Capture.LoopPeriodMicros);
        Assert.Equal(2.5, s.Environment.GradePercent);
        Assert.Equal(hatch.Vehicle, s.Vehicle);
    }

    [Fact]
    public void Json_round_trips()
    {
        foreach (Scenario s in BuiltInScenarios.Scenarios)
        {
            string json = ScenarioFile.ToJson(s);
            Assert.Equal(json, ScenarioFile.ToJson(ScenarioFile.Parse(json)));
        }
    }

    [Theory]
    [InlineData("""{ "vehicle": { "mas_kg": 3 } }""", "unknown field 'vehicle.mas_kg'")]
    [InlineData("""{ "vehicle": { "mass_kg": "heavy" } }""", "field 'vehicle.mass_kg' must be a number")]
    [InlineData("""{ "vehicle": { "mass_kg": -1 } }""", "field 'vehicle.mass_kg' must be a positive number (was -1)")]
    [InlineData("""{ "capture": { "kind": "smoke" } }""", "field 'capture.kind' must be one of exact_edges, polled_counter")]
    [InlineData("""{ "base": "no-such-car" }""", "field 'base' must name a built-in scenario")]
    [InlineData("""{ "second_pickup": { "teeth": 24, "axel": "front" } }""", "field 'second_pickup.axel' is not a known field")]
    [InlineData("""{ "plan": { "target_speed_mps": null, "target_distance_m": null } }""", "field 'plan.target_speed_mps' or plan.target_distance_m must be set")]
    [InlineData("""{ "drivetrain": { "engine": { "gear_ratios": [3, "x"] } } }""", "field 'drivetrain.engine.gear_ratios[1]' must be a number")]
    [InlineData("""{ "plan": { "mark_held_around_launch_s": 0 } }""", "field 'plan.mark_held_around_launch_s' must be")]
    [InlineData("""{ "vehicle": { "mass_kg": 3 """, "not valid JSON")]
    [InlineData("""[1, 2]""", "must be a JSON object")]
    public void Bad_files_give_one_line_naming_the_file_and_the_field(string json, string expected)
    {
        string path = Path.Combine(Path.GetTempPath(), $"scenario-test-{Guid.NewGuid():N}.json");
        File.WriteAllText(path, json);
        try
        {
            var e = Assert.Throws<ScenarioException>(() => ScenarioFile.Load(path));
            Assert.StartsWith(path + ": ", e.Message);
            Assert.Contains(expected, e.Message);
            Assert.DoesNotContain('\n', e.Message);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void A_missing_file_is_named()
    {
        string path = Path.Combine(Path.GetTempPath(), $"no-such-scenario-{Guid.NewGuid():N}.json");
        var e = Assert.Throws<ScenarioException>(() => ScenarioFile.Load(path));
        Assert.StartsWith(path + ": cannot read the file", e.Message);
    }

    [Fact]
    public void A_file_without_a_name_takes_the_file_name()
    {
        string path = Path.Combine(Path.GetTempPath(), $"uphill-{Guid.NewGuid():N}.json");
        File.WriteAllText(path, """{ "environment": { "grade_percent": 3 } }""");
        try
        {
            Scenario s = ScenarioFile.Load(path);
            Assert.Equal(Path.GetFileNameWithoutExtension(path), s.Name);
            Assert.Equal(BuiltInScenarios.Default.Vehicle, s.Vehicle);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void The_example_files_load()
    {
        string folder = Path.Combine(AppContext.BaseDirectory, "examples");
        string[] files = Directory.GetFiles(folder, "*.json");
        Assert.NotEmpty(files);
        foreach (string file in files)
        {
            Scenario s = ScenarioFile.Load(file);
            Assert.Null(s.Validate());
        }
    }

    [Fact]
    public void Apply_varies_a_scenario_in_code()
    {
        Scenario s = ScenarioFile.Apply(BuiltInScenarios.Default, """{ "pickup": { "teeth": 100 }, "accelerometer": { "present": false } }""");
        Assert.Equal(100, s.Pickup.Teeth);
        Assert.False(s.Accelerometer.Present);
        Assert.Equal(BuiltInScenarios.DefaultName, s.Name);
    }
}
