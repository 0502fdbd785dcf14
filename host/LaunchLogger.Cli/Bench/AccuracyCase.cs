using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Cli.Bench;

/// <summary>One simulated run of the accuracy benchmark: a built-in car with its sensors varied.</summary>
/// <param name="Index">Position in the benchmark.</param>
/// <param name="Seed">Seed for the simulation's noise.</param>
/// <param name="Scenario">The varied scenario.</param>
/// <param name="Summary">The variation in a few words, for the per-run listing.</param>
/// <param name="PollPeriodS">The counter's poll period, or null for edge timestamps.</param>
public sealed record AccuracyCase(int Index, int Seed, Scenario Scenario, string Summary, double? PollPeriodS)
{
    /// <summary>The accelerometer's scale as a calibration tells it, or null when not calibrated.</summary>
    public Decoding.Estimate? AccelCalibration { get; init; }

    /// <summary>The rolling circumference told as a measurement gives it (metres, with its σ), when the tyre is calibrated.</summary>
    public Decoding.Estimate? TyreCalibration { get; init; }

    /// <summary>The static circumference told as such (the settings' <c>static_circumference_m</c>), metres, when the tyre is not calibrated.</summary>
    public double? StaticTyreM { get; init; }

    /// <summary>Which wheel carries the pickup as the settings tell it (<c>pickup_wheel</c>), or
    /// null when not said (<c>bench accuracy --pickup-wheel-told</c>).</summary>
    public Decoding.Reconstruction.PickupWheel? PickupWheelTold { get; init; }

    /// <summary>The group the case is reported in.</summary>
    public BenchGroup Group => (HasAccelerometer, DrivenPickup, PollPeriodS) switch
    {
        (true, false, > 1.5e-3) => BenchGroup.SimulatedAccelUndrivenPollCoarse,
        (true, false, >= 0.75e-3) => BenchGroup.SimulatedAccelUndrivenPoll1Ms,
        (true, false, _) => BenchGroup.SimulatedAccelUndriven,
        (true, true, _) => BenchGroup.SimulatedAccelDriven,
        (false, false, _) => BenchGroup.SimulatedPulsesUndriven,
        (false, true, _) => BenchGroup.SimulatedPulsesDriven,
    };

    /// <summary>True when the accelerometer is fitted.</summary>
    public bool HasAccelerometer => Scenario.Accelerometer.Present;

    /// <summary>True when the pickup turns with a driven wheel (so it sees wheelspin and the
    /// tyre's drive slip); always so on an all-wheel-drive car.</summary>
    public bool DrivenPickup => Scenario.Vehicle.DrivenAxle == DrivenAxle.All
        || (Scenario.Vehicle.DrivenAxle == DrivenAxle.Front) == (Scenario.Pickup.Axle == Axle.Front);

    /// <summary>The pickup's wheel as a user who knows the car would tell it (the settings'
    /// <c>pickup_wheel</c>): undriven, driven, or driven with all four wheels.</summary>
    public Decoding.Reconstruction.PickupWheel PickupWheelKnown => !DrivenPickup ? Decoding.Reconstruction.PickupWheel.Undriven
        : Scenario.Vehicle.DrivenAxle == DrivenAxle.All ? Decoding.Reconstruction.PickupWheel.DrivenAllWheels
        : Decoding.Reconstruction.PickupWheel.Driven;

    /// <summary>Builds the benchmark's cases from one seed: the acceleration scenarios in turn,
    /// with 12–100 teeth, exact edge timestamps or a counter polled every 0.1–10 ms (log-uniform,
    /// a third of the polled runs near 1 ms), accelerometer noise and mounting tilt, a pickup on
    /// a driven wheel now and then (wheelspin), and one run in five without an accelerometer.
    /// Every run goes a quarter mile and then stops.</summary>
    /// <param name="runs">How many.</param>
    /// <param name="seed">Seed of the variations.</param>
    /// <param name="calibratedTyre">True: the tyre does not grow, and the box and the decoder are
    /// told its rolling circumference as a measurement gives it (<see cref="TyreCalibrationTold"/>). False (the default): the box is told the static circumference and the
    /// tyre grows with speed, as for a user who has not calibrated at speed
    /// (<see cref="UncalibratedTyre"/>).</param>
    /// <param name="calibratedAccel">True: the decoder is told the forward axis' scale as a
    /// calibration against gravity gives it (<see cref="AccelScaleDraw"/>). The scale error itself
    /// (1 % σ) is drawn either way, from a stream of its own so the other variations stay.</param>
    public static IReadOnlyList<AccuracyCase> Build(int runs, int seed, bool calibratedTyre = false, bool calibratedAccel = false)
    {
        var scaleRandom = new Random(unchecked((seed * 977) + 3));
        int[] teeth = [12, 16, 24, 36, 48, 60, 80, 100];
        string[] cars = BuiltInScenarios.Names.Where(n => !n.Contains("brake", StringComparison.OrdinalIgnoreCase)).ToArray();
        var cases = new List<AccuracyCase>(runs);
        var random = new Random(seed);
        for (int i = 0; i < runs; i++)
        {
            Scenario baseline = BuiltInScenarios.Get(cars[i % cars.Length]);
            int toothCount = teeth[random.Next(teeth.Length)];
            bool exact = random.NextDouble() < 0.5;
            double loopMicros = random.NextDouble() < 0.33 ? 750 + (random.NextDouble() * 750) : 100 * Math.Pow(100, random.NextDouble());
            (double rollingOverStatic, double growth) = UncalibratedTyre.Draw(random);
            bool accel = random.NextDouble() >= 0.2;
            bool driven = random.NextDouble() < 0.3;
            double pitch = (random.NextDouble() * 6) - 3;
            double roll = (random.NextDouble() * 4) - 2;
            double yaw = (random.NextDouble() * 6) - 3;
            double noise = 100 + (random.NextDouble() * 200);
            (double scaleError, Decoding.Estimate? told) = AccelScaleDraw.Draw(scaleRandom, calibratedAccel);
            Decoding.Estimate tyreTold = TyreCalibrationTold.Told(2 * Math.PI * baseline.Tyre.RollingRadiusM);
            Axle pickupAxle = driven ? DrivenAxleOf(baseline) : UndrivenAxleOf(baseline);
            Scenario scenario = baseline with
            {
                Name = $"{baseline.Name}-bench-{i}",
                Tyre = baseline.Tyre with { RadiusGrowthAt30Mps = calibratedTyre ? 0 : growth },
                Box = baseline.Box with { ConfiguredCircumferenceM = calibratedTyre ? tyreTold.Value : 2 * Math.PI * baseline.Tyre.RollingRadiusM / rollingOverStatic },
                Plan = baseline.Plan with { TargetSpeedMps = null, TargetDistanceM = 420, BrakeToStop = true },
                Pickup = baseline.Pickup with { Teeth = toothCount, Axle = pickupAxle },
                Capture = baseline.Capture with
                {
                    Kind = exact ? CaptureKind.ExactEdges : CaptureKind.PolledCounter,
                    LoopPeriodMicros = loopMicros,
                    LoopJitterMicros = Math.Min(baseline.Capture.LoopJitterMicros, 0.4 * loopMicros),
                },
                Accelerometer = baseline.Accelerometer with
                {
                    Present = accel,
                    MountPitchDeg = pitch,
                    MountRollDeg = roll,
                    MountYawDeg = yaw,
                    NoiseDensityMicroGPerRootHz = noise,
                    ScaleError = baseline.Accelerometer.ScaleError with { X = scaleError },
                },
            };
            string summary = FormattableString.Invariant(
                $"{baseline.Name}, {toothCount} teeth on the {(driven || baseline.Vehicle.DrivenAxle == DrivenAxle.All ? "driven" : "undriven")} axle, {(exact ? "edge timestamps" : $"polled every {loopMicros:0} µs")}, {(calibratedTyre ? "tyre calibrated" : $"tyre rolls {rollingOverStatic:0.0000} of static, grows {growth * 100:0.00} % at 30 m/s")}, {(accel ? $"accelerometer (pitch {pitch:+0.0;-0.0}°, scale {scaleError * 100:+0.00;-0.00} %)" : "no accelerometer")}");
            cases.Add(new AccuracyCase(i, unchecked((seed * 7919) + i), scenario, summary, exact ? null : loopMicros * 1e-6) { AccelCalibration = accel ? told : null, TyreCalibration = calibratedTyre ? tyreTold : null, StaticTyreM = calibratedTyre ? null : scenario.Box.ConfiguredCircumferenceM });
        }

        return cases;
    }

    private static Axle DrivenAxleOf(Scenario s) => s.Vehicle.DrivenAxle switch
    {
        DrivenAxle.Front => Axle.Front,
        _ => Axle.Rear,
    };

    // An all-wheel-drive car has no undriven axle: its pickup always sees drive slip.
    private static Axle UndrivenAxleOf(Scenario s) => s.Vehicle.DrivenAxle switch
    {
        DrivenAxle.Front => Axle.Rear,
        _ => Axle.Front,
    };
}
