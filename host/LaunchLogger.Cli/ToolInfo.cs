using System.Reflection;

namespace LaunchLogger.Cli;

/// <summary>Facts about this build of the tool.</summary>
public static class ToolInfo
{
    /// <summary>The tool's version, e.g. "0.1.0".</summary>
    public static string Version { get; } =
        typeof(ToolInfo).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion.Split('+')[0] ?? "0.0.0";
}
