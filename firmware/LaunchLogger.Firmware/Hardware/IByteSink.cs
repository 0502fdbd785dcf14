namespace LaunchLogger.Firmware.Hardware
{
    /// <summary>Where finished log bytes go: a file on storage, a serial port, or both.</summary>
    /// <remarks>Each call hands over one whole frame, delimiter included, or (once, at power-up)
    /// a lone delimiter, the empty frame that ends whatever a power cut left unfinished. An implementation must
    /// not keep a reference to the buffer after returning: the writer reuses it.</remarks>
    public interface IByteSink
    {
        /// <summary>Takes one stuffed frame. Returns false when the bytes could not be taken
        /// (buffer full, card missing); the writer counts that in the health counters.</summary>
        bool Write(byte[] buffer, int offset, int count);
    }
}
