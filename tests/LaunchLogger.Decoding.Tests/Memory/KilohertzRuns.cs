using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Decoding.Tests.Memory;

/// <summary>Runs large enough for memory to show: the default car, its accelerometer at 1 kHz.</summary>
internal static class KilohertzRuns
{
    /// <summary>The default car driven <paramref name="distanceM"/> metres from standstill with
    /// its accelerometer sampling at 1000 Hz (no target speed: the distance ends the run).</summary>
    public static Scenario Driven(double distanceM)
    {
        Scenario baseline = BuiltInScenarios.Default;
        return baseline with
        {
            Accelerometer = baseline.Accelerometer with { OutputDataRateHz = 1000 },
            Plan = baseline.Plan with { TargetSpeedMps = null, TargetDistanceM = distanceM },
        };
    }
}
