using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Import;

/// <summary>A plain-text input exported by a spreadsheet set to a language that writes a decimal
/// comma: ';' between cells and "12,5" for twelve and a half (common practice: such spreadsheets
/// export ';' because the comma is taken by the number; from memory). Before, the header read as
/// one column "t_s;ax_mps2" and the file was refused as a wrong header without saying why; a
/// comma-separated file with decimal commas was refused with a bare cell count. Now the first is
/// read as it means and the second, and every mixed or ambiguous number, is refused by name.</summary>
public class DecimalCommaTests
{
    [Fact]
    public void A_semicolon_table_with_decimal_commas_reads_as_it_means()
    {
        AccelSeries a = AccelFile.Read(new StringReader("# exported\nt_s;ax_mps2\n0;0,1\n0,01;12,5\n0,02;-3,25\n"), "accel.csv");

        Assert.Equal(new[] { 0.0, 0.01, 0.02 }, a.TimeS);
        Assert.Equal(new[] { 0.1, 12.5, -3.25 }, a.ForwardMps2);
    }

    [Fact]
    public void A_semicolon_table_with_decimal_points_reads_as_well()
    {
        AccelSeries a = AccelFile.Read(new StringReader("t_s;ax_mps2;ay_mps2;az_mps2\n1.0;0.5;-0.1;9.8\n1.5;0.6;0.2;9.7\n"), "accel.csv");

        Assert.Equal(new[] { 1.0, 1.5 }, a.TimeS);
        Assert.Equal(new[] { 9.8, 9.7 }, a.VerticalMps2);
    }

    [Fact]
    public void A_one_column_edge_file_with_decimal_commas_is_refused_with_the_hint()
    {
        // One column has no separator to tell a decimal comma from: "0,5" is two cells.
        var e = Assert.Throws<InputException>(() => EdgeFile.Read(new StringReader("t_s\n0,5\n0,75\n"), "edges.csv"));

        Assert.Contains("found 2; if the numbers are written with a decimal comma", e.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("decimal commas between commas", "t_s,ax_mps2\n0,0,1\n0,01,12,5\n", 2, "expected 2 cell(s) (t_s,ax_mps2), found 3; if the numbers are written with a decimal comma")]
    [InlineData("a quoted decimal comma", "t_s,ax_mps2\n0,\"12,5\"\n0.01,1\n", 2, "column 'ax_mps2': '12,5' is not a number; if the numbers are written with a decimal comma")]
    [InlineData("a thousands point", "t_s;ax_mps2\n0;1.234,5\n1;2\n", 2, "column 'ax_mps2': '1.234,5' holds both a point and a comma")]
    [InlineData("marks mixed", "t_s;ax_mps2\n0;12,5\n0.01;2\n", 3, "column 't_s': '0.01' has a decimal point where the numbers above have a decimal comma")]
    public void A_decimal_comma_that_cannot_be_read_for_sure_is_refused_by_name(string name, string text, int line, string detail)
    {
        var e = Assert.Throws<InputException>(() => AccelFile.Read(new StringReader(text), "accel.csv"));

        Assert.True(line == e.Line, $"{name}: line {e.Line}: {e.Message}");
        Assert.StartsWith($"accel.csv:{line}: {detail}", e.Message, StringComparison.Ordinal);
    }
}
