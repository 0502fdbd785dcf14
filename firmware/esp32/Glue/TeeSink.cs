using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Esp32.Glue
{
    /// <summary>Hands every frame to the log file (primary) and the serial stream (secondary).</summary>
    /// <remarks>The answer is the file's, since the file is the record; the stream's refusals are
    /// counted in <see cref="SecondaryRefusals"/> and show to its reader as sequence gaps.</remarks>
    public sealed class TeeSink : IByteSink
    {
        private readonly IByteSink primary;
        private readonly IByteSink secondary;

        /// <summary>Writes to both, primary first.</summary>
        public TeeSink(IByteSink primary, IByteSink secondary)
        {
            this.primary = primary;
            this.secondary = secondary;
        }

        /// <summary>Frames the secondary refused.</summary>
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
