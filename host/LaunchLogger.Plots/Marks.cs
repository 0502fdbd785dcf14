using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using ScottPlot;

namespace LaunchLogger.Plots;

/// <summary>The run's instants drawn on every panel: first motion, the rollout mark with the
/// rollout zone shaded, and brake onset. Only the top panel carries their names.</summary>
internal static class Marks
{
    /// <summary>Names used on the marks (tests look for them in the SVG).</summary>
    public const string FirstMotion = "first motion", Rollout = "rollout", BrakeOnset = "brake onset", RolloutZone = "rollout zone";

    /// <summary>The zero of a record that opened moving: no standstill, so no first motion and no rollout.</summary>
    public const string RecordStart = "record start (rolling)";

    /// <summary>The time axis' title for a run: from first motion, or from the start of a record
    /// that opened moving.</summary>
    public static string TimeAxis(RunAnalysis run, string whose = "") => run.Reconstruction.Staged
        ? $"time from {whose}first motion (s)"
        : $"time from {(whose.Length == 0 ? "the " : whose)}record's start (s)";

    /// <summary>Draws the marks that fall before <paramref name="untilX"/> (time from the zero, s).</summary>
    public static void Add(IReadOnlyList<Plot> panels, RunAnalysis run, double zeroS, DisplayUnits units, double untilX)
    {
        // A record that opened moving has no standstill: its rollout mark means nothing.
        bool staged = run.Reconstruction.Staged;
        double? rollout = staged ? run.Reconstruction.RolloutTimeS?.Value - zeroS : null;
        double? onset = run.Braking?.OnsetS.Value - zeroS;
        if (onset > untilX)
        {
            onset = null;
        }

        string rolloutText = $"{Rollout} {TraceChart.DistanceText(run.Reconstruction.RolloutM, units)}";
        for (int i = 0; i < panels.Count; i++)
        {
            Plot panel = panels[i];
            bool named = i == 0;
            if (rollout is { } r)
            {
                Panels.Zone(panel, 0, r, Palette.RolloutZone, named ? RolloutZone : "");
            }

            Panels.Mark(panel, 0, Palette.FirstMotion, named ? (staged ? FirstMotion : RecordStart) : null);
            if (rollout is { } r2)
            {
                Panels.Mark(panel, r2, Palette.Rollout, named ? rolloutText : null);
            }

            if (onset is { } b)
            {
                Panels.Mark(panel, b, Palette.BrakeOnset, named ? BrakeOnset : null);
            }
        }
    }
}
