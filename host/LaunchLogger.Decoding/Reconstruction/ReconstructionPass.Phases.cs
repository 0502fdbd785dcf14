using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Reconstruction;

/// <content>Phases of the record: first motion and the stop.</content>
internal sealed partial class ReconstructionPass
{
    private Estimate FirstMotion()
    {
        if (!Staged && pulses != null)
        {
            warnings.Add(opening is { } s
                ? FormattableString.Invariant($"the run opened while rolling, at {s.SpeedMps.Value:F2} m/s ± {s.SpeedMps.Sigma:F2} by the first pulses{(configuration.Staged ? " although the box was staged" : "")}: there is no standstill, so no standing-start figure; distances count from the first pulse observation")
                : "the run opened while rolling: there is no standstill, distances count from the first pulse observation");
            return new Estimate(pulses.MidS(0), (pulses.HiS[0] - pulses.LoS[0]) / Math.Sqrt(12));
        }

        if (!Staged)
        {
            warnings.Add(accelOpeningSpeed is { } v0
                ? FormattableString.Invariant($"the run opened while rolling, at {v0.Value:F1} m/s ± {v0.Sigma:F1} by the acceleration integrated back from the rest at its end, and has no pulses: there is no standstill, so no standing-start figure; distances count from the start of the samples")
                : "the run opened while rolling and has no pulses: distances count from the start of the samples");
            return new Estimate(accel!.TimeS[0], 0);
        }

        // The samples' instants are rebuilt from burst read times and sample indices on the
        // sensor's own clock: each is placed to within about a sample period (uniform: σ = T/√12),
        // which the onset fit on those instants cannot see.
        double samplePlacement = accel is null ? 0 : accel.PeriodS / Math.Sqrt(12);
        Estimate? fromAccel = onset is { } o ? new Estimate(o.TimeS, Math.Sqrt((o.SigmaS * o.SigmaS) + (samplePlacement * samplePlacement) + Square(TimeAxisOffsetSigma(o.TimeS)))) : null;
        if (fromAccel is { } fa && pulses != null && fa.Value > pulses.HiS[0])
        {
            // Motion begins by the end of the first pulse's bracket: a tooth that sat at the
            // pickup fires as the wheel first turns, so an onset read within its σ of that pulse
            // may lie a little after it. Within 3σ the onset is taken at the pulse; further after
            // it, it contradicts the pulses.
            fromAccel = BoundedAbove(fa, pulses.HiS[0]);
            if (fromAccel is null)
            {
                warnings.Add("the accelerometer onset came after the first pulse; it was not used");
            }
        }

        Estimate? fromPulses = PulsesStart(fromAccel is null ? 0 : onset!.Value.SmoothStartShare);
        if (fromAccel is { } a && fromPulses is { } p)
        {
            double gap = a.Value - p.Value;
            double combined = Math.Sqrt((a.Sigma * a.Sigma) + (p.Sigma * p.Sigma));
            if (Math.Abs(gap) > 3 * combined)
            {
                warnings.Add($"the accelerometer onset and the back-extrapolated pulses disagree on first motion by {gap * 1e3:F1} ms; the accelerometer's is used");
                return a;
            }

            // Inverse-variance mean; when the two differ by more than their σ explain, the σ of
            // the mean is scaled up by that much (the scale factor of the Particle Data Group's
            // averages, Review of Particle Physics, "Introduction": S = √(χ²/(N − 1))).
            double wa = 1 / (a.Sigma * a.Sigma);
            double wp = 1 / (p.Sigma * p.Sigma);
            double scale = Math.Max(1, Math.Abs(gap) / combined);
            return new Estimate(((wa * a.Value) + (wp * p.Value)) / (wa + wp), scale * Math.Sqrt(1 / (wa + wp)));
        }

        if (fromAccel is { } onlyAccel)
        {
            return onlyAccel;
        }

        if (fromPulses is { } onlyPulses)
        {
            if (accel != null)
            {
                warnings.Add("the accelerometer shows no clear onset of motion: first motion is back-extrapolated from the pulses");
            }

            return onlyPulses;
        }

        if (pulses != null)
        {
            // Too few pulses for a fit: the start lies before the first edge, by up to the time
            // the second edge took.
            double first = pulses.MidS(0);
            double spread = pulses.Length > 1 ? pulses.MidS(1) - first : 0.5;
            warnings.Add("too few pulses to back-extrapolate first motion: it is placed one pulse interval before the first pulse, with that much uncertainty");
            return new Estimate(first - spread, spread);
        }

        double start = motionHintS ?? accel!.TimeS[0];
        warnings.Add("the accelerometer shows no clear onset of motion: first motion is taken from the box's own mark or the start of the samples");
        return new Estimate(start, 0.05);
    }

    /// <summary>First motion as the first pulses imply it (<see cref="KinematicStartFit"/>), with
    /// the take-up the accelerometer saw: the pulses cannot tell a ramp from a smooth take-up, and a
    /// ramp fitted to a smooth one puts t₀ late by 0.12 of its rise time and more (the fit's
    /// remarks). With <paramref name="smoothShare"/> the accelerometer's odds that the rise starts
    /// like τ², the two families' starts are mixed by those odds: mean Σ wᵢ·tᵢ, variance
    /// Σ wᵢ·(σᵢ² + (tᵢ − mean)²) (a mixture's moments; Bayesian model averaging as in the onset
    /// fit).</summary>
    private Estimate? PulsesStart(double smoothShare)
    {
        if (kinematic is not { } ramp)
        {
            return null;
        }

        var fromRamp = new Estimate(ramp.TimeS, ramp.SigmaS);
        if (smoothShare < 1e-3 || KinematicStartFit.Fit(pulses!, mpp, options.ToothSpacingErrorFraction * mpp, options.EdgeJitterS, pulses!.MidS(0) - 3.0, KinematicTakeUp.RaisedCosine) is not { } smooth)
        {
            return fromRamp;
        }

        double mean = ((1 - smoothShare) * ramp.TimeS) + (smoothShare * smooth.TimeS);
        double variance = ((1 - smoothShare) * (Square(ramp.SigmaS) + Square(ramp.TimeS - mean))) + (smoothShare * (Square(smooth.SigmaS) + Square(smooth.TimeS - mean)));
        return new Estimate(mean, Math.Sqrt(variance));
    }

    /// <summary>How many of its σ an accelerometer onset may lie after the first pulse and still
    /// be taken as bounded by it; beyond, it contradicts the pulses.</summary>
    private const double OnsetBoundSigmas = 3;

    /// <summary>The onset <paramref name="onsetEstimate"/> given that motion began no later than
    /// <paramref name="boundS"/>: as it is when it lies before the bound; at the bound, with its σ,
    /// when it lies after it by at most <see cref="OnsetBoundSigmas"/> σ (a normal likelihood held
    /// to t ≤ bound is largest at the bound; and the bound is met where the first pulse comes with
    /// first motion, the one case that puts an onset after it); null further after.</summary>
    internal static Estimate? BoundedAbove(Estimate onsetEstimate, double boundS)
    {
        if (onsetEstimate.Value <= boundS)
        {
            return onsetEstimate;
        }

        return onsetEstimate.Value - (OnsetBoundSigmas * onsetEstimate.Sigma) <= boundS
            ? new Estimate(boundS, onsetEstimate.Sigma)
            : null;
    }

    /// <summary>How far the accelerometer's time axis may have slid against the pulses' by
    /// <paramref name="timeS"/>, s: for sample times given in a plain-text file (not rebuilt from
    /// the box's burst read times, which tie them to the box's clock), the sensor's clock rate
    /// error (<see cref="ReconstructionOptions.TextAccelClockRateSigma"/>) times the time since the
    /// record's first sample; 0 for logs.</summary>
    private double TimeAxisOffsetSigma(double timeS) =>
        accelClockOffsetSigmaS ?? (run.Accel is { SampleIndex: null } samples && samples.Count > 0
            ? options.TextAccelClockRateSigma * Math.Max(0, timeS - (samples.ClockOriginS ?? samples.TimeS[0]))
            : 0);

    /// <summary>How long after the onset the accelerometer's clock is matched to the pulses', s.</summary>
    private const double ClockFitWindowS = 15.0;

    /// <summary>Mean deceleration over 0.1 s that ends the clock fit's window, m/s².</summary>
    private const double ClockFitDecelerationMps2 = 0.5;

    /// <summary>For an accelerometer timed by its own clock (a plain-text file), finds its offset
    /// from the pulses' clock at the launch (<see cref="AccelClockFit"/>), combines it with the
    /// prior the clock rate allows over the time since the first sample, and moves the samples'
    /// time axis onto the pulses' clock; first motion then carries the combined σ instead.</summary>
    private void AlignAccelerometerClock(ForwardAcceleration a)
    {
        if (pulses is null || !Staged || onset is not { } o)
        {
            return;
        }

        // Only when the clock can have slid by more than a sample's own placement (T/√12).
        double prior = TimeAxisOffsetSigma(o.TimeS);
        if (!(prior > a.PeriodS / Math.Sqrt(12)))
        {
            return;
        }

        // Drive only: braking pitches the body the other way and reads as another scale.
        double endS = Math.Min(o.TimeS + ClockFitWindowS, a.TimeS[^1]);
        int half = Math.Max(1, (int)Math.Round(0.05 / a.PeriodS));
        for (int i = a.IndexAtOrAfter(o.TimeS + 0.5); i + half < a.Count && a.TimeS[i] < endS; i++)
        {
            double sum = 0;
            for (int j = i - half; j <= i + half; j++)
            {
                sum += accelInput[j];
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
        double[] plain = options.CompensateBodyPitch ? ScaledInput(a.Input(pitchRad, compensatePitch: false)) : accelInput;
        if (AccelClockFit.Fit(a.TimeS, plain, o.TimeS - 0.3, o.TimeS, endS, pulses, mpp, options.ToothSpacingErrorFraction * mpp, InputDensity(a, o.TimeS), options.TextAccelClockRateSigma, new Estimate(options.UndrivenSlipPerMps2, options.UndrivenSlipSigma), MeasuredInputDensity(a, o.TimeS)) is not { } matched)
        {
            return;
        }

        double lag = SquatShare(a, plain, o.TimeS, endS) * BodyPitchLagS;
        var fit = new Estimate(matched.Value, Math.Sqrt((matched.Sigma * matched.Sigma) + (lag * lag)));
        // Inverse-variance combination with the prior δ = 0 ± prior.
        double wPrior = 1 / (prior * prior);
        double wFit = 1 / (fit.Sigma * fit.Sigma);
        double offset = wFit * fit.Value / (wPrior + wFit);
        double sigma = Math.Sqrt(1 / (wPrior + wFit));
        a.ShiftTime(-offset);
        accelClockShiftS = -offset;
        onset = o with { TimeS = o.TimeS - offset, DetectedS = o.DetectedS - offset };
        accelClockOffsetSigmaS = sigma;
        warnings.Add(FormattableString.Invariant($"the accelerometer's clock was matched to the pulses' over the launch: its samples moved by {-offset * 1e3:F1} ms ± {sigma * 1e3:F1}"));
    }

    /// <summary>How long the body's pitch may lag the acceleration, s: a car's pitch mode near
    /// 1–1.5 Hz, damped to about a third of critical, follows a slow change of load within
    /// 2ζ/ω ≈ 0.06–0.1 s (any vehicle dynamics text's second-order response; from memory).</summary>
    private const double BodyPitchLagS = 0.1;

    /// <summary>The share of the forward reading that the body's pitch compensation takes out
    /// over the fit's window (least squares through the origin of the compensation against the
    /// uncompensated reading), as a magnitude; 0 without compensation.</summary>
    private double SquatShare(ForwardAcceleration a, double[] plain, double fromS, double toS)
    {
        if (ReferenceEquals(plain, accelInput))
        {
            return 0;
        }

        double cross = 0;
        double square = 0;
        for (int i = a.IndexAtOrAfter(fromS); i < a.Count && a.TimeS[i] <= toS; i++)
        {
            cross += (plain[i] - accelInput[i]) * plain[i];
            square += plain[i] * plain[i];
        }

        return square > 0 ? Math.Abs(cross / square) : 0;
    }

    /// <summary>Below this speed a record counts as opening at rest, m/s.</summary>
    private const double CrawlMps = 0.3;

    /// <summary>How fast an accelerometer-only record that ends at rest opened, when that is
    /// clearly more than a crawl; null when it opened at rest or cannot tell.</summary>
    /// <remarks>At rest at the end the speed is zero, so the speed at the first sample is minus
    /// the acceleration integrated from there to the stop, taken against the level read at the
    /// final rest (whatever level was removed before cancels). Its σ: that level's own σ and
    /// the accelerometer's wander (<see cref="ReconstructionOptions.AccelOnlyBiasWanderDensity"/>,
    /// a random walk: variance q·T³/3 in speed over T) over the time back to the first sample,
    /// and the scale error. Opening moving needs the speed 3 σ clear of a crawl.</remarks>
    private Estimate? AccelOpeningSpeed()
    {
        ForwardAcceleration a = accel!;
        if (FindStop(a.TimeS[0], a.TimeS[^1]) is not { } stop)
        {
            return null;
        }

        int s = Math.Max(1, a.IndexAtOrAfter(stop));
        int n = a.Count - s;
        if (n < 8)
        {
            return null;
        }

        double level = 0;
        for (int i = s; i < a.Count; i++)
        {
            level += accelInput[i];
        }

        level /= n;
        double gained = 0;
        for (int i = 1; i < s; i++)
        {
            gained += (0.5 * (accelInput[i - 1] + accelInput[i]) - level) * (a.TimeS[i] - a.TimeS[i - 1]);
        }

        double speed = -gained;
        double span = stop - a.TimeS[0];
        double levelSigma = a.NoiseMps2 * a.CorrelationFactor / Math.Sqrt(n);
        double sigma = Math.Sqrt(Square(levelSigma * span) + (options.AccelOnlyBiasWanderDensity * span * span * span / 3) + Square(options.ForwardScaleSigma * speed));
        return speed - (3 * sigma) > CrawlMps ? new Estimate(speed, sigma) : null;
    }

    private double? FindStop(double startS, double endOfData) => RunStop.Find(
        new RunStopInputs
        {
            Pulses = pulses,
            MetresPerPulse = mpp,
            AccelTimeS = accel?.TimeS,
            AccelInputMps2 = accel is null ? [] : accelInput,
            AccelNoiseMps2 = accel?.NoiseMps2 ?? 0,
            AccelPeriodS = accel?.PeriodS ?? 0,
            StoppedEvent = run.Events.Any(e => e.Kind == EventKind.Stopped),
            StopHoldS = configuration.StopHoldS,
            StillAtEndS = options.StillAtEndS,
        },
        startS,
        endOfData);
}
