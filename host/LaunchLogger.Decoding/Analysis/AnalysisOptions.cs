using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Verdicts;

namespace LaunchLogger.Decoding.Analysis;

/// <summary>Everything a user can ask of the analysis of a run.</summary>
public sealed record AnalysisOptions
{
    /// <summary>The defaults.</summary>
    public static AnalysisOptions Default { get; } = new();

    /// <summary>Which figures to time.</summary>
    public FigureRequest Figures { get; init; } = FigureRequest.Standard;

    /// <summary>Reconstruction settings.</summary>
    public ReconstructionOptions Reconstruction { get; init; } = ReconstructionOptions.Default;

    /// <summary>Rollout distance override, m; null takes the run's configured one.</summary>
    public double? RolloutM { get; init; }

    /// <summary>Extra nominal speeds to correct stops to, m/s (60 mph and 100 km/h always).</summary>
    public IReadOnlyList<double> StopFromMps { get; init; } = [];

    /// <summary>Calibration of the car and box, when the user has one.</summary>
    public CalibrationSettings? Calibration { get; init; }

    /// <summary>Weather during the runs, when given: figures are also shown corrected to standard air.</summary>
    public Weather? Weather { get; init; }

    /// <summary>How long the brake switch takes to close after the pedal starts to move, s,
    /// when measured (on the bench); subtracted from the switch's time. When null, the
    /// <see cref="Calibration"/>'s <c>brake_switch_delay_s</c> is taken if it has one. Null:
    /// not measured, taken as uniform over 0–30 ms (<see cref="Braking.BrakeSwitchTiming"/>), and,
    /// where an accelerometer was logged, combined with the deceleration's onset
    /// (<see cref="Braking.BrakeOnsetFusion"/>); measured, the switch alone times the onset.</summary>
    public double? BrakeSwitchDelayS { get; init; }

    /// <summary>1-σ of a measured <see cref="BrakeSwitchDelayS"/>, s.</summary>
    public double BrakeSwitchDelaySigmaS { get; init; } = 0.001;

    /// <summary>The pickup tyre's slip stiffness under braking, for the shortfall of its pulses
    /// over a stop (<see cref="Braking.BrakeSlipPrior"/>); car tyres unless told.</summary>
    public Braking.BrakeSlipPrior BrakeSlip { get; init; } = Braking.BrakeSlipPrior.CarTyres;

    /// <summary>Verdict thresholds.</summary>
    public VerdictLimits Limits { get; init; } = VerdictLimits.Default;
}
