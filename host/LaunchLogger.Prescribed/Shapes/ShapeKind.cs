namespace LaunchLogger.Prescribed.Shapes;

/// <summary>The families of records the generator makes.</summary>
public enum ShapeKind
{
    /// <summary>Idle at rest, launch, accelerate past the quarter mile, brake to rest.</summary>
    StandingStart,

    /// <summary>The record opens moving; accelerate, brake to rest.</summary>
    RollingStart,

    /// <summary>Steady cruise, then a stop.</summary>
    CruiseThenStop,

    /// <summary>A short launch and an immediate stop.</summary>
    LaunchThenStop,

    /// <summary>Two standing runs in one record, with a wait between.</summary>
    StopAndGo,

    /// <summary>A standing start after a long wait at rest.</summary>
    LongIdle,
}
