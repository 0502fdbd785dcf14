using System.CommandLine;
using System.Text.Json;
using LaunchLogger.Cli.Core;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger selfcheck</c>: runs an ideal 0.5 g launch through the real firmware
/// core and checks the log it writes, frame by frame.</summary>
public static class SelfCheckCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var json = new Option<bool>("--json") { Description = "Write the result as JSON (figures against their exact values)." };
        var command = new Command("selfcheck", "Run an ideal launch through the firmware core and check the log it writes.") { json };
        command.SetAction(parse => (int)Run(parse.InvocationConfiguration.Output, parse.GetValue(json)));
        return command;
    }

    /// <summary>Runs the check, writing a short report to <paramref name="output"/>.</summary>
    public static ExitCode Run(TextWriter output, bool json = false)
    {
        var settings = new LoggerSettings();
        var sink = new MemoryByteSink();
        var recorder = new RunRecorder(settings, sink, new HealthCounters());

        // 0.5 g from rest (REFERENCES.md, kinematics): 1 ft takes 0.35260 s.
        var launch = new ScriptedLaunch(recorder, settings, 0.5 * 9.80665, launchMicros: 2_000_000);
        long fed = launch.Run(accelerateUntilMicros: 7_000_000, endMicros: 10_000_000);
        byte[] log = sink.ToArray();

        var counts = new int[8];
        int bad = 0;
        int frames = 0;
        int expectSequence = 0;
        int sequenceGaps = 0;
        var payload = new byte[LogFormat.MaxPayloadBytes + 8];
        int start = 0;
        for (int i = 0; i < log.Length; i++)
        {
            if (log[i] != LogFormat.Delimiter)
            {
                continue;
            }

            int n = Cobs.Decode(log, start, i - start, payload, 0);
            start = i + 1;
            frames++;
            if (n < LogFormat.MinPayloadBytes)
            {
                bad++;
                continue;
            }

            uint crc = (uint)(payload[n - 4] | (payload[n - 3] << 8) | (payload[n - 2] << 16) | (payload[n - 1] << 24));
            if (crc != Crc32.Compute(payload, 0, n - 4))
            {
                bad++;
                continue;
            }

            int sequence = payload[1] | (payload[2] << 8);
            if (sequence != expectSequence)
            {
                sequenceGaps++;
            }

            expectSequence = (sequence + 1) & 0xFFFF;
            if (payload[0] < counts.Length)
            {
                counts[payload[0]]++;
            }
        }

        double exactRolloutS = 0.35260; // REFERENCES.md: 1 ft at 0.5 g from rest
        double firmwareRolloutS = (recorder.RolloutMicros - launch.LaunchMicros) / 1e6;
        double firmwareMotionErrorS = (recorder.MotionMicros - launch.LaunchMicros) / 1e6;
        bool ok = bad == 0 && sequenceGaps == 0 && counts[1] == 1 && counts[6] == 1 && recorder.RunNumber == 1
            && Math.Abs(firmwareRolloutS - exactRolloutS) < 0.005 && Math.Abs(firmwareMotionErrorS) < 0.005;
        if (json)
        {
            output.WriteLine(JsonSerializer.Serialize(
                new SelfCheckDocument(ok ? "ok" : "failed", log.Length, frames, bad, sequenceGaps, counts[1], counts[2], counts[3], counts[4], counts[5], counts[6], recorder.RunNumber, fed, firmwareMotionErrorS, firmwareRolloutS, exactRolloutS),
                CalibrateSupport.JsonOptions));
            return ok ? ExitCode.Ok : ExitCode.CheckFailed;
        }

        output.WriteLine("LaunchLogger firmware core self-check");
        output.WriteLine($"  ideal launch at 0.5 g, {settings.PulsesPerRevolution} pulses/rev, {settings.CircumferenceMicrometres / 1e6:F3} m circumference, {fed} pulse edges");
        output.WriteLine($"  log: {log.Length} bytes in {frames} frames; CRC or stuffing errors: {bad}; sequence gaps: {sequenceGaps}");
        output.WriteLine($"  frames by type: configuration {counts[1]}, pulses {counts[2]}, acceleration {counts[3]}, event {counts[4]}, health {counts[5]}, summary {counts[6]}");
        output.WriteLine($"  runs closed: {recorder.RunNumber}; phase now: {recorder.Phase}");
        output.WriteLine($"  first motion (firmware estimate): {firmwareMotionErrorS * 1000:+0.0;-0.0} ms from truth");
        output.WriteLine($"  rollout mark (firmware, linear): {firmwareRolloutS:F5} s after motion; exact {exactRolloutS:F5} s");
        output.WriteLine(ok ? "  result: OK" : "  result: FAILED");
        return ok ? ExitCode.Ok : ExitCode.CheckFailed;
    }
}

/// <summary>The self-check's result as JSON (snake_case names).</summary>
/// <param name="Result">"ok" or "failed".</param>
/// <param name="LogBytes">Size of the log written.</param>
/// <param name="Frames">Frames in it.</param>
/// <param name="BadFrames">Frames failing CRC or stuffing.</param>
/// <param name="SequenceGaps">Breaks in the frame sequence.</param>
/// <param name="ConfigurationFrames">Configuration frames.</param>
/// <param name="PulseFrames">Pulse frames.</param>
/// <param name="AccelerationFrames">Acceleration frames.</param>
/// <param name="EventFrames">Event frames.</param>
/// <param name="HealthFrames">Health frames.</param>
/// <param name="SummaryFrames">Summary frames.</param>
/// <param name="RunsClosed">Runs the core closed.</param>
/// <param name="PulseEdges">Pulse edges fed.</param>
/// <param name="FirstMotionErrorS">The core's first motion minus the launch, s.</param>
/// <param name="RolloutAfterMotionS">The core's rollout mark after the launch, s.</param>
/// <param name="ExactRolloutS">The exact value (0.5 g from rest, 1 ft: 0.35260 s), s.</param>
public sealed record SelfCheckDocument(
    string Result, int LogBytes, int Frames, int BadFrames, int SequenceGaps, int ConfigurationFrames, int PulseFrames,
    int AccelerationFrames, int EventFrames, int HealthFrames, int SummaryFrames, int RunsClosed, long PulseEdges,
    double FirstMotionErrorS, double RolloutAfterMotionS, double ExactRolloutS);
