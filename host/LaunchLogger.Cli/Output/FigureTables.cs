using LaunchLogger.Decoding.Reporting;
using Spectre.Console;

namespace LaunchLogger.Cli.Output;

/// <summary>The two figure tables every report shows: speed intervals and distance marks, with
/// both conventions in adjacent columns.</summary>
public static class FigureTables
{
    /// <summary>Speed intervals: from standstill, after rollout ("same" for rolling intervals).</summary>
    public static Table Intervals(IReadOnlyList<SpeedIntervalReport> intervals)
    {
        var table = new Table().Border(TableBorder.Simple)
            .AddColumn("Speed interval")
            .AddColumn(new TableColumn("From standstill").RightAligned())
            .AddColumn(new TableColumn("After rollout").RightAligned());
        foreach (SpeedIntervalReport i in intervals)
        {
            bool standing = i.FromMps == 0;
            table.AddRow(
                new Text(i.Label),
                new Text(Format.SecondsWithSigma(i.FromStandstillS, i.UncertaintyS)),
                standing ? new Text(Format.SecondsWithSigma(i.FromRolloutS, i.FromRolloutUncertaintyS)) : new Text("same", new Style(decoration: Decoration.Dim)));
        }

        return table;
    }

    /// <summary>Distance marks: elapsed times under both conventions, speed, trap speed.</summary>
    public static Table Marks(IReadOnlyList<DistanceMarkReport> marks, DisplayUnits units)
    {
        var table = new Table().Border(TableBorder.Simple)
            .AddColumn("Distance")
            .AddColumn(new TableColumn("From standstill").RightAligned())
            .AddColumn(new TableColumn("After rollout").RightAligned())
            .AddColumn(new TableColumn("Speed").RightAligned())
            .AddColumn(new TableColumn("Trap speed").RightAligned());
        foreach (DistanceMarkReport m in marks)
        {
            table.AddRow(
                new Text(m.Label),
                new Text(Format.SecondsWithSigma(m.FromStandstillS, m.UncertaintyS)),
                new Text(Format.SecondsWithSigma(m.FromRolloutS, m.FromRolloutUncertaintyS)),
                new Text(Format.Speed(m.SpeedMps, units)),
                new Text(m.TrapSpeedMps is { } trap ? $"{Format.Speed(trap, units)} {Format.SpeedSigma(m.TrapSpeedUncertaintyMps, units)}" : ""));
        }

        return table;
    }
}
