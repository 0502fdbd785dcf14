using LaunchLogger.Cli.Output;

namespace LaunchLogger.Cli.Verbs;

/// <summary>What <c>launchlogger report</c> was asked, typed.</summary>
public sealed record ReportRequest
{
    /// <summary>Log files.</summary>
    public IReadOnlyList<FileInfo> Logs { get; init; } = [];

    /// <summary>Plain-text pulse edge times.</summary>
    public FileInfo? Edges { get; init; }

    /// <summary>Plain-text counter readings.</summary>
    public FileInfo? Counts { get; init; }

    /// <summary>Plain-text accelerometer samples.</summary>
    public FileInfo? Accel { get; init; }

    /// <summary>Distance per pulse, m.</summary>
    public double? MetresPerPulse { get; init; }

    /// <summary>Pulses per wheel revolution.</summary>
    public int? PulsesPerRevolution { get; init; }

    /// <summary>Rolling circumference, m.</summary>
    public double? CircumferenceM { get; init; }

    /// <summary>True for JSON output.</summary>
    public bool Json { get; init; }

    /// <summary>Units for tables.</summary>
    public DisplayUnits Units { get; init; } = DisplayUnits.Imperial;

    /// <summary>Extra speed intervals as typed.</summary>
    public IReadOnlyList<string> Intervals { get; init; } = [];

    /// <summary>Rollout distance override, m.</summary>
    public double? RolloutM { get; init; }

    /// <summary>Weather as typed: "T_C,P_hPa,RH_pct".</summary>
    public string? Weather { get; init; }

    /// <summary>Pairs of runs in opposite directions, as typed: "A,B" (report indexes).</summary>
    public IReadOnlyList<string> Pairs { get; init; } = [];

    /// <summary>A log whose stops bound every launch.</summary>
    public FileInfo? BrakeReference { get; init; }

    /// <summary>Extra nominal speeds to correct stops to, as typed, e.g. "50mph".</summary>
    public IReadOnlyList<string> StopFrom { get; init; } = [];

    /// <summary>A picture of each run's trace to write (.svg or .png); several runs get NAME-runN files.</summary>
    public string? Plot { get; init; }

    /// <summary>Calibration settings file (from <c>launchlogger calibrate</c>) to apply to every run.</summary>
    public FileInfo? Settings { get; init; }

    /// <summary>Which wheel carries the pickup, as told on the command line (<c>--pickup-wheel</c>);
    /// it takes the place of the settings file's <c>pickup_wheel</c>. Null: as the settings say.</summary>
    public LaunchLogger.Decoding.Reconstruction.PickupWheel? PickupWheel { get; init; }

    /// <summary>The pickup tyre's slip stiffness under braking; car tyres unless a caller knows
    /// better (a closed-form input whose edges are the car's own positions: <c>BrakeSlipPrior.None</c>).</summary>
    public LaunchLogger.Decoding.Braking.BrakeSlipPrior BrakeSlip { get; init; } = LaunchLogger.Decoding.Braking.BrakeSlipPrior.CarTyres;
}
