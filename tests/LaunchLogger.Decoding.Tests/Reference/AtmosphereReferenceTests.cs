using LaunchLogger.Decoding.Corrections;

namespace LaunchLogger.Decoding.Tests.Reference;

public class AtmosphereReferenceTests
{
    [Theory]
    // International Standard Atmosphere table by geopotential altitude (ICAO Doc 7488, Manual of
    // the ICAO Standard Atmosphere; US Standard Atmosphere 1976, Table I). Values from memory of
    // those tables, except the tropopause pressure 22 632 Pa at 11 000 m, which pages quoting
    // Doc 7488 give as the layer's base pressure. The tables print six figures, worth ±0.01 m here.
    [InlineData(101325.0, 0)]
    [InlineData(95460.8, 500)]
    [InlineData(89874.57, 1000)]
    [InlineData(79495.2, 2000)]
    [InlineData(70108.5, 3000)]
    [InlineData(54019.9, 5000)]
    [InlineData(22632.06, 11000)]
    public void PressureAltitudeAgreesWithTheStandardAtmosphereTable(double pressurePa, double altitudeM)
    {
        Assert.InRange(Atmosphere.PressureAltitudeM(pressurePa) - altitudeM, -0.05, 0.05);
    }

    [Theory]
    // Same tables, density column (from memory): ρ0 = 1.225 kg/m³ exactly by definition.
    [InlineData(1.225, 0)]
    [InlineData(1.16727, 500)]
    [InlineData(1.11164, 1000)]
    [InlineData(1.00649, 2000)]
    [InlineData(0.909122, 3000)]
    [InlineData(0.736116, 5000)]
    public void DensityAltitudeAgreesWithTheStandardAtmosphereTable(double densityKgPerM3, double altitudeM)
    {
        // Six printed figures are worth about ±0.05 m of altitude.
        Assert.InRange(Atmosphere.DensityAltitudeM(densityKgPerM3) - altitudeM, -0.1, 0.1);
    }

    [Theory]
    // CRC Handbook of Chemistry and Physics, 73rd ed. (1992–93), "Vapor pressure of water from 0
    // to 370 °C", kPa. Buck (1981) claims about 0.05 % over this range; the check allows 0.1 %.
    [InlineData(0, 0.61129)]
    [InlineData(10, 1.2281)]
    [InlineData(20, 2.3388)]
    [InlineData(25, 3.1690)]
    [InlineData(30, 4.2455)]
    [InlineData(40, 7.3814)]
    public void SaturationVapourPressureAgreesWithTheHandbookTable(double temperatureC, double tableKPa)
    {
        double pa = Atmosphere.SaturationVapourPressurePa(temperatureC);
        Assert.InRange(pa / (tableKPa * 1000), 0.999, 1.001);
    }

    [Theory]
    // Dry air at 101 325 Pa: 15 °C → 1.2250 kg/m³ (the ISA sea-level density, ICAO Doc 7488);
    // 0, 20 and 25 °C → 1.2922, 1.2041, 1.1839 kg/m³ (dry-air tables of engineering handbooks,
    // from memory).
    [InlineData(15, 1.2250)]
    [InlineData(0, 1.2922)]
    [InlineData(20, 1.2041)]
    [InlineData(25, 1.1839)]
    public void DryAirDensityAgreesWithTheTables(double temperatureC, double density)
    {
        Assert.InRange(Atmosphere.HumidAirDensity(temperatureC, 101325, 0) - density, -1e-4, 1e-4);
    }

    [Theory]
    [InlineData(20, 101325, 50)]
    [InlineData(30, 95000, 80)]
    [InlineData(5, 100000, 30)]
    public void MoistAirDensityAgreesWithTheVirtualTemperatureForm(double temperatureC, double pressurePa, double humidityPct)
    {
        // A second derivation with its own constants: ρ = p/(R_d·T_v), T_v = T/(1 − (e/p)(1 − ε))
        // (meteorology texts, e.g. Wallace & Hobbs, Atmospheric Science, §3.1.1), ε = M_w/M_d =
        // 18.01528/28.96546, R_d = R/M_d with CODATA R = 8.314462618 (molar masses as in the
        // CIPM-2007 air density equation, from memory); e from the CRC table above, interpolated
        // in ln e where needed.
        double e = humidityPct / 100 * CrcVapourPressurePa(temperatureC);
        double epsilon = 18.01528 / 28.96546;
        double rd = 8.314462618 / 0.02896546;
        double virtualK = (temperatureC + 273.15) / (1 - (e / pressurePa * (1 - epsilon)));
        double expected = pressurePa / (rd * virtualK);

        Assert.InRange(Atmosphere.HumidAirDensity(temperatureC, pressurePa, humidityPct) - expected, -2e-4, 2e-4);
        // Water vapour is lighter than the air it displaces (M_w < M_d): humid air is less dense.
        Assert.True(Atmosphere.HumidAirDensity(temperatureC, pressurePa, humidityPct) < Atmosphere.HumidAirDensity(temperatureC, pressurePa, 0));
    }

    [Theory]
    // SAE J1349 power correction, JUN1990 form (the revision the code implements):
    // CF = 1.18·(99/p_d)·√((T + 273)/298) − 0.18, to 25 °C and 99 kPa of dry air. The form and its
    // revision date are as quoted in secondary sources; the standard itself was not at hand.
    // Second derivation from the model behind it, not the formula: indicated power scales with
    // dry-air pressure and 1/√T (intake flow), friction power does not change, and mechanical
    // efficiency at the test is 1/1.18 (≈ 85 %); CF = corrected brake power / measured brake power.
    [InlineData(99, 25)]
    [InlineData(85, 25)]
    [InlineData(100, 20)]
    [InlineData(95, 35)]
    [InlineData(80, 40)]
    [InlineData(101, -5)]
    public void J1349FactorFollowsFromConstantFrictionAndIntakeFlow(double dryKPa, double temperatureC)
    {
        const double MeasuredBrakeKw = 150;
        double indicated = MeasuredBrakeKw * 1.18;
        double friction = indicated - MeasuredBrakeKw;
        double indicatedAtStandard = indicated * (99 / dryKPa) * Math.Sqrt((temperatureC + 273) / 298);
        double expected = (indicatedAtStandard - friction) / MeasuredBrakeKw;

        Assert.Equal(expected, Atmosphere.J1349CorrectionFactor(dryKPa, temperatureC), 9);
    }

    [Fact]
    public void J1349RevisionsDifferByAboutOneTenthOfAPercentAtMost()
    {
        // Later revisions use 1.176/0.176 (85 % mechanical efficiency; from memory). The two forms
        // differ by 0.004·(x − 1), x = (99/p_d)·√((T+273)/298): at most 0.0013 in CF (0.13 % of a
        // corrected time) for a track from sea level to 2000 m and −5 to 40 °C. The code keeps the
        // 1990 form because its coefficients are the ones we could confirm with their revision date.
        double x = (99.0 / 78) * Math.Sqrt((40.0 + 273) / 298);
        double later = (1.176 * x) - 0.176;
        Assert.InRange(Atmosphere.J1349CorrectionFactor(78, 40) - later, 0, 0.0013);
        Assert.Equal(1.0, Atmosphere.J1349CorrectionFactor(99, 25), 12); // the reference state itself
    }

    [Fact]
    public void WeatherParsesAndRejectsNonsense()
    {
        Weather w = Weather.Parse("20,1013.25,50");
        Assert.Equal(Atmosphere.HumidAirDensity(20, 101325, 50), w.DensityKgPerM3, 12);
        Assert.Contains("three numbers", Assert.Throws<FormatException>(() => Weather.Parse("20,1013")).Message);
        Assert.Contains("humidity", Assert.Throws<FormatException>(() => Weather.Parse("20,1013,150")).Message);
        Assert.Contains("not a number", Assert.Throws<FormatException>(() => Weather.Parse("warm,1013,50")).Message);
    }

    /// <summary>The CRC Handbook table above (kPa → Pa), interpolated linearly in ln e between its rows.</summary>
    private static double CrcVapourPressurePa(double temperatureC)
    {
        double[] t = [0, 5, 10, 20, 25, 30, 40];
        double[] kpa = [0.61129, 0.8726, 1.2281, 2.3388, 3.1690, 4.2455, 7.3814];
        int i = 0;
        while (i < t.Length - 2 && temperatureC > t[i + 1])
        {
            i++;
        }

        double f = (temperatureC - t[i]) / (t[i + 1] - t[i]);
        return 1000 * Math.Exp(Math.Log(kpa[i]) + (f * (Math.Log(kpa[i + 1]) - Math.Log(kpa[i]))));
    }
}
