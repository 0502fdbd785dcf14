namespace LaunchLogger.Simulation.Scenarios;

/// <summary>The box: its clock, and the settings the user configured it with (written into each
/// run's configuration frame). SI units here; the simulator converts to the firmware's integers.</summary>
public sealed record BoxSpec
{
    /// <summary>The 32-bit microsecond counter's value when the simulation starts (the box has
    /// been running this long). Near 4 294 967 295 the counter wraps during the run.</summary>
    public long ClockStartMicros { get; init; } = 7_000_000;

    /// <summary>The hardware pulse counters' value when the simulation starts.</summary>
    public long CounterStart { get; init; }

    /// <summary>The rolling circumference the user configured, m; null for the true one at low
    /// speed (a perfect calibration).</summary>
    public double? ConfiguredCircumferenceM { get; init; }

    /// <summary>Rollout distance, m (0.3048 = 1 ft).</summary>
    public double RolloutM { get; init; } = 0.3048;

    /// <summary>Stillness needed to stage, s.</summary>
    public double StageHoldS { get; init; } = 1.0;

    /// <summary>Time without pulses that ends a run, s.</summary>
    public double StopHoldS { get; init; } = 2.0;

    /// <summary>Peak-to-peak band per axis that still counts as still, milli-g (over the means of
    /// blocks of <see cref="StillBlockS"/>).</summary>
    public int StillBandMilliG { get; init; } = 60;

    /// <summary>Length of the blocks whose means the still band bounds, s.</summary>
    public double StillBlockS { get; init; } = 0.05;

    /// <summary>Forward acceleration that means motion, milli-g, averaged over the confirm window or
    /// a still block, whichever holds more samples.</summary>
    public int MotionThresholdMilliG { get; init; } = 40;

    /// <summary>Fewest samples in the accelerometer onset's confirm window.</summary>
    public int MotionConfirmSamples { get; init; } = 16;

    /// <summary>Length of the accelerometer pre-trigger ring, s.</summary>
    public double PreTriggerS { get; init; } = 1.5;

    /// <summary>Bracket width above which an observation counts as wide, µs.</summary>
    public int BracketLimitMicros { get; init; } = 2000;
}
