using System.Globalization;
using System.Text.RegularExpressions;
using System.Xml.Linq;
using LaunchLogger.Decoding.Analysis;

namespace LaunchLogger.Plots.Tests;

public sealed partial class RunChartsSvgTests
{
    [Fact]
    public void A_trace_is_an_svg_document_of_the_asked_size()
    {
        var svg = new SvgDocument(RunCharts.TraceSvg(SimulatedRuns.Launch, new ChartOptions { WidthPx = 800, HeightPx = 600 }));
        Assert.Equal(SvgDocument.Svg + "svg", svg.Root.Name);
        Assert.Equal("800", (string?)svg.Root.Attribute("width"));
        Assert.Equal("600", (string?)svg.Root.Attribute("height"));
        Assert.Equal("0 0 800 600", (string?)svg.Root.Attribute("viewBox"));
    }

    [Fact]
    public void A_trace_labels_its_axes_and_names_its_marks_in_imperial_units()
    {
        IReadOnlyList<string> texts = new SvgDocument(RunCharts.TraceSvg(SimulatedRuns.Launch)).Texts;
        Assert.Contains("speed (mph)", texts);
        Assert.Contains("distance (ft)", texts);
        Assert.Contains("acceleration (m/s²)", texts);
        Assert.Contains("time from first motion (s)", texts);
        Assert.Contains("first motion", texts);
        Assert.Contains("rollout 1 ft", texts); // 0.3048 m is one international foot (1959 yard and pound agreement)
        Assert.Contains("rollout zone", texts);
        Assert.Contains("brake onset", texts);
        Assert.Contains("± 1 σ", texts);
    }

    [Fact]
    public void A_trace_in_metric_units_says_so()
    {
        IReadOnlyList<string> texts = new SvgDocument(RunCharts.TraceSvg(SimulatedRuns.Launch, new ChartOptions { Units = DisplayUnits.Metric })).Texts;
        Assert.Contains("speed (km/h)", texts);
        Assert.Contains("distance (m)", texts);
        Assert.Contains("rollout 0.30 m", texts);
        Assert.DoesNotContain("speed (mph)", texts);
    }

    [Fact]
    public void The_speed_axis_reaches_the_runs_top_speed_in_the_units_shown()
    {
        // The top tick must be at or above the highest speed, converted with 1 mph = 0.44704 m/s
        // exactly (1959 international yard: 1 mile = 1609.344 m, 1 h = 3600 s).
        RunAnalysis run = SimulatedRuns.Launch;
        double topMph = run.Figures.MaxSpeedMps / 0.44704;
        var svg = new SvgDocument(RunCharts.TraceSvg(run));
        double[] ticks = svg.Texts
            .Select(t => double.TryParse(t.Replace(",", ""), NumberStyles.Float, CultureInfo.InvariantCulture, out double v) ? v : double.NaN)
            .Where(double.IsFinite).ToArray();
        Assert.Contains(ticks, v => v >= topMph - 10 && v <= topMph * 1.5);
    }

    [Fact]
    public void The_marks_stand_where_the_run_put_them_in_time()
    {
        // On a linear time axis, pixel offsets from first motion are proportional to time offsets,
        // whatever the axis' scale: (x_rollout - x_0) / (x_onset - x_0) = t_rollout / t_onset.
        RunAnalysis run = SimulatedRuns.Launch;
        var svg = new SvgDocument(RunCharts.TraceSvg(run));
        double x0 = FirstVerticalLine(svg, Palette.FirstMotion);
        double xRollout = FirstVerticalLine(svg, Palette.Rollout);
        double xOnset = FirstVerticalLine(svg, Palette.BrakeOnset);
        double t0 = run.Reconstruction.FirstMotionS.Value;
        double expected = (run.Reconstruction.RolloutTimeS!.Value.Value - t0) / (run.Braking!.OnsetS.Value - t0);
        Assert.Equal(expected, (xRollout - x0) / (xOnset - x0), 2);
    }

    [Fact]
    public void The_launch_close_up_ends_before_the_stop_and_keeps_the_start_marks()
    {
        RunAnalysis run = SimulatedRuns.Launch;
        var svg = new SvgDocument(RunCharts.Launch(run).ToSvg());
        Assert.Contains("rollout 1 ft", svg.Texts);
        Assert.Contains("first motion", svg.Texts);
        Assert.DoesNotContain("brake onset", svg.Texts);

        // The top time tick is within the close-up: at most a few seconds after first motion.
        double[] times = svg.Texts.Select(t => double.TryParse(t, NumberStyles.Float, CultureInfo.InvariantCulture, out double v) ? v : double.NaN).Where(double.IsFinite).ToArray();
        double rollout = run.Reconstruction.RolloutTimeS!.Value.Value - run.Reconstruction.FirstMotionS.Value;
        Assert.Contains(times, x => x > rollout);
        double xOnset = run.Braking!.OnsetS.Value - run.Reconstruction.FirstMotionS.Value;
        Assert.True(xOnset > 5, "the scenario brakes well after its launch");
    }

    [Fact]
    public void A_record_that_opened_moving_shows_no_first_motion_and_no_rollout()
    {
        RunAnalysis rolling = SimulatedRuns.OpenedMoving(SimulatedRuns.Launch);
        IReadOnlyList<string> texts = new SvgDocument(RunCharts.TraceSvg(rolling)).Texts;
        Assert.Contains("record start (rolling)", texts);
        Assert.Contains("time from the record's start (s)", texts);
        Assert.DoesNotContain("first motion", texts);
        Assert.DoesNotContain("rollout zone", texts);
        Assert.DoesNotContain("rollout 1 ft", texts);

        // Neither convention's zero exists for it, so an overlay of it alone has nothing to align.
        Assert.Throws<ArgumentException>(() => RunCharts.Overlay([rolling], RunAlignment.Standstill));
        Assert.Throws<ArgumentException>(() => RunCharts.Overlay([rolling], RunAlignment.Rollout));
    }

    [Fact]
    public void No_band_is_drawn_when_the_trajectory_has_no_sigma()
    {
        IReadOnlyList<string> texts = new SvgDocument(RunCharts.TraceSvg(SimulatedRuns.WithoutSigma(SimulatedRuns.Launch))).Texts;
        Assert.DoesNotContain("± 1 σ", texts);
        Assert.Contains("speed (mph)", texts);
    }

    [Fact]
    public void The_svg_is_self_contained()
    {
        var svg = new SvgDocument(RunCharts.TraceSvg(SimulatedRuns.Launch));
        Assert.Empty(svg.Document.Descendants(SvgDocument.Svg + "image"));
        Assert.Empty(svg.Document.Descendants(SvgDocument.Svg + "style"));
        Assert.DoesNotContain(svg.Attributes, a => a.Name.LocalName == "href");
        Assert.DoesNotContain(svg.Attributes, a => !a.IsNamespaceDeclaration && a.Value.Contains("http", StringComparison.OrdinalIgnoreCase));

        // Every url(#id) points inside the document.
        ISet<string> ids = svg.Ids;
        var references = svg.Attributes.SelectMany(a => UrlReference().Matches(a.Value)).Select(m => m.Groups[1].Value).ToList();
        Assert.NotEmpty(references);
        Assert.All(references, r => Assert.Contains(r, ids));
        Assert.All(svg.Document.Descendants(SvgDocument.Svg + "text"), t => Assert.Equal("DejaVu Sans", (string?)t.Attribute("font-family")));
    }

    [Fact]
    public void Glyph_positions_are_plain_number_lists()
    {
        // SVG 1.1 section 10.4: x and y on <text> are a <list-of-coordinates> (numbers separated
        // by white space and/or a comma), so a trailing separator is invalid.
        var svg = new SvgDocument(RunCharts.TraceSvg(SimulatedRuns.Launch));
        foreach (XElement text in svg.Document.Descendants(SvgDocument.Svg + "text"))
        {
            string x = (string)text.Attribute("x")!;
            Assert.Matches("^-?[0-9.]+( -?[0-9.]+)*$", x);
            Assert.Equal(text.Value.Length, x.Split(' ').Length);
        }
    }

    [Fact]
    public void Two_different_charts_share_no_ids_and_one_chart_is_drawn_the_same_twice()
    {
        string a = RunCharts.Trace(SimulatedRuns.Launch).ToInlineSvg();
        string b = RunCharts.Trace(SimulatedRuns.Stop).ToInlineSvg();
        Assert.StartsWith("<svg", a, StringComparison.Ordinal);
        Assert.Empty(new SvgDocument(a).Ids.Intersect(new SvgDocument(b).Ids));
        Assert.Equal(a, RunCharts.Trace(SimulatedRuns.Launch).ToInlineSvg());
    }

    [Fact]
    public void An_overlay_names_each_run_and_its_zero()
    {
        RunAnalysis[] runs = [SimulatedRuns.Launch, SimulatedRuns.Stop];
        IReadOnlyList<string> standstill = new SvgDocument(RunCharts.Overlay(runs, RunAlignment.Standstill, names: ["blue car", "red car"]).ToSvg()).Texts;
        Assert.Contains("blue car", standstill);
        Assert.Contains("red car", standstill);
        Assert.Contains("time from first motion (s)", standstill);
        IReadOnlyList<string> rollout = new SvgDocument(RunCharts.Overlay(runs, RunAlignment.Rollout).ToSvg()).Texts;
        Assert.Contains("time from the rollout mark (s)", rollout);
        Assert.Contains("run 2", rollout);
    }

    [Fact]
    public void A_stop_is_drawn_against_time_and_distance_from_onset()
    {
        IReadOnlyList<string> texts = new SvgDocument(RunCharts.Braking(SimulatedRuns.Stop).ToSvg()).Texts;
        Assert.Contains("time from brake onset (s)", texts);
        Assert.Contains("distance from brake onset (ft)", texts);
        Assert.Contains("deceleration (m/s²)", texts);
        Assert.Contains("brake onset", texts);
        Assert.Contains("standstill", texts);
        Assert.Contains("MFDD (UN R13-H)", texts);
    }

    [Fact]
    public void A_cross_check_shows_both_traces_and_their_difference()
    {
        RunAnalysis run = SimulatedRuns.Stop;
        IReadOnlyList<string> texts = new SvgDocument(RunCharts.CrossCheck(run, SimulatedRuns.CrossCheckAt10Hz(run), new ChartOptions { Units = DisplayUnits.Metric }).ToSvg()).Texts;
        Assert.Contains("ours", texts);
        Assert.Contains("theirs", texts);
        Assert.Contains("theirs − ours", texts);
        Assert.Contains("± 2 σ combined", texts);
        Assert.Contains("difference (km/h)", texts);
    }

    [Fact]
    public void Charts_refuse_what_they_cannot_draw()
    {
        Assert.Throws<ArgumentException>(() => RunCharts.Braking(SimulatedRuns.Launch with { Braking = null }));
        Assert.Throws<ArgumentException>(() => RunCharts.Overlay([], RunAlignment.Standstill));
        Assert.Throws<ArgumentException>(() => RunCharts.Overlay([SimulatedRuns.Launch], RunAlignment.Standstill, names: ["a", "b"]));
        Assert.Throws<ArgumentOutOfRangeException>(() => RunCharts.Trace(SimulatedRuns.Launch, new ChartOptions { WidthPx = 100 }));
        Assert.Throws<ArgumentOutOfRangeException>(() => RunCharts.Trace(SimulatedRuns.Launch, new ChartOptions { HeightPx = 9000 }));
    }

    /// <summary>The x of the first vertical line stroked in a colour (the top panel's mark).</summary>
    private static double FirstVerticalLine(SvgDocument svg, ScottPlot.Color colour)
    {
        string hex = $"#{colour.R:X2}{colour.G:X2}{colour.B:X2}";
        foreach (XElement path in svg.Document.Descendants(SvgDocument.Svg + "path"))
        {
            if (string.Equals((string?)path.Attribute("stroke"), hex, StringComparison.OrdinalIgnoreCase)
                && VerticalSegment().Match((string?)path.Attribute("d") ?? "") is { Success: true } m
                && m.Groups[1].Value == m.Groups[3].Value && Math.Abs(double.Parse(m.Groups[2].Value, CultureInfo.InvariantCulture) - double.Parse(m.Groups[4].Value, CultureInfo.InvariantCulture)) > 50)
            {
                return double.Parse(m.Groups[1].Value, CultureInfo.InvariantCulture);
            }
        }

        throw new Xunit.Sdk.XunitException($"no vertical line in {hex}");
    }

    [GeneratedRegex(@"url\(#([^)]+)\)")]
    private static partial Regex UrlReference();

    [GeneratedRegex(@"^M([-0-9.]+) ([-0-9.]+)L([-0-9.]+) ([-0-9.]+)$")]
    private static partial Regex VerticalSegment();
}
