using System.Text.Json;
using System.Text.Json.Serialization;
using LaunchLogger.Decoding.Import;

namespace LaunchLogger.Decoding.Calibration;

/// <summary>Reads and writes <see cref="CalibrationSettings"/> as JSON (snake_case names, SI
/// units except angles in degrees as the names say).</summary>
public static class CalibrationFile
{
    /// <summary>The serializer settings.</summary>
    public static JsonSerializerOptions Options { get; } = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
        DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull,
        WriteIndented = true,
        UnmappedMemberHandling = JsonUnmappedMemberHandling.Disallow,
    };

    /// <summary>Loads a settings file.</summary>
    /// <exception cref="InputException">Missing, unreadable or not a settings file; the message says why.</exception>
    public static CalibrationSettings Load(string path)
    {
        string text;
        try
        {
            text = File.ReadAllText(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException(path, 0, $"cannot read the settings file: {e.Message}", e);
        }

        try
        {
            CalibrationSettings? settings = JsonSerializer.Deserialize<CalibrationSettings>(text, Options);
            if (settings is null)
            {
                throw new InputException(path, 0, "the settings file is empty");
            }

            if (settings.CircumferenceM is { } c && !(c > 0.1 && c < 10))
            {
                throw new InputException(path, 0, $"circumference_m must be between 0.1 and 10 m (was {c})");
            }

            return settings;
        }
        catch (JsonException e)
        {
            throw new InputException(path, (int)(e.LineNumber ?? -1) + 1, $"not a settings file: {e.Message}", e);
        }
    }

    /// <summary>The settings as JSON text.</summary>
    public static string ToJson(CalibrationSettings settings) => JsonSerializer.Serialize(settings, Options);
}
