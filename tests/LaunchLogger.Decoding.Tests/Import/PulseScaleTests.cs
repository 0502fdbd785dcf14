using LaunchLogger.Decoding.Import;
using UnitsNet;

namespace LaunchLogger.Decoding.Tests.Import;

public class PulseScaleTests
{
    [Fact]
    public void MetresPerPulseGivenDirectly()
    {
        Assert.Equal(new PulseScale(0.04, 0, 0), PulseScale.FromOptions(0.04, null, null));
    }

    [Fact]
    public void WheelGivesCircumferenceOverPulses()
    {
        PulseScale scale = PulseScale.FromOptions(null, 48, 1.96)!;

        Assert.Equal(1.96 / 48, scale.MetresPerPulse, 1e-15);
        Assert.Equal((48, 1.96), (scale.PulsesPerRevolution, scale.CircumferenceM));
    }

    [Fact]
    public void WheelMeasuredInInches()
    {
        // A 25-inch tyre, 4 pulses per revolution: 25·π in per revolution.
        // Reference library: UnitsNet for in → m (1 in = 0.0254 m exactly).
        double circumferenceM = Length.FromInches(25 * Math.PI).Meters;

        PulseScale scale = PulseScale.FromOptions(null, 4, circumferenceM)!;

        Assert.Equal(0.0254 * 25 * Math.PI / 4, scale.MetresPerPulse, 1e-15);
    }

    [Fact]
    public void NoOptionsGiveNoScale()
    {
        Assert.Null(PulseScale.FromOptions(null, null, null));
    }

    [Theory]
    [InlineData("both forms", 0.04, 48, 1.96, "--metres-per-pulse", "give it or --pulses-per-rev with --circumference-m, not both")]
    [InlineData("zero", 0.0, null, null, "--metres-per-pulse", "0 m per pulse is outside 0.0001 to 5 m")]
    [InlineData("huge", 1e308, null, null, "--metres-per-pulse", "1E+308 m per pulse is outside 0.0001 to 5 m")]
    [InlineData("tiny", 1e-300, null, null, "--metres-per-pulse", "1E-300 m per pulse is outside 0.0001 to 5 m")]
    [InlineData("not a number", double.NaN, null, null, "--metres-per-pulse", "NaN m per pulse is outside 0.0001 to 5 m")]
    [InlineData("pulses alone", null, 48, null, "--circumference-m", "is needed with --pulses-per-rev")]
    [InlineData("circumference alone", null, null, 1.96, "--pulses-per-rev", "is needed with --circumference-m")]
    [InlineData("no pulses", null, 0, 1.96, "--pulses-per-rev", "0 pulses per revolution is outside 1 to 10000")]
    [InlineData("negative circumference", null, 48, -2.0, "--circumference-m", "circumference -2 m is outside 0.3 to 5 m")]
    [InlineData("circumference of a planet", null, 48, 4e7, "--circumference-m", "circumference 40000000 m is outside 0.3 to 5 m")]
    public void OptionsThatDoNotFitNameTheOption(string name, double? mpp, int? ppr, double? circumference, string option, string detail)
    {
        var e = Assert.Throws<InputException>(() => PulseScale.FromOptions(mpp, ppr, circumference));

        Assert.True(option == e.File, name);
        Assert.Equal(detail, e.Detail);
        Assert.Equal($"{option}: {detail}", e.Message);
    }
}
