using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Reading;

/// <summary>The body of an event frame (LOG-FORMAT.md, frame 0x04).</summary>
/// <param name="Kind">What happened; kinds this reader does not know keep no extra fields.</param>
/// <param name="TimeMicros">When, µs.</param>
/// <param name="Values">The kind's extra fields in log order: Staged: rest x, y, z (milli-g),
/// samples averaged; Motion: cause; Rollout: speed (mm/s); AccelGap: samples presumed lost;
/// BrakeOn, BrakeOff: the loop's gap before the reading (µs) where the log has it; empty for the others.</param>
public sealed record EventBody(EventKind Kind, long TimeMicros, long[] Values);
