using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>Windows read from the drive force per unit mass alone — the accelerometer input on
/// the grid plus typical air drag and rolling resistance: where the car is driven, where it is
/// braked firmly, and the accelerometer's error stepping as a brake window starts. Needs no
/// pulses; <see cref="WheelWindowFinder"/> sets the pulses against these.</summary>
internal sealed class DriveForceWindows
{
    /// <summary>Braking force per unit mass under which a brake rise counts as not yet begun, m/s².</summary>
    private const double RiseFootMps2 = 0.3;

    /// <summary>Below this rate of rise of the braking force the rise counts as not yet begun,
    /// m/s³ (half the slowest rise the bench draws, 0.5 g over 2 s; the ±0.05 s mean of a 100 Hz
    /// input moves by a few hundredths of a m/s² from noise alone).</summary>
    private const double RiseFootJerkMps3 = 1.0;

    /// <summary>The step of the walk back to a rise's foot, s.</summary>
    private const double RiseStepS = 0.1;

    /// <summary>How far back a firm window may be opened to its rise's foot, s.</summary>
    private const double LongestRiseS = 3;

    private readonly StepGrid steps;
    private readonly ReconstructionOptions options;

    /// <summary>Windows over <paramref name="steps"/>, with the drag, rolling resistance and the
    /// accelerometer's error allowances of <paramref name="options"/>.</summary>
    public DriveForceWindows(StepGrid steps, ReconstructionOptions options)
    {
        this.steps = steps;
        this.options = options;
    }

    /// <summary>Stretches where the drive force per unit mass (measured acceleration plus typical
    /// drag and rolling resistance, averaged over 0.1 s) exceeds 0.5 m/s², widened by 0.1 s.</summary>
    public List<TimeWindow> DriveWindows(double startS, double? stopS)
    {
        double[] grid = steps.TimeS;
        var windows = new List<TimeWindow>();
        double stop = stopS ?? double.PositiveInfinity;
        int k0 = FusionSmoother.FirstIndexAfter(grid, startS);
        double open = double.NaN;
        for (int k = k0; k + 1 < grid.Length; k++)
        {
            // Mean input over the steps within ±0.05 s.
            double sum = 0;
            double span = 0;
            for (int j = k; j + 1 < grid.Length && grid[j] < grid[k] + 0.05; j++)
            {
                sum += steps.StepSpeedMps[j];
                span += grid[j + 1] - grid[j];
            }

            for (int j = k - 1; j >= k0 && grid[j] > grid[k] - 0.05; j--)
            {
                sum += steps.StepSpeedMps[j];
                span += grid[j + 1] - grid[j];
            }

            bool drive = grid[k] < stop && span > 0 && (sum / span) + (options.RollingResistance * Units.StandardGravity) > 0.5;
            if (drive && double.IsNaN(open))
            {
                open = k == k0 ? startS : grid[k] - 0.1;
            }
            else if (!drive && !double.IsNaN(open))
            {
                windows.Add(new TimeWindow(open, grid[k] + 0.1));
                open = double.NaN;
            }
        }

        if (!double.IsNaN(open))
        {
            windows.Add(new TimeWindow(open, Math.Min(stop, grid[^1])));
        }

        return windows;
    }

    /// <summary>Stretches of firm braking: the braking force per unit mass (the measured
    /// deceleration, averaged over ±0.05 s, less typical drag and rolling resistance) exceeds
    /// <paramref name="decelMps2"/>; widened by 0.1 s each side (the slip builds with the brake
    /// pressure), joined across gaps under 0.2 s, cut at the stop. The speed is taken as
    /// <paramref name="startSpeedMps"/> at <paramref name="startS"/> for the drag.</summary>
    public List<TimeWindow> BrakingWindows(double startS, double? stopS, double decelMps2, double startSpeedMps) =>
        BrakingWindows(startS, stopS, decelMps2, DriveForce(startS, stopS, startSpeedMps));

    /// <summary>Firm braking where the pulses are kept (<see cref="FusionSettings.FirmBrakeWindows"/>):
    /// the stretches of <see cref="BrakingWindows(double, double?, double, double)"/> over
    /// <see cref="ReconstructionOptions.BrakingDecelMps2"/>, each opened back to the foot of its
    /// brake rise (<see cref="FromRiseFoot"/>).</summary>
    public List<TimeWindow> FirmBraking(double startS, double? stopS, double startSpeedMps)
    {
        var input = new double[steps.TimeS.Length];
        double[] drive = DriveForce(startS, stopS, startSpeedMps, input);
        return FromRiseFoot(startS, drive, input, BrakingWindows(startS, stopS, options.BrakingDecelMps2, drive));
    }

    /// <summary>Variance of the accelerometer's error stepping as each brake window starts: its
    /// scale error times the mean deceleration there (<paramref name="withScale"/>; not where the
    /// scale error is a state of its own), and what pitch compensation leaves.</summary>
    public double[] BrakeStepVariances(List<TimeWindow> braking, bool withScale)
    {
        var result = new double[braking.Count];
        double[] grid = steps.TimeS;
        for (int i = 0; i < braking.Count; i++)
        {
            int k = FusionSmoother.FirstIndexAfter(grid, braking[i].StartS);
            double dv = 0;
            double dt = 0;
            for (; k + 1 < grid.Length && grid[k] < braking[i].EndS; k++)
            {
                dv += steps.StepSpeedMps[k];
                dt += grid[k + 1] - grid[k];
            }

            double decel = dt > 0 ? Math.Abs(dv / dt) : 0;
            double scale = withScale ? options.AccelScaleSigma * decel : 0;
            result[i] = (scale * scale) + (options.BrakeBiasStepSigmaMps2 * options.BrakeBiasStepSigmaMps2);
        }

        return result;
    }

    /// <summary>The same over a drive force already found (<see cref="DriveForce"/>).</summary>
    private List<TimeWindow> BrakingWindows(double startS, double? stopS, double decelMps2, double[] drive)
    {
        var windows = new List<TimeWindow>();
        double[] grid = steps.TimeS;
        double stop = stopS ?? double.PositiveInfinity;
        int k0 = FusionSmoother.FirstIndexAfter(grid, startS);
        int n = grid.Length;
        double open = double.NaN;
        double last = double.NaN;
        for (int k = k0; k + 1 < n && grid[k] < stop; k++)
        {
            if (drive[k] < -decelMps2)
            {
                if (double.IsNaN(open))
                {
                    open = Math.Max(grid[k] - 0.1, startS);
                }
                else if (grid[k] - last > 0.2)
                {
                    windows.Add(new TimeWindow(open, Math.Min(last + 0.1, stop)));
                    open = Math.Max(grid[k] - 0.1, startS);
                }

                last = grid[k];
            }
        }

        if (!double.IsNaN(open))
        {
            windows.Add(new TimeWindow(open, Math.Min(last + 0.1, stop)));
        }

        return windows;
    }

    /// <summary>The drive force per unit mass at each grid point (the input averaged over ±0.05 s
    /// plus typical drag and rolling resistance; negative under braking), from
    /// <paramref name="startS"/> to <paramref name="stopS"/> (0 elsewhere), the speed taken as
    /// <paramref name="startSpeedMps"/> at the start for the drag; the averaged input alone in
    /// <paramref name="meanInput"/> when given.</summary>
    private double[] DriveForce(double startS, double? stopS, double startSpeedMps, double[]? meanInput = null)
    {
        double[] grid = steps.TimeS;
        double[] dv = steps.StepSpeedMps;
        double stop = stopS ?? double.PositiveInfinity;
        int k0 = FusionSmoother.FirstIndexAfter(grid, startS);
        int n = grid.Length;
        var drive = new double[n];
        double sum = 0;
        double span = 0;
        int lo = k0;
        int hi = k0;
        double speed = startSpeedMps;
        for (int k = k0; k + 1 < n && grid[k] < stop; k++)
        {
            // Running mean of the input over the steps within ±0.05 s.
            while (hi + 1 < n && grid[hi] < grid[k] + 0.05)
            {
                sum += dv[hi];
                span += grid[hi + 1] - grid[hi];
                hi++;
            }

            while (lo < k && grid[lo] <= grid[k] - 0.05)
            {
                sum -= dv[lo];
                span -= grid[lo + 1] - grid[lo];
                lo++;
            }

            speed = Math.Max(speed + dv[k], 0);
            drive[k] = span > 0 ? (sum / span) + (options.RollingResistance * Units.StandardGravity) + (options.DragPerMassPerSpeedSquared * speed * speed) : 0;
            if (meanInput != null)
            {
                meanInput[k] = span > 0 ? sum / span : 0;
            }
        }

        return drive;
    }

    /// <summary>Each window opened back to the foot of its brake rise: the last point before it
    /// where the braking force (<paramref name="drive"/>, <see cref="DriveForce"/>; the averaged
    /// input alone in <paramref name="input"/>) was under <see cref="RiseFootMps2"/>,
    /// at most <see cref="LongestRiseS"/> earlier, not before <paramref name="startS"/> or the
    /// window before. A braked tyre slips from the first touch of the pedal, by the deceleration
    /// over g0·C: on a slow rise (0.5–2 s) the 0.1 s widening of a firm window opened up to half
    /// a second after the slip began, and the pulse speed's shortfall there, up to 0.15 m/s at
    /// 60 mph, was taken up by the accelerometer's error before the slip state could have it.</summary>
    private List<TimeWindow> FromRiseFoot(double startS, double[] drive, double[] input, List<TimeWindow> windows)
    {
        if (windows.Count == 0)
        {
            return windows;
        }

        double[] grid = steps.TimeS;
        int k0 = FusionSmoother.FirstIndexAfter(grid, startS);
        var result = new List<TimeWindow>(windows.Count);
        double earliest = startS;
        foreach (TimeWindow w in windows)
        {
            int k = Math.Min(FusionSmoother.FirstIndexAfter(grid, w.StartS), grid.Length - 1);
            double from = Math.Max(earliest, w.StartS - LongestRiseS);
            while (k > k0 && grid[k - 1] > from && -drive[k - 1] >= RiseFootMps2)
            {
                k--;
            }

            // The force is net of typical drag, which a coasting car's own deceleration may not
            // show: back on while the force still rises, 0.1 s at a time, as long as the car was
            // slowing at all (not into the drive before a lift-off).
            int back = FusionSmoother.FirstIndexAfter(grid, grid[k] - RiseStepS);
            while (back > k0 && back < k && grid[back] > from && input[back] < 0 && drive[back] - drive[k] > RiseFootJerkMps3 * (grid[k] - grid[back]))
            {
                k = back;
                back = FusionSmoother.FirstIndexAfter(grid, grid[k] - RiseStepS);
            }

            // Half the force's averaging span before the foot, where the rise's first steps lie.
            double open = Math.Max(Math.Min(w.StartS, grid[k] - 0.05), earliest);
            result.Add(new TimeWindow(open, w.EndS));
            earliest = w.EndS;
        }

        return result;
    }
}
