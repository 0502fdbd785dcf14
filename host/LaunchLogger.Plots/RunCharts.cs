using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.CrossCheck;

namespace LaunchLogger.Plots;

/// <summary>The charts of runs: one run's trace, several runs overlaid, a stop, and a
/// cross-check against another instrument. Each returns a <see cref="Chart"/> to write as SVG or
/// PNG; <see cref="TraceSvg"/> is the shortcut for inlining one run's trace in HTML.</summary>
/// <remarks>Speeds and distances are in <see cref="ChartOptions.Units"/>; acceleration is in
/// m/s² whatever the units (as in the report's tables). Times are seconds from the run's first
/// motion (or the alignment asked for), never the log's own clock.</remarks>
public static class RunCharts
{
    /// <summary>One run: speed, distance and acceleration against time from first motion, with
    /// first motion, the rollout mark and brake onset marked, the rollout zone shaded, and ±1 σ
    /// bands on speed and distance where the reconstruction gives σ.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The options' size is out of range.</exception>
    public static Chart Trace(RunAnalysis run, ChartOptions? options = null) =>
        TraceChart.Draw(run, Checked(options));

    /// <summary><see cref="Trace"/> as a self-contained SVG document, for inlining.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The options' size is out of range.</exception>
    public static string TraceSvg(RunAnalysis run, ChartOptions? options = null) =>
        Trace(run, options).ToSvg();

    /// <summary>The start of one run, close up: as <see cref="Trace"/> from just before first
    /// motion to a little past the rollout mark (at least 2 s, and 4 times the mark's time), with
    /// the rollout distance drawn across the distance panel.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The options' size is out of range.</exception>
    public static Chart Launch(RunAnalysis run, ChartOptions? options = null) =>
        TraceChart.DrawLaunch(run, Checked(options));

    /// <summary>Several runs' speed and distance on one time axis whose zero is each run's first
    /// motion or its rollout mark. Runs without that zero (records that opened moving; runs that
    /// never reached the mark) are left out.</summary>
    /// <exception cref="ArgumentException">No run, a name count that differs from the run count,
    /// or no run with the zero asked for.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The options' size is out of range.</exception>
    public static Chart Overlay(IReadOnlyList<RunAnalysis> runs, RunAlignment alignment, ChartOptions? options = null, IReadOnlyList<string>? names = null) =>
        OverlayChart.Draw(runs, alignment, Checked(options), names);

    /// <summary>The run's final stop: speed and deceleration against time and against distance
    /// from brake onset.</summary>
    /// <exception cref="ArgumentException">The run has no stop.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The options' size is out of range.</exception>
    public static Chart Braking(RunAnalysis run, ChartOptions? options = null) =>
        BrakingChart.Draw(run, Checked(options));

    /// <summary>Our speed and the other instrument's (on our clock, after alignment), and their
    /// difference, against time from our first motion.</summary>
    /// <exception cref="ArgumentOutOfRangeException">The options' size is out of range.</exception>
    public static Chart CrossCheck(RunAnalysis ours, CrossCheckResult result, ChartOptions? options = null) =>
        CrossCheckChart.Draw(ours, result, Checked(options));

    private static ChartOptions Checked(ChartOptions? options)
    {
        options ??= new ChartOptions();
        options.Validate();
        return options;
    }
}
