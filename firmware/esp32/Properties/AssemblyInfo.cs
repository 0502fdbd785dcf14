using System.Reflection;

[assembly: AssemblyTitle("LaunchLogger.Esp32")]
[assembly: AssemblyDescription("LaunchLogger box firmware for an ESP32 DevKit")]
[assembly: AssemblyProduct("LaunchLogger")]
[assembly: AssemblyVersion("0.1.0.0")]
