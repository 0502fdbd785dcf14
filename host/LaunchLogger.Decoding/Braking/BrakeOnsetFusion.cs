using MathNet.Numerics;

namespace LaunchLogger.Decoding.Braking;

/// <summary>The pedal's first movement from a brake switch whose delay was not measured and
/// from the deceleration, together.</summary>
/// <remarks>
/// <para>What each says about the pedal's first movement p (the onset SAE J299 times a stop from):</para>
/// <para>The switch: its reading came a loop lag ℓ and a switch delay δ after p. ℓ is known to
/// its σ (<see cref="BrakeSwitchTiming.LagOfGap"/>, <see cref="BrakeSwitchTiming.LagOfLoop"/>,
/// taken as Gaussian); δ only to lie in [<see cref="BrakeSwitchTiming.DelayLowS"/>,
/// <see cref="BrakeSwitchTiming.DelayHighS"/>], uniform. So p lies in a window as wide as the
/// delay's range, ending at the reading less the lag; its edges blurred by the lag's σ. Nothing
/// within that window is likelier than the rest.</para>
/// <para>The deceleration: the ramp fit (<see cref="BrakeOnsetFit"/>) measures when the
/// deceleration begins, to its σ. The pedal moves first: pads and master cylinder take up their
/// clearance before pressure builds, so the deceleration starts a dead time τ after p, τ ≥ 0. Our
/// generator (host/LaunchLogger.Prescribed, <c>RunMarks.BrakeOnsetS</c>: "when the deceleration
/// of the run's stop begins to build", the switch closing its delay after that) and our simulator
/// (<c>BrakeSystem</c>: the pedal's demand rises from the moment it is pressed) both take τ = 0.
/// A real car's is taken to be a few milliseconds on a firm application (an assumption); τ is
/// uniform in [0, <see cref="DeadTimeHighS"/>], so p lies in [m − τ_max, m] about the fitted onset
/// m, its edges blurred by the fit's σ.</para>
/// <para>The onset is the product of the two (each a window blurred by a Gaussian: a difference
/// of two normal distribution functions), integrated on a fine grid over the switch's window:
/// its mean and its standard deviation. With the reading r, the lag's mean ℓ̄ and σ b_s, the
/// delay in [δ_lo, δ_hi], the fitted onset m with σ b_d, and Φ the standard normal distribution:
/// <code>
/// U      = r − ℓ̄ − δ_lo,  W = δ_hi − δ_lo
/// L_s(p) = Φ((U − p)/b_s) − Φ((U − W − p)/b_s)          the switch
/// L_d(p) = Φ((m − p)/b_d) − Φ((m − τ_max − p)/b_d)      the deceleration
/// p̂      = ∫ p·L_s·L_d dp / ∫ L_s·L_d dp
/// σ²     = ∫ (p − p̂)²·L_s·L_d dp / ∫ L_s·L_d dp
/// </code> Where the two windows lie further apart than
/// <see cref="DisagreementSigmas"/> blurs, they do not describe one event (a fit that took a
/// lift-off for the rise, a dead time longer than allowed for); the switch alone is kept, as it
/// bounds the onset whatever the deceleration did.</para>
/// </remarks>
public static class BrakeOnsetFusion
{
    /// <summary>Longest dead time from the pedal's first movement to the deceleration's start, s.
    /// An assumption, neither measured nor from a source: a firm application takes up the pads'
    /// clearance in a few milliseconds, and neither our generator nor our simulator has any.
    /// 10 ms rather than 5: on the generator's switch stops (`bench accuracy --runs 1600 --seed 2
    /// --calibrated-tyre`) the quick rises' onset p95 goes 3.3 → 5.3 ms and the whole group's
    /// stopping distance p95 stays at 0.30 m, a small price for room against a real car's lag. A
    /// car whose brakes lag longer reads its onset late by the excess, at most to the switch's
    /// window, whose latest edge the product never passes.</summary>
    public const double DeadTimeHighS = 0.010;

    /// <summary>The switch's and the deceleration's windows are taken for one event while the
    /// gap between them is at most this many of their combined blurs (σ).</summary>
    public const double DisagreementSigmas = 3;

    /// <summary>The smallest blur a window's edge is given, s: a hard edge would make the product
    /// vanish between grid points.</summary>
    public const double SmallestBlurS = 1e-4;

    /// <summary>Grid points across the product's support.</summary>
    private const int GridPoints = 2001;

    /// <summary>The onset from a switch's onset (<see cref="BrakeSwitchTiming.Onset"/> with the
    /// delay's prior: its mean and σ include the uniform delay over <paramref name="delaySpanS"/>)
    /// and the deceleration's onset, or null when they disagree.</summary>
    /// <param name="switchOnset">The pedal's first movement from the switch alone.</param>
    /// <param name="delaySpanS">Width of the switch delay's uniform range included in
    /// <paramref name="switchOnset"/>, s (above 0).</param>
    /// <param name="decelerationOnset">When the deceleration began, with its σ.</param>
    public static Estimate? Combine(Estimate switchOnset, double delaySpanS, Estimate decelerationOnset)
    {
        if (!(delaySpanS > 0) || !(decelerationOnset.Sigma > 0) || !double.IsFinite(decelerationOnset.Value))
        {
            return null;
        }

        // The switch's window [switchLow, switchHigh], blurred by the loop lag's σ (what its σ
        // holds beyond the uniform delay's span / √12).
        double switchHigh = switchOnset.Value + (delaySpanS / 2);
        double switchLow = switchHigh - delaySpanS;
        double switchBlur = Math.Max(Math.Sqrt(Math.Max((switchOnset.Sigma * switchOnset.Sigma) - (delaySpanS * delaySpanS / 12), 0)), SmallestBlurS);

        // The deceleration's window: the pedal moved up to DeadTimeHighS before it.
        double decelHigh = decelerationOnset.Value;
        double decelLow = decelHigh - DeadTimeHighS;
        double decelBlur = Math.Max(decelerationOnset.Sigma, SmallestBlurS);

        double gap = Math.Max(Math.Max(switchLow - decelHigh, decelLow - switchHigh), 0);
        if (gap > DisagreementSigmas * Math.Sqrt((switchBlur * switchBlur) + (decelBlur * decelBlur)))
        {
            return null;
        }

        double from = switchLow - (6 * switchBlur);
        double to = switchHigh + (6 * switchBlur);
        double step = (to - from) / (GridPoints - 1);
        double weight = 0, first = 0, second = 0;
        for (int i = 0; i < GridPoints; i++)
        {
            double p = from + (i * step);
            double w = Window(p, switchLow, switchHigh, switchBlur) * Window(p, decelLow, decelHigh, decelBlur);
            weight += w;
            first += w * p;
            second += w * p * p;
        }

        if (!(weight > 1e-12))
        {
            return null;
        }

        double mean = first / weight;
        double variance = Math.Max((second / weight) - (mean * mean), 0);
        return new Estimate(mean, Math.Sqrt(variance + (step * step / 12)));
    }

    /// <summary>A uniform window [low, high] blurred by a Gaussian of σ <paramref name="blur"/>, at
    /// <paramref name="x"/> (up to a constant): Φ(zₕ) − Φ(zₗ), taken as the difference of the two
    /// tails on the side where both are small, so far from the window it does not cancel to 0.</summary>
    private static double Window(double x, double low, double high, double blur)
    {
        double zLow = (low - x) / blur;
        double zHigh = (high - x) / blur;
        return zLow >= 0 ? UpperTail(zLow) - UpperTail(zHigh) : UpperTail(-zHigh) - UpperTail(-zLow);
    }

    /// <summary>1 − Φ(z), the standard normal's upper tail, from Math.NET Numerics' erfc (accurate
    /// far into the tail, where 1 − Φ computed as a difference would round to 0).</summary>
    private static double UpperTail(double z) => z >= 0 ? 0.5 * SpecialFunctions.Erfc(z / Math.Sqrt(2)) : 1 - (0.5 * SpecialFunctions.Erfc(-z / Math.Sqrt(2)));
}
