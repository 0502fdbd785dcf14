namespace LaunchLogger.Firmware.Hardware
{
    /// <summary>A three-axis accelerometer read in bursts from its FIFO.</summary>
    public interface IAccelerometer
    {
        /// <summary>The sensor's nominal output data rate in milli-hertz.</summary>
        int OutputDataRateMilliHz { get; }

        /// <summary>The sensor's full scale in milli-g (readings at ± this value are clipped).</summary>
        int FullScaleMilliG { get; }

        /// <summary>Reads what the FIFO holds, up to <paramref name="maxSamples"/> samples, into
        /// <paramref name="xyzMilliG"/> as x, y, z triples in milli-g, oldest first.</summary>
        /// <param name="xyzMilliG">Destination, at least 3 × <paramref name="maxSamples"/> long.</param>
        /// <param name="maxSamples">The most samples to take.</param>
        /// <param name="fifoOverflowed">True when the sensor reports samples lost since the last read.</param>
        /// <returns>The number of samples read, 0 when none was waiting, or -1 when the read failed.</returns>
        int ReadBurst(short[] xyzMilliG, int maxSamples, out bool fifoOverflowed);
    }
}
