namespace LaunchLogger.Decoding.Runs;

/// <summary>One accelerometer burst as the box saw it: the sensor index of its last sample and
/// the box-clock time it was read.</summary>
/// <param name="LastIndex">The sensor's index of the burst's last (newest) sample.</param>
/// <param name="ReadS">When the box read the burst, seconds; at or after that sample was taken.</param>
/// <param name="Segment">Which stretch of unbroken sample numbering the burst belongs to (0, 1, …):
/// after a FIFO overflow the indices are only estimates, so each stretch gets its own time origin.</param>
public readonly record struct BurstReading(long LastIndex, double ReadS, int Segment);
