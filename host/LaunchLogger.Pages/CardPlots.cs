using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Plots;

namespace LaunchLogger.Pages;

/// <summary>The plots a run card embeds, drawn by the plot library (LaunchLogger.Plots) as
/// inline SVG.</summary>
public static class CardPlots
{
    /// <summary>Plot size on a card: wide enough for a screen, scaled to the page's width in print.</summary>
    private static ChartOptions Options(DisplayUnits units) => new() { Units = units, WidthPx = 960, HeightPx = 640 };

    /// <summary>The plots of one analysed run, in the order the card shows them: the run's trace
    /// (speed, distance and acceleration against time with first motion, the rollout mark and
    /// brake onset), the start close up for a standing start, then its stop when it ends with one.</summary>
    public static IReadOnlyList<PlotFigure> For(RunAnalysis analysis, DisplayUnits units)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        var plots = new List<PlotFigure>
        {
            new("Speed, distance and acceleration against time, with first motion, the rollout mark and brake onset marked and the rollout zone shaded.",
                RunCharts.Trace(analysis, Options(units)).ToInlineSvg()),
        };
        if (analysis.Reconstruction.Staged && analysis.Figures.RolloutTimeS is not null)
        {
            plots.Add(new("The start close up: first motion, the rollout zone and the rollout mark, where the two conventions start their clocks.",
                RunCharts.Launch(analysis, Options(units)).ToInlineSvg()));
        }

        if (analysis.Braking is not null)
        {
            plots.Add(new("The stop: speed and deceleration from brake onset to standstill.", RunCharts.Braking(analysis, Options(units)).ToInlineSvg()));
        }

        return plots;
    }
}
