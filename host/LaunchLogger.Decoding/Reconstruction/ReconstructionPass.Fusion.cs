using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Decoding.Reconstruction;

/// <content>Fusion: the filter's settings, the trajectory it yields, and what it says about slip and bias.</content>
internal sealed partial class ReconstructionPass
{
    private void ReportSlip(FusionResult fused, bool modelled)
    {
        if (!modelled || !fused.SlipKept)
        {
            return;
        }

        // Slip at half a g of drive: worth a word once it passes 0.3 %.
        double atHalfG = fused.Slip.Value * 0.5 * Units.StandardGravity;
        if (Math.Abs(atHalfG) > 0.003)
        {
            warnings.Add($"the pulses show the tyre slipping by about {atHalfG * 100:F1} % at half a g of drive (a driven wheel?); distances and speeds are corrected for it");
        }
    }

    /// <summary>The filter's settings for one pass. <paramref name="spin"/> and
    /// <paramref name="slipSignal"/> are the windows stage's, or what replaces them under
    /// sustained spin; the slides, firm braking and brake slip signal come from
    /// <paramref name="windows"/> as it found them.</summary>
    private FusionSettings Settings(StepGrid steps, double startS, double? stopS, List<TimeWindow> spin, WheelWindows windows, double[]? slipSignal)
    {
        double[] grid = steps.TimeS;
        List<TimeWindow> braking = windows.Slides;
        List<TimeWindow> firmBraking = windows.FirmBraking;
        double[]? brakeSlipSignal = windows.BrakeSlipSignal;
        var forces = new DriveForceWindows(steps, options);
        bool withAccel = accel != null;
        double inputDensity = 0;
        double thirdMean = 0;
        double thirdSigma;
        if (withAccel)
        {
            AccelRest resting = accelRest!;
            inputDensity = accel!.InputDensity(resting, startS, options);
            thirdSigma = Math.Sqrt((resting.LevelSigmaMps2 * resting.LevelSigmaMps2) + (options.BiasPriorMps2 * options.BiasPriorMps2));
        }
        else
        {
            thirdMean = kinematic is { } k && k.RampS == 0 ? k.AccelMps2 : 0;
            thirdSigma = Math.Max(2.0, kinematic?.AccelMps2 ?? 0);
        }

        double phaseMean = 0.5 * mpp;
        double phaseSigma = mpp / Math.Sqrt(12);
        if (!withAccel && kinematic is { } start)
        {
            // Without an accelerometer nothing but the early pulses' shape speaks to the phase.
            phaseMean = start.PhaseM;
            phaseSigma = Math.Min(start.PhaseSigmaM, phaseSigma);
        }
        double speed = 0;
        double speedSigma = 0;
        if (!Staged && pulses != null)
        {
            // Rolling start: distance 0 at the first observation, speed from the first pulses.
            phaseMean = pulses.Counts[0] * mpp;
            phaseSigma = Math.Max(options.ToothSpacingErrorFraction * mpp, 1e-4);
            if (opening is { } s0)
            {
                // The start fit's speed at the first observation; its σ widened for shapes the quadratic misses.
                speed = s0.SpeedMps.Value * MeasuredScale;
                speedSigma = Math.Max(3 * s0.SpeedMps.Sigma * MeasuredScale, 0.1);
            }
            else
            {
                int j = Math.Min(pulses.Length - 1, 4);
                speed = j > 0 ? (pulses.Counts[j] - pulses.Counts[0]) * mpp / Math.Max(pulses.MidS(j) - pulses.MidS(0), 1e-3) : 0;
                speedSigma = Math.Max(0.3 * speed, 0.5);
            }

            // The first count was reached somewhere in its bracket, not at the bracket's middle
            // where distances start: at speed that is v·w/√12 of distance (uniform), which a tight
            // phase would force into a false speed transient at the start.
            double firstBracketM = speed * (pulses.HiS[0] - pulses.LoS[0]) / Math.Sqrt(12);
            phaseSigma = Math.Sqrt((phaseSigma * phaseSigma) + (firstBracketM * firstBracketM));
        }

        else if (!Staged && accelOpeningSpeed is { } v0)
        {
            speed = v0.Value;
            speedSigma = v0.Sigma;
        }

        // Where the pulses are kept under firm braking the brake slip is fitted, and the
        // accelerometer's scale error is then one state over the whole record, not a step per window.
        bool scaleState = withAccel && brakeSlipSignal != null && firmBraking.Count > 0;
        int stopIndex = int.MaxValue;
        if (stopS is { } s)
        {
            int i = Array.BinarySearch(grid, s);
            stopIndex = i >= 0 ? i : ~i;
        }

        return new FusionSettings
        {
            Mode = withAccel ? FusionMode.Accelerometer : FusionMode.Kinematic,
            GridS = grid,
            StepSpeedMps = steps.StepSpeedMps,
            StepDistanceM = steps.StepDistanceM,
            NoInput = steps.NoInput,
            StartS = startS,
            StartSpeedMps = steps.StartSpeedMps,
            StartDistanceM = steps.StartDistanceM,
            InitialSpeedMps = speed,
            InitialSpeedSigma = speedSigma,
            ThirdMean = thirdMean,
            ThirdSigma = thirdSigma,
            PhaseMean = phaseMean,
            PhaseSigma = phaseSigma,
            InputDensity = inputDensity,
            ThirdDensity = !withAccel ? options.JerkDensity : pulses is null ? options.AccelOnlyBiasWanderDensity : options.BiasWanderDensity,
            StopIndex = stopIndex,
            StopStepSpeedVariance = withAccel && stopS is { } rest ? StopFinder.StopGapSpeedVariance(accel!.TimeS, accelInput, rest) : 0,
            Pulses = pulses,
            MetresPerPulse = mpp,
            PulseGrowthM = pulseGrowthM,
            PulseToothOffsets = toothOffsets,
            ToothSigmaM = options.ToothSpacingErrorFraction * mpp,
            EdgeJitterS = options.EdgeJitterS,
            SpinWindows = [.. spin],

            // Across a spin or slide the wheel may gain or lose any distance: the phase starts afresh.
            SpinPhaseVariance = 1e6,
            BrakeWindows = [.. braking],
            BrakeBiasStepVariance = forces.BrakeStepVariances(braking, withScale: true),
            FirmBrakeWindows = [.. firmBraking],
            FirmBrakeStepVariance = forces.BrakeStepVariances(firmBraking, withScale: !scaleState),
            BrakeThirdDensity = options.BrakeBiasWanderDensity,
            FirmBrakeThirdDensity = scaleState ? options.FirmBrakeBiasWanderDensity : options.BrakeBiasWanderDensity,
            SlipSignal = slipSignal,
            BrakeSlipSignal = brakeSlipSignal,
            BrakeSlipMean = brakeSlipSignal is null ? 0 : options.BrakeSlip.MeanInverse / Units.StandardGravity,
            BrakeSlipSigma = brakeSlipSignal is null ? 0 : options.BrakeSlip.InverseSigma / Units.StandardGravity,
            ScaleSigma = scaleState ? options.ForwardScaleSigma : 0,
            SlipSigma = slipSignal is null ? 0 : options.WheelSlipSigma,
            SlipMinimum = options.WheelSlipMinimum,
            UnkeptSlipMean = slipSignal is null ? 0 : options.UndrivenSlipPerMps2,
            UnkeptSlipSigma = slipSignal is null ? 0 : options.UndrivenSlipSigma,
            MaxStoredSteps = options.FilterStatesKept,
        };
    }

    /// <remarks>The σ columns add what the filter cannot see: the pulses' own scale (an undriven
    /// tyre still slips a little under rolling resistance and the torque that spins it up, see
    /// <see cref="ReconstructionOptions.PulseScaleSigma"/>) or, without pulses, the
    /// accelerometer's (<see cref="ReconstructionOptions.AccelScaleSigma"/>), and, on a driven wheel, the part of the
    /// slip the linear slip law misses (<see cref="ReconstructionOptions.SlipModelError"/> of the
    /// correction). Both are systematic, so they grow with distance and speed. With pulses, the
    /// circumference is known only to <see cref="ReconstructionOptions.CircumferenceSigmaFraction"/>
    /// and, unless calibrated at speed, the tyre grows with the square of speed by up to
    /// <see cref="ReconstructionOptions.TyreGrowthSigmaAt30Mps"/> at 30 m/s: a distance error
    /// ∫ g(v)·v dt and a speed error g(v)·v, g(v) = G·(v / 30 m/s)². The box's clock rate error
    /// τ moves distance at a time by v·τ·t and speed by v·τ. All are systematic and taken as
    /// independent of each other and of what the filter sees.</remarks>
    private const double GrowthReferenceMps = 30;

    private static double Square(double x) => x * x;

    private Trajectory MakeTrajectory(StepGrid steps, double startS, double? stopS, List<TimeWindow> spin, FusionResult fused, double[]? slipSignal)
    {
        double[] grid = steps.TimeS;
        int n = grid.Length;

        // The filter's arrays become the trajectory's (zeros before first motion already).
        double[] distance = fused.DistanceM;
        double[] speed = fused.SpeedMps;
        double[] sd = fused.DistanceSigmaM;
        double[] sv = fused.SpeedSigmaMps;
        var shared = new double[n];
        var accelOut = new double[n];
        int k0 = FusionSmoother.FirstIndexAfter(grid, startS);
        double stop = stopS ?? double.PositiveInfinity;
        double previous = 0;
        double growthDistance = 0;
        double pulsesOnlySlip = 0;
        double lawSlip = 0;
        double toldSlip = 0;
        double carDistance = 0;
        double circumferenceSigma = pulses is null ? 0 : this.circumferenceSigma;
        double growthSigma = pulses is null ? 0 : this.growthSigma;
        double[]? launchSlip = LaunchSlip(steps, startS, k0, fused, driven: fused.SlipKept || spin.Count > 0 || SlipToldApart(fused));
        for (int k = k0; k < n; k++)
        {
            bool atRest = grid[k] >= stop;

            // Distance never goes back, and stands still once the car is at rest.
            double d = atRest && k > k0 && grid[k - 1] >= stop ? previous : Math.Max(distance[k], previous);
            previous = d;
            distance[k] = d;
            speed[k] = atRest ? 0 : Math.Max(speed[k], 0);
            double scale = pulses is null ? options.ForwardScaleSigma : options.PulseScaleSigma;
            double slipDistance = 0;
            double slipSpeed = 0;
            if (slipSignal != null)
            {
                // A kept slip is wrong by the part the linear law misses; a slip not kept, held
                // at an undriven wheel's, by as much as the data leave room for beyond it (their
                // estimate's distance from it and σ), since a driven wheel whose slip hides in
                // the accelerometer's bias still counts too far.
                double unexplained = fused.SlipKept ? options.SlipModelError * Math.Abs(fused.Slip.Value) : Math.Abs(fused.Slip.Value - fused.SlipUsed.Value) + fused.Slip.Sigma;
                slipDistance = unexplained * slipSignal[k];
                double rate = k + 1 < n ? (slipSignal[k + 1] - slipSignal[k]) / (grid[k + 1] - grid[k]) : 0;
                slipSpeed = unexplained * rate;
            }
            else if (accel is null && pulses != null && options.WheelSlipSigma > 0)
            {
                // Pulses alone cannot tell a driven wheel from an undriven one: its slip under
                // drive, up to the slip law's prior, is in σ (the fitted acceleration stands in
                // for the accelerometer), and so is the launch slip near the tyre's grip limit.
                double drive = Math.Max(fused.Third[k] + (options.DragPerMassPerSpeedSquared * speed[k] * speed[k]) + (options.RollingResistance * Units.StandardGravity), 0);
                double fade = options.LaunchSlipFadeM;
                // A record that opens moving has no launch, but a told driven wheel slips by its
                // law wherever it passes drive (a rolling start's pull, a second run's launch past
                // its first metres): its law's mean and spread apply from the first observation,
                // where the distance counts from.
                (double launchMean, double launchSigma) = Staged ? PulsesOnlyLaunchSlip() : (0, 0);
                (double driveMean, double driveSigma) = PulsesOnlyDriveSlip();

                // Where a launch slip is expected, the tyre works at its peak at the start and its
                // linear slip law takes over as the launch slip fades (the launch's F is the
                // whole slip there, not an addition to the law's): the law's expected slip is
                // weighed by 1 − e^(−d/L), and it runs with the car's speed (the count's over the
                // slip at the last step). Its spread is kept from the start, as when not told:
                // where the law takes over is known only as well as L, which is ours.
                double linear = launchMean > 0 ? 1 - Math.Exp(-carDistance / fade) : 1;
                if (k > k0)
                {
                    pulsesOnlySlip += speed[k] * drive * (grid[k] - grid[k - 1]);
                    lawSlip += speed[k] / (1 + toldSlip) * drive * linear * (grid[k] - grid[k - 1]);
                }

                if (launchMean > 0 || driveMean > 0)
                {
                    // A wheel told to be driven runs ahead of the car by its slips' expected
                    // values: the distance and speed are moved back by them.
                    d = LaunchSlipAllowance.WithoutSlip(d - (driveMean * lawSlip), launchMean, fade);
                    distance[k] = d;
                    carDistance = d;
                    double launchShare = launchMean > 0 ? Math.Exp(-d / fade) : 0;
                    toldSlip = (launchMean * launchShare) + (driveMean * drive * (1 - launchShare));
                    speed[k] /= 1 + toldSlip;
                }

                slipDistance = (driveSigma * pulsesOnlySlip) + (launchSigma * fade * (1 - Math.Exp(-d / fade)));
                slipSpeed = (driveSigma * speed[k] * drive) + (launchMean > 0 ? launchSigma * Math.Exp(-d / fade) * speed[k] : 0);
            }

            double dSys = (scale * d) + slipDistance;
            double vSys = (scale * speed[k]) + slipSpeed;
            double growth = growthSigma * (speed[k] / GrowthReferenceMps) * (speed[k] / GrowthReferenceMps);
            if (k > k0)
            {
                growthDistance += growth * speed[k] * (grid[k] - grid[k - 1]);
            }

            double clock = options.TimebaseSigma * (grid[k] - startS);
            double dScale = circumferenceSigma * d;
            double launch = launchSlip?[k] ?? 0;
            double launchSpeed = LaunchSlipAllowance.SpeedSigma(launch, d, speed[k], options.LaunchSlipFadeM);

            // The launch slip is held once the car is away, so like the circumference and growth
            // terms it is shared along the path: a distance between two later times does not carry it.
            // A scale and growth measured together are correlated (growthCorrelation; 0 for priors).
            double tyreCross = 2 * growthCorrelation * dScale * growthDistance;
            double tyreSpeedCross = 2 * growthCorrelation * circumferenceSigma * growth * speed[k] * speed[k];
            shared[k] = Math.Sqrt((dSys * dSys) + (dScale * dScale) + (growthDistance * growthDistance) + tyreCross + (launch * launch));
            sd[k] = Math.Sqrt((sd[k] * sd[k]) + (shared[k] * shared[k]) + Square(speed[k] * clock));
            sv[k] = atRest ? 0 : Math.Sqrt((sv[k] * sv[k]) + (vSys * vSys) + Square(circumferenceSigma * speed[k]) + Square(growth * speed[k]) + tyreSpeedCross + Square(options.TimebaseSigma * speed[k]) + Square(launchSpeed));
            if (atRest)
            {
                accelOut[k] = 0;
            }
            else if (accel != null)
            {
                // Mean input over the steps either side of the grid point, less the bias.
                double before = k > 0 ? steps.StepSpeedMps[k - 1] / (grid[k] - grid[k - 1]) : 0;
                double after = k + 1 < n ? steps.StepSpeedMps[k] / (grid[k + 1] - grid[k]) : before;
                accelOut[k] = (k > 0 ? 0.5 * (before + after) : after) - fused.Third[k];
            }
            else
            {
                accelOut[k] = fused.Third[k];
            }
        }

        if (accel != null && n > k0)
        {
            // The input is noisy from sample to sample; report a centred mean over about 10 ms.
            double step = (grid[^1] - grid[k0]) / Math.Max(n - 1 - k0, 1);
            int half = Math.Max(1, (int)Math.Round(0.005 / Math.Max(step, 1e-6)));
            var smooth = new double[n];
            double sum = 0;
            int lo = k0;
            int hi = k0 - 1;
            for (int k = k0; k < n; k++)
            {
                int wantLo = Math.Max(k0, k - half);
                int wantHi = Math.Min(n - 1, k + half);
                while (hi < wantHi)
                {
                    hi++;
                    sum += accelOut[hi];
                }

                while (lo < wantLo)
                {
                    sum -= accelOut[lo];
                    lo++;
                }

                smooth[k] = grid[k] >= stop ? 0 : sum / (hi - lo + 1);
            }

            accelOut = smooth;
        }

        return new Trajectory
        {
            TimeS = grid,
            DistanceM = distance,
            SpeedMps = speed,
            AccelMps2 = accelOut,
            DistanceSigmaM = sd,
            SharedDistanceSigmaM = shared,
            SpeedSigmaMps = sv,
        };
    }

    /// <summary>The launch slip the accelerometer shows beyond its own error
    /// (<see cref="LaunchSlipAllowance"/>); null without both sensors or without a standstill.
    /// <paramref name="driven"/>: the run shows the wheel driven (a slip kept, a slip told apart
    /// from an undriven wheel's, or wheelspin), so the launch slip's prior is a driven tyre's.</summary>
    private double[]? LaunchSlip(StepGrid steps, double startS, int k0, FusionResult fused, bool driven)
    {
        if (accel is null || pulses is null || !Staged)
        {
            return null;
        }

        double pulseScale = Math.Sqrt(Square(circumferenceSigma) + Square(options.PulseScaleSigma));
        return LaunchSlipAllowance.DistanceSigma(
            steps.TimeS, k0, startS, steps.StartSpeedMps, steps.StartDistanceM, steps.StepSpeedMps, steps.StepDistanceM,
            fused.DistanceM, fused.DistanceSigmaM, LaunchBiasSigma(accelRest!), options.ForwardScaleSigma, pulseScale,
            driven ? (options.PulsesOnlyLaunchSlip, options.LaunchSlipFadeM) : null);
    }

    /// <summary>The launch slip's expected value and 1-σ with pulses only, fractions of the
    /// distance: by what the user told of the pickup's wheel (<see cref="ReconstructionOptions.PickupWheel"/>).
    /// Not told, the slip's size is in σ about an unmoved estimate; driven, the estimate is moved
    /// by the slip's expected value and σ keeps its spread; undriven, there is none.</summary>
    /// <remarks>A wheel of a car with all four driven works at about half the force over load of a
    /// driven pair's (<see cref="ReconstructionOptions.AllWheelsDrivenSlip"/>), so a launch may
    /// leave it anywhere from its slip law's linear range to its grip peak: no launch slip beyond
    /// the law's is expected, and the not-said allowance stays in σ.</remarks>
    private (double Mean, double Sigma) PulsesOnlyLaunchSlip() => DistanceWheel switch
    {
        PickupWheel.Driven => (options.DrivenLaunchSlip, options.DrivenLaunchSlipSigma),
        PickupWheel.Undriven => (0, 0),
        _ => (0, options.PulsesOnlyLaunchSlip),
    };

    /// <summary>The pickup wheel's slip per m/s² of drive with pulses only, its expected value and
    /// 1-σ, s²/m: by what the user told of the wheel. Driven, a driven tyre's slip law
    /// (<see cref="ReconstructionOptions.DrivenSlip"/>, <see cref="ReconstructionOptions.AllWheelsDrivenSlip"/>);
    /// not told or undriven, 0 ± <see cref="ReconstructionOptions.WheelSlipSigma"/>.</summary>
    /// <remarks>Told undriven, the undriven wheel's own lag (<see cref="ReconstructionOptions.UndrivenSlipPerMps2"/>,
    /// σ 100 times narrower) would be the slip's prior, but this σ also stands for the start's
    /// kinematic fit, which reads first motion and the first feet early with pulses alone and is not
    /// modelled apart: with the undriven prior, the simulated undriven group's rollout mark fell to
    /// 98.5 % within ±3σ (`bench accuracy --seeds 1-4 --pickup-wheel-told --calibrated-tyre`).</remarks>
    private (double Mean, double Sigma) PulsesOnlyDriveSlip() => DistanceWheel switch
    {
        PickupWheel.Driven => DriveSlipLaw(options.DrivenSlip),
        PickupWheel.DrivenAllWheels => DriveSlipLaw(options.AllWheelsDrivenSlip),
        _ => (0, options.WheelSlipSigma),
    };

    /// <summary>The wheel the distance comes from, as far as the user's word on the pickup's wheel
    /// (<see cref="ReconstructionOptions.PickupWheel"/>) tells it: the pickup's own when its channel
    /// carries distance. When a second channel does because it turned less under drive
    /// (<see cref="ChannelSetup"/>), that is the undriven axle's wheel of a car with one driven
    /// axle, another driven wheel of one with all four driven, and not said otherwise.</summary>
    private PickupWheel DistanceWheel => channelNote is null ? options.PickupWheel : options.PickupWheel switch
    {
        PickupWheel.Driven => PickupWheel.Undriven,
        PickupWheel.DrivenAllWheels => PickupWheel.DrivenAllWheels,
        _ => PickupWheel.NotSaid,
    };

    /// <summary>A tyre's slip per m/s² of drive, s²/m: its share/C per unit of the car's drive over g0.</summary>
    private static (double Mean, double Sigma) DriveSlipLaw(Braking.BrakeSlipPrior tyre) =>
        (tyre.MeanWheelSlip / Units.StandardGravity, tyre.WheelSlipSigma / Units.StandardGravity);

    /// <summary>True when the fused slip coefficient lies beyond 3σ (its own and the undriven
    /// wheel's prior combined) of an undriven wheel's, kept or not: the pulses show a wheel that
    /// slips under drive even where the slip is too small, or the brackets too coarse, for the
    /// filter to keep it (<see cref="FusionSettings.SlipEvidence"/>).</summary>
    private bool SlipToldApart(FusionResult fused)
    {
        double apart = fused.Slip.Value - options.UndrivenSlipPerMps2;
        return apart * apart > 9 * (Square(fused.Slip.Sigma) + Square(options.UndrivenSlipSigma));
    }

    /// <summary>Whether the distance's wheel is taken as one that passes drive, for the slip
    /// swing's verdict (<see cref="ReconstructedRun.DrivenWheel"/>): told undriven, no; otherwise
    /// when the fused slip coefficient is kept positive beyond 2σ, or, kept or not, lies above an
    /// undriven wheel's by <see cref="SlipToldApart"/>. A wheel told driven still needs its slip
    /// to show it: the simulator's clean undriven launches swing in 15 of 62 (most likely the body's
    /// pitch, which the accelerometer sees and the wheel does not — not yet traced; ACCURACY-NOTES,
    /// branch drivengate), and a driven wheel that slips that little would swing the same way. A
    /// slip not kept
    /// is reported as 0 (σ 0), the slip the filter then used, not the one it found: a launch held
    /// at its tyre's peak slips by more than k·a at the start and less later, so the evidence test
    /// may not keep the law while its coefficient still lies many σ from an undriven wheel's.</summary>
    private bool TakenAsDriven(FusionResult fused) => DistanceWheel switch
    {
        PickupWheel.Undriven => false,
        _ => fused.SlipKept
            ? fused.Slip.Value > 0 && fused.Slip.Value > 2 * fused.Slip.Sigma
            : fused.Slip.Value > options.UndrivenSlipPerMps2 && SlipToldApart(fused),
    };

    /// <summary>σ of the input's bias over the launch, m/s²: its resting level's σ and the drift
    /// since staging.</summary>
    private double LaunchBiasSigma(AccelRest rest) => Math.Sqrt(Square(rest.LevelSigmaMps2) + Square(options.BiasPriorMps2));

    /// <summary>The accelerometer's own distance where it first reaches the first foot, with the σ
    /// <see cref="LaunchSlipAllowance"/> gives it; null without an accelerometer, a standstill, or
    /// within the allowance's window.</summary>
    private AccelDistanceCheck? AccelFirstFoot(StepGrid steps, double startS)
    {
        if (accel is null || !Staged)
        {
            return null;
        }

        double[] grid = steps.TimeS;
        int k0 = FusionSmoother.FirstIndexAfter(grid, startS);
        double[] d = LaunchSlipAllowance.AccelDistance(grid, k0, steps.StartSpeedMps, steps.StartDistanceM, steps.StepSpeedMps, steps.StepDistanceM);
        for (int k = k0; k < grid.Length && grid[k] - startS <= LaunchSlipAllowance.WindowS; k++)
        {
            if (d[k] >= Metrics.Units.MetresPerFoot)
            {
                return new AccelDistanceCheck(grid[k], d[k], LaunchSlipAllowance.AccelSigma(grid[k] - startS, d[k], LaunchBiasSigma(accelRest!), options.ForwardScaleSigma));
            }
        }

        return null;
    }

    private static Estimate MeanBias(double[] grid, double startS, double? stopS, FusionResult fused)
    {
        double sum = 0;
        double sigma = 0;
        int count = 0;
        double stop = stopS ?? double.PositiveInfinity;
        for (int k = FusionSmoother.FirstIndexAfter(grid, startS); k < grid.Length && grid[k] < stop; k++)
        {
            sum += fused.Third[k];
            sigma += fused.ThirdSigma[k];
            count++;
        }

        return count == 0 ? new Estimate(0, 0) : new Estimate(sum / count, sigma / count);
    }
}
