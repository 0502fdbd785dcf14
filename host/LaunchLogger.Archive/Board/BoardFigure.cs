namespace LaunchLogger.Archive.Board;

/// <summary>A figure the board can rank by. Each is read from the report document the decoder
/// makes (never re-computed here), matched by its speeds or distance, not by its label.</summary>
/// <param name="Code">Stable name used on the command line, in the archive and in exports.</param>
/// <param name="Description">For --help and headings.</param>
/// <param name="Quantity">What it measures (decides units and direction).</param>
/// <param name="HasConventions">True when it differs between timing from standstill and after the rollout.</param>
/// <param name="Read">Reads the figure from a run's report entry: (standstill value, its σ, after-rollout value, its σ), SI.</param>
public sealed record BoardFigure(
    string Code,
    string Description,
    FigureQuantity Quantity,
    bool HasConventions,
    Func<LaunchLogger.Decoding.Reporting.RunReport, FigureValue?> Read)
{
    /// <summary>True when a higher value ranks first (speeds); times and distances rank lowest first.</summary>
    public bool HigherIsBetter => Quantity == FigureQuantity.Speed;
}
