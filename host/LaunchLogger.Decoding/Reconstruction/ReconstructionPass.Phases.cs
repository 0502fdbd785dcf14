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

        Estimate? fromPulses = PulsesStart(fromAccel is null ? null : onset);
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
    /// the take-up the accelerometer saw: the pulses cannot tell a ramp from a smooth take-up or
    /// from a ramp through a lag, and a ramp fitted to a smooth one puts t₀ late by 0.12 of its
    /// rise time and more, to a lagged one by about the lag (the fit's remarks). With the
    /// accelerometer's odds that the rise starts like τ² (<see cref="AccelOnset.SmoothStartShare"/>)
    /// or is a lagged ramp (<see cref="AccelOnset.LaggedShare"/>, at its fitted lag), the
    /// families' starts are mixed by those odds: mean Σ wᵢ·tᵢ, variance Σ wᵢ·(σᵢ² + (tᵢ − mean)²)
    /// (a mixture's moments; Bayesian model averaging as in the onset fit).</summary>
    private Estimate? PulsesStart(AccelOnset? seen)
    {
        if (kinematic is not { } ramp)
        {
            return null;
        }

        Span<double> share = [0, seen?.SmoothStartShare ?? 0, seen?.LaggedShare ?? 0];
        Span<double> times = [ramp.TimeS, 0, 0];
        Span<double> sigmas = [ramp.SigmaS, 0, 0];
        KinematicTakeUp[] families = [KinematicTakeUp.Ramp, KinematicTakeUp.RaisedCosine, KinematicTakeUp.LaggedRamp];
        for (int f = 1; f < families.Length; f++)
        {
            if (share[f] < 1e-3 || KinematicStartFit.Fit(pulses!, mpp, options.ToothSpacingErrorFraction * mpp, options.EdgeJitterS, pulses!.MidS(0) - 3.0, families[f], seen!.Value.LagS) is not { } fit)
            {
                share[f] = 0;
                continue;
            }

            times[f] = fit.TimeS;
            sigmas[f] = fit.SigmaS;
        }

        share[0] = Math.Max(0, 1 - share[1] - share[2]);
        double sum = share[0] + share[1] + share[2];
        double mean = 0;
        for (int f = 0; f < 3; f++)
        {
            mean += share[f] * times[f] / sum;
        }

        double variance = 0;
        for (int f = 0; f < 3; f++)
        {
            variance += share[f] * (Square(sigmas[f]) + Square(times[f] - mean)) / sum;
        }

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

    private double? FindStop(double startS, double endOfData) => RunStop.Find(
        new RunStopInputs
        {
            Pulses = pulses,
            MetresPerPulse = mpp,
            AccelTimeS = accel?.TimeS,
            AccelInputMps2 = accel is null ? [] : accelInput,
            AccelNoiseMps2 = accelRest?.NoiseMps2 ?? 0,
            AccelPeriodS = accel?.PeriodS ?? 0,
            StoppedEvent = run.Events.Any(e => e.Kind == EventKind.Stopped),
            StopHoldS = configuration.StopHoldS,
            StillAtEndS = options.StillAtEndS,
        },
        startS,
        endOfData);
}
