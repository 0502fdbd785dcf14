namespace LaunchLogger.Plots;

/// <summary>Where an overlay puts each run's zero of time.</summary>
public enum RunAlignment
{
    /// <summary>At first motion (the standstill convention).</summary>
    Standstill,

    /// <summary>At the rollout mark (the after-rollout convention); runs that never reached it
    /// are left out.</summary>
    Rollout,
}
