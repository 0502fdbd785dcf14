namespace LaunchLogger.Decoding.Reading;

/// <summary>The body of a health frame (LOG-FORMAT.md, frame 0x05): counters since power-up.</summary>
/// <param name="TimeMicros">When the counters were read, µs.</param>
/// <param name="Counters">The counters this reader knows, in log order (at most
/// <see cref="LaunchLogger.Firmware.Wire.LogFormat.HealthCounterCount"/>; fewer when the writer
/// sent fewer). Names are in <see cref="Runs.HealthCounterNames"/>.</param>
public sealed record HealthBody(long TimeMicros, long[] Counters);
