namespace LaunchLogger.Decoding.Runs;

/// <summary>What a run's configuration frame says (LOG-FORMAT.md, frame 0x01), in SI units, or
/// what the command line said for a plain-text input.</summary>
public sealed record RunConfiguration
{
    /// <summary>Log format version; 0 for plain-text inputs.</summary>
    public int FormatVersion { get; init; }

    /// <summary>Firmware version as "major.minor.patch"; empty for plain-text inputs.</summary>
    public string FirmwareVersion { get; init; } = "";

    /// <summary>Run number since the box powered up (1-based); 1 for plain-text inputs.</summary>
    public int RunNumber { get; init; } = 1;

    /// <summary>When the run opened, seconds on the input's axis.</summary>
    public double OpenedS { get; init; }

    /// <summary>True when the run opened from standstill after staging.</summary>
    public bool Staged { get; init; } = true;

    /// <summary>Pulses per wheel revolution, distance channel.</summary>
    public int PulsesPerRevolution { get; init; }

    /// <summary>Rolling circumference, distance channel, metres.</summary>
    public double CircumferenceM { get; init; }

    /// <summary>Distance per pulse of the distance channel, metres.</summary>
    public double MetresPerPulse { get; init; }

    /// <summary>True when a second pulse channel was recorded.</summary>
    public bool HasSecondChannel { get; init; }

    /// <summary>Distance per pulse of the second channel, metres (0 without one).</summary>
    public double SecondMetresPerPulse { get; init; }

    /// <summary>Pulses per wheel revolution of the second channel (0 without one, or when not
    /// known: its tooth positions are then not measured).</summary>
    public int SecondPulsesPerRevolution { get; init; }

    /// <summary>The rollout distance the box used, metres (0.3048 by default).</summary>
    public double RolloutM { get; init; } = 0.3048;

    /// <summary>True when an accelerometer was fitted.</summary>
    public bool HasAccelerometer { get; init; }

    /// <summary>Nominal accelerometer output data rate, Hz.</summary>
    public double AccelNominalRateHz { get; init; }

    /// <summary>Accelerometer full scale, m/s².</summary>
    public double AccelFullScaleMps2 { get; init; }

    /// <summary>Sensor axis pointing forward (0 = x, 1 = y, 2 = z).</summary>
    public int ForwardAxis { get; init; }

    /// <summary>True when that axis points backward.</summary>
    public bool ForwardAxisReversed { get; init; }

    /// <summary>Time without pulses that ended the run on the box, seconds.</summary>
    public double StopHoldS { get; init; }

    /// <summary>Bracket width above which the box counted an observation as wide, seconds.</summary>
    public double BracketLimitS { get; init; }
}
