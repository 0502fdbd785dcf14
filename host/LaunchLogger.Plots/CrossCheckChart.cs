using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.CrossCheck;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using ScottPlot;

namespace LaunchLogger.Plots;

/// <summary>Our speed and the other instrument's on our clock, and their difference with the
/// ±2 combined σ the cross-check judges by.</summary>
internal static class CrossCheckChart
{
    /// <summary>Legend names (tests look for them in the SVG).</summary>
    public const string OursText = "ours", TheirsText = "theirs", DifferenceText = "theirs − ours";

    public static Chart Draw(RunAnalysis ours, CrossCheckResult result, ChartOptions options)
    {
        DisplayUnits units = options.Units;
        Trajectory mine = ours.Reconstruction.Trajectory;
        Trajectory theirs = result.TheirTrajectory;
        double zero = ours.Reconstruction.FirstMotionS.Value;

        Multiplot figure = Panels.Figure(options, 2);
        Plot speed = figure.GetPlot(0), difference = figure.GetPlot(1);
        Panels.Title(speed, options.Title ?? $"Cross-check against {Path.GetFileName(result.Source)} ({result.SampleRateHz:0.#} Hz)");

        double[] tMine = TraceChart.Shifted(mine.TimeS, zero);
        double[] tTheirs = TraceChart.Shifted(theirs.TimeS, zero);
        var other = speed.Add.Scatter(tTheirs, theirs.SpeedMps.Select(s => units.Speed(s)).ToArray(), Palette.Theirs);
        other.LineWidth = 1.4f;
        other.MarkerSize = 4;
        other.LegendText = TheirsText;
        Panels.Line(speed, tMine, mine.SpeedMps.Select(s => units.Speed(s)).ToArray(), Palette.Speed, OursText, options.WidthPx);

        // The difference where both records have the car: at their samples inside our run.
        var times = new List<double>();
        var diffs = new List<double>();
        var sigmas = new List<double>();
        for (int i = 0; i < theirs.Count; i++)
        {
            double at = theirs.TimeS[i];
            if (at < mine.TimeS[0] || at > mine.TimeS[^1])
            {
                continue;
            }

            double ourSigma = mine.SpeedSigmaMps is { } s ? mine.ValueAt(s, at) : 0;
            times.Add(at - zero);
            diffs.Add(units.Speed(theirs.SpeedMps[i] - mine.ValueAt(mine.SpeedMps, at)));
            sigmas.Add(units.Speed(2 * Math.Sqrt((ourSigma * ourSigma) + (result.SpeedSigmaMps * result.SpeedSigmaMps))));
        }

        if (times.Count > 0)
        {
            double[] t = [.. times];
            Panels.Band(difference, t, sigmas.Select(s => -s).ToArray(), [.. sigmas], Palette.Difference, "± 2 σ combined", options.WidthPx);
            var line = difference.Add.Scatter(t, [.. diffs], Palette.Theirs);
            line.LineWidth = 1.4f;
            line.MarkerSize = 4;
            line.LegendText = DifferenceText;
        }

        difference.Add.HorizontalLine(0, 1, Palette.Zero);
        foreach (Plot panel in new[] { speed, difference })
        {
            Panels.Mark(panel, 0, Palette.FirstMotion, panel == speed ? (ours.Reconstruction.Staged ? Marks.FirstMotion : Marks.RecordStart) : null);
        }

        Panels.Label(speed, "", $"speed ({units.SpeedUnit()})");
        Panels.Label(difference, Marks.TimeAxis(ours, "our "), $"difference ({units.SpeedUnit()})");
        Panels.Legend(speed);
        Panels.Headroom(speed, mine.SpeedMps.Concat(theirs.SpeedMps).Select(x => units.Speed(x)));
        Panels.Legend(difference);
        Panels.Headroom(difference, diffs.Concat(sigmas).Concat(sigmas.Select(s => -s)).Append(0));
        Panels.SameX(figure, TraceChart.StartX(tMine), tMine[^1]);
        Panels.LegendsOnlyOn(figure, speed, difference);
        return new Chart(figure, options);
    }
}
