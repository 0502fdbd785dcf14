using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using ScottPlot;

namespace LaunchLogger.Plots;

/// <summary>Several runs' speed and distance on one time axis, each run's zero at its first
/// motion or at its rollout mark.</summary>
internal static class OverlayChart
{
    public static Chart Draw(IReadOnlyList<RunAnalysis> runs, RunAlignment alignment, ChartOptions options, IReadOnlyList<string>? names)
    {
        if (runs.Count == 0)
        {
            throw new ArgumentException("an overlay needs at least one run", nameof(runs));
        }

        if (names != null && names.Count != runs.Count)
        {
            throw new ArgumentException("give one name per run", nameof(names));
        }

        DisplayUnits units = options.Units;
        Multiplot figure = Panels.Figure(options, 2);
        Plot speed = figure.GetPlot(0), distance = figure.GetPlot(1);
        string zeroName = alignment == RunAlignment.Standstill ? "first motion" : "the rollout mark";
        Panels.Title(speed, options.Title ?? $"{runs.Count} runs aligned on {zeroName}");

        double fromX = double.MaxValue, toX = double.MinValue;
        int drawn = 0;
        for (int i = 0; i < runs.Count; i++)
        {
            ReconstructedRun recon = runs[i].Reconstruction;
            double? zero = alignment == RunAlignment.Standstill ? recon.FirstMotionS.Value : recon.RolloutTimeS?.Value;
            if (zero is not { } z || !recon.Staged)
            {
                continue;
            }

            Trajectory path = recon.Trajectory;
            double[] t = TraceChart.Shifted(path.TimeS, z);
            Color colour = Palette.Runs[i % Palette.Runs.Length];
            string name = names?[i] ?? $"run {i + 1}";
            Panels.Line(speed, t, TraceChart.Scale(path.SpeedMps, 1 / units.MpsPerSpeedUnit()), colour, name, options.WidthPx, 1.6f);
            Panels.Line(distance, t, TraceChart.Scale(path.DistanceM, 1 / units.MetresPerDistanceUnit()), colour, name, options.WidthPx, 1.6f).LegendText = "";
            fromX = Math.Min(fromX, Math.Max(t[0], -TraceChart.LeadS - (alignment == RunAlignment.Rollout ? 0.7 : 0)));
            toX = Math.Max(toX, t[^1]);
            drawn++;
        }

        if (drawn == 0)
        {
            throw new ArgumentException(alignment == RunAlignment.Rollout
                ? "no run started from a standstill and reached the rollout mark, so none can be aligned on it"
                : "no run started from a standstill, so none can be aligned on its first motion", nameof(runs));
        }

        foreach (Plot panel in new[] { speed, distance })
        {
            Panels.Mark(panel, 0, alignment == RunAlignment.Standstill ? Palette.FirstMotion : Palette.Rollout,
                panel == speed ? (alignment == RunAlignment.Standstill ? Marks.FirstMotion : Marks.Rollout) : null);
        }

        string axis = alignment == RunAlignment.Standstill ? "time from first motion (s)" : "time from the rollout mark (s)";
        Panels.Label(speed, "", $"speed ({units.SpeedUnit()})");
        Panels.Label(distance, axis, $"distance ({units.DistanceUnit()})");
        Panels.Legend(speed, Alignment.UpperCenter, drawn <= 5 ? Orientation.Horizontal : Orientation.Vertical);
        Panels.Headroom(speed, runs.SelectMany(r => r.Reconstruction.Trajectory.SpeedMps).Select(x => units.Speed(x)));
        Panels.SameX(figure, Math.Min(fromX, -0.015 * (toX - fromX)), toX);
        Panels.LegendsOnlyOn(figure, speed);
        return new Chart(figure, options);
    }
}
