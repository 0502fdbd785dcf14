using LaunchLogger.Simulation.Scenarios;

namespace LaunchLogger.Simulation.Vehicle;

/// <summary>Pedal demand with a linear rise, split front/rear by the bias, and a per-axle ABS
/// that dumps, holds and rebuilds pressure from the wheel's slip (see <see cref="BrakeSpec"/>).</summary>
internal sealed class BrakeSystem
{
    private const double G0 = 9.80665; // standard gravity, m/s² (3rd CGPM, 1901)
    private readonly BrakeSpec spec;
    private readonly double massKg;
    private double startS = double.NaN;
    private double demandG;
    private double pressureFront = 1;
    private double pressureRear = 1;
    private bool dumpingFront;
    private bool dumpingRear;

    internal BrakeSystem(BrakeSpec spec, double massKg)
    {
        this.spec = spec;
        this.massKg = massKg;
    }

    /// <summary>True once the pedal is pressed.</summary>
    internal bool Applied => !double.IsNaN(startS);

    /// <summary>Times ABS dumped pressure on either axle.</summary>
    internal int AbsCycles { get; private set; }

    /// <summary>Presses the pedal at <paramref name="timeS"/> for <paramref name="demandG"/>.</summary>
    internal void Apply(double timeS, double demandG)
    {
        startS = timeS;
        this.demandG = demandG;
        pressureFront = 1;
        pressureRear = 1;
    }

    /// <summary>Releases the pedal.</summary>
    internal void Release() => startS = double.NaN;

    /// <summary>Brake torque magnitudes at each axle for the coming step, N·m.</summary>
    internal void Torques(double timeS, double dtS, double speedMps, double slipFront, double slipRear, double radiusM,
        out double front, out double rear)
    {
        if (!Applied)
        {
            front = 0;
            rear = 0;
            return;
        }

        double rise = spec.RiseTimeS > 0 ? Math.Clamp((timeS - startS) / spec.RiseTimeS, 0, 1) : 1;
        double total = demandG * rise * massKg * G0 * radiusM;
        if (spec.AbsEnabled && speedMps > spec.AbsMinSpeedMps)
        {
            pressureFront = Modulate(pressureFront, slipFront, dtS, ref dumpingFront);
            pressureRear = Modulate(pressureRear, slipRear, dtS, ref dumpingRear);
        }
        else
        {
            pressureFront = 1;
            pressureRear = 1;
        }

        front = total * spec.FrontBias * pressureFront;
        rear = total * (1 - spec.FrontBias) * pressureRear;
    }

    private double Modulate(double pressure, double slip, double dtS, ref bool dumping)
    {
        if (slip < -spec.AbsReleaseSlip)
        {
            if (!dumping)
            {
                AbsCycles++;
                dumping = true;
            }

            return Math.Max(0, pressure - (spec.AbsDumpRatePerS * dtS));
        }

        dumping = false;
        return slip > -spec.AbsReapplySlip ? Math.Min(1, pressure + (spec.AbsApplyRatePerS * dtS)) : pressure;
    }
}
