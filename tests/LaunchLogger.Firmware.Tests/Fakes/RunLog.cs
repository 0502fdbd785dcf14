using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>Typed views of a decoded log for assertions.</summary>
public static class RunLog
{
    public static IEnumerable<EventFrame> Events(this IEnumerable<Frame> frames, EventKind kind) =>
        frames.OfType<EventFrame>().Where(e => e.Kind == kind);

    public static EventFrame SingleEvent(this IEnumerable<Frame> frames, EventKind kind) =>
        Assert.Single(frames.Events(kind));

    public static int IndexOf(this IReadOnlyList<Frame> frames, Func<Frame, bool> match)
    {
        for (int i = 0; i < frames.Count; i++)
        {
            if (match(frames[i]))
            {
                return i;
            }
        }

        return -1;
    }

    /// <summary>Every observation of a channel, in frame order, with counts made absolute again by
    /// adding the run's origin count (channel 0's from the configuration frame, 0 otherwise).</summary>
    public static List<DecodedObservation> Observations(this IReadOnlyList<Frame> frames, int channel, long origin) =>
        frames.OfType<PulsesFrame>()
            .Where(p => p.Channel == channel)
            .SelectMany(p => p.Observations)
            .Select(o => o with { Count = o.Count + origin })
            .ToList();
}
