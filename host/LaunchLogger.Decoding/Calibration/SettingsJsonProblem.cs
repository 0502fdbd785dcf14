using System.Text.Json;
using System.Text.Json.Serialization.Metadata;
using System.Text.RegularExpressions;
using Quickenshtein;

namespace LaunchLogger.Decoding.Calibration;

/// <summary>Says what is wrong in a settings file the JSON reader refused, in the file's own
/// words: an unknown name (with the known name it most likely meant), a value of the wrong kind
/// (naming the setting and what it must be), or where the JSON itself breaks — never a .NET type
/// name, which a user editing the file by hand cannot act on.</summary>
public static partial class SettingsJsonProblem
{
    /// <summary>One line for <paramref name="e"/>, thrown reading <typeparamref name="T"/> with
    /// <paramref name="options"/>.</summary>
    public static string Describe<T>(JsonException e, JsonSerializerOptions options)
    {
        ArgumentNullException.ThrowIfNull(e);
        ArgumentNullException.ThrowIfNull(options);
        JsonTypeInfo info = options.GetTypeInfo(typeof(T));
        string[] known = info.Properties.Select(p => p.Name).Order(StringComparer.Ordinal).ToArray();

        Match unknown = Unmapped().Match(e.Message);
        if (unknown.Success)
        {
            string name = unknown.Groups["name"].Value;
            string? nearest = known.MinBy(k => Distance(name, k));
            string guess = nearest is not null && Distance(name, nearest) <= Math.Max(2, name.Length / 4) ? $"; did you mean '{nearest}'?" : "";
            return $"unknown setting '{name}'{guess} (known: {string.Join(", ", known)})";
        }

        string? setting = e.Path is { Length: > 2 } path && path.StartsWith("$.", StringComparison.Ordinal) ? path[2..] : null;
        JsonPropertyInfo? property = setting is null ? null : info.Properties.FirstOrDefault(p => p.Name == setting);
        if (property is not null && e.Message.StartsWith("The JSON value could not be converted", StringComparison.Ordinal))
        {
            return $"'{setting}' {Kind(property.PropertyType)}";
        }

        string where = e.LineNumber is { } line ? $"line {line + 1}, column {(e.BytePositionInLine ?? 0) + 1}: " : "";
        return $"not valid JSON at {where}{Reason(e.Message)}";
    }

    private static string Kind(Type type)
    {
        type = Nullable.GetUnderlyingType(type) ?? type;
        if (type.IsEnum)
        {
            return $"must be one of {string.Join(", ", Enum.GetNames(type).Select(n => JsonNamingPolicy.SnakeCaseLower.ConvertName(n)))} (in quotes)";
        }

        if (type == typeof(int) || type == typeof(long))
        {
            return "must be a whole number (without quotes)";
        }

        return type == typeof(double) ? "must be a number (without quotes, e.g. 1.8221)" : "has a value of the wrong kind";
    }

    // The reader's own sentence, without its advice to programmers and its position (given above).
    private static string Reason(string message)
    {
        string reason = message.Split(" Path: ", 2)[0].Replace(" Change the reader options.", "", StringComparison.Ordinal);
        reason = reason.Split(" LineNumber: ", 2)[0].Trim().TrimEnd('.');
        return reason.Length > 0 ? char.ToLowerInvariant(reason[0]) + reason[1..] : "unreadable";
    }

    // The edit distance (insertions, deletions, substitutions: Levenshtein's) from Quickenshtein.
    private static int Distance(string a, string b) => Levenshtein.GetDistance(a, b);

    [GeneratedRegex(@"^The JSON property '(?<name>[^']*)' could not be mapped")]
    private static partial Regex Unmapped();
}
