namespace LaunchLogger.Archive.Board;

/// <summary>The board of one class.</summary>
/// <param name="Class">The class (null: runs without one).</param>
/// <param name="Rows">Ranked, first place first.</param>
public sealed record BoardSection(string? Class, IReadOnlyList<BoardRow> Rows);
