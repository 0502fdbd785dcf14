using System.Runtime.InteropServices;
using LaunchLogger.Cli;

// The verbs are composed in LaunchLoggerCommand; each lives in Verbs/ with its own factory and handler.
// Ctrl+C (SIGINT) and SIGTERM cancel the verb's token, so that it stops at its next check and
// removes what it was writing; a second signal ends the process at once.
using var interrupted = new CancellationTokenSource();
using PosixSignalRegistration sigint = PosixSignalRegistration.Create(PosixSignal.SIGINT, Interrupt);
using PosixSignalRegistration sigterm = PosixSignalRegistration.Create(PosixSignal.SIGTERM, Interrupt);
SafetyNotice.ShowOnFirstRun(Console.Error);
return await LaunchLoggerCommand.InvokeAsync(args, Console.Out, Console.Error, interrupted.Token);

void Interrupt(PosixSignalContext signal)
{
    if (!interrupted.IsCancellationRequested)
    {
        signal.Cancel = true;
        interrupted.Cancel();
    }
}
