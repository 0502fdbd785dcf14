using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Runs;

/// <summary>An event frame of the log, on the input's time axis.</summary>
/// <param name="Kind">What happened.</param>
/// <param name="TimeS">When, seconds.</param>
/// <param name="Values">The kind's extra fields in log order (LOG-FORMAT.md, frame 0x04):
/// Staged: rest x, y, z (milli-g), samples; Motion: cause; Rollout: speed (mm/s); AccelGap: lost samples;
/// BrakeOn, BrakeOff: the loop's gap before the reading (µs), where the log has it.</param>
public sealed record RunEvent(EventKind Kind, double TimeS, long[] Values);
