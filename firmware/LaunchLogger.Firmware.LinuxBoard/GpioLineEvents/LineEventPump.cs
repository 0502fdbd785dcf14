namespace LaunchLogger.Firmware.LinuxBoard.GpioLineEvents;

/// <summary>A background thread that moves line events from the kernel into the capture
/// queue, so the capture loop never waits on the GPIO device.</summary>
/// <remarks>The thread runs at above-normal priority: the kernel keeps the timestamps, so a late
/// read costs nothing in accuracy, but a long stall could overflow the kernel's event buffer
/// (which the tracker then counts as drops).</remarks>
public sealed class LineEventPump : IDisposable
{
    private const int PollTimeoutMs = 50;
    private readonly GpioLineEventReader reader;
    private readonly LineEdgeTracker tracker;
    private readonly TextWriter errors;
    private readonly Thread thread;
    private volatile bool stopping;

    /// <summary>Starts pumping at once.</summary>
    public LineEventPump(GpioLineEventReader reader, LineEdgeTracker tracker, TextWriter errors)
    {
        this.reader = reader ?? throw new ArgumentNullException(nameof(reader));
        this.tracker = tracker ?? throw new ArgumentNullException(nameof(tracker));
        this.errors = errors ?? TextWriter.Null;
        thread = new Thread(Pump) { IsBackground = true, Name = "gpio line events", Priority = ThreadPriority.AboveNormal };
        thread.Start();
    }

    /// <summary>Read failures seen (each followed by a short pause and a retry).</summary>
    public long ReadFailures { get; private set; }

    /// <summary>Stops the thread and releases the lines.</summary>
    public void Dispose()
    {
        stopping = true;
        thread.Join();
        reader.Dispose();
    }

    private void Pump()
    {
        GpioLineEvent[] events = new GpioLineEvent[64];
        while (!stopping)
        {
            int n;
            try
            {
                n = reader.ReadEvents(events, PollTimeoutMs);
            }
            catch (IOException e)
            {
                ReadFailures++;
                errors.WriteLine("pulse input: " + e.Message);
                Thread.Sleep(PollTimeoutMs);
                continue;
            }

            for (int i = 0; i < n; i++)
            {
                tracker.OnEvent(events[i]);
            }
        }
    }
}
