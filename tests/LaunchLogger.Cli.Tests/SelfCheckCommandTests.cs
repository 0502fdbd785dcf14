using System.Text.Json;
using LaunchLogger.Cli.Verbs;

namespace LaunchLogger.Cli.Tests;

public class SelfCheckCommandTests
{
    [Fact]
    public void TheFirmwareCorePassesItsSelfCheck()
    {
        var output = new StringWriter();
        Assert.Equal(ExitCode.Ok, SelfCheckCommand.Run(output));
        Assert.Contains("result: OK", output.ToString());
        Assert.Contains("CRC or stuffing errors: 0", output.ToString());
    }

    [Fact]
    public void TheSelfChecksJsonBoundsTheCoresFiguresAgainstKinematics()
    {
        var output = new StringWriter();
        Assert.Equal(ExitCode.Ok, SelfCheckCommand.Run(output, json: true));
        JsonElement root = JsonDocument.Parse(output.ToString()).RootElement;

        Assert.Equal("ok", root.GetProperty("result").GetString());
        Assert.Equal(0, root.GetProperty("bad_frames").GetInt32());
        Assert.Equal(0, root.GetProperty("sequence_gaps").GetInt32());
        Assert.Equal(1, root.GetProperty("configuration_frames").GetInt32());
        Assert.Equal(1, root.GetProperty("summary_frames").GetInt32());
        Assert.Equal(1, root.GetProperty("runs_closed").GetInt32());
        Assert.True(root.GetProperty("pulse_frames").GetInt32() > 0);

        // REFERENCES.md (kinematics, any textbook): 1 ft at 0.5 g from rest takes √(2·0.3048/4.903325) = 0.35260 s.
        Assert.Equal(Math.Sqrt(2 * 0.3048 / (0.5 * 9.80665)), root.GetProperty("exact_rollout_s").GetDouble(), 5);

        // The core's own figures, held to about three times what they measure (beside each)
        // rather than the self-check's 5 ms pass mark.
        Assert.InRange(root.GetProperty("first_motion_error_s").GetDouble(), -FirstMotionTolS, FirstMotionTolS);
        Assert.InRange(root.GetProperty("rollout_after_motion_s").GetDouble() - 0.35260, -RolloutTolS, RolloutTolS);
    }

    /// <summary>Measured +0.0 ms (the onset falls on the launch's own sample); held to half a
    /// 1 kHz sample, so a 1 ms shift fails.</summary>
    private const double FirstMotionTolS = 0.0005;

    /// <summary>Measured −0.20 ms (straight lines between pulse midpoints over a rising speed);
    /// held to 0.6 ms.</summary>
    private const double RolloutTolS = 0.0006;
}
