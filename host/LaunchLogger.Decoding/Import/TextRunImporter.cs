using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Import;

/// <summary>Builds a <see cref="DecodedRun"/> from plain-text inputs made by other capture
/// hardware or scripts, so that they go through the same reconstruction as logs.</summary>
/// <remarks>Everything is checked before anything is built; the first problem is thrown as an
/// <see cref="InputException"/> naming the file (or option) and line. The run's time axis is the
/// files' own; pulses and samples from two files must share it.</remarks>
public static class TextRunImporter
{
    /// <summary>Option names, for messages.</summary>
    public const string EdgesOption = "--edges";

    /// <summary>Option name of the counts file.</summary>
    public const string CountsOption = "--counts";

    /// <summary>Option name of the accelerometer file.</summary>
    public const string AccelOption = "--accel";

    /// <summary>Reads the files the request names into one run.</summary>
    /// <exception cref="InputException">The request or a file is unusable.</exception>
    public static DecodedRun Import(TextImportRequest request)
    {
        ArgumentNullException.ThrowIfNull(request);
        if (request.EdgesPath != null && request.CountsPath != null)
        {
            throw new InputException(CountsOption, 0, $"give {EdgesOption} or {CountsOption}, not both");
        }

        string? pulsePath = request.EdgesPath ?? request.CountsPath;
        if (pulsePath == null && request.AccelPath == null)
        {
            throw new InputException(EdgesOption, 0, $"nothing to import: give {EdgesOption} or {CountsOption}, and/or {AccelOption}");
        }

        if (pulsePath != null && request.Scale == null)
        {
            throw new InputException(
                PulseScale.MetresPerPulseOption,
                0,
                $"needed with {(request.EdgesPath != null ? EdgesOption : CountsOption)}: give it, or {PulseScale.PulsesPerRevOption} with {PulseScale.CircumferenceOption}");
        }

        IReadOnlyList<PulseRecord> pulses = request.EdgesPath != null
            ? EdgeFile.Read(request.EdgesPath)
            : request.CountsPath != null ? CountFile.Read(request.CountsPath) : [];
        AccelSeries? accel = request.AccelPath != null ? AccelFile.Read(request.AccelPath) : null;

        double firstS = Math.Min(
            pulses.Count > 0 ? pulses[0].LoS : double.PositiveInfinity,
            accel != null ? accel.TimeS[0] : double.PositiveInfinity);
        PulseScale? scale = request.Scale;
        var configuration = new RunConfiguration
        {
            OpenedS = firstS,
            PulsesPerRevolution = scale?.PulsesPerRevolution ?? 0,
            CircumferenceM = scale?.CircumferenceM ?? 0,
            MetresPerPulse = pulsePath != null ? scale!.MetresPerPulse : 0,
            HasAccelerometer = accel != null,
            AccelNominalRateHz = accel != null ? 1 / accel.SamplePeriodS : 0,
        };
        string source = string.Join(" + ", new[] { pulsePath, request.AccelPath }.Where(p => p != null).Select(p => Path.GetFileName(p!)));
        var warnings = new List<string>();
        if (pulsePath == null)
        {
            warnings.Add("accelerometer only: distance and speed come from integrating acceleration and drift with time");
        }

        return new DecodedRun
        {
            Source = source,
            Configuration = configuration,
            Pulses = pulses,
            Accel = accel,
            Complete = true,
            Warnings = warnings,
        };
    }
}
