using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Decoding.Verdicts;
using LaunchLogger.Firmware.Wire;
using LaunchLogger.Simulation;
using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Decoding.Tests.Analysis;

/// <summary>A launch with the mark button held (under the bench rest's 3-s hold): the box opens
/// the run on its first pulse, not on the accelerometer's onset, and its own first-motion mark
/// comes late. The decoder finds first motion in the pre-trigger samples itself, so the run's
/// figures are those of the same launch made without the press.</summary>
public class MarkHeldLaunchTests
{
    [Theory]
    [InlineData("club-hatch")]
    [InlineData("roadster-launch")]
    [InlineData("electric-saloon")]
    public void A_launch_with_the_mark_button_held_decodes_like_the_same_launch_without(string name)
    {
        Scenario plain = BuiltInScenarios.Get(name);
        Scenario held = plain with { Plan = plain.Plan with { MarkHeldAroundLaunchS = 1.0 } };

        SimulationResult plainSimulation = Simulator.Run(plain, seed: 1);
        SimulationResult heldSimulation = Simulator.Run(held, seed: 1);
        LogReadResult plainRead = LogReader.Read(plainSimulation.LogBytes, "plain.log");
        LogReadResult heldRead = LogReader.Read(heldSimulation.LogBytes, "held.log");
        RunAnalysis plainRun = SessionAnalyzer.Analyze(plainRead.Runs).Runs.Single();
        RunAnalysis heldRun = SessionAnalyzer.Analyze(heldRead.Runs).Runs.Single();

        // The box's own mark: the accelerometer's onset without the press, the first pulse with it.
        DecodedRun plainLog = plainRead.Runs.Single();
        DecodedRun heldLog = heldRead.Runs.Single();
        Assert.Equal(MotionCause.AccelOnset, (MotionCause)plainLog.Events.Single(e => e.Kind == EventKind.Motion).Values[0]);
        Assert.Equal(MotionCause.PulseCount, (MotionCause)heldLog.Events.Single(e => e.Kind == EventKind.Motion).Values[0]);
        Assert.True(heldLog.FirmwareMotionS > plainLog.FirmwareMotionS + 0.02, $"{name}: the box's mark {heldLog.FirmwareMotionS} against {plainLog.FirmwareMotionS}");

        // The decoder's: the same launch, within a small part of its stated σ.
        Assert.Equal(VerdictLevel.Valid, heldRun.Verdict!.Level);
        Estimate plainStart = plainRun.Figures.FirstMotionS;
        Estimate heldStart = heldRun.Figures.FirstMotionS;
        Assert.True(Math.Abs(heldStart.Value - plainStart.Value) <= 0.25 * plainStart.Sigma, $"{name}: first motion {heldStart.Value} against {plainStart.Value} ± {plainStart.Sigma}");
        Assert.InRange(heldStart.Sigma, 0.5 * plainStart.Sigma, 1.5 * plainStart.Sigma);
        MarkFigure plainSixty = plainRun.Figures.DistanceMarks.Single(m => m.Mark.Label == "60 ft");
        MarkFigure heldSixty = heldRun.Figures.DistanceMarks.Single(m => m.Mark.Label == "60 ft");
        Assert.True(Math.Abs(heldSixty.FromStandstillS!.Value - plainSixty.FromStandstillS!.Value) <= 0.1 * plainSixty.UncertaintyS!.Value, $"{name}: 60 ft");
    }
}
