namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>Finds stretches where the pulses run well ahead of the accelerometer (a driven wheel
/// spinning faster than the car moves) or well behind it (a wheel sliding under braking).</summary>
/// <remarks>Over windows of about 40 ms the mean speed from the pulses (between the edges'
/// best times, <see cref="PulseChannel.EdgeS"/>, so that a long bracket does not fake a burst of
/// speed) is compared with the mean speed from integrating the accelerometer. Without spin their difference is smooth: an offset,
/// a drift (accelerometer bias) and a share of the speed (scale errors). That baseline is fitted
/// robustly — iteratively reweighted least squares with Tukey's biweight (P. J. Huber, "Robust
/// Statistics", 1981; Holland &amp; Welsch 1977) — and windows standing well above it are spin,
/// well below it a slide. Stretches the caller already sets aside (firm braking) are left out of
/// the fit. A window's pulse speed is only as good as its two edge times (a coarse pickup's edge
/// polled across a loop stall is known to a bracket of tens of ms, <see cref="PulseChannel.EdgeSigmaS"/>)
/// and the two teeth's spacing: a window is flagged only when it stands above the baseline by four
/// times the spread of the rest and its own σ together — a gap the brackets explain is no spin.
/// Flagged windows (over <see cref="ReconstructionOptions.WheelspinFraction"/> of the speed) are
/// set aside for distance; they are spin for the verdict only where the lead passes what a tyre
/// slips at its grip peak (<see cref="BeyondPeak"/>, <see cref="ReconstructionOptions.LaunchSpinSlip"/>
/// of the speed) by four times the same σ: a clean hard launch held near its tyre's peak past
/// 1 m/s runs 4–20 % ahead, which is no reason to trust its pulses and no reason to doubt the run.</remarks>
internal static class WheelspinDetector
{
    private const double WindowS = 0.04;

    public static List<TimeWindow> Find(
        PulseChannel pulses, double mpp, double toothSigmaM, double[] accelT, double[] input, double startS, double endS, List<TimeWindow> skip,
        ReconstructionOptions options, out double largestAhead, out double largestBehind, out List<TimeWindow> spinning, out List<TimeWindow> pastPeak)
    {
        largestAhead = 0;
        largestBehind = 0;
        spinning = [];
        pastPeak = [];
        double minExcessMps = options.WheelspinMinExcessMps;
        double fraction = options.WheelspinFraction;
        var found = new List<TimeWindow>();
        var integral = new RunningDistance(accelT, input, startS);

        // Window statistics.
        var mids = new List<double>();
        var speeds = new List<double>();
        var accelSpeeds = new List<double>();
        var starts = new List<double>();
        var ends = new List<double>();
        var sigmas = new List<double>();
        int i = 0;
        while (i < pulses.Length)
        {
            double ti = pulses.EdgeS(i);
            int j = i + 1;
            while (j < pulses.Length && pulses.EdgeS(j) < ti + WindowS)
            {
                j++;
            }

            if (j >= pulses.Length)
            {
                break;
            }

            double tj = pulses.EdgeS(j);
            if (tj > endS)
            {
                break;
            }

            if (ti > startS && !Overlaps(skip, ti, tj))
            {
                double span = tj - ti;
                double vp = (pulses.Counts[j] - pulses.Counts[i]) * mpp / span;
                double before = integral.At(ti);
                double va = (integral.At(tj) - before) / span;
                if (vp >= 1.0)
                {
                    mids.Add(0.5 * (ti + tj));
                    speeds.Add(vp);
                    accelSpeeds.Add(va);
                    starts.Add(ti);
                    ends.Add(tj);

                    // σ of the window's pulse speed: the two edge times, and the two teeth.
                    double timing = vp * Math.Sqrt(Square(pulses.EdgeSigmaS(i)) + Square(pulses.EdgeSigmaS(j))) / span;
                    double teeth = Math.Sqrt(2) * toothSigmaM / span;
                    sigmas.Add(Math.Sqrt((timing * timing) + (teeth * teeth)));
                }
            }

            i = j;
        }

        int n = mids.Count;
        if (n < 8)
        {
            return found;
        }

        // Robust baseline r = c0 + c1·(t − start) + c2·va.
        var r = new double[n];
        var weights = new double[n];
        for (int k = 0; k < n; k++)
        {
            r[k] = speeds[k] - accelSpeeds[k];
            weights[k] = 1;
        }

        var residual = new double[n];
        double scale = 0;
        for (int iteration = 0; iteration < 8; iteration++)
        {
            double s00 = 0, s01 = 0, s02 = 0, s11 = 0, s12 = 0, s22 = 0, q0 = 0, q1 = 0, q2 = 0;
            for (int k = 0; k < n; k++)
            {
                double w = weights[k];
                double x1 = mids[k] - startS;
                double x2 = accelSpeeds[k];
                s00 += w;
                s01 += w * x1;
                s02 += w * x2;
                s11 += w * x1 * x1;
                s12 += w * x1 * x2;
                s22 += w * x2 * x2;
                q0 += w * r[k];
                q1 += w * x1 * r[k];
                q2 += w * x2 * r[k];
            }

            if (!AccelOnsetFit.SolveSymmetric3(s00 + 1e-9, s01, s02, s11 + 1e-9, s12, s22 + 1e-9, q0, q1, q2, out double c0, out double c1, out double c2))
            {
                return found;
            }

            var absolute = new double[n];
            for (int k = 0; k < n; k++)
            {
                residual[k] = r[k] - (c0 + (c1 * (mids[k] - startS)) + (c2 * accelSpeeds[k]));
                absolute[k] = Math.Abs(residual[k]);
            }

            Array.Sort(absolute);
            scale = Math.Max(1.4826 * absolute[n / 2], 1e-3);
            for (int k = 0; k < n; k++)
            {
                double u = residual[k] / (4.685 * scale);
                weights[k] = Math.Abs(u) < 1 ? (1 - (u * u)) * (1 - (u * u)) : 0;
            }
        }

        var spin = new bool[n];
        var slide = new bool[n];
        var beyondPeak = new bool[n];
        for (int k = 0; k < n; k++)
        {
            double limit = Math.Max(Math.Max(minExcessMps, fraction * Math.Max(accelSpeeds[k], 0)), 4 * Math.Sqrt((scale * scale) + (sigmas[k] * sigmas[k])));
            spin[k] = residual[k] > limit;
            slide[k] = residual[k] < -limit;
            beyondPeak[k] = spin[k] && BeyondPeak(residual[k], Math.Max(accelSpeeds[k], 0), (scale * scale) + (sigmas[k] * sigmas[k]), options);
            double share = residual[k] / Math.Max(accelSpeeds[k], 1);
            largestAhead = spin[k] ? Math.Max(largestAhead, share) : largestAhead;
            largestBehind = slide[k] ? Math.Max(largestBehind, -share) : largestBehind;
        }

        spinning = Group(spin, starts, ends, startS);
        pastPeak = Group(beyondPeak, starts, ends, startS);
        found.AddRange(spinning);
        found.AddRange(Group(slide, starts, ends, startS));
        found.Sort((a, b) => a.StartS.CompareTo(b.StartS));
        return found;
    }

    /// <summary>Finds spin at the launch, where <see cref="Find"/>'s windows do not reach (they
    /// start at 1 m/s, and near standstill a spinning wheel runs ahead by only centimetres a second):
    /// over every stretch between two edges from first motion until the car passes
    /// <see cref="LaunchSpeedMps"/> (or <see cref="LaunchLongestS"/>), the distance the pulses
    /// count against the accelerometer's own over the same time.</summary>
    /// <remarks>The pulses' distance over the accelerometer's is one plus the wheel's slip ratio
    /// averaged over the stretch (weighted by speed). A clean launch slips at most as much as its
    /// tyre does at the peak of its force–slip curve: a slip ratio of about 0.1–0.2 on dry roads
    /// (J. Y. Wong, "Theory of Ground Vehicles", ch. 1; H. B. Pacejka, "Tire and Vehicle
    /// Dynamics", ch. 1; from memory) — beyond the peak the force falls and the wheel runs away.
    /// So a stretch is spin only when its pulses exceed (1 + <see cref="ReconstructionOptions.LaunchSpinSlip"/>)
    /// times the accelerometer's distance by more than four times the σ of that difference: the
    /// two teeth's spacing, the told circumference (<see cref="ReconstructionOptions.CircumferenceSigmaFraction"/>
    /// of the count), the two edges' times at the car's speed there, the accelerometer's scale
    /// (<see cref="ReconstructionOptions.AccelScaleCalibration"/> or <see cref="ReconstructionOptions.AccelScaleSigma"/>)
    /// and a bias of <see cref="ReconstructionOptions.BiasPriorMps2"/> integrated twice from the
    /// start. Nothing here is fitted to a simulated tyre: a launch held at its tyre's peak never
    /// trips it. The accelerometer's distance is integrated from <see cref="LaunchLeadInS"/> before
    /// first motion, so a first motion placed a little late loses none of the launch.</remarks>
    public static List<TimeWindow> FindAtLaunch(
        PulseChannel pulses, double mpp, double toothSigmaM, double[] accelT, double[] input, double startS, double endS, ReconstructionOptions options, out double largestSlip)
    {
        largestSlip = 0;
        var found = new List<TimeWindow>();
        double fromS = startS - LaunchLeadInS;
        var integral = new RunningDistance(accelT, input, fromS);
        var times = new List<double>();
        var counts = new List<long>();
        var timeSigmas = new List<double>();
        var distances = new List<double>();
        var speeds = new List<double>();
        double lastS = Math.Min(endS, startS + LaunchLongestS);
        foreach (int i in EdgesIn(pulses, startS, lastS))
        {
            double t = pulses.EdgeS(i);
            double d = integral.At(t, out double v);
            times.Add(t);
            counts.Add(pulses.Counts[i]);
            timeSigmas.Add(pulses.EdgeSigmaS(i));
            distances.Add(d);
            speeds.Add(Math.Max(v, 0));
            if (v > LaunchSpeedMps)
            {
                break;
            }
        }

        double clean = 1 + options.LaunchSpinSlip;
        double scaleSigma = options.ForwardScaleSigma;
        double circumferenceSigma = options.CircumferenceSigmaFraction;
        double biasSigma = options.BiasPriorMps2;
        for (int a = 0; a < times.Count; a++)
        {
            double ta = times[a] - fromS;
            double edgeA = speeds[a] * timeSigmas[a];
            for (int b = a + 1; b < times.Count; b++)
            {
                double byPulses = (counts[b] - counts[a]) * mpp;
                double byAccel = distances[b] - distances[a];
                if (byPulses <= clean * byAccel || byAccel <= 0)
                {
                    continue;
                }

                double tb = times[b] - fromS;
                double edgeB = speeds[b] * timeSigmas[b];
                double bias = 0.5 * biasSigma * ((tb * tb) - (ta * ta));
                double variance = (2 * toothSigmaM * toothSigmaM) + Square(circumferenceSigma * byPulses) + (edgeA * edgeA) + (edgeB * edgeB)
                    + Square(clean * scaleSigma * byAccel) + Square(clean * bias);
                if (BeyondPeak(byPulses - byAccel, byAccel, variance, options))
                {
                    largestSlip = Math.Max(largestSlip, (byPulses / byAccel) - 1);
                    found.Add(new TimeWindow(times[a], times[b]));
                }
            }
        }

        return Union(found);
    }

    /// <summary>True when the pulses' lead over the car, <paramref name="lead"/> (a distance or a
    /// speed), passes <see cref="ReconstructionOptions.LaunchSpinSlip"/> times the car's own
    /// <paramref name="byCar"/> — the most a tyre slips at the peak of its force–slip curve — by
    /// more than <see cref="SpinSigmas"/> times the σ of that difference (√<paramref name="variance"/>).
    /// A wheel held at its tyre's grip peak never passes it; a wheel that ran away past the peak
    /// does once the data resolve it.</summary>
    internal static bool BeyondPeak(double lead, double byCar, double variance, ReconstructionOptions options) =>
        lead - (options.LaunchSpinSlip * byCar) > SpinSigmas * Math.Sqrt(variance);

    /// <summary>How many σ a lead must pass a tyre's peak slip by to be spin.</summary>
    public const double SpinSigmas = 4;

    /// <summary>Where a launch spin is looked for: until the car passes this speed, m/s — beyond
    /// it <see cref="Find"/>'s windows (from 1 m/s) see a spinning wheel's excess of speed.</summary>
    public const double LaunchSpeedMps = 3;

    /// <summary>Where a launch spin is looked for at the longest, s after first motion.</summary>
    public const double LaunchLongestS = 1.5;

    /// <summary>How far before first motion the launch's accelerometer distance is integrated
    /// from, s.</summary>
    public const double LaunchLeadInS = 0.05;

    /// <summary>The indices of the edges after <paramref name="afterS"/> up to <paramref name="untilS"/>, in order.</summary>
    internal static IEnumerable<int> EdgesIn(PulseChannel pulses, double afterS, double untilS)
    {
        for (int i = 0; i < pulses.Length; i++)
        {
            double t = pulses.EdgeS(i);
            if (t > untilS)
            {
                yield break;
            }

            if (t > afterS)
            {
                yield return i;
            }
        }
    }

    /// <summary>The union of <paramref name="windows"/>, sorted, overlapping ones merged.</summary>
    public static List<TimeWindow> Union(IEnumerable<TimeWindow> windows)
    {
        var result = new List<TimeWindow>();
        foreach (TimeWindow w in windows.OrderBy(w => w.StartS))
        {
            if (result.Count > 0 && w.StartS <= result[^1].EndS)
            {
                result[^1] = new TimeWindow(result[^1].StartS, Math.Max(result[^1].EndS, w.EndS));
            }
            else
            {
                result.Add(w);
            }
        }

        return result;
    }

    private static double Square(double x) => x * x;

    private static bool Overlaps(List<TimeWindow> windows, double from, double to)
    {
        foreach (TimeWindow w in windows)
        {
            if (from <= w.EndS && to >= w.StartS)
            {
                return true;
            }
        }

        return false;
    }

    /// <summary>Groups flagged windows (bridging single unflagged ones), widened by a window each
    /// side; a group reaching back to the first window reaches back to first motion.</summary>
    private static List<TimeWindow> Group(bool[] flagged, List<double> starts, List<double> ends, double startS)
    {
        var found = new List<TimeWindow>();
        int n = flagged.Length;
        int a = 0;
        while (a < n)
        {
            if (!flagged[a])
            {
                a++;
                continue;
            }

            int b = a;
            while (b + 1 < n && (flagged[b + 1] || (b + 2 < n && flagged[b + 2])))
            {
                b++;
            }

            double from = a == 0 ? startS : starts[a - 1];
            double to = b + 1 < n ? ends[b + 1] : ends[b];
            if (found.Count > 0 && from <= found[^1].EndS)
            {
                found[^1] = new TimeWindow(found[^1].StartS, to);
            }
            else
            {
                found.Add(new TimeWindow(from, to));
            }

            a = b + 1;
        }

        return found;
    }

    /// <summary>Distance from integrating the input twice from rest at the start, read at
    /// times that never go back (the input taken as linear between samples).</summary>
    internal sealed class RunningDistance(double[] t, double[] input, double startS)
    {
        private int next = FirstAfter(t, startS);
        private double time = startS;
        private double value = Interpolate(t, input, startS);
        private double speed;
        private double distance;

        public double At(double when) => At(when, out _);

        /// <summary>The distance at <paramref name="when"/>, and the speed there.</summary>
        public double At(double when, out double speedThere)
        {
            while (next < t.Length && t[next] <= when)
            {
                Advance(t[next], input[next]);
                next++;
            }

            if (when <= time)
            {
                speedThere = speed;
                return distance;
            }

            double u = next < t.Length ? Interpolate(t, input, when) : value;
            double h = when - time;
            double v = speed + (0.5 * (value + u) * h);
            speedThere = v;
            return distance + (0.5 * (speed + v) * h);
        }

        private void Advance(double to, double u)
        {
            double h = to - time;
            if (h <= 0)
            {
                return;
            }

            double v = speed + (0.5 * (value + u) * h);
            distance += 0.5 * (speed + v) * h;
            speed = v;
            time = to;
            value = u;
        }

        private static int FirstAfter(double[] t, double at)
        {
            int i = Array.BinarySearch(t, at);
            return i >= 0 ? i + 1 : ~i;
        }

        private static double Interpolate(double[] t, double[] y, double at)
        {
            int i = Array.BinarySearch(t, at);
            if (i >= 0)
            {
                return y[i];
            }

            i = ~i;
            if (i == 0)
            {
                return y[0];
            }

            if (i >= t.Length)
            {
                return y[^1];
            }

            double f = (at - t[i - 1]) / (t[i] - t[i - 1]);
            return y[i - 1] + (f * (y[i] - y[i - 1]));
        }
    }
}
