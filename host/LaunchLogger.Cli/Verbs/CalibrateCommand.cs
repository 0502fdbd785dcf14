using System.CommandLine;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger calibrate …</c>: measure the car and the box, and keep the results
/// in a settings file that <c>launchlogger report --settings</c> applies.</summary>
public static class CalibrateCommand
{
    /// <summary>Builds the verb with its sub-verbs.</summary>
    public static Command Create()
    {
        return new Command(
            "calibrate",
            "Measure the rolling circumference, the accelerometer's scale and mounting and the pickup's tooth spacing from logs, " +
            "and save them in a settings file for report --settings. Calibration runs are runs: closed ground only, never public roads.")
        {
            CalibrateDistanceCommand.Create(),
            CalibrateTyreSizeCommand.Create(),
            CalibrateAccelerometerCommand.Create(),
            CalibrateMountingCommand.Create(),
            CalibrateTeethCommand.Create(),
        };
    }
}
