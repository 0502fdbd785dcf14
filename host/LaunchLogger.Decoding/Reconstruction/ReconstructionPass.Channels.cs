using LaunchLogger.Firmware.Wire;
namespace LaunchLogger.Decoding.Reconstruction;

/// <content>Channel preparation: which pulse channel carries distance, bracket checks, the accelerometer's resting level, onset and pitch.</content>
internal sealed partial class ReconstructionPass
{
    /// <summary>Distance the second channel covered divided by the first's, from the later first
    /// pulse (plus 0.2 s) to the first channel's highest speed, when both saw enough of it.</summary>
    private static double? DistanceUnderDrive(PulseChannel a, double mppA, PulseChannel b, double mppB)
    {
        double from = Math.Max(a.MidS(0), b.MidS(0)) + 0.2;

        // Highest speed of channel a over half-second spans.
        double peakS = double.NaN;
        double peak = 0;
        int j = 0;
        for (int i = 0; i < a.Length; i++)
        {
            while (j < a.Length && a.MidS(j) < a.MidS(i) + 0.5)
            {
                j++;
            }

            if (j >= a.Length)
            {
                break;
            }

            double speed = (a.Counts[j] - a.Counts[i]) * mppA / (a.MidS(j) - a.MidS(i));
            if (speed > peak)
            {
                peak = speed;
                peakS = a.MidS(j);
            }
        }

        if (double.IsNaN(peakS) || peakS < from + 1)
        {
            return null;
        }

        double da = (CountAt(a, peakS) - CountAt(a, from)) * mppA;
        double db = (CountAt(b, peakS) - CountAt(b, from)) * mppB;
        return da > 10 && db > 0 ? db / da : null;
    }

    /// <summary>Count at <paramref name="t"/>, interpolated between observation midpoints.</summary>
    private static double CountAt(PulseChannel c, double t)
    {
        int lo = 0;
        int hi = c.Length - 1;
        if (t <= c.MidS(0))
        {
            return c.Counts[0];
        }

        if (t >= c.MidS(hi))
        {
            return c.Counts[hi];
        }

        while (hi - lo > 1)
        {
            int mid = (lo + hi) >>> 1;
            if (c.MidS(mid) <= t)
            {
                lo = mid;
            }
            else
            {
                hi = mid;
            }
        }

        double f = (t - c.MidS(lo)) / (c.MidS(hi) - c.MidS(lo));
        return c.Counts[lo] + (f * (c.Counts[hi] - c.Counts[lo]));
    }

    /// <summary>Distance noise of one pulse observation at the start: the tooth spacing error,
    /// and the widest of the first brackets at the speed they imply (a bracket's width in time
    /// is a distance once the car moves).</summary>
    private double StartNoiseM()
    {
        PulseChannel p = pulses!;
        int n = Math.Min(p.Length, StartMotion.MinimumObservations);
        double width = 0;
        for (int i = 0; i < n; i++)
        {
            width = Math.Max(width, p.HiS[i] - p.LoS[i]);
        }

        double span = n > 1 ? p.MidS(n - 1) - p.MidS(0) : 0;
        double speed = span > 0 ? (p.Counts[n - 1] - p.Counts[0]) * mpp / span : 0;
        return Math.Sqrt(Math.Pow(options.ToothSpacingErrorFraction * mpp, 2) + Math.Pow(speed * width / Math.Sqrt(12), 2));
    }

    private void CheckPulses()
    {
        if (pulses is null)
        {
            return;
        }

        if (pulses.Dropped > 0)
        {
            warnings.Add($"{pulses.Dropped} pulse observations went backwards in count or time and were left out");
        }

        double limit = options.WideBracketS ?? (configuration.BracketLimitS > 0 ? configuration.BracketLimitS : 0.002);
        int wide = 0;
        double widest = 0;
        for (int i = 0; i < pulses.Length; i++)
        {
            double w = pulses.HiS[i] - pulses.LoS[i];
            widest = Math.Max(widest, w);
            if (w > limit)
            {
                wide++;
            }
        }

        // A log's run already carries the reader's warning about wide brackets; say it here only
        // for plain-text inputs (format version 0), which have no reader of their own to say it.
        if (wide > 0 && configuration.FormatVersion == 0)
        {
            warnings.Add($"{wide} of {pulses.Length} pulse observations have brackets wider than {limit * 1e3:F1} ms (widest {widest * 1e3:F1} ms); they count with their width");
        }
    }

    /// <summary>Stretch after the first pulse over which a record that opens moving takes the
    /// accelerometer's level against the first pulses' acceleration, s.</summary>
    private const double OpeningLevelSpanS = 0.3;

    private void PrepareAccelerometer(ForwardAcceleration a)
    {
        double? reference = Min(pulses?.LoS[0], motionHintS);
        int restTo = reference is { } r ? a.IndexAtOrAfter(r - 0.05) : a.IndexAtOrAfter(a.TimeS[0] + 0.5);
        int restFrom = a.IndexAtOrAfter((reference ?? a.TimeS[0]) - 2.0);
        if (motionHintS is null && pulses != null)
        {
            // Only the first pulse bounds the onset: it may come long before, so rest on the older half.
            restTo = restFrom + ((restTo - restFrom) / 2);
        }

        if (!a.SetRest(restFrom, restTo))
        {
            double? level = RestGravityForward();
            if (level is { } l)
            {
                a.SetRest(l, 0.05);
                warnings.Add("too few accelerometer samples before first motion: the resting level comes from the staging event");
            }
            else
            {
                a.SetRest(a.ForwardMps2[0], 0.05);
                warnings.Add("too few accelerometer samples before first motion: the first sample is taken as the resting level");
            }
        }

        if (!Staged && pulses != null && opening is { } open && a.SetRest(a.IndexAtOrAfter(pulses.LoS[0]), a.IndexAtOrAfter(pulses.LoS[0] + OpeningLevelSpanS)))
        {
            // No rest to read the level from: over the opening stretch the accelerometer reads the
            // level plus the acceleration the first pulses show.
            double sigma = Math.Sqrt((a.RestLevelSigmaMps2 * a.RestLevelSigmaMps2) + (open.AccelMps2.Sigma * open.AccelMps2.Sigma));
            a.MoveRestLevel(a.RestLevelMps2 - open.AccelMps2.Value, sigma);
            ReadLevelAtFinalRest(a);
        }

        FindOnset(a);
        if (onset is { } o && a.SetRest(a.IndexAtOrAfter(o.TimeS - 2.0), a.IndexAtOrAfter(o.TimeS - 0.03)))
        {
            FindOnset(a);
        }

        (pitchRad, pitchSigmaRad) = RestingPitch(a);
        accelInput = ScaledInput(a.Input(pitchRad, options.CompensateBodyPitch));
    }

    /// <summary><paramref name="input"/> with the calibrated scale divided out (the forward axis
    /// reads its scale factor times the force), in place.</summary>
    private double[] ScaledInput(double[] input)
    {
        if (options.AccelScaleCalibration is { Value: > 0 } calibration)
        {
            for (int i = 0; i < input.Length; i++)
            {
                input[i] /= calibration.Value;
            }
        }

        return input;
    }

    /// <summary>How long after the last pulse a record that ends at rest is surely standing, s.</summary>
    private const double FinalRestAfterLastPulseS = 1.0;

    /// <summary>How much the accelerometer's level may change between a record's opening and the
    /// rest it ends in, m/s²: the road's grade changing by half a per cent over a stop's length
    /// (ours), and the sensor's drift.</summary>
    private const double FinalRestLevelChangeMps2 = 0.05;

    /// <summary>A record that opens moving and ends at rest: the level read at the final rest (to
    /// within its change since the opening, <see cref="FinalRestLevelChangeMps2"/>) joins the one
    /// read against the first pulses' acceleration, inverse-variance weighted. The first pulses'
    /// acceleration can be a poor guide (a coarse pickup at speed: σ of metres per second
    /// squared), and a poor level tilts the resting pitch and with it the input's scale.</summary>
    private void ReadLevelAtFinalRest(ForwardAcceleration a)
    {
        bool stoppedEvent = run.Events.Any(e => e.Kind == EventKind.Stopped);
        double from = pulses!.HiS[^1] + FinalRestAfterLastPulseS;
        int first = a.IndexAtOrAfter(from);
        if (a.Count - first < 8 || a.TimeS[^1] - from < 0.25 || !(stoppedEvent || StopFinder.EndsAtRest(pulses, mpp)))
        {
            return;
        }

        (double opening, double openingSigma) = (a.RestLevelMps2, a.RestLevelSigmaMps2);
        if (!a.SetRest(first, a.Count))
        {
            return;
        }

        double atEnd = a.RestLevelMps2;
        double endSigma = Math.Sqrt(Square(a.RestLevelSigmaMps2) + Square(FinalRestLevelChangeMps2));
        double wOpening = 1 / Math.Max(openingSigma * openingSigma, 1e-12);
        double wEnd = 1 / (endSigma * endSigma);
        a.MoveRestLevel(((wOpening * opening) + (wEnd * atEnd)) / (wOpening + wEnd), Math.Sqrt(1 / (wOpening + wEnd)));
        finalRestFromS = from;
    }

    private void FindOnset(ForwardAcceleration a)
    {
        if (pulses != null && Staged)
        {
            onset = AccelOnsetFit.Find(a.TimeS, a.ForwardMps2, a.RestLevelMps2, a.NoiseMps2, a.CorrelationFactor, a.PeriodS, 0, a.IndexAtOrAfter(pulses.HiS[0]), lastRise: true);
        }
        else if (Staged)
        {
            int from = motionHintS is { } h ? a.IndexAtOrAfter(h - 0.5) : a.IndexAtOrAfter(a.TimeS[0] + 0.3);
            onset = AccelOnsetFit.Find(a.TimeS, a.ForwardMps2, a.RestLevelMps2, a.NoiseMps2, a.CorrelationFactor, a.PeriodS, from, a.Count, lastRise: false);
        }
        else
        {
            onset = null;
        }

    }

    private double? RestGravityForward()
    {
        if (run.RestGravityMilliG is not { } g)
        {
            return null;
        }

        double component = configuration.ForwardAxis switch { 1 => g.Y, 2 => g.Z, _ => g.X };
        double sign = configuration.ForwardAxisReversed ? -1 : 1;
        return sign * component * G0 / 1000;
    }

    private (double Pitch, double Sigma) RestingPitch(ForwardAcceleration a)
    {
        double magnitude = G0;
        if (run.RestGravityMilliG is { } g)
        {
            double norm = Math.Sqrt((g.X * g.X) + (g.Y * g.Y) + (g.Z * g.Z)) * G0 / 1000;
            if (norm > 0.5 * G0 && norm < 1.5 * G0)
            {
                magnitude = norm;
            }
        }

        double ratio = Math.Clamp(a.RestLevelMps2 / magnitude, -0.99, 0.99);
        double pitch = Math.Asin(ratio);
        double sigma = a.RestLevelSigmaMps2 / (magnitude * Math.Cos(pitch));
        return (pitch, sigma);
    }
}
