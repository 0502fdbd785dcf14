using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Runs;

public class PulseRecordTests
{
    [Fact]
    public void MidpointAndWidthOfABracket()
    {
        var record = new PulseRecord(3, 1.000, 1.004);
        Assert.Equal(1.002, record.MidS, 12);
        Assert.Equal(0.004, record.WidthS, 12);
    }
}
