using LaunchLogger.Prescribed.Motion;

namespace LaunchLogger.Prescribed.Shapes;

/// <summary>A named prescribed record and what it is.</summary>
/// <param name="Name">A few words, for listings and test names.</param>
/// <param name="Kind">Its family.</param>
/// <param name="Profile">The trajectory.</param>
public sealed record Shape(string Name, ShapeKind Kind, MotionProfile Profile)
{
    /// <summary>True when every run starts from rest (standing-start figures are due).</summary>
    public bool StandingOnly => Profile.Runs.All(r => r.Standing);

    /// <summary>Number of runs in the record.</summary>
    public int RunCount => Profile.Runs.Count;

    /// <inheritdoc/>
    public override string ToString() => Name;
}
