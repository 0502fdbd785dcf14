using System.CommandLine;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger bench …</c>: benchmark commands. Each prints its own table; none is
/// a test, and none asserts a time.</summary>
public static class BenchCommand
{
    /// <summary>Builds the verb with its sub-verbs.</summary>
    public static Command Create()
    {
        return new Command("bench", "Measure speed, memory and accuracy.")
        {
            BenchCoreCommand.Create(),
            BenchAccuracyCommand.Create(),
            BenchDecodeCommand.Create(),
            BenchBrakingCommand.Create(),
            BenchArchiveCommand.Create(),
            BenchRobustnessCommand.Create(),
            BenchCrossCheckCommand.Create(),
        };
    }
}
