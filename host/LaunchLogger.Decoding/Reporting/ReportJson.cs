using System.Text.Json;
using System.Text.Json.Serialization;

namespace LaunchLogger.Decoding.Reporting;

/// <summary>Writes and reads <see cref="ReportDocument"/> as JSON.</summary>
public static class ReportJson
{
    /// <summary>The serializer settings: snake_case names, nulls written, indented; a number that
    /// is not finite is written as null (never as the string "NaN").</summary>
    public static JsonSerializerOptions Options { get; } = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
        DefaultIgnoreCondition = JsonIgnoreCondition.Never,
        WriteIndented = true,
        Converters = { new FiniteNumberConverter() },
    };

    /// <summary>The document as JSON text.</summary>
    public static string Serialize(ReportDocument document) => JsonSerializer.Serialize(document, Options);

    /// <summary>Parses a document written by <see cref="Serialize"/>.</summary>
    public static ReportDocument? Deserialize(string json) => JsonSerializer.Deserialize<ReportDocument>(json, Options);
}
