using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Simulation.Vehicle;

/// <summary>Turns the driver's throttle into torque at the driven axles: an engine with a clutch
/// and stepped gears, or an electric motor with one reduction.</summary>
/// <remarks>
/// Engine: before launch the clutch is open and launch control holds <see cref="EngineSpec.LaunchRpm"/>.
/// At launch the clutch's capacity ramps up; while it slips it passes its capacity (sign of the slip
/// speed) and the engine speed follows I·dω/dt = T_engine − T_clutch, fuel cut above the launch
/// speed. The clutch locks when the engine speed meets the gearbox input speed; from then on the
/// engine's inertia, reflected through the ratio squared, rides on the driven axle. Upshift at the
/// shift speed: no drive for the shift time, then the next gear with the clutch locked (the engine
/// speed jumps to match: synchronisation losses are not modelled). With a traction-control slip
/// set, clutch capacity and engine torque are trimmed while the driven wheels slip past it.
/// Electric: T = min(T_max, P_max/ω) ramped in at launch, trimmed by traction control when the
/// driven wheels' slip passes its limit; the rotor's inertia always rides on the driven axle.
/// </remarks>
internal sealed class Powertrain
{
    private const double RadPerSecPerRpm = 2 * Math.PI / 60;

    private readonly DrivetrainSpec spec;
    private readonly DrivenAxle driven;
    private readonly double frontShare;
    private readonly double[] curveRpm;
    private readonly double[] curveTorque;
    private ClutchState clutch = ClutchState.Open;
    private double launchS = double.NaN;
    private double shiftEndsS;
    private double tractionFactor = 1;

    internal Powertrain(DrivetrainSpec spec, DrivenAxle driven, double frontTorqueFraction)
    {
        this.spec = spec;
        this.driven = driven;
        frontShare = driven switch
        {
            DrivenAxle.Front => 1,
            DrivenAxle.Rear => 0,
            _ => frontTorqueFraction,
        };
        curveRpm = spec.Engine.TorqueCurve.Select(p => p.Rpm).ToArray();
        curveTorque = spec.Engine.TorqueCurve.Select(p => p.TorqueNm).ToArray();
        EngineOmega = spec.Engine.LaunchRpm * RadPerSecPerRpm;
    }

    private enum ClutchState
    {
        Open,
        Slipping,
        Locked,
        Shifting,
    }

    /// <summary>Gear engaged, 0 = first.</summary>
    internal int Gear { get; private set; }

    /// <summary>Engine speed, rad/s (engine drivetrains only).</summary>
    internal double EngineOmega { get; private set; }

    /// <summary>True while the throttle is on.</summary>
    internal bool Throttle { get; private set; }

    /// <summary>Times (simulation s) at which upshifts began.</summary>
    internal List<double> ShiftStartsS { get; } = [];

    /// <summary>Share of the drive torque (and reflected inertia) on the front axle.</summary>
    internal double FrontShare => frontShare;

    /// <summary>Full throttle from <paramref name="timeS"/>: the clutch or the torque ramp starts.</summary>
    internal void Launch(double timeS)
    {
        launchS = timeS;
        Throttle = true;
        Gear = 0;
        tractionFactor = 1;
        clutch = spec.Kind == DrivetrainKind.Engine ? ClutchState.Slipping : ClutchState.Locked;
        EngineOmega = spec.Engine.LaunchRpm * RadPerSecPerRpm;
    }

    /// <summary>Throttle off and clutch open (coasting, braking, standing).</summary>
    internal void Release()
    {
        Throttle = false;
        if (spec.Kind == DrivetrainKind.Engine)
        {
            clutch = ClutchState.Open;
        }
    }

    /// <summary>The torque at the driven axles for the coming step and the inertia the
    /// drivetrain adds to them. Explicit: held constant over the step.</summary>
    internal void Prepare(double timeS, double dtS, double omegaFront, double omegaRear, double drivenSlip,
        out double torqueFront, out double torqueRear, out double inertiaFront, out double inertiaRear)
    {
        double axleTorque = 0;
        double reflectedInertia = 0;
        double axleOmega = (frontShare * omegaFront) + ((1 - frontShare) * omegaRear);
        if (spec.Kind == DrivetrainKind.Engine)
        {
            UpdateTraction(spec.Engine.TractionControlSlip, drivenSlip, dtS);
            EngineStep(timeS, dtS, axleOmega, ref axleTorque, ref reflectedInertia);
        }
        else
        {
            MotorStep(timeS, dtS, axleOmega, drivenSlip, ref axleTorque, ref reflectedInertia);
        }

        torqueFront = axleTorque * frontShare;
        torqueRear = axleTorque * (1 - frontShare);
        inertiaFront = reflectedInertia * frontShare;
        inertiaRear = reflectedInertia * (1 - frontShare);
    }

    /// <summary>After the axles moved: lock a slipping clutch once the engine meets the gearbox.</summary>
    internal void AfterStep(double omegaFront, double omegaRear)
    {
        if (spec.Kind != DrivetrainKind.Engine || clutch != ClutchState.Slipping)
        {
            return;
        }

        double input = Ratio() * ((frontShare * omegaFront) + ((1 - frontShare) * omegaRear));
        if (EngineOmega <= input)
        {
            clutch = ClutchState.Locked;
            EngineOmega = input;
        }
    }

    private double Ratio() => spec.Kind == DrivetrainKind.Engine
        ? spec.Engine.GearRatios[Gear] * spec.Engine.FinalDrive
        : spec.Motor.GearRatio;

    private void EngineStep(double timeS, double dtS, double axleOmega, ref double axleTorque, ref double reflectedInertia)
    {
        EngineSpec e = spec.Engine;
        if (!Throttle)
        {
            return;
        }

        double eta = spec.Efficiency;
        switch (clutch)
        {
            case ClutchState.Slipping:
            {
                double ramp = e.ClutchEngageS > 0 ? Math.Min(1, (timeS - launchS) / e.ClutchEngageS) : 1;
                double capacity = e.ClutchCapacityNm * Math.Max(0, ramp) * tractionFactor;
                double rpm = EngineOmega / RadPerSecPerRpm;
                double engineTorque = rpm < e.LaunchRpm ? FullThrottleTorque(rpm) : 0;
                double slipSpeed = EngineOmega - (Ratio() * axleOmega);
                double clutchTorque = slipSpeed >= 0 ? capacity : -capacity;
                EngineOmega = Math.Max(e.IdleRpm * RadPerSecPerRpm, EngineOmega + (dtS * (engineTorque - clutchTorque) / e.InertiaKgM2));
                axleTorque = clutchTorque * Ratio() * eta;
                break;
            }

            case ClutchState.Locked:
            {
                double ratio = Ratio();
                EngineOmega = ratio * axleOmega;
                double rpm = EngineOmega / RadPerSecPerRpm;
                if (rpm >= e.ShiftRpm && Gear < e.GearRatios.Count - 1)
                {
                    clutch = ClutchState.Shifting;
                    shiftEndsS = timeS + e.ShiftTimeS;
                    ShiftStartsS.Add(timeS);
                    return;
                }

                double engineTorque = rpm < e.RedlineRpm ? FullThrottleTorque(rpm) * tractionFactor : 0;
                axleTorque = engineTorque * ratio * eta;
                reflectedInertia = e.InertiaKgM2 * ratio * ratio;
                break;
            }

            case ClutchState.Shifting:
                if (timeS >= shiftEndsS)
                {
                    Gear++;
                    clutch = ClutchState.Locked;
                    EngineStep(timeS, dtS, axleOmega, ref axleTorque, ref reflectedInertia);
                }

                break;
        }
    }

    private void MotorStep(double timeS, double dtS, double axleOmega, double drivenSlip, ref double axleTorque, ref double reflectedInertia)
    {
        MotorSpec m = spec.Motor;
        double ratio = m.GearRatio;
        reflectedInertia = m.InertiaKgM2 * ratio * ratio;
        EngineOmega = ratio * axleOmega;
        if (!Throttle)
        {
            return;
        }

        UpdateTraction(m.TractionControlSlip, drivenSlip, dtS);
        double rpm = EngineOmega / RadPerSecPerRpm;
        double torque = rpm >= m.MaxRpm ? 0 : Math.Min(m.MaxTorqueNm, m.MaxPowerW / Math.Max(EngineOmega, 1e-9));
        double ramp = m.TorqueRampS > 0 ? Math.Clamp((timeS - launchS) / m.TorqueRampS, 0, 1) : 1;
        axleTorque = torque * ramp * tractionFactor * ratio * spec.Efficiency;
    }

    /// <summary>A simple traction control (or a driver feathering clutch and throttle): trims the
    /// drive fast while the driven wheels slip more than the limit, restores it slowly.</summary>
    private void UpdateTraction(double? limit, double drivenSlip, double dtS)
    {
        if (limit is { } slipLimit && Throttle)
        {
            tractionFactor += drivenSlip > slipLimit ? -20 * dtS : 4 * dtS;
            tractionFactor = Math.Clamp(tractionFactor, 0.05, 1);
        }
    }

    private double FullThrottleTorque(double rpm)
    {
        if (rpm <= curveRpm[0])
        {
            return curveTorque[0];
        }

        for (int i = 1; i < curveRpm.Length; i++)
        {
            if (rpm <= curveRpm[i])
            {
                double f = (rpm - curveRpm[i - 1]) / (curveRpm[i] - curveRpm[i - 1]);
                return curveTorque[i - 1] + (f * (curveTorque[i] - curveTorque[i - 1]));
            }
        }

        return curveTorque[^1];
    }
}
