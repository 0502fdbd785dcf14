using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Decoding.Tests.Braking;

/// <summary>A stop as a braked wheel's pulses see it: the tyre turns slower than the road by
/// s = share·deceleration / (g0·C) (H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1, linear range;
/// C 15–30 for car tyres, from memory; share the wheel's force over its load as a multiple of the
/// car's deceleration, 0.6–1.3 on either axle of a road car, <see cref="BrakeSlipPrior.CarTyres"/>),
/// against the closed-form stop of the car itself. The prior's mean of share/C is
/// 0.95 × ln 2 / 15 (the mean share times the mean of 1/C over 15–30).</summary>
public class BrakeSlipCorrectionTests
{
    private const double G0 = 9.80665; // ISO 80000-3
    private const double V0 = 100 / 3.6;
    private const double Decel = 8;
    private const double RiseS = 0.2;
    private const double OnsetS = 1.0;
    private static readonly double MeanWheelSlip = 0.95 * Math.Log(2) / 15;

    // Kinematics: a linear rise to D over R, then D to rest. The car covers V·R − D·R²/6 in the
    // rise and (V − D·R/2)²/(2D) after it.
    private static readonly double TrueDistance = (V0 * RiseS) - (Decel * RiseS * RiseS / 6) + (Math.Pow(V0 - (Decel * RiseS / 2), 2) / (2 * Decel));

    [Theory]
    [InlineData(15.0)]
    [InlineData(21.64)]
    [InlineData(30.0)]
    public void The_stopping_distance_from_slipping_pulses_holds_the_car_s_own(double stiffness)
    {
        BrakingResult r = BrakingAnalyzer.Analyze(WheelSeen(stiffness), [new Estimate(OnsetS, 0.001)], null, null, 0.001)!;
        double error = r.StoppingDistanceM.Value - TrueDistance;

        // A wheel working at the car's deceleration (share 1). Uncorrected, it counts the stop
        // v0²/(2·g0·C) short: 1.3–2.6 m here. The ends of the range lie 0.8σ (C 30) and 1.8σ
        // (C 15) from the prior's mean of share/C: within 3σ.
        Assert.True(Math.Abs(error) <= 3 * r.StoppingDistanceM.Sigma, $"C {stiffness}: error {error:F3} m, σ {r.StoppingDistanceM.Sigma:F3} m");
        Assert.InRange(r.StoppingDistanceM.Sigma, 0.3, 1.0);
        Assert.Equal(V0 * V0 / (2 * Decel), r.StoppingDistanceM.Value - (V0 * RiseS / 2), 0.05 + (Math.Abs((1 / stiffness) - MeanWheelSlip) * V0 * V0 / (2 * G0)));
    }

    [Fact]
    public void A_wheel_in_the_middle_of_the_prior_gives_the_distance_and_the_mfdd_of_the_car()
    {
        // C = 21.64 is where the mean of 1/C over 15–30 lies (ln 2 / 15), and a share of 0.95 the
        // middle of 0.6–1.3: the correction is then the wheel's own shortfall. The MFDD window (0.8 to 0.1 of v0) lies in the steady part,
        // so the car's MFDD is D itself (UN R13-H: (vb² − ve²) / (25.92·(se − sb)) of a constant
        // deceleration).
        BrakingResult r = BrakingAnalyzer.Analyze(WheelSeen(21.64, 0.95), [new Estimate(OnsetS, 0.001)], null, null, 0.001)!;
        Assert.Equal(TrueDistance, r.StoppingDistanceM.Value, 0.03);
        Assert.Equal(Decel, r.MfddMps2!.Value, 0.002);
        Assert.Equal(V0 * V0 / (2 * TrueDistance), r.MeanDecelMps2, 0.005);
    }

    [Fact]
    public void Where_the_pulses_do_not_carry_the_distance_nothing_is_added()
    {
        Trajectory seen = WheelSeen(21.64);

        // From the accelerometer alone (no pulse σ) and where the wheel slid and its pulses were
        // set aside, the trajectory is the accelerometer's and no wheel slip is in it.
        BrakingResult accelOnly = BrakingAnalyzer.Analyze(seen, [new Estimate(OnsetS, 0.001)], null, null, 0)!;
        BrakingResult slid = BrakingAnalyzer.Analyze(seen, [new Estimate(OnsetS, 0.001)], null, null, 0.001, [new TimeWindow(OnsetS - 0.1, 20)])!;
        BrakingResult pulses = BrakingAnalyzer.Analyze(seen, [new Estimate(OnsetS, 0.001)], null, null, 0.001)!;
        Assert.Equal(0, accelOnly.BrakeSlipCorrectionM);
        Assert.Equal(0, slid.BrakeSlipCorrectionM);
        Assert.Equal(accelOnly.StoppingDistanceM.Value, slid.StoppingDistanceM.Value, 12);

        // With the pulses: the slip's expected part, v0²/(2·g0)·0.95·ln 2/15 = 1.73 m, added once.
        Assert.Equal(V0 * V0 / (2 * G0) * MeanWheelSlip, pulses.BrakeSlipCorrectionM, 0.02);
        Assert.Equal(accelOnly.StoppingDistanceM.Value + pulses.BrakeSlipCorrectionM, pulses.StoppingDistanceM.Value, 9);

        // The pulses set aside from 1.2 s after the onset: only the braking done before that
        // counts, (v0² − v²)/(2·g0)·0.95·ln 2/15 with v the car's speed there (0.92 m). The wheel
        // reads v·(1 − s) there, so the decoder's figure is larger by about v²·s/g0·0.95·ln 2/15 (0.06 m).
        double cut = OnsetS + RiseS + 1.0;
        BrakingResult partSlid = BrakingAnalyzer.Analyze(seen, [new Estimate(OnsetS, 0.001)], null, null, 0.001, [new TimeWindow(cut, 20)])!;
        double vAtCut = V0 - (Decel * RiseS / 2) - (Decel * 1.0);
        Assert.Equal(((V0 * V0) - (vAtCut * vAtCut)) / (2 * G0) * MeanWheelSlip, partSlid.BrakeSlipCorrectionM, 0.08);
    }

    [Fact]
    public void What_the_fusion_added_for_the_slip_is_taken_off_before_the_prior_s_shortfall_is_added()
    {
        // The fusion added k_b·∫v·max(−a, 0) dt to the wheel's distance (here as if C = 20): over
        // the stop that is taken off again, and the prior's expected shortfall added as for the
        // wheel's own pulses, so both give the same stop (a wheel in the middle of the prior).
        Trajectory wheel = WheelSeen(21.64, 0.95);
        double[] added = new double[wheel.Count];
        double work = 0;
        for (int i = 1; i < wheel.Count; i++)
        {
            double dt = wheel.TimeS[i] - wheel.TimeS[i - 1];
            work += 0.5 * ((Math.Max(-wheel.AccelMps2[i], 0) * wheel.SpeedMps[i]) + (Math.Max(-wheel.AccelMps2[i - 1], 0) * wheel.SpeedMps[i - 1])) * dt;
            added[i] = work / (G0 * 20);
        }

        var fusedDistance = new double[wheel.Count];
        for (int i = 0; i < wheel.Count; i++)
        {
            fusedDistance[i] = wheel.DistanceM[i] + added[i];
        }

        Trajectory fused = new() { TimeS = wheel.TimeS, DistanceM = fusedDistance, SpeedMps = wheel.SpeedMps, AccelMps2 = wheel.AccelMps2 };
        BrakingResult fromFused = BrakingAnalyzer.Analyze(fused, [new Estimate(OnsetS, 0.001)], null, null, 0.001, null, null, added)!;
        BrakingResult fromWheel = BrakingAnalyzer.Analyze(wheel, [new Estimate(OnsetS, 0.001)], null, null, 0.001)!;
        Assert.Equal(fromWheel.StoppingDistanceM.Value, fromFused.StoppingDistanceM.Value, 6);
        Assert.Equal(fromWheel.BrakeSlipCorrectionM, fromFused.BrakeSlipCorrectionM, 9);
        Assert.Equal(TrueDistance, fromFused.StoppingDistanceM.Value, 0.03);
    }

    /// <summary>The stop as the wheel's pulses give it with a tyre of slip stiffness C working at
    /// <paramref name="share"/> of the car's deceleration: the car's speed v and deceleration d(t),
    /// the wheel's speed v·(1 − share·d/(g0·C)), its distance integrated.</summary>
    private static Trajectory WheelSeen(double stiffness, double share = 1)
    {
        const double step = 0.0005;
        int n = (int)((OnsetS + RiseS + (V0 / Decel) + 1.0) / step);
        var t = new double[n];
        var x = new double[n];
        var v = new double[n];
        var a = new double[n];
        double carSpeed = V0;
        for (int i = 0; i < n; i++)
        {
            t[i] = i * step;
            double d = t[i] <= OnsetS ? 0 : Decel * Math.Min((t[i] - OnsetS) / RiseS, 1);
            if (i > 0)
            {
                double dPrev = t[i - 1] <= OnsetS ? 0 : Decel * Math.Min((t[i - 1] - OnsetS) / RiseS, 1);
                carSpeed = Math.Max(carSpeed - (0.5 * (d + dPrev) * step), 0);
            }

            d = carSpeed > 0 ? d : 0;
            v[i] = carSpeed * (1 - (share * d / (G0 * stiffness)));
            x[i] = i == 0 ? 0 : x[i - 1] + (0.5 * (v[i] + v[i - 1]) * step);
        }

        for (int i = 0; i < n; i++)
        {
            a[i] = (v[Math.Min(i + 1, n - 1)] - v[Math.Max(i - 1, 0)]) / (t[Math.Min(i + 1, n - 1)] - t[Math.Max(i - 1, 0)]);
        }

        return new Trajectory { TimeS = t, DistanceM = x, SpeedMps = v, AccelMps2 = a };
    }
}
