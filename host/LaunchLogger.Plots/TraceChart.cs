using System.Globalization;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using ScottPlot;

namespace LaunchLogger.Plots;

/// <summary>One run's speed, distance and acceleration, stacked on one time axis.</summary>
internal static class TraceChart
{
    /// <summary>Seconds shown before first motion, so the standstill is seen.</summary>
    public const double LeadS = 0.3;

    public static Chart Draw(RunAnalysis run, ChartOptions options)
    {
        DisplayUnits units = options.Units;
        ReconstructedRun recon = run.Reconstruction;
        Trajectory path = recon.Trajectory;
        double zero = recon.FirstMotionS.Value;
        double[] t = Shifted(path.TimeS, zero);

        Multiplot figure = Panels.Figure(3);
        Plot speed = figure.GetPlot(0), distance = figure.GetPlot(1), accel = figure.GetPlot(2);
        Panels.Title(speed, options.Title ?? "Speed, distance and acceleration — " + Path.GetFileName(run.Run.Source));

        double[] v = Scale(path.SpeedMps, 1 / units.MpsPerSpeedUnit());
        double[] d = Scale(path.DistanceM, 1 / units.MetresPerDistanceUnit());
        double[] a = path.AccelMps2;
        if (Meaningful(path.SpeedSigmaMps) is { } vs)
        {
            double[] s = Scale(vs, 1 / units.MpsPerSpeedUnit());
            Panels.Band(speed, t, Minus(v, s), Plus(v, s), Palette.Speed, "± 1 σ", options.WidthPx);
        }

        if (Meaningful(path.DistanceSigmaM) is { } ds)
        {
            double[] s = Scale(ds, 1 / units.MetresPerDistanceUnit());
            Panels.Band(distance, t, Minus(d, s), Plus(d, s), Palette.Distance, "± 1 σ", options.WidthPx);
        }

        Panels.Line(speed, t, v, Palette.Speed, "speed", options.WidthPx);
        Panels.Line(distance, t, d, Palette.Distance, "distance", options.WidthPx);
        Panels.Line(accel, t, a, Palette.Accel, "acceleration", options.WidthPx);
        accel.Add.HorizontalLine(0, 1, Palette.Zero, LinePattern.Dotted);

        Marks.Add([speed, distance, accel], run, zero, units);
        Panels.Label(speed, "", $"speed ({units.SpeedUnit()})");
        Panels.Label(distance, "", $"distance ({units.DistanceUnit()})");
        Panels.Label(accel, "time from first motion (s)", "acceleration (m/s²)");
        Panels.Legend(speed);
        Panels.Headroom(speed, Meaningful(path.SpeedSigmaMps) is { } top ? v.Zip(top, (x, e) => x + (e / units.MpsPerSpeedUnit())).Append(v.Min()) : v);
        Panels.SameX(figure, t[0] < -LeadS ? -LeadS : t[0], t[^1]);
        Panels.LegendsOnlyOn(figure, speed);
        return new Chart(figure, options);
    }

    /// <summary>Times less a zero.</summary>
    public static double[] Shifted(double[] times, double zero) => Array.ConvertAll(times, x => x - zero);

    /// <summary>Values times a factor.</summary>
    public static double[] Scale(double[] values, double factor) => Array.ConvertAll(values, x => x * factor);

    /// <summary>The σ column when it says something: present, finite, and not all zero.</summary>
    public static double[]? Meaningful(double[]? sigma) =>
        sigma != null && sigma.All(double.IsFinite) && sigma.Any(s => s > 0) ? sigma : null;

    private static double[] Plus(double[] x, double[] s) => x.Zip(s, (a, b) => a + b).ToArray();

    private static double[] Minus(double[] x, double[] s) => x.Zip(s, (a, b) => a - b).ToArray();

    /// <summary>A distance with its unit, for mark labels.</summary>
    public static string DistanceText(double metres, DisplayUnits units) =>
        units.Distance(metres).ToString(units == DisplayUnits.Imperial ? "0.#" : "0.00", CultureInfo.InvariantCulture) + " " + units.DistanceUnit();
}
