using LaunchLogger.Prescribed.Motion;
using MathNet.Numerics.RootFinding;

namespace LaunchLogger.Prescribed.Sensors;

/// <summary>A toothed wheel and pickup: one pulse each time a tooth passes, at the exact times the
/// wheel's turning puts them.</summary>
/// <remarks>
/// The wheel turns R(t) = ∫ v / C(v) dt revolutions; pulse k (k = 1, 2, …) comes when
/// R = (k − 1 + φ)/N, with N teeth and φ the fraction of a tooth pitch before the first tooth
/// reaches the pickup. With a rigid tyre R = x / C, and each pulse time is a distance crossing
/// of the trajectory. With growth, drive slip (v·(1 + κ) in place of v), the spin-up lag of an
/// undriven wheel (v·(1 − s)) or a braked wheel's slip (v·(1 − s_b)), R is integrated over chunks of at most
/// <see cref="ChunkS"/> by Gauss–Legendre quadrature, its error checked by comparing 12 and 24
/// points (subdividing until they agree to 1e-12 revolutions), and each pulse time is then a
/// root of R found by Brent's method.
/// </remarks>
/// <param name="Teeth">Pulses per revolution (8–100 in practice).</param>
/// <param name="Tyre">The tyre.</param>
/// <param name="PhaseFraction">φ in [0, 1): where the first tooth sits.</param>
/// <param name="Slip">Drive slip when the wheel is driven (its rate is then v·(1 + κ) / C(v),
/// integrated as with growth); null for an undriven wheel.</param>
/// <param name="SpinUp">An undriven wheel's lag while the car speeds up (its rate is then
/// v·(1 − s) / C(v)); null for a wheel without inertia, as the closed-form tests take it. Not
/// with <paramref name="Slip"/>: a driven wheel's axle spins it up.</param>
/// <param name="Brake">The wheel's slip while the car slows (its rate is then v·(1 − s_b) / C(v));
/// null for a wheel that rolls freely under braking, as the closed-form tests take it. Goes with
/// either of the above: every wheel is braked.</param>
/// <param name="Spin">A driven wheel's spin past its tyre's friction peak (its rate then gains
/// v·κ_spin / C(v), κ_spin counted from the car's first motion); null for none. Not with
/// <paramref name="SpinUp"/>: an undriven wheel cannot spin.</param>
/// <param name="Wobble">A driven wheel's slip swinging across its tyre's grip peak (its rate then
/// gains v·κ_w / C(v), κ_w counted from the car's first motion); null for none. Not with
/// <paramref name="SpinUp"/>.</param>
public sealed record WheelPickup(int Teeth, TyreModel Tyre, double PhaseFraction = 0.5, DriveSlip? Slip = null, SpinUpLag? SpinUp = null, BrakeSlip? Brake = null, WheelSpin? Spin = null, SlipWobble? Wobble = null)
{
    /// <summary>Longest span integrated in one piece, s.</summary>
    public const double ChunkS = 0.05;

    private const double RevolutionTolerance = 1e-12;

    private static readonly LegendreRule Coarse = new(12);
    private static readonly LegendreRule Fine = new(24);

    /// <summary>Least distance at which an edge is placed, m (a nanometre: far below any figure).</summary>
    private const double FirstEdgeDistanceM = 1e-9;

    /// <summary>Distance per pulse the decoder is told, m.</summary>
    public double StatedMetresPerPulse => Tyre.StatedCircumferenceM / Teeth;

    /// <summary>The exact pulse times over the whole profile.</summary>
    public double[] EdgeTimes(MotionProfile profile)
    {
        ArgumentNullException.ThrowIfNull(profile);
        if (Teeth < 1 || !(PhaseFraction >= 0 && PhaseFraction < 1))
        {
            throw new ArgumentOutOfRangeException(nameof(Teeth), "at least one tooth and a phase in [0, 1)");
        }

        if (Slip != null && SpinUp != null)
        {
            throw new ArgumentException("a driven wheel's slip and an undriven wheel's spin-up lag do not go together", nameof(profile));
        }

        if ((Spin != null || Wobble != null) && SpinUp != null)
        {
            throw new ArgumentException("an undriven wheel (one with a spin-up lag) cannot spin", nameof(profile));
        }

        return Tyre.Rigid && Slip is null && SpinUp is null && Brake is null && Spin is null && Wobble is null ? RigidEdges(profile) : GrowingEdges(profile);
    }

    private double[] RigidEdges(MotionProfile profile)
    {
        double pitch = Tyre.RollingAtRestM / Teeth;
        double total = profile.StateAt(profile.EndS).DistanceM;
        var edges = new List<double>();
        double after = 0;
        for (long k = 1; ; k++)
        {
            // A tooth sitting exactly at the pickup (φ = 0) fires as the wheel first turns, not
            // at the record's start: its crossing is taken just beyond the rest position.
            double d = Math.Max((k - 1 + PhaseFraction) * pitch, FirstEdgeDistanceM);
            if (d > total)
            {
                break;
            }

            double t = profile.TimeAtDistance(d, after) ?? profile.EndS;
            edges.Add(t);
            after = t;
        }

        return [.. edges];
    }

    private double[] GrowingEdges(MotionProfile profile)
    {
        var edges = new List<double>();
        double revs = 0;
        double next = PhaseFraction / Teeth;
        double motionS = profile.Segments.FirstOrDefault(s => !s.AtRest)?.StartS ?? 0;
        foreach (PlacedSegment s in profile.Segments)
        {
            if (s.AtRest)
            {
                continue;
            }

            int chunks = Math.Max(1, (int)Math.Ceiling(s.DurationS / ChunkS));
            for (int c = 0; c < chunks; c++)
            {
                double a = s.StartS + (s.DurationS * c / chunks);
                double b = c == chunks - 1 ? s.EndS : s.StartS + (s.DurationS * (c + 1) / chunks);
                double gained = Revolutions(s, a, b, motionS);
                double baseRevs = revs;
                while (next <= baseRevs + gained)
                {
                    double target = next - baseRevs;
                    double t = Brent.FindRoot(x => Revolutions(s, a, x, motionS) - target, a, b, MotionProfile.RootToleranceS, 200);
                    edges.Add(t);
                    next += 1.0 / Teeth;
                }

                revs = baseRevs + gained;
            }
        }

        return [.. edges];
    }

    /// <summary>Revolutions turned between <paramref name="a"/> and <paramref name="b"/> within
    /// segment <paramref name="s"/>, to within <see cref="RevolutionTolerance"/>; the car first
    /// moved at <paramref name="motionS"/>.</summary>
    private double Revolutions(PlacedSegment s, double a, double b, double motionS)
    {
        if (b <= a)
        {
            return 0;
        }

        // The distance is worked out only for a driven wheel's slip, which depends on it.
        double Rate(double t)
        {
            double tau = t - s.StartS;
            (double v, double accel) = s.SpeedAndAccelAt(tau);
            double slip = (Slip?.At(s.StateAt(tau).DistanceM, accel, v) ?? 0) - (SpinUp?.At(accel) ?? 0) - (Brake?.At(accel) ?? 0) + (Spin?.At(t - motionS) ?? 0) + (Wobble?.At(t - motionS) ?? 0);
            return v * (1 + slip) / Tyre.CircumferenceAt(v);
        }

        double coarse = Coarse.Integrate(Rate, a, b);
        double fine = Fine.Integrate(Rate, a, b);
        if (Math.Abs(fine - coarse) <= RevolutionTolerance || b - a < 1e-6)
        {
            return fine;
        }

        double m = 0.5 * (a + b);
        return Revolutions(s, a, m, motionS) + Revolutions(s, m, b, motionS);
    }
}
