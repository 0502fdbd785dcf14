using LaunchLogger.Decoding.Import;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Import;

public class AccelFileTests
{
    [Fact]
    public void LongitudinalOnly()
    {
        AccelSeries a = AccelFile.Read(new StringReader("t_s,ax_mps2\n0.000,0.1\n0.010,4.9\n0.020,5.0\n"), "accel.csv");

        Assert.Equal(new[] { 0.0, 0.010, 0.020 }, a.TimeS);
        Assert.Equal(new[] { 0.1, 4.9, 5.0 }, a.ForwardMps2);
        Assert.Equal(new double[3], a.LateralMps2);
        Assert.Equal(new double[3], a.VerticalMps2);
        Assert.False(a.HasAllAxes);
        Assert.Equal(0.010, a.SamplePeriodS, 1e-15);
        Assert.Equal(0, a.SamplePeriodUncertaintyS);
        Assert.Null(a.SampleIndex);
    }

    [Fact]
    public void ThreeAxes()
    {
        AccelSeries a = AccelFile.Read(new StringReader("T_S, AX_MPS2, ay_mps2, az_mps2\n1.0,0.5,-0.1,9.8\n1.5,0.6,0.2,9.7\n"), "accel.csv");

        Assert.True(a.HasAllAxes);
        Assert.Equal(new[] { -0.1, 0.2 }, a.LateralMps2);
        Assert.Equal(new[] { 9.8, 9.7 }, a.VerticalMps2);
    }

    [Theory]
    [InlineData("two of three extra axes", "t_s,ax_mps2,ay_mps2\n", 1, "wrong header 't_s,ax_mps2,ay_mps2': expected 't_s,ax_mps2' or 't_s,ax_mps2,ay_mps2,az_mps2'")]
    [InlineData("bad ax", "t_s,ax_mps2\n0,1\n1,fast\n", 3, "column 'ax_mps2': 'fast' is not a number")]
    [InlineData("bad az", "t_s,ax_mps2,ay_mps2,az_mps2\n0,1,2,3\n1,1,2,Infinity\n", 3, "column 'az_mps2': 'Infinity' is not a finite number")]
    [InlineData("time backwards", "t_s,ax_mps2\n0,1\n1,1\n0.5,1\n", 4, "time goes backwards: t_s 0.5 is not after the previous row's 1")]
    [InlineData("too few rows", "t_s,ax_mps2\n0,1\n", 1, "too few rows: at least 2 data rows are needed after the header, found 1")]
    public void BadInputNamesFileAndLine(string name, string text, int line, string detail)
    {
        var e = Assert.Throws<InputException>(() => AccelFile.Read(new StringReader(text), "accel.csv"));

        Assert.True(line == e.Line, $"{name}: line {e.Line}");
        Assert.Equal($"accel.csv:{line}: {detail}", e.Message);
    }
}
