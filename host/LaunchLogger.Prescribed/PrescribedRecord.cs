using LaunchLogger.Prescribed.Output;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Truth;

namespace LaunchLogger.Prescribed;

/// <summary>One generated record: the exact pulse times, what the capture saw, the accelerometer
/// samples, the truth of every run, and the record written as CSV text or as a log.</summary>
public sealed class PrescribedRecord
{
    private PrescribedRecord(PrescribedRecordSpec spec, double[] trueEdges, double[] observedEdges, IReadOnlyList<CountBracket>? brackets, AccelSample[]? accel, IReadOnlyList<TruthRun> truth)
    {
        Spec = spec;
        TrueEdgesS = trueEdges;
        ObservedEdgesS = observedEdges;
        Brackets = brackets;
        AccelSamples = accel;
        Truth = truth;
    }

    /// <summary>What made it.</summary>
    public PrescribedRecordSpec Spec { get; }

    /// <summary>Exact pulse times, s.</summary>
    public double[] TrueEdgesS { get; }

    /// <summary>Pulse times as the edge capture stamped them (empty for a polled counter).</summary>
    public double[] ObservedEdgesS { get; }

    /// <summary>The polled counter's readings, or null for edge timestamps.</summary>
    public IReadOnlyList<CountBracket>? Brackets { get; }

    /// <summary>The accelerometer's samples, or null.</summary>
    public AccelSample[]? AccelSamples { get; }

    /// <summary>Truth figures of every run, in time order.</summary>
    public IReadOnlyList<TruthRun> Truth { get; }

    /// <summary>Distance per pulse the decoder is to be told, m.</summary>
    public double StatedMetresPerPulse => Spec.Pickup.StatedMetresPerPulse;

    /// <summary>True when the pulses are a polled counter's brackets.</summary>
    public bool IsPolled => Brackets != null;

    /// <summary>The pulses as CSV: edges (<c>t_s</c>) or counts (<c>t_lo_s,t_hi_s,count</c>).</summary>
    public string PulsesCsv => IsPolled
        ? PrescribedCsv.ToText(w => PrescribedCsv.WriteCounts(w, Brackets!))
        : PrescribedCsv.ToText(w => PrescribedCsv.WriteEdges(w, ObservedEdgesS));

    /// <summary>The accelerometer as CSV, or null.</summary>
    public string? AccelCsv => AccelSamples is { } s ? PrescribedCsv.ToText(w => PrescribedCsv.WriteAccel(w, s)) : null;

    /// <summary>Generates <paramref name="spec"/>.</summary>
    public static PrescribedRecord Generate(PrescribedRecordSpec spec)
    {
        ArgumentNullException.ThrowIfNull(spec);
        var master = new Random(spec.Seed);
        var edgeRandom = new Random(master.Next());
        var accelRandom = new Random(master.Next());
        var profile = spec.Shape.Profile;
        double[] trueEdges = spec.Pickup.EdgeTimes(profile);
        IReadOnlyList<CountBracket>? brackets = spec.Polled?.Read(trueEdges, profile.EndS, edgeRandom);
        double[] observed = spec.Polled is null ? spec.Edges.Observe(trueEdges, edgeRandom) : [];
        AccelSample[]? accel = spec.Accel?.Sample(profile, accelRandom);
        return new PrescribedRecord(spec, trueEdges, observed, brackets, accel, TruthCalculator.Compute(profile));
    }

    /// <summary>Writes the files a command line or importer reads into <paramref name="folder"/>:
    /// <c>edges.csv</c> or <c>counts.csv</c>, and <c>accel.csv</c> when there is an accelerometer.</summary>
    /// <returns>The pulse file's path and the accelerometer file's path (or null).</returns>
    public (string PulsesPath, string? AccelPath) WriteFiles(string folder)
    {
        Directory.CreateDirectory(folder);
        string pulses = Path.Combine(folder, IsPolled ? "counts.csv" : "edges.csv");
        File.WriteAllText(pulses, PulsesCsv);
        string? accel = null;
        if (AccelCsv is { } text)
        {
            accel = Path.Combine(folder, "accel.csv");
            File.WriteAllText(accel, text);
        }

        return (pulses, accel);
    }

    /// <summary>The record written by the firmware core as a log (the box's clock reads the
    /// record's time).</summary>
    public byte[] ToLog(LogOptions? options = null) =>
        PrescribedLog.Write(Spec.Shape.Profile, TrueEdgesS, Spec.Pickup, AccelSamples, options ?? Spec.LogOptions, new Random(Spec.Seed ^ 0x5EED));
}
