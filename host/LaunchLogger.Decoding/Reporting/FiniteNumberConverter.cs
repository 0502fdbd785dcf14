using System.Text.Json;
using System.Text.Json.Serialization;

namespace LaunchLogger.Decoding.Reporting;

/// <summary>Writes a number that is not finite (NaN, ±infinity) as JSON <c>null</c>, as
/// REPORT-JSON.md promises ("a figure that could not be computed is null"); reads null back as NaN.</summary>
internal sealed class FiniteNumberConverter : JsonConverter<double>
{
    /// <inheritdoc/>
    public override bool HandleNull => true;

    /// <inheritdoc/>
    public override double Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options) =>
        reader.TokenType == JsonTokenType.Null ? double.NaN : reader.GetDouble();

    /// <inheritdoc/>
    public override void Write(Utf8JsonWriter writer, double value, JsonSerializerOptions options)
    {
        if (double.IsFinite(value))
        {
            writer.WriteNumberValue(value);
        }
        else
        {
            writer.WriteNullValue();
        }
    }
}
