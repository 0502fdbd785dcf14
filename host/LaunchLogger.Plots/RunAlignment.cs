namespace LaunchLogger.Plots;

/// <summary>Where an overlay puts each run's zero of time.</summary>
public enum RunAlignment
{
    /// <summary>At first motion (the standstill convention). Records that opened moving are left out.</summary>
    Standstill,

    /// <summary>At the rollout mark (the after-rollout convention); runs that never reached it
    /// are left out.</summary>
    Rollout,
}
