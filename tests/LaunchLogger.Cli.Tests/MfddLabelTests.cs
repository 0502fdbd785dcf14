using System.Xml.Linq;

namespace LaunchLogger.Cli.Tests;

/// <summary>The mean fully developed deceleration carries one name on the report's table, the
/// card and the stop's plot. Before, the plot said "MFDD (UN R13-H)" and the table and the card
/// "MFDD (UN R13)". The formula with its 0.8·v0 to 0.1·v0 window is the one of UN Regulation
/// No. 13-H (braking of passenger cars), Annex 3 (shared REFERENCES.md, "Braking").</summary>
public sealed class MfddLabelTests
{
    /// <summary>The SVG namespace (W3C SVG 1.1, section 5.1.1).</summary>
    private static readonly XNamespace Svg = "http://www.w3.org/2000/svg";

    private const string Label = "MFDD (UN R13-H)";

    [Fact]
    public async Task The_table_the_card_and_the_plot_name_the_MFDD_alike()
    {
        using var folder = new TempFolder();
        string log = folder.File("stop.log");
        File.WriteAllBytes(log, SimulatedLogs.BrakeTest.LogBytes);

        var table = new StringWriter();
        var error = new StringWriter();
        Assert.Equal(0, await LaunchLoggerCommand.InvokeAsync(["report", log], table, error));
        Assert.Equal(0, await LaunchLoggerCommand.InvokeAsync(["card", log, "--out", folder.File("card.html")], new StringWriter(), error));
        Assert.Equal(0, await LaunchLoggerCommand.InvokeAsync(["plot", log, "--kind", "braking", "--out", folder.File("stop.svg")], new StringWriter(), error));

        string card = File.ReadAllText(folder.File("card.html"));
        string[] plot = XDocument.Load(folder.File("stop.svg")).Descendants(Svg + "text").Select(t => t.Value.Trim()).ToArray();
        Assert.Contains(Label, table.ToString(), StringComparison.Ordinal);
        Assert.Contains($"<dt>{Label}</dt>", card, StringComparison.Ordinal);
        Assert.Contains(Label, plot);
        Assert.DoesNotContain("(UN R13)", table.ToString() + card, StringComparison.Ordinal);
    }
}
