using LaunchLogger.Simulation.Scenarios;
using MathNet.Numerics.Distributions;

namespace LaunchLogger.Simulation.Sensors;

/// <summary>A toothed ring on a wheel and its sensor: turns the wheel's revolutions into the true
/// times of every counted edge.</summary>
/// <remarks>Edge positions around the ring are the ideal ones (k / teeth, and k + duty for the
/// falling edge) plus a fixed error per edge drawn once from the seed, so the pattern repeats
/// exactly every revolution and the count per revolution is exact. Within a simulation step the
/// wheel's angular acceleration is constant (consistent with the trapezoid position update), so an
/// edge's time is the root of a quadratic, not a straight-line guess.</remarks>
internal sealed class PulsePickup
{
    private readonly double[] edgeFractions;
    private readonly double startOffsetRevs;
    private long revolution;
    private int nextIndex;

    internal PulsePickup(PulsePickupSpec spec, Random random)
    {
        Spec = spec;
        int teeth = spec.Teeth;
        int perTooth = spec.EdgesPerTooth;
        edgeFractions = new double[teeth * perTooth];
        double sigma = spec.ToothSpacingErrorFraction;
        for (int k = 0; k < teeth; k++)
        {
            for (int e = 0; e < perTooth; e++)
            {
                double ideal = k + (e == 0 ? 0 : spec.DutyCycle);
                double error = sigma > 0 ? Math.Clamp(Normal.Sample(random, 0, sigma), -0.2, 0.2) : 0;
                double position = (ideal + error) / teeth;
                edgeFractions[(k * perTooth) + e] = position - Math.Floor(position);
            }
        }

        Array.Sort(edgeFractions);

        // Where the wheel happens to stand when the simulation starts.
        startOffsetRevs = random.NextDouble();
        revolution = 0;
        nextIndex = 0;
        while (edgeFractions[nextIndex] <= startOffsetRevs)
        {
            nextIndex++;
            if (nextIndex == edgeFractions.Length)
            {
                nextIndex = 0;
                revolution = 1;
                break;
            }
        }

        EdgePositionsFromFirstRev = new double[edgeFractions.Length];
        for (int j = 0; j < edgeFractions.Length; j++)
        {
            EdgePositionsFromFirstRev[j] = edgeFractions[(nextIndex + j) % edgeFractions.Length];
        }
    }

    /// <summary>Each edge's position around the ring, revolutions in [0, 1), in the order the
    /// edges pass the sensor, starting with the first edge counted.</summary>
    internal double[] EdgePositionsFromFirstRev { get; }

    internal PulsePickupSpec Spec { get; }

    /// <summary>Edges counted per wheel revolution.</summary>
    internal int PulsesPerRevolution => edgeFractions.Length;

    /// <summary>True times (simulation s) of every edge so far, in order.</summary>
    internal List<double> EdgeTimesS { get; } = [];

    /// <summary>Records the edges passed while the wheel turned from <paramref name="revs0"/> at
    /// <paramref name="t0"/> (speed <paramref name="omega0"/> rad/s) to <paramref name="revs1"/> at
    /// <paramref name="t1"/> (speed <paramref name="omega1"/>).</summary>
    internal void Advance(double t0, double t1, double revs0, double revs1, double omega0, double omega1)
    {
        double p0 = startOffsetRevs + revs0;
        double p1 = startOffsetRevs + revs1;
        double dt = t1 - t0;
        double w0 = omega0 / (2 * Math.PI);
        double alpha = (omega1 - omega0) / (2 * Math.PI) / dt;
        while (true)
        {
            double edge = revolution + edgeFractions[nextIndex];
            if (edge > p1)
            {
                return;
            }

            EdgeTimesS.Add(t0 + TimeToCover(edge - p0, w0, alpha, dt));
            nextIndex++;
            if (nextIndex == edgeFractions.Length)
            {
                nextIndex = 0;
                revolution++;
            }
        }
    }

    /// <summary>Solves d = w0·τ + α·τ²/2 for τ in [0, dt].</summary>
    private static double TimeToCover(double d, double w0, double alpha, double dt)
    {
        double tau;
        if (Math.Abs(alpha * dt) < 1e-9 * Math.Max(Math.Abs(w0), 1e-12))
        {
            tau = w0 > 0 ? d / w0 : dt;
        }
        else
        {
            double disc = Math.Max(0, (w0 * w0) + (2 * alpha * d));
            tau = 2 * d / (w0 + Math.Sqrt(disc)); // the stable form of (−w0 + √disc)/α
            if (double.IsNaN(tau) || double.IsInfinity(tau))
            {
                tau = dt;
            }
        }

        return Math.Clamp(tau, 0, dt);
    }
}
