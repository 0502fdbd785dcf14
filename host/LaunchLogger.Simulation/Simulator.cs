using LaunchLogger.Decoding;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Firmware;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Simulation.Box;
using LaunchLogger.Simulation.Scenarios;
using LaunchLogger.Simulation.Sensors;
using LaunchLogger.Simulation.Truth;
using LaunchLogger.Simulation.Vehicle;
using MathNet.Numerics.Distributions;

namespace LaunchLogger.Simulation;

/// <summary>Runs a scenario: the vehicle model moves the car, the sensor models turn its motion
/// into pulse edges and accelerometer samples, and fake hardware feeds those to the real firmware
/// core (<see cref="CaptureLoop"/>, <see cref="RunRecorder"/>), which writes the log.</summary>
/// <remarks>Physics advances in fixed steps of <see cref="StepS"/>; the box's main loop runs at its
/// own jittered period and sees, at each pass, exactly what had happened by then. All randomness
/// comes from <see cref="Random"/> instances seeded from the one seed, a separate stream per model,
/// so a scenario and a seed always give the same log bytes.</remarks>
public static class Simulator
{
    /// <summary>The physics step, s (0.1 ms).</summary>
    public const double StepS = 1e-4;

    /// <summary>Spacing of the truth trajectory's regular grid, s (1 ms).</summary>
    public const double TruthGridS = StepS * TruthEverySteps;

    private const int TruthEverySteps = 10;

    /// <summary>Simulates <paramref name="scenario"/> with <paramref name="seed"/>.</summary>
    /// <exception cref="ArgumentException">The scenario is invalid; the message names the field.</exception>
    /// <exception cref="OperationCanceledException">Cancelled.</exception>
    public static SimulationResult Run(Scenario scenario, int seed, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(scenario);
        string? problem = scenario.Validate();
        if (problem != null)
        {
            throw new ArgumentException($"scenario '{scenario.Name}': {problem}", nameof(scenario));
        }

        return new SimulationRun(scenario, seed).Execute(cancellationToken);
    }

    /// <summary>Simulates the built-in scenario <paramref name="name"/>.</summary>
    /// <exception cref="KeyNotFoundException">No built-in scenario has that name.</exception>
    public static SimulationResult Run(string name, int seed) => Run(BuiltInScenarios.Get(name), seed);

    /// <summary>The settings the box is configured with for <paramref name="scenario"/>.</summary>
    public static LoggerSettings SettingsFor(Scenario scenario)
    {
        ArgumentNullException.ThrowIfNull(scenario);
        BoxSpec box = scenario.Box;
        AccelerometerSpec accel = scenario.Accelerometer;
        double trueCircumference = 2 * Math.PI * scenario.Tyre.RollingRadiusM;
        var settings = new LoggerSettings
        {
            PulsesPerRevolution = scenario.Pickup.Teeth * scenario.Pickup.EdgesPerTooth,
            CircumferenceMicrometres = Micro(box.ConfiguredCircumferenceM ?? trueCircumference),
            SecondChannelEnabled = scenario.SecondPickup != null,
            RolloutMicrometres = Micro(box.RolloutM),
            AccelPresent = accel.Present,
            StageHoldMicros = Micro(box.StageHoldS),
            StillBandMilliG = box.StillBandMilliG,
            StillBlockMicros = Micro(box.StillBlockS),
            MotionThresholdMilliG = box.MotionThresholdMilliG,
            MotionConfirmSamples = box.MotionConfirmSamples,
            StopHoldMicros = Micro(box.StopHoldS),
            BracketLimitMicros = box.BracketLimitMicros,
            ForwardAxis = 0,
            ForwardAxisReversed = Math.Cos(accel.MountYawDeg * Math.PI / 180) < 0,
        };
        if (scenario.SecondPickup is { } second)
        {
            settings.SecondPulsesPerRevolution = second.Teeth * second.EdgesPerTooth;
            settings.SecondCircumferenceMicrometres = settings.CircumferenceMicrometres;
        }

        if (accel.Present)
        {
            settings.AccelOutputDataRateMilliHz = (int)Math.Round(accel.OutputDataRateHz * 1000);
            settings.AccelFullScaleMilliG = (int)Math.Round(accel.FullScaleG * 1000);
            settings.PreTriggerSamples = Math.Max(box.MotionConfirmSamples, (int)Math.Ceiling(box.PreTriggerS * accel.OutputDataRateHz));
            settings.PreTriggerBursts = (2 * (int)Math.Ceiling(box.PreTriggerS * 1e6 / accel.ReadIntervalMicros)) + 8;
        }

        return settings;
    }

    private static int Micro(double value) => (int)Math.Round(value * 1e6);

    /// <summary>The state of one simulation.</summary>
    private sealed class SimulationRun
    {
        private readonly Scenario scenario;
        private readonly int seed;
        private readonly VehicleModel vehicle;
        private readonly PulsePickup[] pickups;
        private readonly AccelerometerModel? accel;
        private readonly TruthRecorder truth;
        private readonly Random loopRandom;
        private readonly Random edgeRandom;
        private readonly List<long>[] stampsMicros;
        private Phase phase = Phase.Staged;
        private double endS;
        private double coastEndsS;
        private long steps;
        private double? launchS;
        private double? firstMotionS;
        private double? rolloutS;
        private double? rolloutSpeed;
        private double? targetReachedS;
        private double? brakeOnsetS;
        private double? brakeOnsetSpeed;
        private double? brakeOnsetDistance;
        private double? standstillS;
        private double? standstillDistance;
        private double peakSpeed;
        private double peakAccel;
        private double peakSlip;
        private double pickupSpinS;
        private long pulsesAtFirstMotion = -1;

        internal SimulationRun(Scenario scenario, int seed)
        {
            this.scenario = scenario;
            this.seed = seed;
            var master = new Random(seed);
            var pickupRandom = new Random(master.Next());
            var secondPickupRandom = new Random(master.Next());
            var accelRandom = new Random(master.Next());
            loopRandom = new Random(master.Next());
            edgeRandom = new Random(master.Next());
            vehicle = new VehicleModel(scenario, StepS);
            pickups = scenario.SecondPickup is { } second
                ? [new PulsePickup(scenario.Pickup, pickupRandom), new PulsePickup(second, secondPickupRandom)]
                : [new PulsePickup(scenario.Pickup, pickupRandom)];
            stampsMicros = pickups.Select(_ => new List<long>()).ToArray();
            accel = scenario.Accelerometer.Present ? new AccelerometerModel(scenario.Accelerometer, vehicle.GradeRad, accelRandom) : null;
            truth = new TruthRecorder(scenario.Box.ClockStartMicros * 1e-6);
            endS = scenario.Plan.MaxDurationS;
        }

        private enum Phase
        {
            Staged,
            Accelerating,
            Coasting,
            Braking,
            Stopped,
            Done,
        }

        internal SimulationResult Execute(CancellationToken cancellationToken)
        {
            LoggerSettings settings = SettingsFor(scenario);
            var health = new HealthCounters();
            var sink = new MemoryLogSink();
            var recorder = new RunRecorder(settings, sink, health);
            var counter = new SimulatedMicrosecondCounter(scenario.Box.ClockStartMicros);
            var clock = new MonotonicClock(counter, health);
            long counterStart = scenario.Box.CounterStart;
            var edgeLists = pickups.Select(p => p.EdgeTimesS).ToArray();
            SimulatedPulseCounter? pulseCounter = null;
            PolledPulseSource? polled = null;
            EdgeObservationQueue? queue = null;
            IPulseSource source;
            if (scenario.Capture.Kind == CaptureKind.PolledCounter)
            {
                pulseCounter = new SimulatedPulseCounter(edgeLists, counterStart);
                polled = new PolledPulseSource(pulseCounter, clock);
                source = polled;
            }
            else
            {
                queue = new EdgeObservationQueue(scenario.Capture.QueueCapacity, health);
                source = queue;
            }

            for (int c = 0; c < pickups.Length; c++)
            {
                recorder.SetCounterOrigin(c, counterStart);
            }

            SimulatedAccelerometer? accelerometer = accel is null ? null : new SimulatedAccelerometer(
                accel, settings.AccelOutputDataRateMilliHz, settings.AccelFullScaleMilliG, scenario.Accelerometer.FifoDepth);
            SimulatedBrakeSwitch? brakeSwitch = scenario.BrakeSwitch.Present ? new SimulatedBrakeSwitch(scenario.BrakeSwitch.DelayS) : null;
            if (brakeSwitch != null && scenario.Plan.HoldBrakeWhileStaged)
            {
                brakeSwitch.Pedal(0, true);
            }

            SimulatedMarkButton? markButton = scenario.Plan.MarkHeldAroundLaunchS is { } held
                ? new SimulatedMarkButton(scenario.Plan.StageS - held, scenario.Plan.StageS + held)
                : null;
            var loop = new CaptureLoop(
                clock,
                source,
                accelerometer,
                brakeSwitch,
                markButton,
                null,
                recorder,
                accelerometer is null ? 1 : scenario.Accelerometer.FifoDepth,
                accelerometer is null ? 1_000_000 : scenario.Accelerometer.ReadIntervalMicros)
            {
                // The boards' debounce of the switch inputs.
                SwitchHoldMicros = 20_000,
            };

            int[] delivered = new int[pickups.Length];
            long loopMicros = 0;
            truth.Add(0, 0, 0, 0);
            while (loopMicros * 1e-6 <= endS)
            {
                double loopS = loopMicros * 1e-6;
                while (vehicle.TimeS < loopS - 1e-12 && phase != Phase.Done)
                {
                    PhysicsStep(brakeSwitch);
                    if ((steps & 0xFFFF) == 0)
                    {
                        cancellationToken.ThrowIfCancellationRequested();
                    }
                }

                counter.NowMicros = loopMicros;
                if (queue != null)
                {
                    DeliverEdges(queue, counter, delivered, loopMicros, counterStart);
                }

                if (pulseCounter != null && polled != null)
                {
                    pulseCounter.NowS = loopS;
                    polled.Poll();
                }

                if (accelerometer != null)
                {
                    accelerometer.NowS = loopS;
                }

                if (brakeSwitch != null)
                {
                    brakeSwitch.NowS = loopS;
                }

                if (markButton != null)
                {
                    markButton.NowS = loopS;
                }

                loop.Step();
                loopMicros += NextLoopPeriodMicros();
            }

            if (recorder.Phase == RunPhase.Moving || recorder.Phase == RunPhase.RolledOut)
            {
                recorder.Shutdown(clock.NowMicros());
            }

            truth.Add(vehicle.TimeS, vehicle.DistanceM, vehicle.SpeedMps, vehicle.AccelMps2);
            return BuildResult(settings, sink, recorder, health, accelerometer);
        }

        private void PhysicsStep(SimulatedBrakeSwitch? brakeSwitch)
        {
            RunPlan plan = scenario.Plan;
            double t0 = vehicle.TimeS;
            switch (phase)
            {
                case Phase.Staged when t0 >= plan.StageS - 1e-9:
                    vehicle.Launch();
                    launchS = t0;
                    phase = Phase.Accelerating;
                    if (plan.HoldBrakeWhileStaged)
                    {
                        brakeSwitch?.Pedal(t0, false);
                    }

                    break;
                case Phase.Coasting when t0 >= coastEndsS - 1e-9:
                    if (plan.BrakeToStop)
                    {
                        vehicle.Brake(plan.BrakeDemandG);
                        brakeOnsetS = t0;
                        brakeOnsetSpeed = vehicle.SpeedMps;
                        brakeOnsetDistance = vehicle.DistanceM;
                        brakeSwitch?.Pedal(t0, true);
                        phase = Phase.Braking;
                    }
                    else
                    {
                        endS = t0;
                        phase = Phase.Done;
                        return;
                    }

                    break;
            }

            double x0 = vehicle.DistanceM;
            double v0 = vehicle.SpeedMps;
            double revsFront0 = vehicle.RevsFront;
            double revsRear0 = vehicle.RevsRear;
            double omegaFront0 = vehicle.OmegaFront;
            double omegaRear0 = vehicle.OmegaRear;
            double pitch0 = vehicle.PitchRad;
            vehicle.Step();
            steps++;
            double t1 = vehicle.TimeS;
            double a = vehicle.AccelMps2;
            foreach (PulsePickup pickup in pickups)
            {
                bool front = pickup.Spec.Axle == Axle.Front;
                pickup.Advance(t0, t1, front ? revsFront0 : revsRear0, front ? vehicle.RevsFront : vehicle.RevsRear,
                    front ? omegaFront0 : omegaRear0, front ? vehicle.OmegaFront : vehicle.OmegaRear);
            }

            accel?.Advance(t0, t1, a, pitch0, vehicle.PitchRad);

            if (vehicle.StartedMovingAtS is { } moved && firstMotionS is null)
            {
                firstMotionS = moved;
                pulsesAtFirstMotion = pickups[0].EdgeTimesS.Count;
                truth.Add(moved, 0, 0, a);
            }

            double rollout = scenario.Box.RolloutM;
            if (firstMotionS != null && rolloutS is null && vehicle.DistanceM >= rollout && rollout > x0)
            {
                double tau = SolveStep(rollout - x0, v0, a, StepS);
                rolloutS = t0 + tau;
                rolloutSpeed = v0 + (a * tau);
                truth.Add(rolloutS.Value, rollout, rolloutSpeed.Value, a);
            }

            if (vehicle.StoppedAtS is { } stopped)
            {
                standstillS = stopped;
                standstillDistance = vehicle.DistanceM;
                truth.Add(stopped, vehicle.DistanceM, 0, a);
                phase = Phase.Stopped;
                endS = stopped + plan.StandStillAfterS;
            }

            if (phase == Phase.Accelerating)
            {
                peakSlip = Math.Max(peakSlip, DrivenSlip());
                double pickupSlip = scenario.Pickup.Axle == Axle.Front ? vehicle.SlipFront : vehicle.SlipRear;
                pickupSpinS += pickupSlip > scenario.Tyre.PeakSlip ? t1 - t0 : 0;
                if ((plan.TargetSpeedMps is { } vt && vehicle.SpeedMps >= vt) || (plan.TargetDistanceM is { } xt && vehicle.DistanceM >= xt))
                {
                    vehicle.Coast();
                    targetReachedS = t1;
                    coastEndsS = t1 + plan.CoastS;
                    phase = Phase.Coasting;
                }
            }

            if (firstMotionS != null)
            {
                peakSpeed = Math.Max(peakSpeed, vehicle.SpeedMps);
                peakAccel = Math.Max(peakAccel, a);
            }

            if (steps % TruthEverySteps == 0)
            {
                truth.Add(t1, vehicle.DistanceM, vehicle.SpeedMps, a);
            }
        }

        private double DrivenSlip() => scenario.Vehicle.DrivenAxle switch
        {
            DrivenAxle.Front => vehicle.SlipFront,
            DrivenAxle.Rear => vehicle.SlipRear,
            _ => Math.Max(vehicle.SlipFront, vehicle.SlipRear),
        };

        /// <summary>Time into a step of constant acceleration at which distance <paramref name="d"/> is covered.</summary>
        private static double SolveStep(double d, double v0, double a, double dt)
        {
            double disc = Math.Max(0, (v0 * v0) + (2 * a * d));
            double denominator = v0 + Math.Sqrt(disc);
            double tau = denominator > 0 ? 2 * d / denominator : dt;
            return Math.Clamp(tau, 0, dt);
        }

        private void DeliverEdges(EdgeObservationQueue queue, SimulatedMicrosecondCounter counter, int[] delivered, long loopMicros, long counterStart)
        {
            CaptureSpec capture = scenario.Capture;
            for (int c = 0; c < pickups.Length; c++)
            {
                List<double> edges = pickups[c].EdgeTimesS;
                List<long> stamps = stampsMicros[c];
                while (delivered[c] < edges.Count)
                {
                    int i = delivered[c];
                    if (stamps.Count <= i)
                    {
                        // Timestamped by the kernel's interrupt handler: late, never early.
                        double delay = Math.Max(0, capture.EdgeLatencyMicros + (capture.EdgeJitterMicros > 0 ? Normal.Sample(edgeRandom, 0, capture.EdgeJitterMicros) : 0));
                        long stamp = (long)Math.Ceiling((edges[i] * 1e6) + delay);
                        if (stamps.Count > 0 && stamp <= stamps[^1])
                        {
                            stamp = stamps[^1] + 1;
                        }

                        stamps.Add(stamp);
                    }

                    if (stamps[i] > loopMicros)
                    {
                        break;
                    }

                    queue.TryWriteEdge(c, counterStart + i + 1, counter.BoxMicros(stamps[i]));
                    delivered[c]++;
                }
            }
        }

        private long NextLoopPeriodMicros()
        {
            CaptureSpec capture = scenario.Capture;
            double period = capture.LoopPeriodMicros;
            if (capture.LoopJitterMicros > 0)
            {
                period += Normal.Sample(loopRandom, 0, capture.LoopJitterMicros);
            }

            period = Math.Clamp(period, Math.Max(1, capture.LoopPeriodMicros / 5), capture.LoopPeriodMicros * 5);
            if (capture.PausesPerSecond > 0 && loopRandom.NextDouble() < capture.PausesPerSecond * capture.LoopPeriodMicros * 1e-6)
            {
                period += capture.PauseMicros;
            }

            return Math.Max(1, (long)Math.Round(period));
        }

        private SimulationResult BuildResult(LoggerSettings settings, MemoryLogSink sink, RunRecorder recorder, HealthCounters health, SimulatedAccelerometer? accelerometer)
        {
            double offsetS = scenario.Box.ClockStartMicros * 1e-6;
            double? Box(double? simS) => simS is { } s ? s + offsetS : null;
            var trajectory = truth.ToTrajectory();
            var events = new TruthEvents
            {
                LaunchS = Box(launchS),
                FirstMotionS = Box(firstMotionS),
                RolloutS = Box(rolloutS),
                RolloutSpeedMps = rolloutSpeed,
                RolloutDistanceM = scenario.Box.RolloutM,
                TargetReachedS = Box(targetReachedS),
                ShiftStartsS = vehicle.Powertrain.ShiftStartsS.Select(s => s + offsetS).ToArray(),
                BrakeOnsetS = Box(brakeOnsetS),
                BrakeOnsetSpeedMps = brakeOnsetSpeed,
                BrakeOnsetDistanceM = brakeOnsetDistance,
                BrakeSwitchOnS = scenario.BrakeSwitch.Present && brakeOnsetS is { } b ? b + scenario.BrakeSwitch.DelayS + offsetS : null,
                AbsCycles = vehicle.Brakes.AbsCycles,
                StandstillS = Box(standstillS),
                StandstillDistanceM = standstillDistance,
                PeakSpeedMps = peakSpeed,
                PeakAccelMps2 = peakAccel,
                PeakDrivenSlip = peakSlip,
                PickupSpinS = pickupSpinS,
                GradePercent = scenario.Environment.GradePercent,
                HeadwindMps = scenario.Environment.HeadwindMps,
            };
            PulsePickupSpec pickup = scenario.Pickup;
            DrivenAxle driven = scenario.Vehicle.DrivenAxle;
            bool pickupDriven = driven == DrivenAxle.All || (driven == DrivenAxle.Front) == (pickup.Axle == Axle.Front);
            var sensors = new SensorTruth
            {
                PulsesPerRevolution = pickups[0].PulsesPerRevolution,
                TrueCircumferenceM = 2 * Math.PI * scenario.Tyre.RollingRadiusM,
                ConfiguredCircumferenceM = settings.CircumferenceMicrometres * 1e-6,
                EdgePositionsRev = pickups[0].EdgePositionsFromFirstRev,
                PickupOnDrivenWheel = pickupDriven,
                Pulses = pulsesAtFirstMotion < 0 ? 0 : pickups[0].EdgeTimesS.Count - pulsesAtFirstMotion,
                SecondPulsesPerRevolution = pickups.Length > 1 ? pickups[1].PulsesPerRevolution : null,
                AccelPresent = accel != null,
                AccelTrueRateHz = accel is null ? null : 1 / accel.TruePeriodS,
                AccelNominalRateHz = accel is null ? null : scenario.Accelerometer.OutputDataRateHz,
                AccelNoiseSigmaMilliG = accel?.NoiseSigmaMilliG,
                AccelSamplesProduced = accel?.SampleTimesS.Count ?? 0,
                AccelSamplesLost = accelerometer?.SamplesLost ?? 0,
                AccelMountPitchDeg = accel is null ? null : scenario.Accelerometer.MountPitchDeg,
                AccelMountRollDeg = accel is null ? null : scenario.Accelerometer.MountRollDeg,
                AccelMountYawDeg = accel is null ? null : scenario.Accelerometer.MountYawDeg,
            };
            FigureSet? figures = firstMotionS is { } fm
                ? FigureCalculator.Compute(trajectory, new Estimate(fm + offsetS, 0), scenario.Box.RolloutM, brakeOnsetS: events.BrakeOnsetS)
                : null;
            return new SimulationResult
            {
                Scenario = scenario,
                Seed = seed,
                LogBytes = sink.ToArray(),
                Settings = settings,
                Truth = trajectory,
                Events = events,
                Sensors = sensors,
                Figures = figures,
                BoxRuns = recorder.RunNumber,
                BoxFirstMotionS = recorder.RunNumber > 0 && recorder.MotionMicros > 0 ? recorder.MotionMicros * 1e-6 : null,
                BoxRolloutS = recorder.RunNumber > 0 && recorder.RolloutMicros > 0 ? recorder.RolloutMicros * 1e-6 : null,
                Health = health,
                DurationS = vehicle.TimeS,
            };
        }
    }
}
