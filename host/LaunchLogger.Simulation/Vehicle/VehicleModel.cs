using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Simulation.Vehicle;

/// <summary>The car's longitudinal motion: body speed and position, the spin of each axle's
/// wheels, normal loads with weight transfer, and body pitch on the suspension.</summary>
/// <remarks>
/// <para>State: distance x, speed v, front and rear wheel speeds ω_f, ω_r, pitch φ and its rate.
/// Forces: tyre force N·μ(κ) per axle with slip κ = (ω·r − v) / max(v, v_floor); aerodynamic drag
/// ½ρ·CdA·(v + w)·|v + w|; rolling resistance C_rr·N; the grade's weight component m·g·sin θ.
/// Loads: N_f = m·g·cos θ·(front share) − F_x·h/L, where F_x is the sum of the tyre forces (moments
/// about the rear contact patch, the textbook weight-transfer formula; Gillespie, Fundamentals of
/// Vehicle Dynamics, ch. 2). Pitch: I·φ̈ + c·φ̇ + k·φ = F_x·h, nose up positive, with I and c set by
/// the scenario's pitch frequency and damping ratio.</para>
/// <para>Integration: a fixed step of 0.1 ms with a linearly implicit (semi-implicit, Rosenbrock–
/// Euler) update for v, ω_f, ω_r. Tyre slip is stiff: near standstill the slip's time constant
/// J·v_floor / (r²·N·dμ/dκ) is a fraction of a millisecond, and an explicit method would need
/// steps far below that. Solving (I − Δt·J)·Δy = Δt·f(y) with the Jacobian of the tyre forces
/// is stable at any step and exact for linear systems; the small step keeps the explicitly held
/// inputs (engine torque, brake torque, loads) accurate. Positions use the trapezoid rule, which
/// is exact for the constant acceleration within a step. The pitch uses semi-implicit (symplectic)
/// Euler, stable because Δt·ω_pitch ≪ 1.</para>
/// <para>The car never rolls backwards: speed and wheel speeds are clamped at zero, which also
/// models a held brake and static rolling resistance at standstill.</para>
/// </remarks>
internal sealed class VehicleModel
{
    /// <summary>Standard gravity, m/s² (3rd CGPM, 1901).</summary>
    internal const double G0 = 9.80665;

    /// <summary>The slip ratio's denominator never falls below this speed, m/s.</summary>
    internal const double SlipSpeedFloorMps = 0.3;

    private readonly Scenario scenario;
    private readonly VehicleSpec body;
    private readonly TyreCurve tyre;
    private readonly double sinGrade;
    private readonly double cosGrade;
    private readonly double pitchInertia;
    private readonly double pitchDamping;
    private readonly double stepS;
    private double tyreForceSum;
    private double lastUnclampedAccel = double.NaN;
    private long stepCount;

    /// <param name="scenario">The car, road and drivetrain.</param>
    /// <param name="stepS">The fixed integration step, s.</param>
    internal VehicleModel(Scenario scenario, double stepS)
    {
        this.stepS = stepS;
        this.scenario = scenario;
        body = scenario.Vehicle;
        tyre = new TyreCurve(scenario.Tyre);
        double grade = Math.Atan(scenario.Environment.GradePercent / 100);
        GradeRad = grade;
        sinGrade = Math.Sin(grade);
        cosGrade = Math.Cos(grade);
        Powertrain = new Powertrain(scenario.Drivetrain, body.DrivenAxle, body.FrontTorqueFraction);
        Brakes = new BrakeSystem(scenario.Brakes, body.MassKg);
        double wn = 2 * Math.PI * body.PitchFrequencyHz;
        pitchInertia = body.PitchStiffnessNmPerRad / (wn * wn);
        pitchDamping = 2 * body.PitchDampingRatio * Math.Sqrt(body.PitchStiffnessNmPerRad * pitchInertia);

        // Held on the brakes: the tyres carry the grade's weight component, so the body already
        // leans as it would under that acceleration.
        tyreForceSum = body.MassKg * G0 * sinGrade;
        PitchRad = tyreForceSum * body.CgHeightM / body.PitchStiffnessNmPerRad;
        Mode = DriveMode.Hold;
    }

    /// <summary>What the driver is doing.</summary>
    internal enum DriveMode
    {
        /// <summary>Standing on the brakes: nothing moves.</summary>
        Hold,

        /// <summary>Full throttle.</summary>
        Drive,

        /// <summary>Throttle off, clutch open, no brakes.</summary>
        Coast,

        /// <summary>Braking to a stop.</summary>
        Brake,
    }

    internal DriveMode Mode { get; private set; }

    internal Powertrain Powertrain { get; }

    internal BrakeSystem Brakes { get; }

    /// <summary>Road grade, rad (positive uphill).</summary>
    internal double GradeRad { get; }

    /// <summary>Simulation time, s (the step count times the step, so it does not drift).</summary>
    internal double TimeS { get; private set; }

    /// <summary>The fixed integration step, s.</summary>
    internal double StepS => stepS;

    /// <summary>Distance from the standstill position, m.</summary>
    internal double DistanceM { get; private set; }

    /// <summary>Speed, m/s.</summary>
    internal double SpeedMps { get; private set; }

    /// <summary>Mean longitudinal acceleration over the last step, m/s².</summary>
    internal double AccelMps2 { get; private set; }

    /// <summary>Front and rear wheel speeds, rad/s.</summary>
    internal double OmegaFront { get; private set; }

    /// <summary>Rear wheel speed, rad/s.</summary>
    internal double OmegaRear { get; private set; }

    /// <summary>Revolutions turned by the front wheels since the start.</summary>
    internal double RevsFront { get; private set; }

    /// <summary>Revolutions turned by the rear wheels since the start.</summary>
    internal double RevsRear { get; private set; }

    /// <summary>Body pitch, rad, nose up positive.</summary>
    internal double PitchRad { get; private set; }

    /// <summary>Body pitch rate, rad/s.</summary>
    internal double PitchRateRadS { get; private set; }

    /// <summary>Normal load on the front axle in the last step, N.</summary>
    internal double LoadFrontN { get; private set; }

    /// <summary>Normal load on the rear axle in the last step, N.</summary>
    internal double LoadRearN { get; private set; }

    /// <summary>Slip ratio of the front tyres in the last step.</summary>
    internal double SlipFront { get; private set; }

    /// <summary>Slip ratio of the rear tyres in the last step.</summary>
    internal double SlipRear { get; private set; }

    /// <summary>Set by a step in which the car started to move: when, within the step, s.</summary>
    internal double? StartedMovingAtS { get; private set; }

    /// <summary>Set by a step in which the car came to rest while braking: when, s.</summary>
    internal double? StoppedAtS { get; private set; }

    /// <summary>Effective rolling radius at <paramref name="speedMps"/>, m.</summary>
    internal double RollingRadius(double speedMps)
    {
        double ratio = speedMps / 30;
        return scenario.Tyre.RollingRadiusM * (1 + (scenario.Tyre.RadiusGrowthAt30Mps * ratio * ratio));
    }

    /// <summary>Full throttle from now.</summary>
    internal void Launch()
    {
        Mode = DriveMode.Drive;
        Brakes.Release();
        Powertrain.Launch(TimeS);
        lastUnclampedAccel = double.NaN;
    }

    /// <summary>Throttle off.</summary>
    internal void Coast()
    {
        Mode = DriveMode.Coast;
        Powertrain.Release();
    }

    /// <summary>Press the brake pedal for <paramref name="demandG"/> from now.</summary>
    internal void Brake(double demandG)
    {
        Mode = DriveMode.Brake;
        Powertrain.Release();
        Brakes.Apply(TimeS, demandG);
    }

    /// <summary>Advances one step.</summary>
    internal void Step()
    {
        double dtS = stepS;
        StartedMovingAtS = null;
        StoppedAtS = null;
        if (Mode == DriveMode.Hold)
        {
            tyreForceSum = body.MassKg * G0 * sinGrade;
            AccelMps2 = 0;
            StepPitch(dtS);
            Tick();
            return;
        }

        double m = body.MassKg;
        double v = SpeedMps;
        double r = RollingRadius(v);
        double slipSpeed = Math.Max(v, SlipSpeedFloorMps);
        double weight = m * G0 * cosGrade;
        double transfer = tyreForceSum * body.CgHeightM / body.WheelbaseM;
        double loadFront = Math.Clamp((weight * body.FrontWeightFraction) - transfer, 0.02 * weight, 0.98 * weight);
        double loadRear = weight - loadFront;
        LoadFrontN = loadFront;
        LoadRearN = loadRear;

        double slipFront = ((OmegaFront * r) - v) / slipSpeed;
        double slipRear = ((OmegaRear * r) - v) / slipSpeed;
        double drivenSlip = body.DrivenAxle switch
        {
            DrivenAxle.Front => slipFront,
            DrivenAxle.Rear => slipRear,
            _ => Math.Max(slipFront, slipRear),
        };

        Powertrain.Prepare(TimeS, dtS, OmegaFront, OmegaRear, drivenSlip, out double driveFront, out double driveRear, out double extraFront, out double extraRear);
        Brakes.Torques(TimeS, dtS, v, slipFront, slipRear, r, out double brakeFront, out double brakeRear);
        double inertiaFront = body.AxleInertiaKgM2 + extraFront;
        double inertiaRear = body.AxleInertiaKgM2 + extraRear;

        double forceFront = loadFront * tyre.Friction(slipFront);
        double forceRear = loadRear * tyre.Friction(slipRear);
        double dForceFront = loadFront * tyre.Slope(slipFront) / slipSpeed; // ∂F/∂(ω·r − v)
        double dForceRear = loadRear * tyre.Slope(slipRear) / slipSpeed;
        double air = v + scenario.Environment.HeadwindMps;
        double rho = scenario.Environment.AirDensityKgM3;
        double drag = 0.5 * rho * body.DragAreaM2 * air * Math.Abs(air);
        double dDrag = rho * body.DragAreaM2 * Math.Abs(air);
        double resist = drag + (body.RollingResistanceCoefficient * weight) + (m * G0 * sinGrade);

        // f(y) and the Jacobian entries (loads, torques and the slip denominator held).
        double fv = (forceFront + forceRear - resist) / m;
        double ff = (driveFront - brakeFront - (r * forceFront)) / inertiaFront;
        double fr = (driveRear - brakeRear - (r * forceRear)) / inertiaRear;
        double avv = (-dForceFront - dForceRear - dDrag) / m;
        double avf = dForceFront * r / m;
        double avr = dForceRear * r / m;
        double afv = r * dForceFront / inertiaFront;
        double aff = -r * r * dForceFront / inertiaFront;
        double arv = r * dForceRear / inertiaRear;
        double arr = -r * r * dForceRear / inertiaRear;

        // (I − Δt·A)·Δ = Δt·f, solved by eliminating the two wheel rows (an arrow matrix).
        double pf = dtS * ff / (1 - (dtS * aff));
        double qf = dtS * afv / (1 - (dtS * aff));
        double pr = dtS * fr / (1 - (dtS * arr));
        double qr = dtS * arv / (1 - (dtS * arr));
        double dv = ((dtS * fv) + (dtS * avf * pf) + (dtS * avr * pr)) / (1 - (dtS * avv) - (dtS * avf * qf) - (dtS * avr * qr));
        double dOmegaFront = pf + (qf * dv);
        double dOmegaRear = pr + (qr * dv);

        double vNew = v + dv;
        double omegaFrontNew = Math.Max(0, OmegaFront + dOmegaFront);
        double omegaRearNew = Math.Max(0, OmegaRear + dOmegaRear);
        double unclampedAccel = dv / dtS;
        double moved = dtS;
        if (vNew <= 0)
        {
            if (v > 0 && Mode == DriveMode.Brake)
            {
                // Came to rest inside the step: the speed fell linearly to zero.
                moved = dtS * v / (v - vNew);
                StoppedAtS = TimeS + moved;
                Mode = DriveMode.Hold;
                omegaFrontNew = 0;
                omegaRearNew = 0;
            }

            vNew = 0;
        }
        else if (v <= 0)
        {
            // Started to move inside the step. The net force crossed zero between the previous
            // step's mean (held negative by the clamp) and this one's: interpolate.
            double t = TimeS;
            if (!double.IsNaN(lastUnclampedAccel) && lastUnclampedAccel < 0)
            {
                double f = -lastUnclampedAccel / (unclampedAccel - lastUnclampedAccel);
                t = TimeS - (0.5 * dtS) + (f * dtS);
            }

            StartedMovingAtS = Math.Clamp(t, TimeS, TimeS + dtS);
        }

        DistanceM += StoppedAtS is null ? 0.5 * dtS * (v + vNew) : 0.5 * moved * v;
        RevsFront += 0.5 * dtS * (OmegaFront + omegaFrontNew) / (2 * Math.PI);
        RevsRear += 0.5 * dtS * (OmegaRear + omegaRearNew) / (2 * Math.PI);
        AccelMps2 = StoppedAtS is null ? (vNew - v) / dtS : unclampedAccel;
        lastUnclampedAccel = unclampedAccel;
        SpeedMps = vNew;
        OmegaFront = omegaFrontNew;
        OmegaRear = omegaRearNew;
        SlipFront = slipFront;
        SlipRear = slipRear;

        // Tyre forces at the new state, to first order, for the next step's loads and the pitch.
        tyreForceSum = Mode == DriveMode.Hold
            ? m * G0 * sinGrade
            : forceFront + forceRear + (dForceFront * ((r * dOmegaFront) - dv)) + (dForceRear * ((r * dOmegaRear) - dv));
        Powertrain.AfterStep(OmegaFront, OmegaRear);
        StepPitch(dtS);
        Tick();
    }

    private void Tick()
    {
        stepCount++;
        TimeS = stepCount * stepS;
    }

    private void StepPitch(double dtS)
    {
        double moment = tyreForceSum * body.CgHeightM;
        double k = body.PitchStiffnessNmPerRad;
        PitchRateRadS += dtS * (moment - (pitchDamping * PitchRateRadS) - (k * PitchRad)) / pitchInertia;
        PitchRad += dtS * PitchRateRadS;
    }
}
