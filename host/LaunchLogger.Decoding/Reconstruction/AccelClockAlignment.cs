namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The clock stage: for an accelerometer timed by its own clock (a plain-text file), finds
/// its offset from the pulses' clock at the launch (<see cref="AccelClockFit"/>), combines it with
/// the prior the clock rate allows over the time since the first sample, and moves the samples'
/// time axis onto the pulses' clock; first motion then carries the combined σ instead.</summary>
internal static class AccelClockAlignment
{
    /// <summary>How long after the onset the accelerometer's clock is matched to the pulses', s.</summary>
    private const double ClockFitWindowS = 15.0;

    /// <summary>Mean deceleration over 0.1 s that ends the clock fit's window, m/s².</summary>
    private const double ClockFitDecelerationMps2 = 0.5;

    /// <summary>How long the body's pitch may lag the acceleration, s: a car's pitch mode near
    /// 1–1.5 Hz, damped to about a third of critical, follows a slow change of load within
    /// 2ζ/ω ≈ 0.06–0.1 s (any vehicle dynamics text's second-order response; from memory).</summary>
    private const double BodyPitchLagS = 0.1;

    /// <summary>The accelerometer on the pulses' clock, or null when its clock cannot have slid by
    /// more than a sample's own placement (T/√12: a log's samples are tied to the box's clock), or
    /// the launch holds too few pulses to match.</summary>
    public static AccelClockMatch? Align(AccelClockInputs input)
    {
        ForwardAcceleration a = input.Accel;
        AccelOnset o = input.Onset;
        ReconstructionOptions options = input.Options;

        // Only when the clock can have slid by more than a sample's own placement (T/√12).
        double prior = input.PriorOffsetSigmaS;
        if (!(prior > a.PeriodS / Math.Sqrt(12)))
        {
            return null;
        }

        // Drive only: braking pitches the body the other way and reads as another scale.
        double endS = Math.Min(o.TimeS + ClockFitWindowS, a.TimeS[^1]);
        int half = Math.Max(1, (int)Math.Round(0.05 / a.PeriodS));
        for (int i = a.IndexAtOrAfter(o.TimeS + 0.5); i + half < a.Count && a.TimeS[i] < endS; i++)
        {
            double sum = 0;
            for (int j = i - half; j <= i + half; j++)
            {
                sum += input.InputMps2[j];
            }

            if (sum / ((2 * half) + 1) < -ClockFitDecelerationMps2)
            {
                endS = a.TimeS[i] - 0.2;
                break;
            }
        }

        // The fit reads the forward axis as it is, not compensated for the body's pitch: the
        // compensation passes the vertical axis' noise through at a gain of up to g/(2·p₀) where
        // the acceleration is small, a random walk of speed many times the forward axis' own, and
        // the squat it takes out follows the acceleration, a scale the fit's scale column takes.
        // What the scale cannot take is the body's pitch lagging the acceleration: that reads as
        // an offset of the lag times the squat's share of the reading, put into σ.
        double[] plain = options.CompensateBodyPitch
            ? AccelSetup.Scaled(a.Input(input.Rest, input.PitchRad, compensatePitch: false), options.AccelScaleCalibration)
            : input.InputMps2;
        if (AccelClockFit.Fit(a.TimeS, plain, o.TimeS - 0.3, o.TimeS, endS, input.Pulses, input.MetresPerPulse, options.ToothSpacingErrorFraction * input.MetresPerPulse, a.InputDensity(input.Rest, o.TimeS, options), options.TextAccelClockRateSigma, new Estimate(options.UndrivenSlipPerMps2, options.UndrivenSlipSigma), a.MeasuredInputDensity(input.Rest, o.TimeS, options.AccelNoiseMps2)) is not { } matched)
        {
            return null;
        }

        double lag = SquatShare(a, plain, input.InputMps2, o.TimeS, endS) * BodyPitchLagS;
        var fit = new Estimate(matched.Value, Math.Sqrt((matched.Sigma * matched.Sigma) + (lag * lag)));
        // Inverse-variance combination with the prior δ = 0 ± prior.
        double wPrior = 1 / (prior * prior);
        double wFit = 1 / (fit.Sigma * fit.Sigma);
        double offset = wFit * fit.Value / (wPrior + wFit);
        double sigma = Math.Sqrt(1 / (wPrior + wFit));
        return new AccelClockMatch
        {
            Accel = a.Shifted(-offset),
            Onset = o with { TimeS = o.TimeS - offset, DetectedS = o.DetectedS - offset },
            ShiftS = -offset,
            OffsetSigmaS = sigma,
            Note = FormattableString.Invariant($"the accelerometer's clock was matched to the pulses' over the launch: its samples moved by {-offset * 1e3:F1} ms ± {sigma * 1e3:F1}"),
        };
    }

    /// <summary>The share of the forward reading that the body's pitch compensation takes out
    /// over the fit's window (least squares through the origin of the compensation against the
    /// uncompensated reading), as a magnitude; 0 without compensation.</summary>
    private static double SquatShare(ForwardAcceleration a, double[] plain, double[] compensated, double fromS, double toS)
    {
        if (ReferenceEquals(plain, compensated))
        {
            return 0;
        }

        double cross = 0;
        double square = 0;
        for (int i = a.IndexAtOrAfter(fromS); i < a.Count && a.TimeS[i] <= toS; i++)
        {
            cross += (plain[i] - compensated[i]) * plain[i];
            square += plain[i] * plain[i];
        }

        return square > 0 ? Math.Abs(cross / square) : 0;
    }
}
