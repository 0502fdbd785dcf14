using LaunchLogger.Cli.Capture;

namespace LaunchLogger.Archive.Tests.Support;

/// <summary>A link that delivers prepared byte chunks: each segment is one connection, which
/// drops (the cable pulled) when its chunks are used up, and stays unopenable for a few tries
/// before the next segment connects. After the last segment the link stays quiet.</summary>
internal sealed class ScriptedLink(IReadOnlyList<IReadOnlyList<byte[]>> segments, int failedOpensBetween = 3) : ILink
{
    private int segment = -1;
    private int refusals;

    public string Name => "scripted";

    /// <summary>Set once the last chunk of the last segment has been read.</summary>
    public ManualResetEventSlim AllDelivered { get; } = new();

    public ILinkConnection Open()
    {
        if (segment >= 0 && refusals < failedOpensBetween)
        {
            refusals++;
            throw new LinkLostException("scripted: unplugged");
        }

        if (segment + 1 >= segments.Count)
        {
            throw new LinkLostException("scripted: nothing more");
        }

        refusals = 0;
        segment++;
        return new Connection(segments[segment], segment == segments.Count - 1, AllDelivered);
    }

    private sealed class Connection(IReadOnlyList<byte[]> chunks, bool last, ManualResetEventSlim done) : ILinkConnection
    {
        private int next;

        public int Read(byte[] buffer)
        {
            if (next < chunks.Count)
            {
                byte[] chunk = chunks[next++];
                chunk.CopyTo(buffer, 0);
                return chunk.Length;
            }

            if (!last)
            {
                throw new LinkLostException("scripted: cable pulled");
            }

            done.Set();
            Thread.Sleep(5);
            return 0;
        }

        public void Dispose()
        {
        }
    }
}
