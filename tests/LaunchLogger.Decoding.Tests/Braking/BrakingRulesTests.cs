using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Tests.Metrics;

namespace LaunchLogger.Decoding.Tests.Braking;

/// <summary>The stop finder's rules one at a time, on closed-form stops
/// (<see cref="ClosedFormTrajectory.Stop"/>; kinematics, any textbook).</summary>
public class BrakingRulesTests
{
    private const double V100 = 100 / 3.6; // 100 km/h in m/s

    [Fact]
    public void StandstillIsWhereTheSpeedFallsBelowFiveCentimetresASecond()
    {
        // From 100 km/h at 8 m/s² from 1 s: v = V − 8·(t − 1) reaches 0.05 m/s at 1 + (V − 0.05)/8;
        // the speed is linear there, so interpolating between 0.5-ms samples is exact.
        BrakingResult r = BrakingAnalyzer.Analyze(ClosedFormTrajectory.Stop(V100, 1.0, [new StopPhase(8, 0, 0)]), [1.0])!;
        Assert.Equal(1 + ((V100 - 0.05) / 8), r.StandstillS, 6);
    }

    [Fact]
    public void PeakDecelerationIsTheHardestPartOfTheStop()
    {
        Trajectory twoStage = ClosedFormTrajectory.Stop(V100, 1.0, [new StopPhase(6, 0, 0.5 * V100 / 6), new StopPhase(9, 0, 0)]);
        Assert.Equal(9, BrakingAnalyzer.Analyze(twoStage, [1.0])!.PeakDecelMps2, 9);
    }

    [Fact]
    public void TheLastSwitchClosingBeforeStandstillIsTheOnsetWithItsOwnSigma()
    {
        // A dab at 0.4 s, the real application at 1.0 s, and the switch again after the car stood.
        Trajectory stop = ClosedFormTrajectory.Stop(V100, 1.0, [new StopPhase(8, 0, 0)]);
        double standstill = 1 + (V100 / 8);
        BrakingResult r = BrakingAnalyzer.Analyze(stop, [0.4, 1.0, standstill + 0.5])!;
        Assert.Equal(1.0, r.OnsetS.Value);
        Assert.Equal(BrakingAnalyzer.GivenOnsetSigmaS, r.OnsetS.Sigma, 12);

        // Onsets with their own σ (from the switch's reading) are taken as they are.
        BrakingResult own = BrakingAnalyzer.Analyze(stop, [new Estimate(0.4, 0.003), new Estimate(1.0, 0.009), new Estimate(standstill + 0.5, 0.001)], null, null, 0)!;
        Assert.Equal(new Estimate(1.0, 0.009), own.OnsetS);

        // Without a σ on the trajectory the distance's σ is the onset's times the speed there.
        Assert.Equal(V100 * r.OnsetS.Sigma, r.StoppingDistanceM.Sigma, 9);

        // A closing only after standstill is no onset: the deceleration gives it instead.
        Assert.Equal("deceleration onset", BrakingAnalyzer.Analyze(stop, [standstill + 0.5])!.OnsetMethod);
    }

    [Fact]
    public void TheTrajectorysDistanceSigmaAddsAtBothEnds()
    {
        // σ_d = 0.1 m at onset and at standstill, with the onset's own σ times the speed:
        // root-sum-square of the three.
        Trajectory stop = ClosedFormTrajectory.Stop(V100, 1.0, [new StopPhase(8, 0, 0)]);
        var withSigma = new Trajectory { TimeS = stop.TimeS, DistanceM = stop.DistanceM, SpeedMps = stop.SpeedMps, AccelMps2 = stop.AccelMps2, DistanceSigmaM = [.. stop.TimeS.Select(_ => 0.1)] };
        BrakingResult r = BrakingAnalyzer.Analyze(withSigma, [1.0])!;
        Assert.Equal(Math.Sqrt((0.1 * 0.1) + (0.1 * 0.1) + Math.Pow(V100 * r.OnsetS.Sigma, 2)), r.StoppingDistanceM.Sigma, 9);
    }

    [Fact]
    public void AScaleErrorSharedAlongThePathCountsOnTheStopsLengthOnly()
    {
        // The stop begins 400 m down the road. A 1 % scale error shared along the path puts both
        // ends 1 % out, so their difference — the stopping distance — is 1 % of itself out (a tape
        // stretched by 1 % reads every interval 1 % long; common practice); each end also has
        // 2 cm of its own, independent of the other.
        Trajectory stop = ClosedFormTrajectory.Stop(V100, 1.0, [new StopPhase(8, 0, 0)]);
        double[] d = [.. stop.DistanceM.Select(x => x + 400)];
        double[] shared = [.. d.Select(x => 0.01 * x)];
        double[] sd = [.. shared.Select(s => Math.Sqrt((s * s) + (0.02 * 0.02)))];
        var withSigma = new Trajectory { TimeS = stop.TimeS, DistanceM = d, SpeedMps = stop.SpeedMps, AccelMps2 = stop.AccelMps2, DistanceSigmaM = sd, SharedDistanceSigmaM = shared };
        BrakingResult r = BrakingAnalyzer.Analyze(withSigma, [1.0])!;
        double length = V100 * V100 / 16; // v²/(2a), kinematics
        Assert.Equal(length, r.StoppingDistanceM.Value, 2);
        Assert.Equal(Math.Sqrt(Math.Pow(0.01 * length, 2) + (2 * 0.02 * 0.02) + Math.Pow(V100 * r.OnsetS.Sigma, 2)), r.StoppingDistanceM.Sigma, 4);
    }

    [Fact]
    public void WhereThePulsesGiveTheDistanceTheBrakedWheelsSlipIsAddedAndItsSpreadCountsInSigma()
    {
        // 100 km/h at 8 m/s²: a braked tyre of slip stiffness C per unit load turns
        // (8 / 9.80665) / C slower than the road passes (Pacejka, "Tire and Vehicle Dynamics",
        // ch. 1; C 15–30 for car tyres, from memory); over the stop the pulses miss
        // v0²/(2·g0)·(1/C) = 39.3 m / C, times the share of the car's deceleration its wheel works
        // at (0.6–1.3 on either axle, the axle not told). Over C uniform in 15–30 and the share
        // uniform in 0.6–1.3, independent, share/C has mean 0.95·ln 2 / 15 and σ
        // √(E[share²]/450 − mean²), E[share²] = (0.6² + 0.6·1.3 + 1.3²)/3.
        Trajectory stop = ClosedFormTrajectory.Stop(V100, 1.0, [new StopPhase(8, 0, 0)]);
        BrakingResult pulses = BrakingAnalyzer.Analyze(stop, [1.0], pulsePositionSigmaM: 0.001)!;
        double length = V100 * V100 / 16;
        double work = V100 * V100 / (2 * 9.80665);
        double mean = 0.95 * Math.Log(2) / 15;
        double spread = Math.Sqrt((((0.36 + 0.78 + 1.69) / 3) / 450.0) - (mean * mean));
        Assert.Equal(length + (work * mean), pulses.StoppingDistanceM.Value, 2);
        Assert.Equal(Math.Sqrt(Math.Pow(V100 * pulses.OnsetS.Sigma, 2) + Math.Pow(work * spread, 2)), pulses.StoppingDistanceM.Sigma, 3);

        // From the accelerometer alone no wheel slips: only the onset's σ remains.
        BrakingResult accelOnly = BrakingAnalyzer.Analyze(stop, [1.0])!;
        Assert.Equal(V100 * accelOnly.OnsetS.Sigma, accelOnly.StoppingDistanceM.Sigma, 9);
    }

    [Fact]
    public void TheLevelBeforeTheRiseIsSubtractedBeforeTheLineIsDrawn()
    {
        // Coasting at 0.5 m/s² of drag for 2 s from 1 s, then a rise of 75 m/s³ to 8 m/s²: the
        // brakes came on at 3.0 s. Measured from zero instead of the drag, the line would cross
        // 0.5 / 75 s = 6.7 ms early (kinematics of the prescribed stop).
        Trajectory stop = ClosedFormTrajectory.Stop(V100, 1.0, [new StopPhase(0.5, 0, 2.0), new StopPhase(0.5, 75, 0.1), new StopPhase(8, 0, 0)]);
        BrakingResult r = BrakingAnalyzer.Analyze(stop)!;
        Assert.Equal(3.0, r.OnsetS.Value, 0.001);
    }

    [Fact]
    public void ASlowRiseIsTimedByTheRampFitAndAQuickOneByTheLineWithTheFitsSigmaBeside()
    {
        // Noise-free rises from cruise at 2.0 s (closed form). A rise of 1 s is the fit's alone: its
        // σ is the fit's. A rise of 0.2 s is the line's, whose σ carries the fit's beside its own.
        foreach ((double rise, bool fitAlone) in new[] { (1.0, true), (0.2, false) })
        {
            Trajectory stop = ClosedFormTrajectory.Stop(V100, 2.0, [new StopPhase(0, 8 / rise, rise), new StopPhase(8, 0, 0)]);
            BrakingResult r = BrakingAnalyzer.Analyze(stop)!;
            int peak = 0;
            double standstill = r.StandstillS;
            Estimate fit = BrakeOnsetFit.Fit(stop.TimeS, stop.AccelMps2, stop.TimeS, stop.AccelMps2, stop.TimeS[0], stop.TimeS[peak], standstill, out _)!.Value;
            Assert.Equal(2.0, r.OnsetS.Value, 0.001);
            if (fitAlone)
            {
                Assert.Equal(fit.Sigma, r.OnsetS.Sigma, 12);
            }
            else
            {
                Assert.True(r.OnsetS.Sigma > fit.Sigma * 1.000001, $"σ {r.OnsetS.Sigma} against the fit's {fit.Sigma}");
            }
        }
    }

    [Fact]
    public void FromPulsesAloneTheOnsetsSigmaCarriesThePositionNoiseAndTheSmoothersSpread()
    {
        // The rule as stated: 2·√(σ_position / deceleration) for the position noise (D·τ²/2 = σ),
        // and the smoother's spread, in quadrature with the fit's own σ. (A wheel that does not
        // slip under braking: with a slip prior the pulses' onset is fitted with the slip's step,
        // whose own σ is the fit's alone.)
        Trajectory stop = ClosedFormTrajectory.Stop(V100, 1.0, [new StopPhase(0, 0, 0.3), new StopPhase(0, 8 / 0.2, 0.2), new StopPhase(8, 0, 0)]);
        double own = BrakingAnalyzer.Analyze(stop)!.OnsetS.Sigma;
        double pulses = BrakingAnalyzer.Analyze(stop, [], null, null, 0.0005, brakeSlip: BrakeSlipPrior.None)!.OnsetS.Sigma;
        double spread = 2 * Math.Sqrt(0.0005 / 8);
        Assert.Equal(Math.Sqrt((own * own) + (spread * spread) + (BrakingAnalyzer.SmootherSpreadS * BrakingAnalyzer.SmootherSpreadS)), pulses, 9);

        // A rise with no step in it (the car's own deceleration) fitted with the slip's step
        // allowed: the step comes out nil and the onset where the brakes came on, 1.3 s.
        Assert.Equal(1.3, BrakingAnalyzer.Analyze(stop, [], null, null, 0.0005)!.OnsetS.Value, 0.001);

        // With the accelerometer's own samples the onset does not rest on the smoothed trajectory.
        Assert.Equal(own, BrakingAnalyzer.Analyze(stop, rawAccel: (stop.TimeS, stop.AccelMps2), pulsePositionSigmaM: 0.0005)!.OnsetS.Sigma, 12);

        // Ten samples or fewer are no accelerometer record: the trajectory's rule applies.
        Assert.Equal(pulses, BrakingAnalyzer.Analyze(stop, [], null, (stop.TimeS[..10], stop.AccelMps2[..10]), 0.0005, brakeSlip: BrakeSlipPrior.None)!.OnsetS.Sigma, 12);
    }

    [Theory]
    [InlineData(0.4, true)]
    [InlineData(0.6, false)]
    public void ASwitchClosingUpToHalfASecondBeforeTheTopSpeedCounts(double beforePeakS, bool counts)
    {
        // Drive at 1 m/s² until 3 s (the top speed), coast, brakes at 3.5 s. A foot resting on the
        // pedal may close the switch just before the lift-off; earlier than 0.5 s it belongs to
        // something else.
        Trajectory stop = ClosedFormTrajectory.Stop(25, 1.0, [new StopPhase(-1, 0, 2.0), new StopPhase(0.7, 0, 0.5), new StopPhase(0.7, (5 - 0.7) / 0.2, 0.2), new StopPhase(5, 0, 0)]);
        BrakingResult r = BrakingAnalyzer.Analyze(stop, [3.0 - beforePeakS])!;
        Assert.Equal(counts ? "brake switch" : "deceleration onset", r.OnsetMethod);
        Assert.Equal(counts ? 3.0 - beforePeakS : 3.5, r.OnsetS.Value, 0.003);
    }

    [Theory]
    [InlineData(4.5, false)]
    [InlineData(5.0, true)]
    [InlineData(5.5, true)]
    public void OnlyAStopFromAtLeastFiveMetresASecondCounts(double fromMps, bool counts)
    {
        Trajectory stop = ClosedFormTrajectory.Stop(fromMps, 1.0, [new StopPhase(4, 0, 0)]);
        Assert.Equal(counts, BrakingAnalyzer.Analyze(stop, [1.0]) is not null);
    }

    [Fact]
    public void TooShortOrAlwaysStandingTrajectoriesHaveNoStopAndNullIsACallerError()
    {
        Assert.Throws<ArgumentNullException>(() => BrakingAnalyzer.Analyze(null!));
        var two = new Trajectory { TimeS = [0, 1], DistanceM = [0, 0], SpeedMps = [0, 0], AccelMps2 = [0, 0] };
        Assert.Null(BrakingAnalyzer.Analyze(two));
        var standing = new Trajectory { TimeS = [0, 1, 2, 3], DistanceM = [0, 0, 0, 0], SpeedMps = [0, 0.01, 0, 0], AccelMps2 = [0, 0, 0, 0] };
        Assert.Null(BrakingAnalyzer.Analyze(standing));
    }

    [Fact]
    public void TheBoundsAreTheTargetSpeedOverTheMeanDeceleration()
    {
        // t = v / a (kinematics) for 60 mph (26.8224 m/s, exact) and 100 km/h.
        BrakingResult r = BrakingAnalyzer.Analyze(ClosedFormTrajectory.Stop(V100, 1.0, [new StopPhase(8, 0, 0)]), [1.0])!;
        Assert.Equal(8, r.MeanDecelMps2, 2);
        Assert.Equal(26.8224 / r.MeanDecelMps2, r.TractionBound0To60S, 9);
        Assert.Equal(V100 / r.MeanDecelMps2, r.TractionBound0To100KmhS, 9);
    }

    [Fact]
    public void ExtraNominalSpeedsAreCorrectedWithinTenPerCentAndLabelledInBothUnits()
    {
        // From 100 km/h: 80 km/h is 25 % off (not corrected); 105 km/h is 4.8 % off (corrected by
        // (v_nom/v_act)², common practice).
        Trajectory stop = ClosedFormTrajectory.Stop(V100, 1.0, [new StopPhase(8, 0, 0)]);
        BrakingResult r = BrakingAnalyzer.Analyze(stop, [1.0], nominalSpeedsMps: [80 / 3.6, 105 / 3.6])!;
        Assert.Equal(["60-0 mph", "100-0 km/h", "49.7-0 mph (80-0 km/h)", "65.2-0 mph (105-0 km/h)"], r.CorrectedStops.Select(c => c.Label));
        CorrectedStop eighty = r.CorrectedStops[2];
        Assert.Null(eighty.CorrectedDistanceM);
        Assert.Contains("is more than 10 % from 22.2 m/s", eighty.Method);
        CorrectedStop oneFive = r.CorrectedStops[3];
        Assert.Equal(r.StoppingDistanceM.Value * Math.Pow(105 / 100.0, 2), oneFive.CorrectedDistanceM!.Value, 6);
        Assert.Equal(105 / 3.6, oneFive.NominalMps, 12);

        // 60 mph is 96.56 km/h, 3.4 % below 100 km/h: corrected too.
        Assert.NotNull(r.CorrectedStops[0].CorrectedDistanceM);
    }

    [Fact]
    public void TheAccelerometersOwnSamplesTimeTheOnsetWhenGiven()
    {
        // The trajectory's acceleration rises at 1.3 s; the accelerometer's own samples (the
        // same shape 0.1 s later, as a smoother would have spread it early) rise at 1.4 s.
        Trajectory stop = ClosedFormTrajectory.Stop(V100, 1.0, [new StopPhase(0, 0, 0.3), new StopPhase(0, 8 / 0.2, 0.2), new StopPhase(8, 0, 0)]);
        double[] rawT = [.. stop.TimeS.Select(t => t + 0.1)];
        BrakingResult fromRaw = BrakingAnalyzer.Analyze(stop, rawAccel: (rawT, stop.AccelMps2))!;
        Assert.Equal(1.4, fromRaw.OnsetS.Value, 3);
        Assert.Equal(1.3, BrakingAnalyzer.Analyze(stop)!.OnsetS.Value, 3);
    }
}
