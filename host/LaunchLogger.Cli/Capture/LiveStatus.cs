using System.Globalization;
using LaunchLogger.Decoding.Reading;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Cli.Capture;

/// <summary>What the box is doing right now, from the frames as they arrive: its phase, speed
/// and distance from the pulse counts, and when the rollout mark passed. For the live status
/// line only; figures come from the full analysis when the run closes.</summary>
public sealed class LiveStatus
{
    private const double SpeedWindowS = 0.25;
    private readonly List<PulseObservation> pulses = [];
    private double metresPerPulse;
    private long lastCount;
    private double lastTimeS;
    private long windowCount;
    private double windowTimeS;

    /// <summary>The box's run number, 0 before the first run.</summary>
    public long Run { get; private set; }

    /// <summary>"waiting", "armed", "staged", "moving", "braking", "stopped" or "closed".</summary>
    public string Phase { get; private set; } = "waiting";

    /// <summary>Speed over the last quarter second of pulses, m/s.</summary>
    public double SpeedMps { get; private set; }

    /// <summary>Distance from the run's origin, m.</summary>
    public double DistanceM { get; private set; }

    /// <summary>When the box saw the rollout mark pass, s on its clock; null before.</summary>
    public double? RolloutS { get; private set; }

    /// <summary>The box's clock at the latest frame, s.</summary>
    public double ClockS { get; private set; }

    /// <summary>Takes one frame; returns true when the phase changed or the rollout mark passed.</summary>
    public bool Add(in Frame frame)
    {
        string before = Phase;
        double? rolloutBefore = RolloutS;
        switch (frame.Type)
        {
            case FrameType.Configuration when FrameBodies.TryReadConfiguration(frame.Body, out ConfigurationBody c):
                Run = c.RunNumber;
                metresPerPulse = c.CircumferenceMicrometres * 1e-6 / c.PulsesPerRevolution;
                Phase = c.Staged ? "staged" : "armed";
                (SpeedMps, DistanceM, RolloutS, lastCount, windowCount, lastTimeS, windowTimeS) = (0, 0, null, 0, 0, c.OpenedMicros * 1e-6, c.OpenedMicros * 1e-6);
                break;
            case FrameType.Pulses:
                pulses.Clear();
                if (FrameBodies.TryReadPulses(frame.Body, out int channel, pulses) && channel == 0 && pulses.Count > 0)
                {
                    PulseObservation last = pulses[^1];
                    lastCount = last.Count;
                    lastTimeS = last.HiMicros * 1e-6;
                    ClockS = lastTimeS;
                    DistanceM = lastCount * metresPerPulse;
                    if (lastTimeS - windowTimeS >= SpeedWindowS)
                    {
                        SpeedMps = (lastCount - windowCount) * metresPerPulse / (lastTimeS - windowTimeS);
                        (windowCount, windowTimeS) = (lastCount, lastTimeS);
                    }
                }

                break;
            case FrameType.Event when FrameBodies.TryReadEvent(frame.Body, out EventBody e):
                ClockS = e.TimeMicros * 1e-6;
                switch (e.Kind)
                {
                    case EventKind.Staged:
                        Phase = "staged";
                        break;
                    case EventKind.Motion:
                        Phase = "moving";
                        break;
                    case EventKind.Rollout:
                        RolloutS = ClockS;
                        break;
                    case EventKind.BrakeOn:
                        Phase = "braking";
                        break;
                    case EventKind.BrakeOff:
                        Phase = "moving";
                        break;
                    case EventKind.Stopped:
                        Phase = "stopped";
                        SpeedMps = 0;
                        break;
                }

                break;
            case FrameType.Summary:
                Phase = "closed";
                break;
        }

        return Phase != before || RolloutS != rolloutBefore;
    }

    /// <summary>The status line, e.g. "run 3  moving  41.2 mph  88.0 ft  rollout passed at 12.698 s".</summary>
    public string Line(DisplayUnits units)
    {
        CultureInfo inv = CultureInfo.InvariantCulture;
        string rollout = RolloutS is { } r ? $"  rollout passed at {r.ToString("0.000", inv)} s" : "";
        return Run == 0
            ? "waiting for the box's first run"
            : $"run {Run}  {Phase,-8} {Output.Format.Speed(SpeedMps, units),10}  {Output.Format.Distance(DistanceM, units),10}{rollout}";
    }
}
