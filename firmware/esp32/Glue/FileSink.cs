using System.IO;
using LaunchLogger.Firmware.Hardware;
using nanoFramework.Hardware.Esp32;

namespace LaunchLogger.Esp32.Glue
{
    /// <summary>Appends log frames to a file on the SD card (D:\) or internal flash (I:\).</summary>
    /// <remarks>The ESP32 has no clean shutdown: power goes when the ignition does. So the file is
    /// flushed to the card at most every <c>flushIntervalMs</c> (500 ms by default): a power cut
    /// loses at most that much, and the log format decodes everything up to the last whole frame.
    /// Flushing every frame would stall the capture loop on card writes. A failed write (card
    /// pulled) refuses the frame; the core counts that in its health frame.</remarks>
    public sealed class FileSink : IByteSink
    {
        private readonly FileStream stream;
        private readonly long flushIntervalMicros;
        private long lastFlushMicros;

        /// <summary>Creates the next free <c>launchlog-NNNN.log</c> in <paramref name="folder"/>.</summary>
        public FileSink(string folder, int flushIntervalMs)
        {
            Path = NextFreeName(folder);
            stream = new FileStream(Path, FileMode.Create, FileAccess.Write);
            flushIntervalMicros = flushIntervalMs * 1000L;
            lastFlushMicros = (long)HighResTimer.GetCurrent();
        }

        /// <summary>The file written.</summary>
        public string Path { get; private set; }

        /// <inheritdoc/>
        public bool Write(byte[] buffer, int offset, int count)
        {
            try
            {
                stream.Write(buffer, offset, count);
                long now = (long)HighResTimer.GetCurrent();
                if (now - lastFlushMicros >= flushIntervalMicros)
                {
                    stream.Flush();
                    lastFlushMicros = now;
                }

                return true;
            }
            catch (IOException)
            {
                return false;
            }
        }

        private static string NextFreeName(string folder)
        {
            for (int n = 1; n < 10000; n++)
            {
                string number = n.ToString("D4");
                string candidate = folder + "launchlog-" + number + ".log";
                if (!File.Exists(candidate))
                {
                    return candidate;
                }
            }

            throw new IOException("no free log file name in " + folder);
        }
    }
}
