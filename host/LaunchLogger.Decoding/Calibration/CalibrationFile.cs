using System.Globalization;
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
        Converters = { new JsonStringEnumConverter(JsonNamingPolicy.SnakeCaseLower, allowIntegerValues: false) },
    };

    /// <summary>Loads a settings file.</summary>
    /// <exception cref="InputException">Missing, unreadable or not a settings file; the message says why.</exception>
    public static CalibrationSettings Load(string path)
    {
        ArgumentNullException.ThrowIfNull(path);
        string text;
        try
        {
            text = File.ReadAllText(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException(path, 0, $"cannot read the settings file: {OneLine(e.Message)}", e);
        }

        CalibrationSettings? settings;
        try
        {
            settings = JsonSerializer.Deserialize<CalibrationSettings>(text, Options);
        }
        catch (JsonException e)
        {
            throw new InputException(path, (int)(e.LineNumber ?? -1) + 1, $"not a settings file: {SettingsJsonProblem.Describe<CalibrationSettings>(e, Options)}", e);
        }

        if (settings is null)
        {
            throw new InputException(path, 0, "the settings file is empty");
        }

        string? problem = Check(settings);
        if (problem != null)
        {
            throw new InputException(path, 0, problem);
        }

        return settings;
    }

    /// <summary>Loads the settings file at <paramref name="path"/>, or returns empty settings
    /// when there is no file there yet (the calibration verbs then create it).</summary>
    /// <exception cref="InputException">The file exists but cannot be used.</exception>
    public static CalibrationSettings LoadOrEmpty(string path)
    {
        ArgumentNullException.ThrowIfNull(path);
        return File.Exists(path) ? Load(path) : new CalibrationSettings();
    }

    /// <summary>Writes <paramref name="settings"/> to <paramref name="path"/>: to a temporary
    /// file beside it first, moved into place only when whole, so a failure never leaves a
    /// half-written settings file.</summary>
    /// <exception cref="ArgumentException">The settings break a rule of the format (see <see cref="Check"/>).</exception>
    /// <exception cref="InputException">The file could not be written; the message says why.</exception>
    public static void Save(string path, CalibrationSettings settings)
    {
        ArgumentNullException.ThrowIfNull(path);
        ArgumentNullException.ThrowIfNull(settings);
        string? problem = Check(settings);
        if (problem != null)
        {
            throw new ArgumentException(problem, nameof(settings));
        }

        string full = Path.GetFullPath(path);
        string folder = Path.GetDirectoryName(full) ?? ".";
        string temp = Path.Combine(folder, string.Create(CultureInfo.InvariantCulture, $".{Path.GetFileName(full)}.{Environment.ProcessId}.{Guid.NewGuid():N}.tmp"));
        try
        {
            File.WriteAllText(temp, ToJson(settings) + "\n");
            File.Move(temp, full, overwrite: true);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            TryDelete(temp);
            throw new InputException(path, 0, $"cannot write the settings file: {OneLine(e.Message)}", e);
        }
    }

    /// <summary>The settings as JSON text.</summary>
    public static string ToJson(CalibrationSettings settings) => JsonSerializer.Serialize(settings, Options);

    /// <summary>Checks the values against the format's rules.</summary>
    /// <returns>Null when usable; otherwise one line naming the field.</returns>
    public static string? Check(CalibrationSettings settings)
    {
        ArgumentNullException.ThrowIfNull(settings);
        if (settings.Version < 1 || settings.Version > CalibrationSettings.CurrentVersion)
        {
            return Invariant($"version {settings.Version} is not known to this tool (it reads version {CalibrationSettings.CurrentVersion})");
        }

        if (settings.CircumferenceM is { } c && !(c > 0.1 && c < 10))
        {
            return Invariant($"circumference_m must be between 0.1 and 10 m (was {c})");
        }

        if (settings.StaticCircumferenceM is { } sc && !(sc > 0.1 && sc < 10))
        {
            return Invariant($"static_circumference_m must be between 0.1 and 10 m (was {sc})");
        }

        if (settings.CircumferenceSigmaM is { } cs && !(cs >= 0 && cs < 1))
        {
            return Invariant($"circumference_sigma_m must be from 0 to 1 m (was {cs})");
        }

        if (settings.MountingPitchDeg is { } p && !(Math.Abs(p) < 45))
        {
            return Invariant($"mounting_pitch_deg must be between -45 and 45 degrees (was {p})");
        }

        if (settings.MountingYawDeg is { } y && !(Math.Abs(y) < 45))
        {
            return Invariant($"mounting_yaw_deg must be between -45 and 45 degrees (was {y})");
        }

        foreach ((string name, double? sigma) in new[] { ("mounting_pitch_sigma_deg", settings.MountingPitchSigmaDeg), ("mounting_yaw_sigma_deg", settings.MountingYawSigmaDeg) })
        {
            if (sigma is { } s && !(s >= 0 && s < 45))
            {
                return Invariant($"{name} must be from 0 to 45 degrees (was {s})");
            }
        }

        if (settings.BrakeSwitchDelayS is { } delay && !(delay >= 0 && delay < 0.2))
        {
            return Invariant($"brake_switch_delay_s must be from 0 to 0.2 s (was {delay})");
        }

        if (settings.BrakeSwitchDelaySigmaS is { } delaySigma)
        {
            if (settings.BrakeSwitchDelayS is null)
            {
                return "brake_switch_delay_sigma_s is given without brake_switch_delay_s";
            }

            if (!(delaySigma > 0 && delaySigma < 0.05))
            {
                return Invariant($"brake_switch_delay_sigma_s must be more than 0 and less than 0.05 s (was {delaySigma})");
            }
        }

        if (settings.PickupWheel is { } wheel && wheel is not (Reconstruction.PickupWheel.Driven or Reconstruction.PickupWheel.Undriven or Reconstruction.PickupWheel.DrivenAllWheels))
        {
            return "pickup_wheel must be driven, driven_all_wheels or undriven (leave it out when not known)";
        }

        return CheckToothSpacing(settings.ToothSpacing, settings.ToothSpacingSigma);
    }

    private static string? CheckToothSpacing(IReadOnlyList<double>? spacing, IReadOnlyList<double>? sigma)
    {
        if (spacing is null)
        {
            return sigma is null ? null : "tooth_spacing_sigma is given without tooth_spacing";
        }

        if (spacing.Count < 2 || spacing.Count > 10_000)
        {
            return Invariant($"tooth_spacing must have from 2 to 10000 entries, one per pulse of a revolution (had {spacing.Count})");
        }

        double sum = 0;
        for (int k = 0; k < spacing.Count; k++)
        {
            if (!(spacing[k] > 0.5 && spacing[k] < 1.5))
            {
                return Invariant($"tooth_spacing[{k}] must be between 0.5 and 1.5 (was {spacing[k]})");
            }

            sum += spacing[k];
        }

        if (Math.Abs((sum / spacing.Count) - 1) > 1e-3)
        {
            return Invariant($"tooth_spacing must average 1 (averages {sum / spacing.Count:0.######})");
        }

        if (sigma != null)
        {
            if (sigma.Count != spacing.Count)
            {
                return Invariant($"tooth_spacing_sigma must have as many entries as tooth_spacing ({sigma.Count} against {spacing.Count})");
            }

            for (int k = 0; k < sigma.Count; k++)
            {
                if (!(sigma[k] >= 0 && sigma[k] < 0.5))
                {
                    return Invariant($"tooth_spacing_sigma[{k}] must be from 0 to 0.5 (was {sigma[k]})");
                }
            }
        }

        return null;
    }

    private static string Invariant(FormattableString text) => FormattableString.Invariant(text);

    private static string OneLine(string text) => text.ReplaceLineEndings(" ").Trim();

    private static void TryDelete(string path)
    {
        try
        {
            File.Delete(path);
        }
        catch (IOException)
        {
        }
        catch (UnauthorizedAccessException)
        {
        }
    }
}
