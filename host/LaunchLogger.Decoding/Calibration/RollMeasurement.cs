namespace LaunchLogger.Decoding.Calibration;

/// <summary>The pulses one measured roll counted, from a standstill at the start line to a
/// standstill at the end line: one run, or consecutive runs of one power-up when the car stopped
/// short and crept up to the line.</summary>
/// <param name="Source">Which run or runs, as the log names them.</param>
/// <param name="Pulses">Pulses counted between the two standstills.</param>
/// <param name="PulsesPerRevolution">Pulses per wheel revolution of the distance channel.</param>
/// <param name="ConfiguredCircumferenceM">The rolling circumference the box was configured with, m.</param>
public sealed record RollMeasurement(string Source, long Pulses, int PulsesPerRevolution, double ConfiguredCircumferenceM)
{
    /// <summary>What the reader should know about this roll, one sentence each.</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];
}
