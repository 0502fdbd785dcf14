namespace LaunchLogger.Decoding.Reading;

/// <summary>The body of a bench-rest frame (LOG-FORMAT.md, frame 0x09): a rest opens.</summary>
/// <param name="RestNumber">The rest's number since power-up (from 1).</param>
/// <param name="OpenedMicros">When it opened (the mark button's release), µs.</param>
/// <param name="LengthMicros">The set length, µs.</param>
/// <param name="AccelOutputDataRateMilliHz">The accelerometer's nominal output data rate, mHz.</param>
/// <param name="AccelFullScaleMilliG">The accelerometer's full scale, milli-g.</param>
/// <param name="ForwardAxis">The sensor axis that points forward in the car (0 = x, 1 = y, 2 = z).</param>
/// <param name="ForwardAxisReversed">True when that axis points backward.</param>
public sealed record BenchRestBody(
    long RestNumber,
    long OpenedMicros,
    long LengthMicros,
    long AccelOutputDataRateMilliHz,
    long AccelFullScaleMilliG,
    int ForwardAxis,
    bool ForwardAxisReversed);

/// <summary>The body of a bench-rest end frame (LOG-FORMAT.md, frame 0x0A).</summary>
/// <param name="RestNumber">The rest's number since power-up.</param>
/// <param name="EndedMicros">When it ended, µs.</param>
/// <param name="Outcome">How it ended: <see cref="Firmware.Wire.LogFormat.BenchRestComplete"/>,
/// <see cref="Firmware.Wire.LogFormat.BenchRestSpoiledByPulse"/> or <see cref="Firmware.Wire.LogFormat.BenchRestCutShort"/>.</param>
/// <param name="SamplesWritten">Accelerometer samples the box wrote in the rest.</param>
/// <param name="SamplesLost">Samples presumed lost to FIFO overflows during it.</param>
/// <param name="FramesWritten">Frames of the rest, its two own frames included.</param>
public sealed record BenchRestEndBody(long RestNumber, long EndedMicros, int Outcome, long SamplesWritten, long SamplesLost, long FramesWritten);
