using LaunchLogger.Decoding.Metrics;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The accelerometer stage: the forward axis' resting level (before first motion, or for a
/// record that opens moving against the first pulses' acceleration and the rest it ends in), the
/// onset of motion, the resting pitch and the input the filter integrates.</summary>
internal sealed class AccelSetup
{
    /// <summary>Stretch after the first pulse over which a record that opens moving takes the
    /// accelerometer's level against the first pulses' acceleration, s.</summary>
    private const double OpeningLevelSpanS = 0.3;

    /// <summary>How long after the last pulse a record that ends at rest is surely standing, s.</summary>
    private const double FinalRestAfterLastPulseS = 1.0;

    /// <summary>How much the accelerometer's level may change between a record's opening and the
    /// rest it ends in, m/s²: the road's grade changing by half a per cent over a stop's length
    /// (ours), and the sensor's drift.</summary>
    private const double FinalRestLevelChangeMps2 = 0.05;

    private readonly AccelSetupInputs input;
    private readonly ForwardAcceleration a;
    private readonly PulseChannel? pulses;
    private readonly ReconstructionOptions options;
    private readonly List<string> warnings = [];
    private AccelRest rest = new();
    private AccelOnset? onset;
    private double finalRestFromS = double.PositiveInfinity;

    private AccelSetup(AccelSetupInputs input)
    {
        this.input = input;
        a = input.Accel;
        pulses = input.Pulses;
        options = input.Options;
    }

    /// <summary>Prepares the accelerometer of one run.</summary>
    public static PreparedAccel Prepare(AccelSetupInputs input)
    {
        var setup = new AccelSetup(input);
        (double pitch, double sigma, double[] scaled) = setup.Run();
        return new PreparedAccel
        {
            Rest = setup.rest,
            Onset = setup.onset,
            PitchRad = pitch,
            PitchSigmaRad = sigma,
            InputMps2 = scaled,
            FinalRestFromS = setup.finalRestFromS,
            Warnings = setup.warnings,
        };
    }

    /// <summary><paramref name="input"/> with the calibrated scale divided out (the forward axis
    /// reads its scale factor times the force), in place; as it is without a calibration.</summary>
    public static double[] Scaled(double[] input, Estimate? calibration)
    {
        if (calibration is { Value: > 0 } c)
        {
            for (int i = 0; i < input.Length; i++)
            {
                input[i] /= c.Value;
            }
        }

        return input;
    }

    private (double Pitch, double Sigma, double[] Input) Run()
    {
        double? motionHintS = input.MotionHintS;
        double? reference = Min(pulses?.LoS[0], motionHintS);
        int restTo = reference is { } r ? a.IndexAtOrAfter(r - 0.05) : a.IndexAtOrAfter(a.TimeS[0] + 0.5);
        int restFrom = a.IndexAtOrAfter((reference ?? a.TimeS[0]) - 2.0);
        if (motionHintS is null && pulses != null)
        {
            // Only the first pulse bounds the onset: it may come long before, so rest on the older half.
            restTo = restFrom + ((restTo - restFrom) / 2);
        }

        if (a.ReadRest(restFrom, restTo) is { } before)
        {
            rest = before;
        }
        else if (RestGravityForward() is { } l)
        {
            rest = AccelRest.Told(l, 0.05);
            warnings.Add("too few accelerometer samples before first motion: the resting level comes from the staging event");
        }
        else
        {
            rest = AccelRest.Told(a.ForwardMps2[0], 0.05);
            warnings.Add("too few accelerometer samples before first motion: the first sample is taken as the resting level");
        }

        if (!input.Staged && pulses != null && input.Opening is { } open && a.ReadRest(a.IndexAtOrAfter(pulses.LoS[0]), a.IndexAtOrAfter(pulses.LoS[0] + OpeningLevelSpanS)) is { } stretch)
        {
            // No rest to read the level from: over the opening stretch the accelerometer reads the
            // level plus the acceleration the first pulses show.
            double sigma = Math.Sqrt((stretch.LevelSigmaMps2 * stretch.LevelSigmaMps2) + (open.AccelMps2.Sigma * open.AccelMps2.Sigma));
            rest = stretch.WithLevel(stretch.LevelMps2 - open.AccelMps2.Value, sigma);
            ReadLevelAtFinalRest();
        }

        FindOnset();
        if (onset is { } o && a.ReadRest(a.IndexAtOrAfter(o.TimeS - 2.0), a.IndexAtOrAfter(o.TimeS - 0.03)) is { } beforeOnset)
        {
            rest = beforeOnset;
            FindOnset();
        }

        (double pitchRad, double pitchSigmaRad) = RestingPitch();
        return (pitchRad, pitchSigmaRad, Scaled(a.Input(rest, pitchRad, options.CompensateBodyPitch), options.AccelScaleCalibration));
    }

    /// <summary>A record that opens moving and ends at rest: the level read at the final rest (to
    /// within its change since the opening, <see cref="FinalRestLevelChangeMps2"/>) joins the one
    /// read against the first pulses' acceleration, inverse-variance weighted. The first pulses'
    /// acceleration can be a poor guide (a coarse pickup at speed: σ of metres per second
    /// squared), and a poor level tilts the resting pitch and with it the input's scale.</summary>
    private void ReadLevelAtFinalRest()
    {
        double from = pulses!.HiS[^1] + FinalRestAfterLastPulseS;
        int first = a.IndexAtOrAfter(from);
        if (a.Count - first < 8 || a.TimeS[^1] - from < 0.25 || !(input.StoppedEvent || StopFinder.EndsAtRest(pulses, input.MetresPerPulse)))
        {
            return;
        }

        (double opening, double openingSigma) = (rest.LevelMps2, rest.LevelSigmaMps2);
        if (a.ReadRest(first, a.Count) is not { } final)
        {
            return;
        }

        // The noise is the final rest's from here on, as read with its level.
        double atEnd = final.LevelMps2;
        double endSigma = Math.Sqrt(Square(final.LevelSigmaMps2) + Square(FinalRestLevelChangeMps2));
        double wOpening = 1 / Math.Max(openingSigma * openingSigma, 1e-12);
        double wEnd = 1 / (endSigma * endSigma);
        rest = final.WithLevel(((wOpening * opening) + (wEnd * atEnd)) / (wOpening + wEnd), Math.Sqrt(1 / (wOpening + wEnd)));
        finalRestFromS = from;
    }

    private void FindOnset()
    {
        if (pulses != null && input.Staged)
        {
            onset = AccelOnsetFit.Find(a.TimeS, a.ForwardMps2, rest.LevelMps2, rest.NoiseMps2, rest.CorrelationFactor, a.PeriodS, 0, a.IndexAtOrAfter(pulses.HiS[0]), lastRise: true);
        }
        else if (input.Staged)
        {
            int from = input.MotionHintS is { } h ? a.IndexAtOrAfter(h - 0.5) : a.IndexAtOrAfter(a.TimeS[0] + 0.3);
            onset = AccelOnsetFit.Find(a.TimeS, a.ForwardMps2, rest.LevelMps2, rest.NoiseMps2, rest.CorrelationFactor, a.PeriodS, from, a.Count, lastRise: false);
        }
        else
        {
            onset = null;
        }
    }

    /// <summary>The forward component of the box's resting gravity vector, m/s², or null without one.</summary>
    private double? RestGravityForward()
    {
        if (input.RestGravityMilliG is not { } g)
        {
            return null;
        }

        double component = input.ForwardAxis switch { 1 => g.Y, 2 => g.Z, _ => g.X };
        double sign = input.ForwardAxisReversed ? -1 : 1;
        return sign * component * Units.StandardGravity / 1000;
    }

    /// <summary>The resting pitch: asin of the resting level over gravity's magnitude (the box's
    /// resting vector's, when it is within half a g of standard gravity; standard gravity
    /// otherwise), σ by the derivative of the arcsine.</summary>
    private (double Pitch, double Sigma) RestingPitch()
    {
        double magnitude = Units.StandardGravity;
        if (input.RestGravityMilliG is { } g)
        {
            double norm = Math.Sqrt((g.X * g.X) + (g.Y * g.Y) + (g.Z * g.Z)) * Units.StandardGravity / 1000;
            if (norm > 0.5 * Units.StandardGravity && norm < 1.5 * Units.StandardGravity)
            {
                magnitude = norm;
            }
        }

        double ratio = Math.Clamp(rest.LevelMps2 / magnitude, -0.99, 0.99);
        double pitch = Math.Asin(ratio);
        double sigma = rest.LevelSigmaMps2 / (magnitude * Math.Cos(pitch));
        return (pitch, sigma);
    }

    private static double Square(double x) => x * x;

    private static double? Min(double? a, double? b) => a is null ? b : b is null ? a : Math.Min(a.Value, b.Value);
}
