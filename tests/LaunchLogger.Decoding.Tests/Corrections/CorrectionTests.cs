using LaunchLogger.Decoding.Corrections;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Tests.Metrics;

namespace LaunchLogger.Decoding.Tests.Corrections;

public class CorrectionTests
{
    private const double G0 = 9.80665; // standard gravity (3rd CGPM, 1901)

    [Fact]
    public void LevelCorrectionRestoresTheLevelRunOfAConstantForce()
    {
        // Kinematics on a slope (any textbook): a constant drive force gives a0 on the level and
        // a0 − g0·sin θ uphill. Re-timing the uphill run must give the level run's figures.
        const double A0 = 5.0;
        double theta = Math.Atan(0.03); // 3 % uphill
        var uphill = ClosedFormTrajectory.ConstantAcceleration(A0 - (G0 * Math.Sin(theta)), t0: 1.0, endS: 30);
        FigureSet level = FigureCalculator.Compute(LevelCorrection.ToLevel(uphill, 1.0, theta), new Estimate(1.0, 0));
        double v60 = 60 * Units.MpsPerMph;
        Assert.Equal(v60 / A0, level.SpeedIntervals.Single(i => i.Interval.Label == "0-60 mph").FromStandstillS!.Value, 4);
        Assert.Equal(Math.Sqrt(2 * 402.336 / A0), level.DistanceMarks.Single(m => m.Mark.Label.StartsWith("1320", StringComparison.Ordinal)).FromStandstillS!.Value, 3);
    }

    [Theory]
    [InlineData(1.0)]
    [InlineData(1.1)]
    [InlineData(0.9)]
    public void WeatherCorrectionMatchesTheSameCarWithMorePower(double correctionFactor)
    {
        // Truth from outside the correction code: a car at constant power per unit mass p, no
        // drag (½·v² = p·t; mechanics textbook), in closed form. The corrected figures of the run
        // at p must equal the closed-form figures of the same car at CF·p (SAE J1349's CF is a
        // power ratio). 0–60 mph after the 1-ft rollout is t(60 mph) − t(1 ft), each part timed
        // afresh at CF·p — not one scaling of the measured after-rollout time.
        const double P = 72.0; // W/kg: 0–60 mph in about 5.0 s
        const double RolloutM = 0.3048; // 1 ft (common practice; SAE J1491 §3.3)
        double v60 = 60 * Units.MpsPerMph;
        double quarterM = 1320 * Units.MetresPerFoot;
        FigureSet measured = FigureCalculator.Compute(ClosedFormTrajectory.ConstantPower(P, t0: 1.0, endS: 20), new Estimate(1.0, 0));

        FigureSet corrected = WeatherCorrection.Apply(measured, correctionFactor);

        double power = correctionFactor * P;
        double zero60 = ClosedFormTrajectory.ConstantPowerTimeToSpeed(power, v60);
        double rollout = ClosedFormTrajectory.ConstantPowerTimeToDistance(power, RolloutM);
        double quarter = ClosedFormTrajectory.ConstantPowerTimeToDistance(power, quarterM);
        double trap = (66 * Units.MetresPerFoot) / (quarter - ClosedFormTrajectory.ConstantPowerTimeToDistance(power, 1254 * Units.MetresPerFoot));
        IntervalFigure sixty = corrected.SpeedIntervals.Single(i => i.Interval.Label == "0-60 mph");
        // The figure code interpolates 1-ms samples: its own error here is well under 0.1 ms.
        // A wrong after-rollout scaling is 21 ms off at CF 1.1 (issue 11).
        const double ToleranceS = 0.0002;
        Assert.InRange(sixty.FromStandstillS!.Value - zero60, -ToleranceS, ToleranceS);
        Assert.InRange(sixty.FromRolloutS!.Value - (zero60 - rollout), -ToleranceS, ToleranceS);
        Assert.InRange(Quarter(corrected).FromStandstillS!.Value - quarter, -ToleranceS, ToleranceS);
        Assert.InRange(Quarter(corrected).FromRolloutS!.Value - (quarter - rollout), -ToleranceS, ToleranceS);
        Assert.InRange(Quarter(corrected).TrapSpeedMps!.Value - trap, -0.001, 0.001);
    }

    [Fact]
    public void APairInOppositeDirectionsCancelsAGradeToFirstOrder()
    {
        // A slope adds −g0·sin θ one way and +g0·sin θ the other; the mean of the two 0–60 times
        // equals the level time to first order (common practice in vehicle testing). For constant
        // acceleration the mean is exactly (v/a)·1/(1 − (δ/a)²): only a second-order term remains.
        const double A0 = 5.0;
        double theta = Math.Atan(0.005);
        double delta = G0 * Math.Sin(theta);
        FigureSet up = FigureCalculator.Compute(ClosedFormTrajectory.ConstantAcceleration(A0 - delta, 0, 30), new Estimate(0, 0));
        FigureSet down = FigureCalculator.Compute(ClosedFormTrajectory.ConstantAcceleration(A0 + delta, 0, 30), new Estimate(0, 0));
        FigureSet mean = PairAverage.Mean(up, down);
        double level = 60 * Units.MpsPerMph / A0;
        Assert.Equal(level / (1 - ((delta / A0) * (delta / A0))), Zero60(mean), 6);
        Assert.True(Math.Abs(Zero60(mean) - level) < Math.Abs(Zero60(up) - level) / 20, "the pair must do far better than either run");
    }

    [Fact]
    public void GradeIsTheRestingPitchLessTheCalibratedMounting()
    {
        GradeEstimate g = GradeEstimate.FromRest(new Estimate(0.030, 0.001), mountingPitchRad: 0.020, mountingPitchSigmaRad: 0.002);
        Assert.Equal(0.010, g.AngleRad, 12);
        Assert.Equal(Math.Sqrt((0.001 * 0.001) + (0.002 * 0.002) + (2 * Math.Pow(GradeEstimate.AxisScaleSigma * 0.010, 2)) + Math.Pow(GradeEstimate.BodyPitchPerG * Math.Sin(0.010), 2)), g.SigmaRad, 12);
        Assert.True(g.MountingCalibrated);
        Assert.Equal(Math.Tan(0.010) * 100, g.Percent, 12);

        GradeEstimate uncalibrated = GradeEstimate.FromRest(new Estimate(0.030, 0.001), mountingPitchRad: null);
        Assert.False(uncalibrated.MountingCalibrated);
        Assert.True(uncalibrated.SigmaRad > 0.015, "an uncalibrated mounting must widen the grade's uncertainty");
    }

    [Theory]
    [InlineData(0.05, 0.02, 0.01, -0.01)]
    [InlineData(0.08, -0.03, -0.01, 0.01)]
    [InlineData(-0.06, 0.01, 0.01, -0.005)]
    public void TheGradesSigmaCarriesTheAxesScaleErrors(double slope, double mountPitch, double scaleX, double scaleZ)
    {
        // A box pitched mountPitch on its bracket, its forward and vertical axes reading (1 + s)
        // of the specific force along them. At rest the reaction to gravity, g straight up, is seen
        // along the box's axes turned by the road's slope and the mounting (rotation about the
        // lateral axis; definition of specific force), and the pitch is read as asin(f_x / |f|).
        // Calibrated on level ground, then staged on the slope: the grade is off by about
        // (s_x − s_z)·θ, which σ must carry. Scale errors of ±1 % are one σ each (common practice).
        static double Pitch(double angle, double sx, double sz)
        {
            double fx = Math.Sin(angle) * (1 + sx), fz = Math.Cos(angle) * (1 + sz);
            return Math.Asin(fx / Math.Sqrt((fx * fx) + (fz * fz)));
        }

        double theta = Math.Atan(slope);
        double mounting = Pitch(mountPitch, scaleX, scaleZ);
        GradeEstimate g = GradeEstimate.FromRest(new Estimate(Pitch(theta + mountPitch, scaleX, scaleZ), 1e-5), mounting, 1e-5);
        double error = g.AngleRad - theta;
        Assert.True(Math.Abs(error) > 10 * 1e-5, "the scale errors must show beyond the readings' own σ");
        Assert.InRange(Math.Abs(error), 0, 2 * g.SigmaRad);
        Assert.InRange(g.SigmaRad, 0, (3 * Math.Abs(error)) + (GradeEstimate.BodyPitchPerG * Math.Abs(Math.Sin(theta))) + 5e-5);
    }

    [Theory]
    [InlineData(0.02)]
    [InlineData(-0.05)]
    public void TheGradesSigmaCarriesTheBodysPitchOnItsSuspension(double slope)
    {
        // Statics: at rest on a slope θ the weight's along-road part m·g0·sin θ acts at the centre
        // of gravity, h above the tyres that hold the car, and the body turns on its pitch stiffness
        // K by φ = m·g0·sin θ·h / K (moment balance). A 1500 kg car, h = 0.5 m, K = 170 kN·m/rad
        // (the braking test car of our simulator) pitches 0.043 rad per g, nose up uphill: the
        // box reads θ + φ, and the grade's σ must cover φ.
        double theta = Math.Atan(slope);
        double phi = 1500 * G0 * Math.Sin(theta) * 0.5 / 170_000;
        GradeEstimate g = GradeEstimate.FromRest(new Estimate(0.01 + theta + phi, 1e-5), 0.01, 1e-5);
        Assert.InRange(Math.Abs(g.AngleRad - theta), 0, 2 * g.SigmaRad);
        Assert.True(Math.Abs(g.AngleRad - theta) > 10 * 1.5e-5, "the body's pitch must show beyond the readings' own σ");
    }

    private static double Zero60(FigureSet f) => f.SpeedIntervals.Single(i => i.Interval.Label == "0-60 mph").FromStandstillS!.Value;

    private static MarkFigure Quarter(FigureSet f) => f.DistanceMarks.Single(m => m.Mark.Label.StartsWith("1320", StringComparison.Ordinal));
}
