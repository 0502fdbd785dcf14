namespace LaunchLogger.Archive.Board;

/// <summary>Where a standing-start figure's clock starts.</summary>
public enum Convention
{
    /// <summary>At true standstill (first motion).</summary>
    Standstill,

    /// <summary>When the car has covered the rollout (normally 1 ft, 0.3048 m): the strip's clock.</summary>
    Rollout,
}
