namespace LaunchLogger.Simulation.Scenarios;

/// <summary>A scenario file could not be used. The message is one line naming the file and, where
/// it applies, the field.</summary>
public sealed class ScenarioException : Exception
{
    /// <summary>Creates the exception.</summary>
    public ScenarioException(string message)
        : base(message)
    {
    }

    /// <summary>Creates the exception with its cause.</summary>
    public ScenarioException(string message, Exception inner)
        : base(message, inner)
    {
    }
}
