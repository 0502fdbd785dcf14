namespace LaunchLogger.Decoding.Reconstruction;

/// <content>The time grid and the accelerometer input integrated over its steps.</content>
internal sealed partial class ReconstructionPass
{
    private StepGrid BuildGrid(double startS, double? stopS, double endOfData)
    {
        double from = startS - options.PreRollS;
        double step = options.GridStepS;
        double end = endOfData;
        if (pulses != null && accel is null)
        {
            end = stopS is { } s ? Math.Max(s, pulses.HiS[^1]) + Math.Clamp(configuration.StopHoldS, 0.5, 3.0) : pulses.HiS[^1];
        }

        end = Math.Max(end, startS + (2 * step));
        int capacity = (int)((end - from) / step) + 8;
        if (accel != null)
        {
            capacity += accel.Count / Math.Max(1, (int)Math.Round(step / accel.PeriodS));
        }

        var grid = new List<double>(capacity);
        double accelEnd = double.NegativeInfinity;
        if (accel != null)
        {
            // Every m-th sample, so that steps are about the grid step long.
            int every = Math.Max(1, (int)Math.Round(step / accel.PeriodS));
            int first = accel.IndexAtOrAfter(from);
            for (int i = first; i < accel.Count; i += every)
            {
                grid.Add(accel.TimeS[i]);
            }

            if (first < accel.Count && grid[^1] < accel.TimeS[^1])
            {
                grid.Add(accel.TimeS[^1]);
            }

            accelEnd = accel.TimeS[^1];
        }

        double t = grid.Count > 0 ? grid[^1] + step : from;
        for (; t <= end + (0.5 * step) || grid.Count < 2 || grid[^1] <= startS; t += step)
        {
            grid.Add(t);
        }

        double[] times = [.. grid];
        int n = times.Length;
        var dv = new double[n];
        var dd = new double[n];
        var noInput = new bool[n];
        double startDv = 0;
        double startDd = 0;
        if (accel != null)
        {
            int index = 0;
            double gap = 2.5 * accel.PeriodS;
            for (int k = 0; k + 1 < n; k++)
            {
                if (times[k] >= accelEnd)
                {
                    noInput[k] = true;
                    continue;
                }

                noInput[k] = Integrate(accel.TimeS, accelInput, times[k], times[k + 1], ref index, gap, out dv[k], out dd[k]) || times[k + 1] > accelEnd;
            }

            int k0 = FusionSmoother.FirstIndexAfter(times, startS);
            if (k0 < n)
            {
                int i0 = 0;
                Integrate(accel.TimeS, accelInput, startS, times[k0], ref i0, gap, out startDv, out startDd);
            }
        }

        return new StepGrid { TimeS = times, StepSpeedMps = dv, StepDistanceM = dd, NoInput = noInput, StartSpeedMps = startDv, StartDistanceM = startDd };
    }

    /// <summary>Speed and distance gained from the input over [a, b], the input taken as linear
    /// between samples (exact for a piecewise-linear input). Returns true when the samples have a
    /// gap longer than <paramref name="gap"/> there.</summary>
    private static bool Integrate(double[] t, double[] u, double a, double b, ref int index, double gap, out double dv, out double dd)
    {
        while (index + 1 < t.Length && t[index + 1] <= a)
        {
            index++;
        }

        dv = 0;
        dd = 0;
        bool hasGap = false;
        double s0 = a;
        double u0 = ValueAt(t, u, index, a);
        int i = index + 1;
        while (true)
        {
            bool last = i >= t.Length || t[i] >= b;
            double s1 = last ? b : t[i];
            double u1 = last ? ValueAt(t, u, Math.Min(i, t.Length - 1) - 1, b) : u[i];
            double h = s1 - s0;
            if (i < t.Length && i > 0 && t[i] - t[i - 1] > gap)
            {
                hasGap = true;
            }

            dd += (dv * h) + (((2 * u0) + u1) / 6 * h * h);
            dv += 0.5 * (u0 + u1) * h;
            if (last)
            {
                break;
            }

            s0 = s1;
            u0 = u1;
            i++;
        }

        return hasGap;
    }

    private static double ValueAt(double[] t, double[] u, int i, double at)
    {
        if (i < 0 || at <= t[0])
        {
            return u[0];
        }

        if (i + 1 >= t.Length)
        {
            return u[^1];
        }

        double f = (at - t[i]) / (t[i + 1] - t[i]);
        return u[i] + (Math.Clamp(f, 0, 1) * (u[i + 1] - u[i]));
    }
}
