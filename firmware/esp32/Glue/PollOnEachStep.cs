#nullable disable
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Hardware;

namespace LaunchLogger.Esp32.Glue
{
    /// <summary>Lets <see cref="LaunchLogger.Firmware.CaptureLoop.Step"/> poll the hardware pulse
    /// counter itself: the first read of each step polls, and the step then drains what changed.</summary>
    /// <remarks>CaptureLoop.Step reads the pulse source until it reports nothing waiting; this
    /// wrapper polls the counter at the start of each such drain, so one Step = one poll.</remarks>
    public sealed class PollOnEachStep : IPulseSource
    {
        private readonly PolledPulseSource source;
        private bool pollNext = true;

        /// <summary>Wraps <paramref name="source"/>.</summary>
        public PollOnEachStep(PolledPulseSource source)
        {
            if (source == null)
            {
                throw new System.ArgumentNullException("source");
            }

            this.source = source;
        }

        /// <summary>Polls made so far.</summary>
        public long Polls { get; private set; }

        /// <inheritdoc/>
        public bool TryRead(out PulseObservation observation)
        {
            if (pollNext)
            {
                source.Poll();
                Polls++;
                pollNext = false;
            }

            if (source.TryRead(out observation))
            {
                return true;
            }

            pollNext = true;
            return false;
        }
    }
}
