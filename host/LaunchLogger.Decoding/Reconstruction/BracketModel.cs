namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>Where in its bracket the last edge of a polled observation lies: "the count rose by
/// r somewhere in (lo, hi]", read against the pulse period the speed implies.</summary>
/// <remarks>
/// <para>Edges come every T = m / v seconds (m metres per pulse, v the speed), and the poll
/// instants are unrelated to them, so the phase of the edge train against the bracket is uniform.
/// Given that exactly r edges fell in (lo, hi], the last one, e, satisfies
/// <code>
/// e − (r − 1)·T &gt; lo        (the first of the r edges is inside the bracket)
/// e − r·T ≤ lo               (the one before it is not)
/// e + T &gt; hi               (the next one is not)
/// </code>
/// and is uniform on what is left: (max(lo, hi − T, lo + (r − 1)·T), min(hi, lo + r·T)]. The
/// measurement is the middle of that interval with the variance of a uniform distribution,
/// width²/12 — no systematic shift at any bracket width, one pulse per bracket or many. (With
/// many pulses per bracket the interval is one pulse period wide: the observation says the
/// distance at the poll instant lies within one pulse of N·m, as it should.)</para>
/// <para>T is known only as well as the speed (and the ring's tooth spacing): each bound moves
/// outward by the relative error <c>slack</c> of T, so an uncertain speed widens the interval
/// instead of shifting it. When the bounds cross (the speed estimate does not fit the bracket at
/// all) the whole bracket is used.</para>
/// </remarks>
public static class BracketModel
{
    /// <summary>The interval the last edge lies in, uniformly.</summary>
    /// <param name="loS">Bracket start (the poll before the rise), s.</param>
    /// <param name="hiS">Bracket end (the poll that saw the rise), s.</param>
    /// <param name="rise">Edges counted in the bracket (1 or more).</param>
    /// <param name="pulsePeriodS">Pulse period at the bracket, s (infinity or NaN when unknown).</param>
    /// <param name="slack">Relative uncertainty of the pulse period (0 = exact).</param>
    /// <param name="fromS">Start of the interval, s.</param>
    /// <param name="toS">End of the interval, s.</param>
    public static void LastEdge(double loS, double hiS, long rise, double pulsePeriodS, double slack, out double fromS, out double toS)
    {
        fromS = loS;
        toS = hiS;
        if (!(pulsePeriodS > 0) || double.IsInfinity(pulsePeriodS) || rise < 1 || !(hiS > loS))
        {
            return;
        }

        double longest = pulsePeriodS * (1 + slack);
        double shortest = pulsePeriodS * Math.Max(1 - slack, 0);
        double from = Math.Max(loS, Math.Max(hiS - longest, loS + ((rise - 1) * shortest)));
        double to = Math.Min(hiS, loS + (rise * longest));
        if (to > from)
        {
            fromS = from;
            toS = to;
        }
    }
}
