namespace LaunchLogger.Prescribed.Shapes;

/// <summary>How a standing start's acceleration rises from rest to its peak.</summary>
public enum LaunchTakeUp
{
    /// <summary>A linear ramp (constant jerk from the first instant).</summary>
    Ramp,

    /// <summary>A raised cosine (<see cref="PrescribedShapes.SmoothRise"/>): the jerk starts
    /// and ends at zero.</summary>
    RaisedCosine,

    /// <summary>The ramp's demand through a first-order lag (<see cref="PrescribedShapes.LaggedRise"/>):
    /// the acceleration starts like τ² and eases into the ramp, reaching the peak later by up to
    /// the lag.</summary>
    Lagged,
}
