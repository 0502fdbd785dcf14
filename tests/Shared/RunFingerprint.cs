using System.Globalization;
using System.Runtime.InteropServices;
using System.Security.Cryptography;
using System.Text;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Tests.Shared;

/// <summary>Everything a read gives — each run's every field and array, the counters and the
/// log's warnings — as one text, doubles by their bits, so that two reads compare exactly.</summary>
internal static class RunFingerprint
{
    /// <summary>The whole read: its runs, counters and warnings.</summary>
    public static string Of(LogReadResult read) => Of(read.Source, read.Runs, read.Stats, read.Warnings);

    /// <summary>Runs handed out one at a time, with the counters and warnings given at the end.</summary>
    public static string Of(string source, IEnumerable<DecodedRun> runs, object stats, IEnumerable<string> warnings)
    {
        var text = new StringBuilder();
        text.Append("source ").AppendLine(source);
        foreach (DecodedRun run in runs)
        {
            text.AppendLine(Of(run));
        }

        text.Append("stats ").AppendLine(stats.ToString());
        foreach (string warning in warnings)
        {
            text.Append("log warning ").AppendLine(warning);
        }

        return text.ToString();
    }

    /// <summary>One run.</summary>
    public static string Of(DecodedRun run)
    {
        var text = new StringBuilder();
        text.Append("run ").AppendLine(run.Source);
        text.AppendLine(run.Configuration.ToString());
        text.Append("pulses ").AppendLine(Digest(run.Pulses.SelectMany(p => new[] { p.Count, Bits(p.LoS), Bits(p.HiS) })));
        text.Append("second pulses ").AppendLine(Digest(run.SecondPulses.SelectMany(p => new[] { p.Count, Bits(p.LoS), Bits(p.HiS) })));
        if (run.Accel is { } a)
        {
            text.Append(CultureInfo.InvariantCulture, $"accel {a.Count} {Bits(a.SamplePeriodS)} {Bits(a.SamplePeriodUncertaintyS)} {a.HasAllAxes} {a.ClockOriginS} {a.Axes}");
            text.Append(' ').Append(Digest(a.TimeS.Select(Bits)));
            text.Append(' ').Append(Digest(a.ForwardMps2.Select(Bits)));
            text.Append(' ').Append(Digest(a.LateralMps2.Select(Bits)));
            text.Append(' ').Append(Digest(a.VerticalMps2.Select(Bits)));
            text.Append(' ').AppendLine(Digest(a.SampleIndex ?? []));
        }

        foreach (RunEvent e in run.Events)
        {
            text.Append(CultureInfo.InvariantCulture, $"event {e.Kind} {Bits(e.TimeS)} {string.Join(',', e.Values)}").AppendLine();
        }

        text.Append(CultureInfo.InvariantCulture, $"rest {run.RestGravityMilliG} motion {run.FirmwareMotionS} rollout {run.FirmwareRolloutS} lost {run.FramesLost} complete {run.Complete}").AppendLine();
        foreach (KeyValuePair<string, long> counter in run.Health.OrderBy(c => c.Key, StringComparer.Ordinal))
        {
            text.Append(CultureInfo.InvariantCulture, $"health {counter.Key} {counter.Value}").AppendLine();
        }

        foreach (string warning in run.Warnings)
        {
            text.Append("warning ").AppendLine(warning);
        }

        return text.ToString();
    }

    private static long Bits(double value) => BitConverter.DoubleToInt64Bits(value);

    private static string Digest(IEnumerable<long> values)
    {
        long[] all = values.ToArray();
        return all.Length.ToString(CultureInfo.InvariantCulture) + ":" + Convert.ToHexString(SHA256.HashData(MemoryMarshal.AsBytes(all.AsSpan())));
    }
}
