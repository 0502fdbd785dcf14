using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Import;

public class CountFileTests
{
    [Fact]
    public void ChangesOnlyCaptureTakesTheFirstRowAsTheFirstPulse()
    {
        const string text = "t_lo_s,t_hi_s,count\n1.000,1.002,1041\n1.100,1.102,1043\n1.150,1.152,1044\n";

        IReadOnlyList<PulseRecord> records = CountFile.Read(new StringReader(text), "counts.csv");

        Assert.Equal(new[] { new PulseRecord(1, 1.000, 1.002), new PulseRecord(3, 1.100, 1.102), new PulseRecord(4, 1.150, 1.152) }, records);
    }

    [Fact]
    public void EveryPollCaptureTakesTheFirstRowAsTheOriginReading()
    {
        // Standing still for three polls, then changes; repeated counts carry no change.
        const string text = "t_lo_s,t_hi_s,count\n0.000,0.002,77\n0.002,0.004,77\n0.004,0.006,77\n0.006,0.008,78\n0.008,0.010,78\n0.010,0.012,80\n";

        IReadOnlyList<PulseRecord> records = CountFile.Read(new StringReader(text), "counts.csv");

        Assert.Equal(new[] { new PulseRecord(1, 0.006, 0.008), new PulseRecord(3, 0.010, 0.012) }, records);
    }

    [Fact]
    public void AnOpeningReadingOfNoWidthIsTheOriginEvenWhenTheCountMovesAtOnce()
    {
        // A record that opens moving: the capture's first reading (no bracket) then a change at
        // every poll. The reading is where the count stood, not a pulse at that instant.
        const string text = "t_lo_s,t_hi_s,count\n0.000,0.000,500\n0.000,0.005,502\n0.005,0.010,503\n";

        IReadOnlyList<PulseRecord> records = CountFile.Read(new StringReader(text), "counts.csv");

        Assert.Equal(new[] { new PulseRecord(2, 0.000, 0.005), new PulseRecord(3, 0.005, 0.010) }, records);
    }

    [Fact]
    public void OverlappingBracketsOfAPollingBoardAreAccepted()
    {
        const string text = "t_lo_s,t_hi_s,count\n1.0000,1.0020,5\n1.0019,1.0040,6\n";

        Assert.Equal(2, CountFile.Read(new StringReader(text), "counts.csv").Count);
    }

    [Theory]
    [InlineData("wrong header", "t_lo,t_hi,count\n", 1, "wrong header 't_lo,t_hi,count': expected 't_lo_s,t_hi_s,count'")]
    [InlineData("count not whole", "t_lo_s,t_hi_s,count\n1,2,3\n2,3,4.5\n", 3, "column 'count': '4.5' is not a whole number")]
    [InlineData("hi not a number", "t_lo_s,t_hi_s,count\n1,x,3\n", 2, "column 't_hi_s': 'x' is not a number")]
    [InlineData("hi before lo", "t_lo_s,t_hi_s,count\n1,2,3\n2.5,2.4,4\n", 3, "t_hi_s 2.4 is before t_lo_s 2.5")]
    [InlineData("hi goes back", "t_lo_s,t_hi_s,count\n1,2,3\n1.5,2,4\n", 3, "time goes backwards: t_hi_s 2 is not after the previous row's 2")]
    [InlineData("lo goes back", "t_lo_s,t_hi_s,count\n1,2,3\n0.5,3,4\n", 3, "time goes backwards: t_lo_s 0.5 is before the previous row's 1")]
    [InlineData("count goes back", "t_lo_s,t_hi_s,count\n1,2,3\n2,3,2\n", 3, "count goes backwards from 3 to 2")]
    [InlineData("too few rows", "t_lo_s,t_hi_s,count\n1,2,3\n", 1, "too few rows: at least 2 data rows are needed after the header, found 1")]
    [InlineData("never changes", "# still\nt_lo_s,t_hi_s,count\n1,2,3\n2,3,3\n", 2, "the count never changes: no pulses to import")]
    [InlineData("missing cell", "t_lo_s,t_hi_s,count\n1,2\n", 2, "expected 3 cell(s) (t_lo_s,t_hi_s,count), found 2")]
    public void BadInputNamesFileAndLine(string name, string text, int line, string detail)
    {
        var e = Assert.Throws<InputException>(() => CountFile.Read(new StringReader(text), "counts.csv"));

        Assert.True(line == e.Line, $"{name}: line {e.Line}");
        Assert.Equal(detail, e.Detail);
        Assert.Equal($"counts.csv:{line}: {detail}", e.Message);
    }
}
