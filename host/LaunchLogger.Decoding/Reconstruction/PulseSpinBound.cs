namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>Spin at the launch from the pulses alone (no accelerometer to hold them against): the
/// wheel's speed running up faster, or falling back faster, than a car whose tyre holds at or
/// below its grip peak can make it.</summary>
/// <remarks>The wheel's speed is w = (1 + s)·v, v the car's speed and s the tyre's slip ratio
/// (SAE J670's longitudinal slip, (ω·r − v)/v; from memory). While the tyre holds at or below the
/// peak of its force–slip curve, s stays between <see cref="LeastSlip"/> (a wheel rolled by the
/// road or held back by engine braking) and <see cref="ReconstructionOptions.LaunchSpinSlip"/> (the
/// most a tyre slips at its peak, 0.1–0.2 on dry roads: J. Y. Wong, "Theory of Ground Vehicles",
/// ch. 1; H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1; from memory). Without brakes the car
/// itself gains speed no faster than its tyres' grip gives, μ·g with μ at most
/// <see cref="ReconstructionOptions.LargestGripMu"/>, and loses it no faster than drag, rolling
/// resistance and engine braking take it, <see cref="LargestDriveDecelMps2"/>. So between a
/// window a of the pulses' speed and a later window b, Δt from a's start to b's end, a clean
/// launch keeps
/// <code>w_b ≤ (1 + s_peak)·(w_a/(1 + s_least) + μ·g·Δt)</code>
/// <code>w_b ≥ (1 + s_least)·(w_a/(1 + s_peak) − d·Δt)</code>
/// (the car's speed over each window bounded through the slip's range, then carried across Δt).
/// A pair that breaks either by more than <see cref="WheelspinDetector.SpinSigmas"/> times the σ
/// of the two windows' speeds (their edges' times and teeth, as <see cref="WheelspinDetector.Find"/>
/// takes them) ran up past the peak, or fell back from past it: spin. Nothing here is fitted to a
/// simulated tyre; every clean launch within those bounds passes whatever its profile.
/// What the data cannot tell: a slip that stays within the peak's range — a tyre swinging about a
/// peak of 0.1 by a few hundredths, or held at 0.15 where its peak lay at 0.1 — breaks no bound,
/// since a clean tyre whose peak lies at 0.2 could do the same; near standstill (v·s_peak under
/// the windows' σ) no slip is resolved at all. Looked for over the launch only, from first motion
/// for <see cref="WheelspinDetector.LaunchLongestS"/> (the brakes of the run's stop must not read
/// as a fall-back), pairs at most <see cref="LongestPairS"/> apart.</remarks>
internal static class PulseSpinBound
{
    /// <summary>The pulses' speed is taken over windows of about this long, s.</summary>
    public const double WindowS = 0.04;

    /// <summary>The longest a pair of windows reaches, s (from the first's start to the second's
    /// end): a spin's run-up or fall-back takes a few hundredths to a tenth of a second, and the
    /// allowance for the car's own speed grows with the span.</summary>
    public const double LongestPairS = 0.25;

    /// <summary>The least slip ratio of a launch's wheel while no brake is on: an undriven wheel
    /// spun up by the road, or a driven one held back by engine braking, turns slower than the
    /// car by a few hundredths at most (from memory).</summary>
    public const double LeastSlip = -0.05;

    /// <summary>The most a car without brakes decelerates, m/s²: drag and rolling resistance at
    /// launch speeds are under 0.05 g and engine braking in first gear adds up to about 0.25 g
    /// (from memory); 0.3 g.</summary>
    public const double LargestDriveDecelMps2 = 0.3 * Metrics.Units.StandardGravity;

    /// <summary>One window's speed from the pulses.</summary>
    private readonly record struct Window(double StartS, double EndS, double SpeedMps, double SigmaMps);

    /// <summary>The stretches of the launch where the pulses broke a bound, merged; empty when
    /// none did.</summary>
    /// <param name="pulses">The pulses.</param>
    /// <param name="mpp">Distance per pulse, m.</param>
    /// <param name="toothSigmaM">σ of one tooth's place, m.</param>
    /// <param name="startS">First motion, s.</param>
    /// <param name="endS">The end of the data or the stop, s.</param>
    /// <param name="options">The peak's slip and the grip's μ.</param>
    /// <param name="largestExcessMps">The largest break of a bound found, m/s (0 when none).</param>
    public static List<TimeWindow> Find(PulseChannel pulses, double mpp, double toothSigmaM, double startS, double endS, ReconstructionOptions options, out double largestExcessMps)
    {
        largestExcessMps = 0;
        List<Window> windows = Windows(pulses, mpp, toothSigmaM, startS, Math.Min(endS, startS + WheelspinDetector.LaunchLongestS));
        double peak = 1 + options.LaunchSpinSlip;
        double least = 1 + LeastSlip;
        double gripMps2 = options.LargestGripMu * Metrics.Units.StandardGravity;
        var found = new List<TimeWindow>();
        for (int a = 0; a < windows.Count; a++)
        {
            Window wa = windows[a];
            for (int b = a + 1; b < windows.Count && windows[b].EndS - wa.StartS <= LongestPairS; b++)
            {
                Window wb = windows[b];
                double spanS = wb.EndS - wa.StartS;
                double runUp = wb.SpeedMps - (peak * ((wa.SpeedMps / least) + (gripMps2 * spanS)));
                double fallBack = (least * ((wa.SpeedMps / peak) - (LargestDriveDecelMps2 * spanS))) - wb.SpeedMps;
                // Back-to-back windows share an edge, whose time moves the two speeds apart: their
                // σ then add, not in quadrature.
                double sigma = b == a + 1 ? (peak / least * wa.SigmaMps) + wb.SigmaMps : Math.Sqrt(Square(peak / least * wa.SigmaMps) + Square(wb.SigmaMps));
                double excess = Math.Max(runUp, fallBack);
                if (excess > WheelspinDetector.SpinSigmas * sigma)
                {
                    largestExcessMps = Math.Max(largestExcessMps, excess);
                    found.Add(new TimeWindow(wa.StartS, wb.EndS));
                }
            }
        }

        return WheelspinDetector.Union(found);
    }

    /// <summary>The pulses' speed over back-to-back windows of about <see cref="WindowS"/> between
    /// edges (their best times, <see cref="PulseChannel.EdgeS"/>) after <paramref name="fromS"/>
    /// up to <paramref name="untilS"/>, each with its σ from its two edges' times and teeth.</summary>
    private static List<Window> Windows(PulseChannel pulses, double mpp, double toothSigmaM, double fromS, double untilS)
    {
        var windows = new List<Window>();
        var edges = WheelspinDetector.EdgesIn(pulses, fromS, untilS).ToList();
        int i = 0;
        while (i < edges.Count)
        {
            int j = i + 1;
            while (j < edges.Count && pulses.EdgeS(edges[j]) < pulses.EdgeS(edges[i]) + WindowS)
            {
                j++;
            }

            if (j >= edges.Count)
            {
                break;
            }

            int p = edges[i], q = edges[j];
            double ti = pulses.EdgeS(p), tj = pulses.EdgeS(q);
            double span = tj - ti;
            double speed = (pulses.Counts[q] - pulses.Counts[p]) * mpp / span;
            double timing = speed * Math.Sqrt(Square(pulses.EdgeSigmaS(p)) + Square(pulses.EdgeSigmaS(q))) / span;
            double teeth = Math.Sqrt(2) * toothSigmaM / span;
            windows.Add(new Window(ti, tj, speed, Math.Sqrt((timing * timing) + (teeth * teeth))));
            i = j;
        }

        return windows;
    }

    private static double Square(double x) => x * x;
}
