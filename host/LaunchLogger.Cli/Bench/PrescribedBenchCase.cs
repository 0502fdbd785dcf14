using LaunchLogger.Prescribed;
using LaunchLogger.Prescribed.Sensors;
using LaunchLogger.Prescribed.Shapes;
using static System.FormattableString;

namespace LaunchLogger.Cli.Bench;

/// <summary>One record of the accuracy benchmark made by the independent generator.</summary>
/// <param name="Index">Position in the benchmark.</param>
/// <param name="Spec">The record.</param>
/// <param name="Group">Where it is reported.</param>
/// <param name="AsLog">True: written as a log by the firmware core; false: as CSV files.</param>
/// <param name="Summary">The variation in a few words.</param>
public sealed record PrescribedBenchCase(int Index, PrescribedRecordSpec Spec, BenchGroup Group, bool AsLog, string Summary)
{
    /// <summary>The accelerometer's scale as a calibration tells it, or null when not calibrated.</summary>
    public LaunchLogger.Decoding.Estimate? AccelCalibration { get; init; }

    /// <summary>The rolling circumference told as a measurement gives it (metres, with its σ), when the tyre is calibrated.</summary>
    public LaunchLogger.Decoding.Estimate? TyreCalibration { get; init; }

    /// <summary>The static circumference told as such (the settings' <c>static_circumference_m</c>), metres, when the tyre is not calibrated.</summary>
    public double? StaticTyreM { get; init; }

    /// <summary>Which wheel carries the pickup as the settings tell it (<c>pickup_wheel</c>), or
    /// null when not said.</summary>
    public LaunchLogger.Decoding.Reconstruction.PickupWheel? PickupWheelTold { get; init; }

    private const double Mph = 0.44704;

    private static readonly (BenchGroup Group, double Share)[] Shares =
    [
        (BenchGroup.GeneratedStanding, 16 / 40.0),
        (BenchGroup.GeneratedLongIdle, 3 / 40.0),
        (BenchGroup.GeneratedRolling, 8 / 40.0),
        (BenchGroup.GeneratedCruiseStop, 10 / 40.0),
        (BenchGroup.GeneratedStopAndGo, 3 / 40.0),
    ];

    /// <summary>Builds <paramref name="runs"/> generated cases: in every 40, 16 standing starts,
    /// 3 after a 60 s idle, 8 rolling starts at 5–60 mph, 10 stops from cruise (brake rise
    /// 0.05–2 s, or a steady rise through the stop) and 3 stop-and-go records; 8–100 teeth; edge
    /// timestamps with 0–20 µs jitter or a counter polled every 0.1–1 ms; an accelerometer at
    /// 100–1600 Hz with bias, tilt, noise and a drifting clock; the pickup on an undriven wheel
    /// that lags the road while it is spun up (<see cref="SpinUpLag.Draw"/>, from a stream of its
    /// own, so every other part of a record is as it was without) and slips while braked
    /// (<see cref="BrakeSlip.Draw"/>, again from a stream of its own); half as logs written by the
    /// firmware core, half as CSV files. Every stop from cruise is then added once more, after
    /// those, as a log with a brake switch (<see cref="BenchGroup.GeneratedCruiseStopSwitch"/>),
    /// its delay drawn from a stream of its own so the records above stay as they are; and every
    /// standing start once more with a smooth take-up (<see cref="BenchGroup.GeneratedStandingSmooth"/>),
    /// its shape redrawn from the same seed with a raised-cosine rise in place of the ramp; and
    /// every other standing start (the first, third, …) once more after those with a lagged
    /// take-up (<see cref="BenchGroup.GeneratedStandingLagged"/>), redrawn from the same seed with
    /// the ramp's demand through a first-order lag (the lag drawn last, from the shape's own
    /// stream). Every other one, not all: a standing start costs about three times the bench's
    /// average record to decode, and all of them again would add a quarter to its run time.</summary>
    /// <param name="runs">Generated records before the switch and smooth-launch copies.</param>
    /// <param name="seed">Seed of every draw.</param>
    /// <param name="firstIndex">Index of the first case.</param>
    /// <param name="calibratedTyre">Tell the tyre as calibrated at speed.</param>
    /// <param name="calibratedAccel">Tell the accelerometer's scale as calibrated.</param>
    /// <param name="smoothLaunches">False to leave out the smooth-launch copies (they come after
    /// every other record but the lagged copies, so those are as they were; their shapes cost time
    /// to build when their group is not wanted).</param>
    /// <param name="laggedLaunches">False to leave out the lagged-launch copies (they come after
    /// the smooth ones and keep their indices whether those are made or not).</param>
    /// <param name="rollingPulsesDriven">True to add, after all those, every record that opens
    /// moving once more with pulses only on a driven wheel (<see cref="AddRollingPulsesDriven"/>).</param>
    /// <param name="pickupWheelTold">True to tell those copies' wheel driven.</param>
    public static IReadOnlyList<PrescribedBenchCase> Build(int runs, int seed, int firstIndex, bool calibratedTyre, bool calibratedAccel = false, bool smoothLaunches = true, bool laggedLaunches = true, bool rollingPulsesDriven = false, bool pickupWheelTold = false)
    {
        int[] teeth = [8, 12, 16, 24, 36, 48, 60, 80, 100];
        double[] rates = [100, 200, 400, 800, 1600];
        var random = new Random(unchecked((seed * 31) + 7));
        var wheelRandom = new Random(unchecked((seed * 37) + 13));
        var scaleRandom = new Random(unchecked((seed * 977) + 5));
        var brakeRandom = new Random(unchecked((seed * 41) + 17));
        var cases = new List<PrescribedBenchCase>(runs);
        var made = new int[Shares.Length];
        var standingShapeSeeds = new List<(PrescribedBenchCase Case, int ShapeSeed)>();
        for (int i = 0; i < runs; i++)
        {
            // The group furthest behind its share comes next, so any number of runs mixes them.
            int k = Enumerable.Range(0, Shares.Length).MaxBy(j => (Shares[j].Share * (i + 1)) - made[j]);
            made[k]++;
            int shapeSeed = random.Next();
            var shapeRandom = new Random(shapeSeed);
            BenchGroup group = Shares[k].Group;
            Shape shape = group switch
            {
                BenchGroup.GeneratedStanding => PrescribedShapes.StandingStart(shapeRandom),
                BenchGroup.GeneratedLongIdle => PrescribedShapes.LongIdle(shapeRandom),
                BenchGroup.GeneratedRolling => PrescribedShapes.RollingStart(Mph * (5 + (55 * shapeRandom.NextDouble())), shapeRandom),
                BenchGroup.GeneratedCruiseStop => CruiseStop(shapeRandom),
                _ => PrescribedShapes.StopAndGo(shapeRandom, 3 + (5 * shapeRandom.NextDouble())),
            };
            int toothCount = teeth[random.Next(teeth.Length)];
            double circumference = 1.8 + (0.3 * random.NextDouble());
            (double ratio, double growth) = UncalibratedTyre.Draw(random);
            LaunchLogger.Decoding.Estimate tyreTold = TyreCalibrationTold.Told(circumference);
            TyreModel tyre = calibratedTyre ? new TyreModel(tyreTold.Value, circumference, 0) : new TyreModel(circumference / ratio, circumference, growth);
            bool polled = random.NextDouble() < 0.5;
            double period = 1e-4 * Math.Pow(10, random.NextDouble());
            double rate = rates[random.Next(rates.Length)];
            (double scaleError, LaunchLogger.Decoding.Estimate? told) = AccelScaleDraw.Draw(scaleRandom, calibratedAccel);
            BrakeSlip brake = BrakeSlip.Draw(brakeRandom);
            var spec = new PrescribedRecordSpec
            {
                Shape = shape,
                Pickup = new WheelPickup(toothCount, tyre, random.NextDouble(), SpinUp: SpinUpLag.Draw(wheelRandom, circumference), Brake: brake),
                Edges = new EdgeTiming(5e-6, 20e-6 * random.NextDouble()),
                Polled = polled ? new PolledCounter(period, 0.1, 1, 5e-3) : null,
                Accel = new AccelSensor
                {
                    RateHz = rate,
                    NoiseMicroGPerRootHz = 100 + (200 * random.NextDouble()),
                    BiasXMps2 = 0.1 * (random.NextDouble() - 0.5),
                    PitchRad = 0.05 * (random.NextDouble() - 0.5) * 2,
                    ClockDriftPpm = 200 * (random.NextDouble() - 0.5),
                    ScaleError = scaleError,
                },
                Seed = random.Next(),
            };
            bool asLog = i % 2 == 1;
            string summary = Invariant($"{shape.Name}; {toothCount} teeth; {(polled ? $"polled every {period * 1e3:0.00} ms" : "edges")}; accelerometer {rate:0} Hz, scale {scaleError * 100:+0.00;-0.00} %; braked tyre C {brake.SlipStiffness:0.0}; {(asLog ? "log" : "CSV")}");
            cases.Add(new PrescribedBenchCase(firstIndex + i, spec, group, asLog, summary) { AccelCalibration = told, TyreCalibration = calibratedTyre ? tyreTold : null, StaticTyreM = calibratedTyre ? null : tyre.StatedCircumferenceM });
            if (group == BenchGroup.GeneratedStanding)
            {
                standingShapeSeeds.Add((cases[^1], shapeSeed));
            }
        }

        var switchRandom = new Random(unchecked((seed * 131) + 11));
        foreach (PrescribedBenchCase stop in cases.Where(c => c.Group == BenchGroup.GeneratedCruiseStop).ToList())
        {
            double delay = 0.005 + (0.02 * switchRandom.NextDouble());
            PrescribedRecordSpec spec = stop.Spec with
            {
                BrakeSwitchDelayS = delay,
                Polled = stop.Spec.Polled is { } p ? p with { StallS = 0.02 } : null,
            };
            string summary = Invariant($"{stop.Summary.Replace("; CSV", "; log", StringComparison.Ordinal)}; brake switch {delay * 1e3:0.0} ms{(spec.Polled is null ? "" : ", 20 ms stalls")}");
            cases.Add(new PrescribedBenchCase(firstIndex + cases.Count, spec, BenchGroup.GeneratedCruiseStopSwitch, true, summary) { AccelCalibration = stop.AccelCalibration, TyreCalibration = stop.TyreCalibration, StaticTyreM = stop.StaticTyreM });
        }

        // The standing starts once more with a smooth take-up, then once more with a lagged one.
        int smoothFirst = firstIndex + cases.Count;
        AddTakeUps(cases, standingShapeSeeds, smoothLaunches, LaunchTakeUp.RaisedCosine, BenchGroup.GeneratedStandingSmooth, smoothFirst, 1);
        AddTakeUps(cases, standingShapeSeeds, laggedLaunches, LaunchTakeUp.Lagged, BenchGroup.GeneratedStandingLagged, smoothFirst + standingShapeSeeds.Count, 2);
        if (rollingPulsesDriven)
        {
            int rollingFirst = smoothFirst + standingShapeSeeds.Count + ((standingShapeSeeds.Count + 1) / 2);
            AddRollingPulsesDriven(cases, seed, rollingFirst, pickupWheelTold);
        }

        return cases;
    }

    /// <summary>Adds every record that opens moving once more, numbered from
    /// <paramref name="firstIndex"/>: pulses only, the pickup on a wheel of the car's one driven
    /// pair, which slips by κ = k·(a + c_d·v² + c_r) (<see cref="DriveSlip"/>; no launch part, the
    /// record opens cruising) and is not spun up by the road. Drawn from a stream of their own, so
    /// the records above stay as they are: k = share/(C·g0) with a car tyre's slip stiffness C of
    /// 15–30 per unit slip (H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1; from memory) and a
    /// driven pair's share 1.4–2.3 (T. D. Gillespie, "Fundamentals of Vehicle Dynamics", ch. 2;
    /// from memory), both uniform; the drag ½·ρ·Cd·A/m of a car of 1,100–1,900 kg with Cd·A
    /// 0.5–0.8 m² in air of 1.2 kg/m³ and a rolling coefficient of 0.008–0.015 (common practice).</summary>
    private static void AddRollingPulsesDriven(List<PrescribedBenchCase> cases, int seed, int firstIndex, bool told)
    {
        var slipRandom = new Random(unchecked((seed * 43) + 19));
        PrescribedBenchCase[] rolling = cases.Where(c => c.Group == BenchGroup.GeneratedRolling).ToArray();
        for (int i = 0; i < rolling.Length; i++)
        {
            PrescribedBenchCase c = rolling[i];
            double stiffness = 15 + (15 * slipRandom.NextDouble());
            double share = 1.4 + (0.9 * slipRandom.NextDouble());
            double drag = 0.5 * 1.2 * (0.5 + (0.3 * slipRandom.NextDouble())) / (1100 + (800 * slipRandom.NextDouble()));
            double rollingCoefficient = 0.008 + (0.007 * slipRandom.NextDouble());
            var law = new DriveSlip(PerMps2: share / (stiffness * 9.80665), LaunchPerMps2: 0, DragPerSpeedSquared: drag, RollingMps2: rollingCoefficient * 9.80665);
            PrescribedRecordSpec spec = c.Spec with { Accel = null, Pickup = c.Spec.Pickup with { SpinUp = null, Slip = law } };
            string summary = Invariant($"{c.Summary[..c.Summary.IndexOf("; accelerometer", StringComparison.Ordinal)]}; pulses only; driven wheel, k {law.PerMps2:0.0000} s²/m (C {stiffness:0.0}, share {share:0.00}){(told ? ", told driven" : "")}; {(c.AsLog ? "log" : "CSV")}");
            cases.Add(c with
            {
                Index = firstIndex + i,
                Spec = spec,
                Group = BenchGroup.GeneratedRollingPulsesDriven,
                Summary = summary,
                AccelCalibration = null,
                PickupWheelTold = told ? LaunchLogger.Decoding.Reconstruction.PickupWheel.Driven : null,
            });
        }
    }

    /// <summary>Adds every <paramref name="every"/>-th standing start (from the first) once more
    /// with another take-up, numbered from <paramref name="firstIndex"/>: the shape redrawn from its
    /// own seed (the same peak, rise time, pull and shifts), the car, sensors and noise as they were.</summary>
    private static void AddTakeUps(List<PrescribedBenchCase> cases, List<(PrescribedBenchCase Case, int ShapeSeed)> standingShapeSeeds, bool wanted, LaunchTakeUp takeUp, BenchGroup group, int firstIndex, int every)
    {
        for (int i = 0; wanted && i < standingShapeSeeds.Count; i += every)
        {
            (PrescribedBenchCase standing, int shapeSeed) = standingShapeSeeds[i];
            Shape shape = PrescribedShapes.StandingStart(new Random(shapeSeed), takeUp: takeUp);
            string summary = shape.Name + standing.Summary[standing.Spec.Shape.Name.Length..];
            cases.Add(standing with { Index = firstIndex + (i / every), Spec = standing.Spec with { Shape = shape }, Group = group, Summary = summary });
        }
    }

    private static Shape CruiseStop(Random random)
    {
        double speed = Mph * (30 + (50 * random.NextDouble()));
        if (random.NextDouble() < 0.2)
        {
            return PrescribedShapes.CruiseThenStop(speed, double.PositiveInfinity, 3 + (5 * random.NextDouble()));
        }

        return PrescribedShapes.CruiseThenStop(speed, 0.05 + (1.95 * random.NextDouble()), 9.80665 * (0.5 + (0.5 * random.NextDouble())));
    }
}
