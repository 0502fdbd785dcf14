using LaunchLogger.Archive.Records;
using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding.Reporting;

namespace LaunchLogger.Pages;

/// <summary>Everything one run card shows.</summary>
public sealed record CardInput
{
    /// <summary>The run's entry in the report document (the same model <c>report --json</c> writes).</summary>
    public required RunReport Run { get; init; }

    /// <summary>The braking bound the run was held against (the document's), when any.</summary>
    public TractionBoundReport? TractionBound { get; init; }

    /// <summary>Said instead of the bound when <see cref="TractionBound"/> is null for a reason other
    /// than there being none (plain text).</summary>
    public string? BoundNote { get; init; }

    /// <summary>The weather the figures were corrected with (the document's), when any.</summary>
    public WeatherReport? Weather { get; init; }

    /// <summary>Where the run is filed, when it comes from the archive.</summary>
    public FiledRun? Filed { get; init; }

    /// <summary>The tool version that made the figures.</summary>
    public required string ToolVersion { get; init; }

    /// <summary>Units the reader wants.</summary>
    public DisplayUnits Units { get; init; } = DisplayUnits.Imperial;

    /// <summary>The run's plots as inline SVG markup (already made; embedded as they are), in
    /// the order shown; empty when none could be drawn.</summary>
    public IReadOnlyList<PlotFigure> Plots { get; init; } = [];
}

/// <summary>One inline SVG plot and its caption.</summary>
/// <param name="Caption">Plain text.</param>
/// <param name="Svg">The SVG element's markup, from the plot library.</param>
public sealed record PlotFigure(string Caption, string Svg);
