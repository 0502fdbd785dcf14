using System.CommandLine;
using System.Text.Json;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Reconstruction;
using static LaunchLogger.Cli.Verbs.CalibrateSupport;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger calibrate tyre-size</c>: the tyre's static circumference, from its
/// size marking or a tape round the tread, for a car whose rolling circumference is not measured
/// yet. Saved as <c>static_circumference_m</c>; the report then takes the tyre to roll on a little
/// less and to grow with speed as a typical tyre does (<see cref="TyrePrior"/>).</summary>
public static class CalibrateTyreSizeCommand
{
    private const string Verb = "tyre-size";

    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var size = new Option<string?>("--size") { Description = "The size marking on the sidewall, e.g. 205/55R16." };
        var tape = new Option<double?>("--static-circumference-m") { Description = "Circumference measured with a tape round the tread, m (at the pressure you run, car off the ground or the tape round the unloaded part)." };
        var settings = new Option<FileInfo?>("--settings") { Description = "Settings file to create or update (other settings in it are kept)." };
        var json = new Option<bool>("--json") { Description = "Write the result as JSON." };
        var command = new Command(
            Verb,
            "Static circumference from the tyre's size or a tape, until a roll measures the rolling one (calibrate distance): the report takes the tyre to roll on 1 % less ± 1 % and to grow with speed.")
        {
            size, tape, settings, json,
        };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(
            parse.GetValue(size),
            parse.GetValue(tape),
            parse.GetValue(settings),
            parse.GetValue(json),
            parse.InvocationConfiguration.Output,
            parse.InvocationConfiguration.Error)));
        return command;
    }

    /// <summary>Runs the verb.</summary>
    public static ExitCode Run(string? size, double? staticCircumferenceM, FileInfo? settings, bool json, TextWriter output, TextWriter error)
    {
        ArgumentNullException.ThrowIfNull(output);
        return Guarded(Verb, error, () =>
        {
            if ((size is null) == (staticCircumferenceM is null))
            {
                throw new UsageException("give either --size (e.g. 205/55R16) or --static-circumference-m");
            }

            TyreSize? marking = null;
            if (size != null)
            {
                marking = TyreSize.Parse(size) ?? throw new UsageException($"--size '{size}' is not a metric size marking such as 205/55R16 (width 100-400 mm, aspect 20-100, rim 10-24 in)");
            }

            double circumference = marking?.StaticCircumferenceM ?? staticCircumferenceM!.Value;
            if (!(circumference > 0.5 && circumference < 5))
            {
                throw new UsageException("--static-circumference-m must be a tyre's circumference, 0.5 to 5 m");
            }

            CalibrationSettings? existing = LoadExisting(settings);
            if (existing?.CircumferenceM is { } rolled)
            {
                error.WriteLine($"launchlogger calibrate {Verb}: the settings already hold a rolled circumference ({F(rolled, "0.00000")} m), which the report uses in place of a static one");
            }

            SaveIfAsked(settings, existing is null ? null : existing with { StaticCircumferenceM = Round(circumference, 6) });
            double sigma = new ReconstructionOptions().CircumferenceSigmaFraction;
            double rolling = circumference * TyrePrior.RollingOverStatic;
            if (json)
            {
                output.WriteLine(JsonSerializer.Serialize(
                    new
                    {
                        Calibration = "static_circumference",
                        Size = marking is null ? null : $"{marking.WidthMm}/{marking.AspectPercent}R{F(marking.RimInches, "0.#")}",
                        DiameterM = marking?.DiameterM,
                        StaticCircumferenceM = circumference,
                        RollingCircumferenceTakenM = rolling,
                        RollingSigmaM = sigma * rolling,
                        GrowthAt30MpsTaken = TyrePrior.GrowthAt30Mps,
                        SavedTo = settings?.ToString(),
                    },
                    JsonOptions));
                return ExitCode.Ok;
            }

            output.WriteLine(marking is null
                ? "Static circumference from a tape round the tread"
                : $"Static circumference from the size marking {marking.WidthMm}/{marking.AspectPercent}R{F(marking.RimInches, "0.#")} (rim + 2 sidewalls: {F(marking.DiameterM * 1000, "0.0")} mm across)");
            output.WriteLine($"  static circumference   {F(circumference, "0.00000")} m  →  {F(Math.Round(circumference * 1e6), "0")} µm for the box's configuration");
            output.WriteLine($"  rolling, taken         {F(rolling, "0.00000")} m ± {F(sigma * rolling, "0.00000")} m (1 σ; a loaded tyre rolls on 0-2 % less)");
            output.WriteLine($"  growth with speed      {F(TyrePrior.GrowthAt30Mps * 100, "0.00")} % at 30 m/s (67 mph), ± {F(new ReconstructionOptions().TyreGrowthSigmaAt30Mps * 100, "0.0")} %");
            output.WriteLine("  A roll over a measured distance (calibrate distance, hardware-notes/calibration.md §1) replaces all of this with a figure good to 0.1 %.");
            SayWhatWasSaved(settings, "static_circumference_m", output);
            return ExitCode.Ok;
        });
    }
}
