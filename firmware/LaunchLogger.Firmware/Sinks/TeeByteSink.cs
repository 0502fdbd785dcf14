using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Firmware.Sinks
{
    /// <summary>Hands every frame to a primary sink (the log file) and to a secondary one (the live
    /// serial stream).</summary>
    /// <remarks>The answer is the primary's: the file is the record, and its refusals belong in the
    /// log's health counters. The stream's refusals (no laptop attached, link too slow) are counted
    /// here in <see cref="SecondaryRefusals"/>; a reader of the stream sees them as gaps in the
    /// frame sequence numbers.</remarks>
    public sealed class TeeByteSink : IByteSink
    {
        private readonly IByteSink primary;
        private readonly IByteSink secondary;

        /// <summary>Writes to both sinks, primary first.</summary>
        public TeeByteSink(IByteSink primary, IByteSink secondary)
        {
            if (primary == null || secondary == null)
            {
                throw new System.ArgumentNullException(primary == null ? "primary" : "secondary");
            }

            this.primary = primary;
            this.secondary = secondary;
        }

        /// <summary>Frames the secondary sink refused.</summary>
        public long SecondaryRefusals { get; private set; }

        /// <inheritdoc/>
        public bool Write(byte[] buffer, int offset, int count)
        {
            bool accepted = primary.Write(buffer, offset, count);
            if (!secondary.Write(buffer, offset, count))
            {
                SecondaryRefusals++;
            }

            return accepted;
        }
    }
}
