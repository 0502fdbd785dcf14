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

    /// <summary>The launch view ends this long after first motion at least, s.</summary>
    public const double LaunchMinimumS = 2.0;

    /// <summary>... and at least this many times the rollout mark's time after first motion.</summary>
    public const double LaunchRolloutMultiple = 4.0;

    /// <summary>The whole run.</summary>
    public static Chart Draw(RunAnalysis run, ChartOptions options) =>
        Draw(run, options, untilS: null, "Speed, distance and acceleration — ");

    /// <summary>The start only: from just before first motion to a little past the rollout mark,
    /// where the two conventions part.</summary>
    public static Chart DrawLaunch(RunAnalysis run, ChartOptions options)
    {
        double rollout = (run.Reconstruction.RolloutTimeS?.Value - run.Reconstruction.FirstMotionS.Value) ?? 0;
        return Draw(run, options, Math.Max(LaunchMinimumS, LaunchRolloutMultiple * rollout), "The launch — ");
    }

    private static Chart Draw(RunAnalysis run, ChartOptions options, double? untilS, string heading)
    {
        DisplayUnits units = options.Units;
        ReconstructedRun recon = run.Reconstruction;
        Trajectory path = recon.Trajectory;
        double zero = recon.FirstMotionS.Value;
        double[] all = Shifted(path.TimeS, zero);
        int from = Math.Max(0, Array.FindIndex(all, x => x >= -LeadS) - 1);
        int to = untilS is { } u ? Math.Min(all.Length, Math.Max(from + 2, Array.FindLastIndex(all, x => x <= u) + 2)) : all.Length;
        double[] t = all[from..to];

        Multiplot figure = Panels.Figure(options, 3);
        Plot speed = figure.GetPlot(0), distance = figure.GetPlot(1), accel = figure.GetPlot(2);
        Panels.Title(speed, options.Title ?? heading + Path.GetFileName(run.Run.Source));

        double[] v = Scale(path.SpeedMps[from..to], 1 / units.MpsPerSpeedUnit());
        double[] d = Scale(path.DistanceM[from..to], 1 / units.MetresPerDistanceUnit());
        double[] a = path.AccelMps2[from..to];
        double[]? speedSigma = Meaningful(path.SpeedSigmaMps)?[from..to];
        if (speedSigma is { } vs)
        {
            double[] s = Scale(vs, 1 / units.MpsPerSpeedUnit());
            Panels.Band(speed, t, Minus(v, s), Plus(v, s), Palette.Speed, "± 1 σ", options.WidthPx);
        }

        if (Meaningful(path.DistanceSigmaM)?[from..to] is { } ds)
        {
            double[] s = Scale(ds, 1 / units.MetresPerDistanceUnit());
            Panels.Band(distance, t, Minus(d, s), Plus(d, s), Palette.Distance, "± 1 σ", options.WidthPx);
        }

        Panels.Line(speed, t, v, Palette.Speed, "speed", options.WidthPx);
        Panels.Line(distance, t, d, Palette.Distance, "distance", options.WidthPx);
        Panels.Line(accel, t, a, Palette.Accel, "acceleration", options.WidthPx);
        accel.Add.HorizontalLine(0, 1, Palette.Zero);

        Marks.Add([speed, distance, accel], run, zero, units, t[^1]);
        if (untilS != null)
        {
            // Zoomed in, the rollout distance itself is worth a line: distance crosses it at the mark.
            distance.Add.HorizontalLine(units.Distance(recon.RolloutM), 1, Palette.Rollout);
        }

        Panels.Label(speed, "", $"speed ({units.SpeedUnit()})");
        Panels.Label(distance, "", $"distance ({units.DistanceUnit()})");
        Panels.Label(accel, Marks.TimeAxis(run), "acceleration (m/s²)");
        Panels.Legend(speed);
        Panels.Headroom(speed, speedSigma is { } top ? v.Zip(top, (x, e) => x + (e / units.MpsPerSpeedUnit())).Append(v.Min()) : v);
        Panels.SameX(figure, StartX(t), t[^1]);
        Panels.LegendsOnlyOn(figure, speed);
        return new Chart(figure, options);
    }

    /// <summary>Where the time axis starts: at most <see cref="LeadS"/> before first motion, and
    /// far enough before it (1.5 % of the span) that the first-motion mark stands off the axis.</summary>
    public static double StartX(double[] t) => Math.Min(Math.Max(t[0], -LeadS), -0.015 * (t[^1] - Math.Max(t[0], -LeadS)));

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
