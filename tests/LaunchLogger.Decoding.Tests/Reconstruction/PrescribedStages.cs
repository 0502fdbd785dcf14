using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Prescribed;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>A record from the independent generator (<see cref="PrescribedRecord"/>) written as
/// plain-text files, imported as a user's would be, and taken through the stages that come before
/// the one under test, wired as the pass wires them: the distance channel, how the first pulses
/// open the record, and the accelerometer stage.</summary>
internal sealed class PrescribedStages
{
    private PrescribedStages(DecodedRun run, ReconstructionOptions options)
    {
        Run = run;
        Options = options;
        Channel = ChannelSetup.Choose(run, options);
        Opening = Channel.Pulses is { } p ? StartMotion.Estimate(p, Channel.MetresPerPulse, Channel.StartNoiseM) : null;
        Staged = run.Configuration.Staged && Opening is not { Moving: true };
        Accel = ForwardAcceleration.From(run.Accel)!;
        Prepared = AccelSetup.Prepare(new AccelSetupInputs
        {
            Accel = Accel,
            Pulses = Channel.Pulses,
            MetresPerPulse = Channel.MetresPerPulse,
            Staged = Staged,
            Opening = Opening,
            Options = options,
        });
    }

    public DecodedRun Run { get; }

    public ReconstructionOptions Options { get; }

    public DistanceChannel Channel { get; }

    public StartMotion? Opening { get; }

    public bool Staged { get; }

    public ForwardAcceleration Accel { get; }

    public PreparedAccel Prepared { get; }

    /// <summary>The record's files (the accelerometer's alone when <paramref name="accelOnly"/>)
    /// through the importer and the stages. A wheel without inertia does not lag the road as it
    /// is spun up: the options are told so, as the circumference is told.</summary>
    public static PrescribedStages Of(PrescribedRecord record, bool accelOnly = false)
    {
        string folder = Path.Combine(Path.GetTempPath(), "launchlogger-stages-" + Guid.NewGuid().ToString("N"));
        try
        {
            (string pulses, string? accel) = record.WriteFiles(folder);
            DecodedRun run = TextRunImporter.Import(new TextImportRequest
            {
                EdgesPath = accelOnly || record.IsPolled ? null : pulses,
                CountsPath = !accelOnly && record.IsPolled ? pulses : null,
                AccelPath = accel,
                Scale = accelOnly ? null : PulseScale.FromOptions(null, record.Spec.Pickup.Teeth, record.Spec.Pickup.Tyre.StatedCircumferenceM),
            });
            var options = new ReconstructionOptions();
            if (record.Spec.Pickup.SpinUp is null && record.Spec.Pickup.Slip is null)
            {
                options = options with { UndrivenSlipPerMps2 = 0, UndrivenSlipSigma = 0 };
            }

            return new PrescribedStages(run, options);
        }
        finally
        {
            Directory.Delete(folder, true);
        }
    }
}
