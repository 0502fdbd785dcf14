using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Tests.Metrics;

namespace LaunchLogger.Decoding.Tests.Corrections;

/// <summary>Every field the corrections touch, one rule at a time.</summary>
public class CorrectionRulesTests
{
    [Fact]
    public void APairsFiguresAreMeansAndItsSigmasHalfTheRootSumSquare()
    {
        // Mean of two runs; σ of the mean of two independent errors is ½·√(σ₁² + σ₂²) (any
        // statistics text). A figure missing from either run is missing from the pair.
        FigureSet a = Figures(interval: 5.0, intervalSigma: 0.03, mark: 12.0, markSigma: 0.04, speed: 50, trapSigma: 0.3, peak: 6, top: 60, distance: 500, meanAccel: 5.2);
        FigureSet b = Figures(interval: 5.4, intervalSigma: 0.04, mark: 12.4, markSigma: 0.03, speed: 48, trapSigma: 0.4, peak: 5, top: 58, distance: 480, meanAccel: null);
        FigureSet mean = PairAverage.Mean(a, b);

        IntervalFigure i = Assert.Single(mean.SpeedIntervals);
        Assert.Equal(5.2, i.FromStandstillS!.Value, 12);
        Assert.Equal(4.9, i.FromRolloutS!.Value, 12);
        Assert.Equal(0.025, i.UncertaintyS!.Value, 12);
        Assert.Equal(0.025, i.FromRolloutUncertaintyS!.Value, 12);
        MarkFigure m = Assert.Single(mean.DistanceMarks);
        Assert.Equal(12.2, m.FromStandstillS!.Value, 12);
        Assert.Equal(11.9, m.FromRolloutS!.Value, 12);
        Assert.Equal(0.025, m.UncertaintyS!.Value, 12);
        Assert.Equal(0.025, m.FromRolloutUncertaintyS!.Value, 12);
        Assert.Equal(49, m.SpeedAtMarkMps!.Value, 12);
        Assert.Equal(48, m.TrapSpeedMps!.Value, 12);
        Assert.Equal(0.25, m.TrapSpeedUncertaintyMps!.Value, 12);
        Assert.Equal(5.5, mean.PeakAccelMps2, 12);
        Assert.Equal(59, mean.MaxSpeedMps, 12);
        Assert.Equal(490, mean.DistanceM, 12);
        Assert.Null(mean.MeanAccel0To60Mps2);
        Assert.Equal(5.2, PairAverage.Mean(a, a).MeanAccel0To60Mps2!.Value, 12);

        Assert.Throws<ArgumentNullException>(() => PairAverage.Mean(null!, b));
        Assert.Throws<ArgumentNullException>(() => PairAverage.Mean(a, null!));
        Assert.Contains("different figure requests", Assert.Throws<ArgumentException>(() => PairAverage.Mean(a, a with { SpeedIntervals = [] })).Message);
        Assert.Throws<ArgumentException>(() => PairAverage.Mean(a, a with { DistanceMarks = [] }));
    }

    [Fact]
    public void WeatherScalesUncertaintiesAndSpeedsLikeTheFiguresThemselves()
    {
        // Constant power (½·v² = p·t, mechanics textbook): at CF·p every time to a speed is 1/CF
        // as long, every time to a distance CF^(−1/3), every speed at a distance CF^(1/3) higher;
        // a σ in time scales with the time it belongs to, the mean 0-60 acceleration by CF.
        const double Cf = 1.1;
        FigureSet f = Figures(interval: 5.0, intervalSigma: 0.03, mark: 12.0, markSigma: 0.04, speed: 50, trapSigma: 0.3, peak: 6, top: 60, distance: 500, meanAccel: 5.2);
        FigureSet c = WeatherCorrection.Apply(f, Cf);
        double elapsed = Math.Pow(Cf, -1.0 / 3);
        IntervalFigure i = c.SpeedIntervals[0];
        Assert.Equal(0.03 / Cf, i.UncertaintyS!.Value, 12);
        Assert.Equal(0.03 / Cf, i.FromRolloutUncertaintyS!.Value, 12);
        MarkFigure m = c.DistanceMarks[0];
        Assert.Equal(0.04 * elapsed, m.UncertaintyS!.Value, 12);
        Assert.Equal(0.04 * elapsed, m.FromRolloutUncertaintyS!.Value, 12);
        Assert.Equal(50 / elapsed, m.SpeedAtMarkMps!.Value, 9);
        Assert.Equal(0.3 / elapsed, m.TrapSpeedUncertaintyMps!.Value, 9);
        Assert.Equal(5.2 * Cf, c.MeanAccel0To60Mps2!.Value, 12);
        Assert.Throws<ArgumentNullException>(() => WeatherCorrection.Apply(null!, Cf));

        // A rolling interval (40-60 mph) is no standing one: 1/CF as a whole under both conventions.
        FigureSet rolling = f with { SpeedIntervals = [new IntervalFigure(SpeedInterval.Mph(40, 60), 2.0, 2.0, 0.02, 0.02)] };
        IntervalFigure r = WeatherCorrection.Apply(rolling, Cf).SpeedIntervals[0];
        Assert.Equal(2.0 / Cf, r.FromStandstillS!.Value, 12);
        Assert.Equal(2.0 / Cf, r.FromRolloutS!.Value, 12);
    }

    [Fact]
    public void LevelCorrectionLeavesTheRestBeforeFirstMotionAndKeepsTheSigmas()
    {
        // Before first motion the car stands: nothing to add. From it, g0·sin θ more (kinematics).
        Trajectory t = ClosedFormTrajectory.ConstantAcceleration(4, t0: 1.0, endS: 3, sigmaDistanceM: 0.01, sigmaSpeedMps: 0.02);
        double theta = Math.Atan(0.04);
        Trajectory level = LevelCorrection.ToLevel(t, 1.0, theta);
        double extra = 9.80665 * Math.Sin(theta); // standard gravity (CGPM 1901)
        int before = FigureCalculator.FirstIndexAtOrAfter(t.TimeS, 0.5);
        int after = FigureCalculator.FirstIndexAtOrAfter(t.TimeS, 2.0);
        Assert.Equal(0, level.AccelMps2[before]);
        Assert.Equal(4 + extra, level.AccelMps2[FigureCalculator.FirstIndexAtOrAfter(t.TimeS, 1.0)], 12); // moving from first motion on
        Assert.Equal(0, level.SpeedMps[before]);
        Assert.Equal(4 + extra, level.AccelMps2[after], 12);
        Assert.Equal((4 + extra) * 1.0, level.SpeedMps[after], 9);
        Assert.Equal((4 + extra) / 2, level.DistanceM[after], 9);
        Assert.Same(t.DistanceSigmaM, level.DistanceSigmaM);
        Assert.Same(t.SpeedSigmaMps, level.SpeedSigmaMps);
        Assert.Throws<ArgumentNullException>(() => LevelCorrection.ToLevel(null!, 0, 0));
    }

    [Fact]
    public void AGradeInDegreesAndItsUncertaintyWithoutAMountingCalibration()
    {
        // 1° is π/180 rad; an uncalibrated mounting adds 2.3° in quadrature (GradeEstimate's
        // allowance), the axes' scale errors √2 · 1 % of the angle and the body's pitch 0.05 rad per g of slope.
        GradeEstimate g = GradeEstimate.FromRest(new Estimate(Math.PI / 90, 0.001), mountingPitchRad: Math.PI / 180);
        Assert.Equal(1.0, g.Degrees, 12);
        GradeEstimate uncalibrated = GradeEstimate.FromRest(new Estimate(0.03, 0.001), mountingPitchRad: null);
        Assert.Equal(0.03, uncalibrated.AngleRad, 12);
        Assert.Equal(Math.Sqrt((0.001 * 0.001) + Math.Pow(2.3 * Math.PI / 180, 2) + (2 * Math.Pow(0.01 * 0.03, 2)) + Math.Pow(0.05 * Math.Sin(0.03), 2)), uncalibrated.SigmaRad, 12);
    }

    [Theory]
    [InlineData("-40,500,0", true)]
    [InlineData("60,1100,100", true)]
    [InlineData("-40.1,1013,50", false)]
    [InlineData("60.1,1013,50", false)]
    [InlineData("20,499,50", false)]
    [InlineData("20,1101,50", false)]
    [InlineData("20,1013,-1", false)]
    [InlineData("20,1013,NaN", false)]
    public void WeatherIsTakenWithinItsLimitsOnly(string text, bool accepted)
    {
        if (accepted)
        {
            Assert.NotNull(Weather.Parse(text));
        }
        else
        {
            Assert.Contains("is outside", Assert.Throws<FormatException>(() => Weather.Parse(text)).Message);
        }
    }

    [Fact]
    public void DryAirAtTheReferenceStateNeedsNoCorrection()
    {
        // SAE J1349 reference state: 99 kPa dry air at 25 °C, CF = 1. With 0 % humidity the dry
        // pressure is the whole pressure.
        var w = new Weather(25, 990, 0);
        Assert.Equal(99, w.DryPressureKPa, 12);
        Assert.Equal(1.0, w.CorrectionFactor, 12);
        Assert.Equal("weather temperature 61 is outside -40 to 60", Assert.Throws<FormatException>(() => Weather.Parse("61,1013,50")).Message);
        Assert.Equal("weather pressure 499 is outside 500 to 1100", Assert.Throws<FormatException>(() => Weather.Parse("20,499,50")).Message);

        // Humid air: the dry pressure is the total less the vapour's, e = RH·e_s; at 25 °C
        // e_s = 3.1690 kPa (Buck 1981 table, as in AtmosphereReferenceTests), so 50 % gives 1.5845 kPa.
        Assert.InRange(new Weather(25, 1013, 50).DryPressureKPa - (101.3 - 1.5845), -0.002, 0.002);
    }

    private static FigureSet Figures(double interval, double intervalSigma, double mark, double markSigma, double speed, double trapSigma, double peak, double top, double distance, double? meanAccel) => new()
    {
        FirstMotionS = new Estimate(1, 0.001),
        RolloutTimeS = new Estimate(1.3, 0.001),
        RolloutDistanceM = 0.3048,
        SpeedIntervals = [new IntervalFigure(SpeedInterval.Mph(0, 60), interval, interval - 0.3, intervalSigma, intervalSigma)],
        DistanceMarks = [new MarkFigure(DistanceMark.Feet("1320 ft", 1320, 66), mark, mark - 0.3, markSigma, markSigma, speed, speed - 1, trapSigma)],
        PeakAccelMps2 = peak,
        MeanAccel0To60Mps2 = meanAccel,
        MaxSpeedMps = top,
        DistanceM = distance,
    };
}
