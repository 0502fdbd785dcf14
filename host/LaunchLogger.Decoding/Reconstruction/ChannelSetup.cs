using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>The channel stage: which pulse channel carries distance (the undriven wheel when two
/// are logged), the ring's tooth positions, and the check of the pulse brackets. Reads the run
/// and the options only.</summary>
internal static class ChannelSetup
{
    /// <summary>Below this ratio of the second channel's distance under drive to the first's, the
    /// first wheel is taken as slipping (driven) and the second carries distance: 0.2 % less (ours).</summary>
    private const double DrivenRatioBelow = 0.998;

    /// <summary>The second channel's distance is compared with the first's from this long after
    /// the later first pulse, s: past the first pulses' brackets.</summary>
    private const double CompareAfterFirstPulseS = 0.2;

    /// <summary>The first channel's highest speed is taken over spans this long, s.</summary>
    private const double PeakSpanS = 0.5;

    /// <summary>Bracket width above which a pulse observation counts as wide when neither the
    /// options nor the configuration say, s.</summary>
    private const double DefaultWideBracketS = 0.002;

    /// <summary>Chooses and checks the distance channel of <paramref name="run"/>.</summary>
    public static DistanceChannel Choose(DecodedRun run, ReconstructionOptions options)
    {
        RunConfiguration configuration = run.Configuration;
        var warnings = new List<string>();
        double mpp = PulseChannel.MetresPerPulse(configuration) * options.RollingOverToldCircumference;
        double secondMpp = configuration.SecondMetresPerPulse * options.RollingOverToldCircumference;
        PulseChannel? pulses = null;
        int channel = 0;
        string? note = null;
        if (options.UsePulses && mpp > 0 && run.Pulses.Count > 0)
        {
            var first = PulseChannel.From(run.Pulses);
            pulses = first.Length > 0 ? first : null;
        }

        if (options.UsePulses && options.UseSecondChannel && configuration.Staged && run.SecondPulses.Count > 2 && configuration.SecondMetresPerPulse > 0)
        {
            var second = PulseChannel.From(run.SecondPulses);
            if (pulses is null)
            {
                (pulses, mpp, channel) = (second, secondMpp, 1);
            }
            else if (DistanceUnderDrive(pulses, mpp, second, secondMpp) is { } ratio && ratio < DrivenRatioBelow)
            {
                // The second wheel covers less under drive: the first one slips, so it is driven.
                note = $"the second pulse channel turned {(1 - ratio) * 100:F1} % less than the first while accelerating; it is taken as the undriven wheel and used for distance";
                (pulses, mpp, channel) = (second, secondMpp, 1);
            }
        }

        double[]? toothOffsets = null;
        if (pulses != null && channel == 0 && options.MeasureToothPositions)
        {
            // The ring's own tooth positions, measured over the run's steady revolutions (and a
            // saved map of it, turned to the run).
            toothOffsets = ToothPositions.Measure(run.Pulses, configuration.PulsesPerRevolution, mpp, run.Source, options.ToothSpacingErrorFraction, options.SavedToothGaps, warnings)?.Offsets(pulses);
        }
        else if (pulses != null && options.MeasureToothPositions)
        {
            // The distance comes from the second wheel: its ring's positions from the run alone.
            // The saved map is the first channel's ring.
            if (options.SavedToothGaps != null)
            {
                warnings.Add("calibration: the settings' tooth-spacing map is not applied to this run: its distance comes from the second pulse channel, and the map is the first channel's ring");
            }

            toothOffsets = ToothPositions.Measure(run.SecondPulses, configuration.SecondPulsesPerRevolution, mpp, run.Source, options.ToothSpacingErrorFraction)?.Offsets(pulses);
        }

        if (pulses != null)
        {
            CheckBrackets(pulses, configuration, options, warnings);
        }

        return new DistanceChannel
        {
            Pulses = pulses,
            MetresPerPulse = mpp,
            Index = channel,
            ChoiceNote = note,
            ToothOffsets = toothOffsets,
            StartNoiseM = pulses is null ? 0 : StartNoiseM(pulses, mpp, options.ToothSpacingErrorFraction),
            Warnings = warnings,
        };
    }

    /// <summary>Distance the second channel covered divided by the first's, from the later first
    /// pulse (plus 0.2 s) to the first channel's highest speed, when both saw enough of it.</summary>
    /// <returns>The ratio, or null when the first channel's peak comes less than a second after
    /// the comparison starts or it covered 10 m or less by then.</returns>
    internal static double? DistanceUnderDrive(PulseChannel a, double mppA, PulseChannel b, double mppB)
    {
        double from = Math.Max(a.MidS(0), b.MidS(0)) + CompareAfterFirstPulseS;

        // Highest speed of channel a over half-second spans.
        double peakS = double.NaN;
        double peak = 0;
        int j = 0;
        for (int i = 0; i < a.Length; i++)
        {
            while (j < a.Length && a.MidS(j) < a.MidS(i) + PeakSpanS)
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
    private static double StartNoiseM(PulseChannel p, double mpp, double toothSpacingErrorFraction)
    {
        int n = Math.Min(p.Length, StartMotion.MinimumObservations);
        double width = 0;
        for (int i = 0; i < n; i++)
        {
            width = Math.Max(width, p.HiS[i] - p.LoS[i]);
        }

        double span = n > 1 ? p.MidS(n - 1) - p.MidS(0) : 0;
        double speed = span > 0 ? (p.Counts[n - 1] - p.Counts[0]) * mpp / span : 0;
        return Math.Sqrt(Math.Pow(toothSpacingErrorFraction * mpp, 2) + Math.Pow(speed * width / Math.Sqrt(12), 2));
    }

    /// <summary>Notes pulse observations that went backwards, and, for plain-text inputs,
    /// brackets wider than the limit.</summary>
    private static void CheckBrackets(PulseChannel pulses, RunConfiguration configuration, ReconstructionOptions options, List<string> warnings)
    {
        if (pulses.Dropped > 0)
        {
            warnings.Add($"{pulses.Dropped} pulse observations went backwards in count or time and were left out");
        }

        double limit = options.WideBracketS ?? (configuration.BracketLimitS > 0 ? configuration.BracketLimitS : DefaultWideBracketS);
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
}
