using System.Text.Json;
using System.Text.Json.Nodes;
using System.Text.Json.Serialization;

namespace LaunchLogger.Simulation.Scenarios;

/// <summary>Reads and writes scenarios as JSON (SCENARIO-FORMAT.md). A file names a built-in
/// scenario as its <c>base</c> and overrides any of its fields; objects merge field by field,
/// lists and values replace.</summary>
public static class ScenarioFile
{
    /// <summary>The JSON options: snake_case names, enums as snake_case strings, unknown fields
    /// rejected, comments and trailing commas allowed.</summary>
    public static JsonSerializerOptions Options { get; } = CreateOptions();

    /// <summary>Loads a scenario file.</summary>
    /// <exception cref="ScenarioException">The file is unreadable, not JSON, names an unknown
    /// field or base, or holds an out-of-range value; the message names the file and the field.</exception>
    public static Scenario Load(string path)
    {
        ArgumentNullException.ThrowIfNull(path);
        string text;
        try
        {
            text = File.ReadAllText(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or NotSupportedException or ArgumentException)
        {
            throw new ScenarioException($"{path}: cannot read the file: {OneLine(e.Message)}", e);
        }

        Scenario scenario = Parse(text, path);
        if (scenario.Name == "custom" || string.IsNullOrWhiteSpace(scenario.Name))
        {
            scenario = scenario with { Name = Path.GetFileNameWithoutExtension(path) };
        }

        return scenario;
    }

    /// <summary>Parses scenario JSON; <paramref name="source"/> names it in error messages.</summary>
    /// <exception cref="ScenarioException">As for <see cref="Load"/>.</exception>
    public static Scenario Parse(string json, string source = "scenario")
    {
        JsonObject patch = ParseObject(json, source);
        Scenario baseScenario = BuiltInScenarios.Default;
        if (patch["base"] is JsonNode baseNode)
        {
            string? name = baseNode.GetValueKind() == JsonValueKind.String ? baseNode.GetValue<string>() : null;
            if (name is null || !BuiltInScenarios.TryGet(name, out Scenario? found))
            {
                throw new ScenarioException($"{source}: field 'base' must name a built-in scenario ({string.Join(", ", BuiltInScenarios.Names)}), was {baseNode.ToJsonString()}");
            }

            baseScenario = found;
        }

        patch.Remove("base");
        return Merge(baseScenario, patch, source, isBuiltInName: patch["name"] is null);
    }

    /// <summary>Applies JSON overrides to a scenario (the same merge as a file with a base).</summary>
    /// <exception cref="ScenarioException">As for <see cref="Load"/>.</exception>
    public static Scenario Apply(Scenario scenario, string jsonOverrides, string source = "overrides")
    {
        ArgumentNullException.ThrowIfNull(scenario);
        JsonObject patch = ParseObject(jsonOverrides, source);
        if (patch.ContainsKey("base"))
        {
            throw new ScenarioException($"{source}: field 'base' is only allowed in a scenario file");
        }

        return Merge(scenario, patch, source, isBuiltInName: false);
    }

    /// <summary>Writes a scenario as indented JSON, every field included.</summary>
    public static string ToJson(Scenario scenario) => JsonSerializer.Serialize(scenario, Options);

    private static Scenario Merge(Scenario baseScenario, JsonObject patch, string source, bool isBuiltInName)
    {
        JsonObject merged = JsonSerializer.SerializeToNode(baseScenario, Options)!.AsObject();
        MergeInto(merged, patch, "", source);
        if (isBuiltInName && patch.Count > 0)
        {
            merged["name"] = "custom";
        }

        Scenario? scenario;
        try
        {
            scenario = merged.Deserialize<Scenario>(Options);
        }
        catch (JsonException e)
        {
            string field = e.Path is { Length: > 0 } p ? p.TrimStart('$').TrimStart('.') : "?";
            string was = ValueAt(merged, field);
            throw new ScenarioException($"{source}: field '{field}' {Reason(e, FieldType(field))} (was {was})", e);
        }

        if (scenario is null)
        {
            throw new ScenarioException($"{source}: the scenario is empty");
        }

        string? problem = scenario.Validate();
        if (problem != null)
        {
            throw new ScenarioException($"{source}: {problem}");
        }

        return scenario;
    }

    private static void MergeInto(JsonObject target, JsonObject patch, string at, string source)
    {
        foreach ((string key, JsonNode? value) in patch.ToList())
        {
            string path = at.Length == 0 ? key : at + "." + key;
            if (!target.ContainsKey(key))
            {
                throw new ScenarioException($"{source}: unknown field '{path}'");
            }

            if (value is null && target[key] is JsonObject)
            {
                // A null section would reach the simulator as a missing part of the car.
                throw new ScenarioException($"{source}: field '{path}' must not be null (leave it out to keep the base scenario's)");
            }

            if (value is JsonObject patchObject && target[key] is JsonObject targetObject)
            {
                MergeInto(targetObject, patchObject, path, source);
            }
            else
            {
                target[key] = value?.DeepClone();
            }
        }
    }

    private static JsonObject ParseObject(string json, string source)
    {
        JsonNode? node;
        try
        {
            node = JsonNode.Parse(json, documentOptions: new JsonDocumentOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true });
        }
        catch (JsonException e)
        {
            string where = e.LineNumber is { } line ? $" at line {line + 1}, column {(e.BytePositionInLine ?? 0) + 1}" : "";
            throw new ScenarioException($"{source}: not valid JSON{where}", e);
        }

        return node as JsonObject ?? throw new ScenarioException($"{source}: a scenario must be a JSON object {{ ... }}");
    }

    private static string Reason(JsonException e, Type? type)
    {
        if (e.Message.Contains("could not be mapped", StringComparison.Ordinal))
        {
            return "is not a known field";
        }

        Type? t = type is null ? null : Nullable.GetUnderlyingType(type) ?? type;
        if (t is { IsEnum: true })
        {
            var names = Enum.GetNames(t).Select(n => JsonNamingPolicy.SnakeCaseLower.ConvertName(n));
            return "must be one of " + string.Join(", ", names);
        }

        if (t == typeof(double))
        {
            return "must be a number";
        }

        if (t == typeof(int) || t == typeof(long))
        {
            return "must be a whole number";
        }

        if (t == typeof(bool))
        {
            return "must be true or false";
        }

        if (t == typeof(string))
        {
            return "must be a string";
        }

        if (t != null && t.IsGenericType)
        {
            return "must be a list [ ... ]";
        }

        return t != null && t.IsClass ? "must be an object { ... }" : "is malformed";
    }

    /// <summary>The declared type of the scenario property at a JSON path like
    /// <c>drivetrain.engine.gear_ratios[2]</c>; null when the path leads nowhere.</summary>
    private static Type? FieldType(string path)
    {
        Type? type = typeof(Scenario);
        foreach (string part in path.Split('.'))
        {
            if (type is null)
            {
                return null;
            }

            string name = part;
            int bracket = part.IndexOf('[', StringComparison.Ordinal);
            if (bracket >= 0)
            {
                name = part[..bracket];
            }

            var property = type.GetProperties().FirstOrDefault(p => PropertyJsonName(p) == name);
            type = property?.PropertyType;
            if (bracket >= 0 && type is { IsGenericType: true })
            {
                type = type.GetGenericArguments()[0];
            }
        }

        return type;
    }

    private static string PropertyJsonName(System.Reflection.PropertyInfo property) =>
        property.GetCustomAttributes(typeof(JsonPropertyNameAttribute), false) is [JsonPropertyNameAttribute named, ..]
            ? named.Name
            : JsonNamingPolicy.SnakeCaseLower.ConvertName(property.Name);

    private static string ValueAt(JsonNode root, string path)
    {
        JsonNode? node = root;
        foreach (string part in path.Split('.'))
        {
            string name = part;
            int index = -1;
            int bracket = part.IndexOf('[', StringComparison.Ordinal);
            if (bracket >= 0)
            {
                name = part[..bracket];
                _ = int.TryParse(part[(bracket + 1)..].TrimEnd(']'), out index);
            }

            node = node is JsonObject o && o.TryGetPropertyValue(name, out JsonNode? child) ? child : null;
            if (index >= 0)
            {
                node = node is JsonArray a && index < a.Count ? a[index] : null;
            }
        }

        string text = node?.ToJsonString() ?? "null";
        return text.Length > 40 ? text[..40] + "…" : text;
    }

    private static string OneLine(string text) => text.ReplaceLineEndings(" ").Trim();

    private static JsonSerializerOptions CreateOptions()
    {
        var options = new JsonSerializerOptions
        {
            PropertyNamingPolicy = JsonNamingPolicy.SnakeCaseLower,
            UnmappedMemberHandling = JsonUnmappedMemberHandling.Disallow,
            ReadCommentHandling = JsonCommentHandling.Skip,
            AllowTrailingCommas = true,
            WriteIndented = true,
            NumberHandling = JsonNumberHandling.Strict,
        };
        options.Converters.Add(new JsonStringEnumConverter(JsonNamingPolicy.SnakeCaseLower, allowIntegerValues: false));
        options.MakeReadOnly(populateMissingResolver: true);
        return options;
    }
}
