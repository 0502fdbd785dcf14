using LaunchLogger.Cli;

// The verbs are composed in LaunchLoggerCommand; each lives in Verbs/ with its own factory and handler.
SafetyNotice.ShowOnFirstRun(Console.Error);
return await LaunchLoggerCommand.InvokeAsync(args, Console.Out, Console.Error);
