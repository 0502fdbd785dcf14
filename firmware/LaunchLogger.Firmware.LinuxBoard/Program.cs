using System.Runtime.InteropServices;
using LaunchLogger.Firmware.LinuxBoard;
using LaunchLogger.Firmware.LinuxBoard.Configuration;

// launchlogger-board SETTINGS.json — logs until Ctrl+C (or SIGTERM from a service manager).
if (args.Length != 1 || args[0] is "-h" or "--help")
{
    Console.Error.WriteLine("usage: launchlogger-board SETTINGS.json");
    Console.Error.WriteLine("  Logs wheel pulses and acceleration to the folder in the settings file until Ctrl+C.");
    Console.Error.WriteLine("  Closed courses only: never make acceleration or braking runs on public roads.");
    return args.Length == 1 ? BoardApp.ExitOk : BoardApp.ExitBadSettings;
}

BoardSettings settings;
try
{
    settings = BoardSettingsFile.Load(args[0]);
}
catch (BoardSettingsException e)
{
    Console.Error.WriteLine("error: " + e.Message);
    return BoardApp.ExitBadSettings;
}

using var stop = new CancellationTokenSource();
Console.CancelKeyPress += (_, e) =>
{
    e.Cancel = true;
    stop.Cancel();
};
using var terminate = PosixSignalRegistration.Create(PosixSignal.SIGTERM, context =>
{
    context.Cancel = true;
    stop.Cancel();
});

return BoardApp.Run(settings, health => LinuxHardware.Open(settings, health, Console.Error), stop.Token, Console.Out);
