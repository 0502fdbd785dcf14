using System.CommandLine;
using System.CommandLine.Parsing;
using System.Text.RegularExpressions;

namespace LaunchLogger.Cli;

/// <summary>Writes the command line's parse errors the way every verb writes its own: one line
/// each, "launchlogger VERB: what is wrong", in the user's words — the option, the value given and
/// what it must be — never a .NET type name, followed by one line pointing at the verb's --help
/// (instead of the whole help text, which buried the one line that mattered).</summary>
public static partial class ParseErrorMessages
{
    /// <summary>Writes <paramref name="parsed"/>'s errors to <paramref name="error"/>.</summary>
    public static void Write(ParseResult parsed, TextWriter error)
    {
        string verb = VerbPath(parsed.CommandResult);
        foreach (ParseError e in parsed.Errors)
        {
            error.WriteLine($"{verb}: {Describe(e, parsed.CommandResult)}");
        }

        error.WriteLine($"{verb}: see `{verb} --help`");
    }

    /// <summary>One error in the user's words.</summary>
    public static string Describe(ParseError e, CommandResult command)
    {
        Match cannotParse = CannotParse().Match(e.Message);
        if (cannotParse.Success)
        {
            string value = cannotParse.Groups["value"].Value;
            string name = cannotParse.Groups["name"].Value;
            Type? type = ValueType(e.SymbolResult);
            return $"{name} '{value}': {Expected(type)}";
        }

        if (e.Message.StartsWith("Required command was not provided", StringComparison.Ordinal))
        {
            string[] verbs = command.Command.Subcommands.Where(c => !c.Hidden).Select(c => c.Name).ToArray();
            return verbs.Length > 0 ? $"give a command: {string.Join(", ", verbs)}" : "a command is missing";
        }

        Match notRecognized = NotRecognized().Match(e.Message);
        if (notRecognized.Success)
        {
            string allowed = string.Join(", ", notRecognized.Groups["allowed"].Captures.Select(c => c.Value));
            string name = e.SymbolResult is OptionResult option ? option.Option.Name : "the value";
            return $"{name} '{notRecognized.Groups["value"].Value}': give one of {allowed}";
        }

        return e.Message.Replace(Environment.NewLine, " ").Replace('\n', ' ').Trim();
    }

    private static string Expected(Type? type)
    {
        type = type is null ? null : Nullable.GetUnderlyingType(type) ?? type;
        if (type is null)
        {
            return "not a value this option takes";
        }

        if (type.IsEnum)
        {
            return $"give one of {string.Join(", ", Enum.GetNames(type).Select(n => n.ToLowerInvariant()))}";
        }

        if (type == typeof(int) || type == typeof(long) || type == typeof(uint) || type == typeof(ulong) || type == typeof(short))
        {
            return "give a whole number";
        }

        if (type == typeof(double) || type == typeof(float) || type == typeof(decimal))
        {
            return "give a number (with a decimal point, e.g. 0.5)";
        }

        if (type == typeof(bool))
        {
            return "give true or false";
        }

        return "not a value this option takes";
    }

    private static Type? ValueType(SymbolResult? result) => result switch
    {
        OptionResult option => option.Option.ValueType,
        ArgumentResult argument => argument.Argument.ValueType,
        _ => null,
    };

    private static string VerbPath(CommandResult? command)
    {
        var names = new List<string>();
        for (SymbolResult? r = command; r is not null; r = r.Parent)
        {
            if (r is CommandResult c && c.Parent is not null)
            {
                names.Add(c.Command.Name);
            }
        }

        names.Add("launchlogger");
        names.Reverse();
        return string.Join(' ', names);
    }

    [GeneratedRegex(@"^Cannot parse argument '(?<value>.*)' for (option|command|argument) '(?<name>[^']*)'", RegexOptions.Singleline)]
    private static partial Regex CannotParse();

    [GeneratedRegex(@"^Argument '(?<value>[^']*)' not recognized\. Must be one of:(\s*'(?<allowed>[^']*)')+", RegexOptions.Singleline)]
    private static partial Regex NotRecognized();
}
