using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Runs;

public class AxisMappingTests
{
    // Expected frames follow ISO 8855's vehicle axes (x forward, y left, z up), so lateral is
    // vertical × forward in the sensor's right-handed axes.
    [Theory]
    [InlineData("flat, x forward", 0, false, 1, 1, 2, 1)]
    [InlineData("flat, x backward", 0, true, 1, -1, 2, 1)]
    [InlineData("flat, y forward", 1, false, 0, -1, 2, 1)]
    [InlineData("on its end, z forward", 2, false, 0, 1, 1, 1)]
    public void WithoutGravityTheBoxIsTakenToLieFlat(string name, int forward, bool reversed, int lateral, int lateralSign, int vertical, int verticalSign)
    {
        AxisMapping m = AxisMapping.Choose(forward, reversed, null);

        Assert.True(new AxisMapping(forward, reversed ? -1 : 1, lateral, lateralSign, vertical, verticalSign, false) == m, name);
    }

    [Theory]
    [InlineData("upside down", 0, false, 0, 0, -990, 1, -1, 2, -1)]
    [InlineData("on its side, y up", 0, false, 20, 1001, 5, 2, -1, 1, 1)]
    [InlineData("tilted, z still most", 1, false, 300, 100, 940, 0, -1, 2, 1)]
    public void RestingGravityPicksTheVerticalAxis(string name, int forward, bool reversed, double gx, double gy, double gz, int lateral, int lateralSign, int vertical, int verticalSign)
    {
        AxisMapping m = AxisMapping.Choose(forward, reversed, (gx, gy, gz));

        Assert.True(new AxisMapping(forward, reversed ? -1 : 1, lateral, lateralSign, vertical, verticalSign, true) == m, name);
    }

    [Fact]
    public void AllZeroGravityKeepsTheDefault()
    {
        Assert.False(AxisMapping.Choose(0, false, (0, 0, 0)).VerticalFromGravity);
    }

    [Fact]
    public void ForwardAxisOutOfRangeIsACallerBug()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => AxisMapping.Choose(3, false, null));
    }
}
