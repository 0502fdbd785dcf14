using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Prescribed.Output;

namespace LaunchLogger.Prescribed.Tests.Decoder;

/// <summary>Feeds a generated record to the decoder the way a user would: as plain-text files
/// through the importer, or as a log through the reader, then the whole analysis.</summary>
public static class DecoderHarness
{
    /// <summary>The record's CSV files, imported and analysed.</summary>
    public static SessionAnalysis AnalyzeText(PrescribedRecord record, AnalysisOptions? options = null)
    {
        string folder = Path.Combine(Path.GetTempPath(), "launchlogger-prescribed-" + Guid.NewGuid().ToString("N"));
        try
        {
            (string pulses, string? accel) = record.WriteFiles(folder);
            DecodedRun run = TextRunImporter.Import(new TextImportRequest
            {
                EdgesPath = record.IsPolled ? null : pulses,
                CountsPath = record.IsPolled ? pulses : null,
                AccelPath = accel,
                Scale = PulseScale.FromOptions(null, record.Spec.Pickup.Teeth, record.Spec.Pickup.Tyre.StatedCircumferenceM),
            });
            return SessionAnalyzer.Analyze([run], Options(record, options));
        }
        finally
        {
            Directory.Delete(folder, true);
        }
    }

    /// <summary>The record's accelerometer file alone, imported and analysed.</summary>
    public static SessionAnalysis AnalyzeAccelerometerOnly(PrescribedRecord record)
    {
        string folder = Path.Combine(Path.GetTempPath(), "launchlogger-prescribed-" + Guid.NewGuid().ToString("N"));
        try
        {
            (_, string? accel) = record.WriteFiles(folder);
            return SessionAnalyzer.Analyze([TextRunImporter.Import(new TextImportRequest { AccelPath = accel })]);
        }
        finally
        {
            Directory.Delete(folder, true);
        }
    }

    /// <summary>The record written as a log by the firmware core, read and analysed.</summary>
    public static SessionAnalysis AnalyzeLog(PrescribedRecord record, AnalysisOptions? options = null) =>
        AnalyzeLog(record, record.Spec.LogOptions, options);

    /// <summary>The record written as a log by the firmware core with the box's options
    /// <paramref name="logOptions"/> (its still block…), read and analysed.</summary>
    public static SessionAnalysis AnalyzeLog(PrescribedRecord record, LogOptions logOptions, AnalysisOptions? options = null)
    {
        LogReadResult log = LogReader.Read(record.ToLog(logOptions), record.Spec.Shape.Name);
        return SessionAnalyzer.Analyze(log.Runs, Options(record, options));
    }

    /// <summary>A pickup wheel without inertia (no <see cref="Sensors.SpinUpLag"/>, the
    /// generator's simplest wheel) does not lag the road as it is spun up, and one without a
    /// <see cref="Sensors.BrakeSlip"/> turns with the road under braking: the decoder is told so,
    /// as it is told the circumference. Any other wheel is decoded with the defaults (or
    /// <paramref name="options"/>, the test's own).</summary>
    private static AnalysisOptions? Options(PrescribedRecord record, AnalysisOptions? options)
    {
        AnalysisOptions? result = options;
        if (record.Spec.Pickup.Brake is null)
        {
            result = (result ?? new AnalysisOptions()) with { BrakeSlip = BrakeSlipPrior.None };
        }

        if (record.Spec.Pickup.SpinUp is not null || record.Spec.Pickup.Slip is not null || record.Spec.Pickup.Spin is not null)
        {
            return result;
        }

        AnalysisOptions given = result ?? new AnalysisOptions();
        return given with { Reconstruction = given.Reconstruction with { UndrivenSlipPerMps2 = 0, UndrivenSlipSigma = 0 } };
    }
}
