using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding.Analysis;

namespace LaunchLogger.Pages;

/// <summary>The plots a run card embeds, drawn by the plot library as inline SVG.</summary>
public static class CardPlots
{
    /// <summary>The plots of one analysed run, in the order the card shows them.</summary>
    public static IReadOnlyList<PlotFigure> For(RunAnalysis analysis, DisplayUnits units)
    {
        ArgumentNullException.ThrowIfNull(analysis);

        // PLOT PLACE: the plot library (host/LaunchLogger.Plots) draws the run's speed,
        // distance and acceleration against time here; until it is merged the card shows a
        // marked empty place instead.
        _ = units;
        return [];
    }
}
