using System.CommandLine;
using System.CommandLine.Parsing;

namespace LaunchLogger.Cli;

/// <summary>Checks for file arguments: a token that looks like an option (starts with '-') and
/// names no existing file is a mistyped option, a usage error — not a missing input file.</summary>
public static class FileArguments
{
    /// <summary>Adds the check to <paramref name="argument"/> and returns it.</summary>
    public static Argument<T> RejectingUnknownOptions<T>(this Argument<T> argument)
    {
        argument.Validators.Add(result =>
        {
            foreach (Token token in result.Tokens)
            {
                if (token.Value.StartsWith('-') && token.Value.Length > 1 && !File.Exists(token.Value))
                {
                    result.AddError($"unknown option '{token.Value}' (see --help)");
                }
            }
        });
        return argument;
    }
}
