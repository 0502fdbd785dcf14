using System.Text.Json.Serialization;

namespace LaunchLogger.Simulation.Truth;

/// <summary>What the sensors really were, for judging calibrations and estimators.</summary>
public sealed record SensorTruth
{
    /// <summary>Pulses per wheel revolution on channel 0.</summary>
    public int PulsesPerRevolution { get; init; }

    /// <summary>True rolling circumference of the channel 0 wheel at low speed, m.</summary>
    public double TrueCircumferenceM { get; init; }

    /// <summary>The circumference configured in the box, m.</summary>
    public double ConfiguredCircumferenceM { get; init; }

    /// <summary>Positions of channel 0's edges around its ring, revolutions in [0, 1), in the
    /// order they pass the sensor, starting with the edge counted first (hardware count
    /// <c>box.counter_start</c> + 1): the gaps between them are the true tooth spacing.</summary>
    [JsonIgnore]
    public IReadOnlyList<double> EdgePositionsRev { get; init; } = [];

    /// <summary>True metres per pulse at low speed without slip.</summary>
    public double TrueMetresPerPulse => TrueCircumferenceM / PulsesPerRevolution;

    /// <summary>True when the channel 0 wheel is driven (its pulses show wheelspin).</summary>
    public bool PickupOnDrivenWheel { get; init; }

    /// <summary>Pulses counted on channel 0 from first motion to the end.</summary>
    public long Pulses { get; init; }

    /// <summary>Pulses per revolution on channel 1; null without a second pickup.</summary>
    public int? SecondPulsesPerRevolution { get; init; }

    /// <summary>True when an accelerometer is fitted.</summary>
    public bool AccelPresent { get; init; }

    /// <summary>The accelerometer's true sample rate on the box's clock, Hz.</summary>
    public double? AccelTrueRateHz { get; init; }

    /// <summary>Its nominal rate, Hz.</summary>
    public double? AccelNominalRateHz { get; init; }

    /// <summary>1-σ noise on each axis per sample, milli-g (before quantisation).</summary>
    public double? AccelNoiseSigmaMilliG { get; init; }

    /// <summary>Samples produced by the sensor in the whole simulation.</summary>
    public long AccelSamplesProduced { get; init; }

    /// <summary>Samples lost to FIFO overflow.</summary>
    public long AccelSamplesLost { get; init; }

    /// <summary>Accelerometer mounting pitch (x axis' front raised), degrees.</summary>
    public double? AccelMountPitchDeg { get; init; }

    /// <summary>Accelerometer mounting roll (y axis' left end raised), degrees.</summary>
    public double? AccelMountRollDeg { get; init; }

    /// <summary>Accelerometer mounting yaw (x axis turned left), degrees.</summary>
    public double? AccelMountYawDeg { get; init; }
}
