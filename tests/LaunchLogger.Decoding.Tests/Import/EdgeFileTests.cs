using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Import;

public class EdgeFileTests
{
    [Fact]
    public void EdgesBecomePointBracketsCountedFromOne()
    {
        const string text = "# pickup on the left rear wheel, club strip, test car 2\nt_s\n0.5\n\n0.62\n  0.71  \n# done\n";

        IReadOnlyList<PulseRecord> edges = EdgeFile.Read(new StringReader(text), "edges.csv");

        Assert.Equal(new[] { new PulseRecord(1, 0.5, 0.5), new PulseRecord(2, 0.62, 0.62), new PulseRecord(3, 0.71, 0.71) }, edges);
    }

    [Fact]
    public void ExponentNotationAndCrLfAreRead()
    {
        IReadOnlyList<PulseRecord> edges = EdgeFile.Read(new StringReader("t_s\r\n1e-3\r\n2.5E-3\r\n"), "edges.csv");

        Assert.Equal(new[] { 0.001, 0.0025 }, edges.Select(e => e.HiS));
    }

    [Theory]
    [InlineData("wrong header", "time\n1\n2\n", 1, "wrong header 'time': expected 't_s'")]
    [InlineData("no header at all", "# nothing\n", 0, "no header line: expected 't_s'")]
    [InlineData("not a number", "t_s\n1.0\nabc\n", 3, "column 't_s': 'abc' is not a number")]
    [InlineData("decimal comma", "t_s\n1.0\n\"1,5\"\n", 3, "column 't_s': '1,5' is not a number")]
    [InlineData("not finite", "t_s\n1.0\nNaN\n", 3, "column 't_s': 'NaN' is not a finite number")]
    [InlineData("empty cell", "t_s\n1.0\n\"\"\n", 3, "column 't_s' is empty")]
    [InlineData("two cells", "t_s\n1.0\n2.0,3.0\n", 3, "expected 1 cell(s) (t_s), found 2")]
    [InlineData("time backwards", "# c\nt_s\n1.0\n0.9\n", 4, "time goes backwards: t_s 0.9 is not after the previous edge's 1")]
    [InlineData("time repeats", "t_s\n1.0\n1.0\n", 3, "time goes backwards: t_s 1 is not after the previous edge's 1")]
    [InlineData("too few rows", "# c\nt_s\n1.0\n", 2, "too few rows: at least 2 data rows are needed after the header, found 1")]
    [InlineData("bad quoting", "t_s\n1.0\n\"2.0\"x\n", 3, "bad quoting:")]
    public void BadInputNamesFileAndLine(string name, string text, int line, string detail)
    {
        var e = Assert.Throws<InputException>(() => EdgeFile.Read(new StringReader(text), "edges.csv"));

        Assert.Equal("edges.csv", e.File);
        Assert.True(line == e.Line, $"{name}: line {e.Line}");
        Assert.StartsWith(detail, e.Detail, StringComparison.Ordinal);
        Assert.StartsWith(line > 0 ? $"edges.csv:{line}: " : "edges.csv: ", e.Message, StringComparison.Ordinal);
        Assert.DoesNotContain('\n', e.Message);
    }

    [Fact]
    public void MissingFileIsNamed()
    {
        string path = Path.Combine(Path.GetTempPath(), "missing-" + Guid.NewGuid() + ".csv");

        var e = Assert.Throws<InputException>(() => EdgeFile.Read(path));

        Assert.Equal($"{path}: file not found", e.Message);
        Assert.Equal(0, e.Line);
    }

    [Fact]
    public void DirectoryIsNotAFile()
    {
        var e = Assert.Throws<InputException>(() => EdgeFile.Read(Path.GetTempPath()));

        Assert.Equal("is a directory, not a file", e.Detail);
    }

    [Fact]
    public void ReadsFromAFileWithAByteOrderMark()
    {
        string path = Path.Combine(Path.GetTempPath(), "edges-" + Guid.NewGuid() + ".csv");
        File.WriteAllText(path, "t_s\n0.1\n0.2\n", new System.Text.UTF8Encoding(encoderShouldEmitUTF8Identifier: true));
        try
        {
            Assert.Equal(2, EdgeFile.Read(path).Count);
        }
        finally
        {
            File.Delete(path);
        }
    }
}
