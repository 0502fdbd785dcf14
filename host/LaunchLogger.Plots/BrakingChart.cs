using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using ScottPlot;

namespace LaunchLogger.Plots;

/// <summary>A stop: speed and deceleration against time (left) and distance (right) from brake
/// onset, with the onset, standstill and the MFDD level marked.</summary>
internal static class BrakingChart
{
    /// <summary>Seconds shown before onset and after standstill.</summary>
    private const double BeforeS = 0.5, AfterS = 0.3;

    public static Chart Draw(RunAnalysis run, ChartOptions options)
    {
        BrakingResult stop = run.Braking ?? throw new ArgumentException("the run has no stop to draw", nameof(run));
        DisplayUnits units = options.Units;
        Trajectory path = run.Reconstruction.Trajectory;
        double onset = stop.OnsetS.Value;
        int first = Math.Max(0, LowerBound(path.TimeS, onset - BeforeS));
        int last = Math.Max(first + 1, Math.Min(path.Count, LowerBound(path.TimeS, stop.StandstillS + AfterS) + 1));
        double onsetDistance = path.ValueAt(path.DistanceM, onset);

        double[] t = path.TimeS[first..last].Select(x => x - onset).ToArray();
        double[] x = path.DistanceM[first..last].Select(d => units.Distance(d - onsetDistance)).ToArray();
        double[] v = path.SpeedMps[first..last].Select(s => units.Speed(s)).ToArray();
        double[] decel = path.AccelMps2[first..last].Select(a => -a).ToArray();

        Multiplot figure = Panels.Figure(options, 4, columns: 2);
        Plot speedT = figure.GetPlot(0), speedX = figure.GetPlot(1), decelT = figure.GetPlot(2), decelX = figure.GetPlot(3);
        Panels.Title(speedT, options.Title ?? "Stop from " + Format(units.Speed(stop.FromMps)) + " " + units.SpeedUnit());
        Panels.Title(speedX, "against distance");

        if (TraceChart.Meaningful(path.SpeedSigmaMps) is { } sigma)
        {
            double[] s = sigma[first..last].Select(s => units.Speed(s)).ToArray();
            double[] low = v.Zip(s, (a, b) => a - b).ToArray(), high = v.Zip(s, (a, b) => a + b).ToArray();
            Panels.Band(speedT, t, low, high, Palette.Speed, "± 1 σ", options.WidthPx);
            Panels.Band(speedX, x, low, high, Palette.Speed, "", options.WidthPx);
        }

        Panels.Line(speedT, t, v, Palette.Speed, "speed", options.WidthPx);
        Panels.Line(speedX, x, v, Palette.Speed, "", options.WidthPx);
        Panels.Line(decelT, t, decel, Palette.Accel, "deceleration", options.WidthPx);
        Panels.Line(decelX, x, decel, Palette.Accel, "", options.WidthPx);

        double stopDistance = units.Distance(stop.StoppingDistanceM.Value);
        double stopTime = stop.StandstillS - onset;
        foreach ((Plot panel, double end, bool named) in new[] { (speedT, stopTime, true), (speedX, stopDistance, false), (decelT, stopTime, false), (decelX, stopDistance, false) })
        {
            Panels.Mark(panel, 0, Palette.BrakeOnset, named ? Marks.BrakeOnset : null);
            Panels.Mark(panel, end, Palette.FirstMotion, named ? "standstill" : null);
        }

        if (stop.MfddMps2 is { } mfdd)
        {
            foreach (Plot panel in new[] { decelT, decelX })
            {
                var line = panel.Add.HorizontalLine(mfdd, 1.2f, Palette.Rollout);
                line.LegendText = panel == decelT ? BrakingFormulas.MfddLabel : "";
            }
        }

        Panels.Label(speedT, "", $"speed ({units.SpeedUnit()})");
        Panels.Label(speedX, "", $"speed ({units.SpeedUnit()})");
        Panels.Label(decelT, "time from brake onset (s)", "deceleration (m/s²)");
        Panels.Label(decelX, $"distance from brake onset ({units.DistanceUnit()})", "deceleration (m/s²)");
        Panels.Legend(speedT, Alignment.UpperRight, Orientation.Vertical);
        Panels.Legend(decelT, Alignment.LowerCenter, Orientation.Horizontal);
        speedT.Axes.SetLimitsX(t[0], t[^1]);
        decelT.Axes.SetLimitsX(t[0], t[^1]);
        Panels.LegendsOnlyOn(figure, speedT, decelT);
        return new Chart(figure, options);
    }

    private static string Format(double value) => value.ToString("0", System.Globalization.CultureInfo.InvariantCulture);

    private static int LowerBound(double[] sorted, double value)
    {
        int i = Array.BinarySearch(sorted, value);
        return i >= 0 ? i : ~i;
    }
}
