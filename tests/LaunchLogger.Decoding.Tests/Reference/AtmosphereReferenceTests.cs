using LaunchLogger.Decoding.Corrections;

namespace LaunchLogger.Decoding.Tests.Reference;

public class AtmosphereReferenceTests
{
    [Theory]
    // International Standard Atmosphere (ICAO Doc 7488; US Standard Atmosphere 1976), check
    // values from shared REFERENCES.md: h_p(89874.57 Pa) = 1000.00 m, h_p(95000 Pa) = 540.34 m.
    [InlineData(89874.57, 1000.00)]
    [InlineData(95000, 540.34)]
    [InlineData(101325, 0)]
    public void PressureAltitude(double pressurePa, double altitudeM)
    {
        Assert.Equal(altitudeM, Atmosphere.PressureAltitudeM(pressurePa), 2);
    }

    [Fact]
    public void DensityAltitudeOfTheStandardDensityAt1000Metres()
    {
        // US Standard Atmosphere 1976 table: density 1.1117 kg/m³ at 1000 m (from memory).
        // The table rounds to 4 digits, worth about ±1 m of altitude here.
        Assert.InRange(Atmosphere.DensityAltitudeM(1.1117), 998.5, 1001.5);
        Assert.Equal(0, Atmosphere.DensityAltitudeM(1.225), 6); // ISA ρ0 = 1.225 kg/m³
    }

    [Fact]
    public void SaturationVapourPressureAt20C()
    {
        // Buck (1981): e_s(20 °C) ≈ 23.37 hPa.
        Assert.Equal(2337, Atmosphere.SaturationVapourPressurePa(20), 0);
    }

    [Fact]
    public void HumidAirDensity()
    {
        // Partial-pressure form with R_d = 287.058, R_v = 461.495 J/(kg·K) (from memory):
        // 101325 Pa, 20 °C, 50 % RH → ≈ 1.1988 kg/m³ (shared REFERENCES.md).
        Assert.Equal(1.1988, Atmosphere.HumidAirDensity(20, 101325, 50), 4);
    }

    [Theory]
    // SAE J1349 correction factor check values (shared REFERENCES.md, formula from memory).
    [InlineData(99, 25, 1.00000)]
    [InlineData(85, 25, 1.19435)]
    [InlineData(100, 20, 0.97836)]
    [InlineData(95, 35, 1.07015)]
    public void J1349CorrectionFactor(double dryKPa, double temperatureC, double factor)
    {
        Assert.Equal(factor, Atmosphere.J1349CorrectionFactor(dryKPa, temperatureC), 5);
    }

    [Fact]
    public void WeatherParsesAndRejectsNonsense()
    {
        Weather w = Weather.Parse("20,1013.25,50");
        Assert.Equal(1.1988, w.DensityKgPerM3, 4);
        Assert.Contains("three numbers", Assert.Throws<FormatException>(() => Weather.Parse("20,1013")).Message);
        Assert.Contains("humidity", Assert.Throws<FormatException>(() => Weather.Parse("20,1013,150")).Message);
        Assert.Contains("not a number", Assert.Throws<FormatException>(() => Weather.Parse("warm,1013,50")).Message);
    }
}
