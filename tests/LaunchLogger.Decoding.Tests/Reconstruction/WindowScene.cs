using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>A prescribed motion written straight into the windows stage's inputs: the car's
/// acceleration as a function of time, the wheel's speed as a function of time and the car's
/// speed, integrated finely (10 µs) into exact pulse edges; the step grid's input integrated from
/// the same acceleration by Simpson's rule; accelerometer samples at 1 kHz. No simulator, no
/// decoder stage before the windows.</summary>
internal sealed record WindowScene
{
    private const double FineStepS = 1e-5;

    /// <summary>The car's acceleration at a time, m/s² (0 for a car at rest).</summary>
    public required Func<double, double> CarAccelMps2 { get; init; }

    /// <summary>The pickup wheel's surface speed from the time and the car's speed, m/s; the
    /// car's speed when null (a wheel that rolls with the road).</summary>
    public Func<double, double, double>? WheelSpeedMps { get; init; }

    /// <summary>First motion, s (the car is at rest before it), or the record's opening when
    /// <see cref="InitialSpeedMps"/> is not 0.</summary>
    public double StartS { get; init; }

    /// <summary>The car's speed at <see cref="StartS"/>, m/s: 0 for a standing start.</summary>
    public double InitialSpeedMps { get; init; }

    /// <summary>End of the data, s.</summary>
    public required double EndS { get; init; }

    /// <summary>The stop, s, or null.</summary>
    public double? StopS { get; init; }

    /// <summary>Distance per pulse, m (a 40-tooth ring on a 2-m tyre).</summary>
    public double MetresPerPulse { get; init; } = 0.05;

    /// <summary>Grid step, s.</summary>
    public double GridStepS { get; init; } = 0.002;

    /// <summary>How long the grid runs before first motion, s.</summary>
    public double PreRollS { get; init; } = 0.5;

    /// <summary>The grid with the acceleration integrated over each step.</summary>
    public StepGrid Grid()
    {
        int n = (int)Math.Round((EndS - StartS + PreRollS) / GridStepS) + 1;
        var times = new double[n];
        var dv = new double[n];
        var dd = new double[n];
        for (int k = 0; k < n; k++)
        {
            times[k] = StartS - PreRollS + (k * GridStepS);
        }

        for (int k = 0; k + 1 < n; k++)
        {
            double t0 = times[k];
            double t1 = times[k + 1];
            dv[k] = Simpson(s => CarAccelMps2(s), t0, t1);
            dd[k] = Simpson(s => (t1 - s) * CarAccelMps2(s), t0, t1);
        }

        return new StepGrid { TimeS = times, StepSpeedMps = dv, StepDistanceM = dd, NoInput = new bool[n] };
    }

    /// <summary>Exact pulse edges of the wheel (each edge a bracket of zero width).</summary>
    public PulseChannel Pulses() => PulseChannel.From(PulseRecords());

    /// <summary>The edges of <see cref="Pulses"/> as the records a run holds.</summary>
    public List<PulseRecord> PulseRecords()
    {
        var records = new List<PulseRecord>();
        double speed = InitialSpeedMps;
        double wheel = 0;
        long count = 0;
        for (double t = StartS; t < EndS; t += FineStepS)
        {
            // Trapezoid for the car's speed, then the wheel's distance over the same step.
            double a0 = CarAccelMps2(t);
            double a1 = CarAccelMps2(t + FineStepS);
            double next = Math.Max(speed + (0.5 * (a0 + a1) * FineStepS), 0);
            double w0 = Wheel(t, speed);
            double w1 = Wheel(t + FineStepS, next);
            double after = wheel + (0.5 * (w0 + w1) * FineStepS);
            while (after >= (count + 1) * MetresPerPulse)
            {
                count++;
                double edge = t + (FineStepS * (((count * MetresPerPulse) - wheel) / (after - wheel)));
                records.Add(new PulseRecord(count, edge, edge));
            }

            speed = next;
            wheel = after;
        }

        return records;
    }

    /// <summary>Accelerometer samples every <paramref name="periodS"/> (1 kHz unless told) over
    /// the grid's span, the resting level removed.</summary>
    public (double[] TimeS, double[] InputMps2) Accelerometer(double periodS = 0.001)
    {
        int n = (int)Math.Round((EndS - StartS + PreRollS) / periodS) + 1;
        var times = new double[n];
        var input = new double[n];
        for (int i = 0; i < n; i++)
        {
            times[i] = StartS - PreRollS + (i * periodS);
            input[i] = CarAccelMps2(times[i]);
        }

        return (times, input);
    }

    /// <summary>The windows stage's inputs for this scene: a staged run with both sensors.</summary>
    public WheelWindowInputs Inputs(ReconstructionOptions options)
    {
        (double[] accelT, double[] input) = Accelerometer();
        return new WheelWindowInputs
        {
            Steps = Grid(),
            Pulses = Pulses(),
            MetresPerPulse = MetresPerPulse,
            AccelTimeS = accelT,
            AccelInputMps2 = input,
            Staged = true,
            StartS = StartS,
            StopS = StopS,
            EndS = StopS ?? EndS,
            StartSpeedMps = 0,
            Options = options,
        };
    }

    private double Wheel(double t, double carSpeed) => WheelSpeedMps is null ? carSpeed : WheelSpeedMps(t, carSpeed);

    /// <summary>Composite Simpson's rule over 10 panels; the scenes' accelerations are piecewise
    /// linear, for which it is exact within each panel that holds no corner.</summary>
    private static double Simpson(Func<double, double> f, double a, double b)
    {
        const int Panels = 10;
        double h = (b - a) / Panels;
        double sum = f(a) + f(b);
        for (int i = 1; i < Panels; i++)
        {
            sum += f(a + (i * h)) * (i % 2 == 1 ? 4 : 2);
        }

        return sum * h / 3;
    }
}
