namespace LaunchLogger.Decoding.Reading;

/// <summary>One pulse observation of a pulses body as written: the count reached and its
/// bracket in µs of the box's clock (the channel is the body's).</summary>
/// <param name="Count">Pulses since the run's origin.</param>
/// <param name="LoMicros">Bracket start (exclusive), µs.</param>
/// <param name="HiMicros">Bracket end (inclusive), µs.</param>
internal readonly record struct PulseMicros(long Count, long LoMicros, long HiMicros);
