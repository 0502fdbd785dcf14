using System.Globalization;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>Where each edge of the distance channel's ring really sits, measured from the run's
/// own pulses: a ring's teeth are not evenly spaced (a cut or printed ring to about 1 % of a pitch,
/// more on a coarse one), and the same edge comes round every revolution.</summary>
/// <remarks>
/// <para>The filter takes count N to be reached at distance N·m − φ, each edge off by an
/// independent error of <see cref="ReconstructionOptions.ToothSpacingErrorFraction"/> of a pitch.
/// On a coarse ring that error is the largest left at the first foot: two or three edges fix the
/// phase there, each a few millimetres off (the simulator's 12-tooth ring, 1.5 % of a 15-cm pitch:
/// 2.3 mm, 1.4 ms at 1.6 m/s). But the errors are not noise: they repeat exactly every revolution,
/// and a quarter mile turns the wheel two hundred times. <see cref="ToothSpacingCalibration"/>
/// measures each gap against the revolution around it wherever the speed is steady enough
/// (hardware-notes/calibration.md §4; the detrending removes a steady change of speed); summed,
/// the gaps give each edge's place, N + D(N mod n) pitches, D of mean zero over the ring (so that
/// the phase keeps its prior of a uniform place within one pitch).</para>
/// <para>The map is used only when the run gives one (enough steady revolutions, brackets narrow
/// enough, both halves of the run agreeing) and it knows the edges better than the prior does:
/// gap errors σ_k add up along the ring like a tied random walk, at most √(Σσ_k²)/2 at its
/// middle (<see cref="SigmaPulses"/>). The filter keeps the prior's σ for each edge all the same:
/// it is also what the filter's other choices (a kept slip's evidence, the brackets' edge
/// model) were set against, and on an evenly cut ring a tighter σ moved the generator's
/// mid-run figures both ways by up to 2 ms (0-60 mph p95 2.67 → 3.33 ms) where the placed
/// edges alone leave them as they were.</para>
/// </remarks>
internal sealed class ToothPositions
{
    private readonly double[] offsets;

    private ToothPositions(double[] offsets, double sigma)
    {
        this.offsets = offsets;
        SigmaPulses = sigma;
    }

    /// <summary>1-σ of an edge's place after the map, in pitches (decides whether the map is used).</summary>
    public double SigmaPulses { get; }

    /// <summary>Measures the ring's edge places from <paramref name="pulses"/>, numbered by the
    /// run's own count, and from a saved map turned to the run where one is given; null when
    /// neither gives a map, or one no better than <paramref name="priorFraction"/> (the prior's
    /// σ, in pitches).</summary>
    /// <param name="pulses">The distance channel.</param>
    /// <param name="n">Pulses per revolution.</param>
    /// <param name="metresPerPulse">Distance per pulse, m.</param>
    /// <param name="source">The run's name.</param>
    /// <param name="priorFraction">The prior's σ of an edge, in pitches.</param>
    /// <param name="saved">The settings' map of this ring (<see cref="CalibrationSettings.ToothSpacing"/>),
    /// or null; used only when the run's steady revolutions tell how to turn it
    /// (<see cref="ToothSpacingCalibration.Align"/>), and then weighed with the run's own map by
    /// each gap's σ.</param>
    /// <param name="notes">Where to say whether the saved map was used, and why not.</param>
    public static ToothPositions? Measure(IReadOnlyList<PulseRecord> pulses, int n, double metresPerPulse, string source, double priorFraction, ToothGaps? saved = null, ICollection<string>? notes = null)
    {
        if (n < 2)
        {
            return null;
        }

        double[]? spacing = null;
        double[]? sigmas = null;
        if (pulses.Count >= ToothSpacingCalibration.MinimumRevolutions * n
            && ToothSpacingCalibration.Measure(pulses, n, metresPerPulse, source, null, out _) is { HalvesDisagree: false } own)
        {
            spacing = [.. own.Spacing];
            sigmas = [.. own.Sigma];
        }

        string? savedNote = null;
        if (saved is { } map && map.Spacing.Count == n)
        {
            if (ToothSpacingCalibration.Align(pulses, map.Spacing, map.Sigma, out string? refusal) is not { } turn)
            {
                notes?.Add($"calibration: the settings' tooth-spacing map is not applied to this run: {refusal}");
            }
            else
            {
                string withOwn = spacing is null ? "" : ", weighed with the map the run itself gives";
                (spacing, sigmas) = Combine(map, turn.Shift, spacing, sigmas);
                savedNote = string.Create(CultureInfo.InvariantCulture, $"calibration: the settings' tooth-spacing map is applied, its entry {turn.Shift} taken as this run's tooth 0 (found over {turn.Revolutions:0} steady revolutions{withOwn})");
            }
        }

        if (spacing is null || sigmas is null)
        {
            return null;
        }

        var place = new double[n];
        double variance = 0;
        for (int k = 1; k < n; k++)
        {
            place[k] = place[k - 1] + spacing[k] - 1;
        }

        for (int k = 0; k < n; k++)
        {
            variance += sigmas[k] * sigmas[k];
        }

        double mean = place.Average();
        for (int k = 0; k < n; k++)
        {
            place[k] -= mean;
        }

        double sigma = 0.5 * Math.Sqrt(variance);
        if (sigma >= priorFraction)
        {
            if (savedNote != null)
            {
                notes?.Add(string.Create(CultureInfo.InvariantCulture, $"calibration: the settings' tooth-spacing map is not applied to this run: with it each edge is known to {sigma * 100:0.##} % of a pitch, no better than the {priorFraction * 100:0.##} % taken without a map"));
            }

            return null;
        }

        if (savedNote != null)
        {
            notes?.Add(savedNote);
        }

        return new ToothPositions(place, sigma);
    }

    /// <summary>The saved map turned to the run (entry (k + shift) mod n is the run's gap k),
    /// weighed with the run's own map where there is one, each gap by the inverse of its variance.</summary>
    private static (double[] Spacing, double[] Sigma) Combine(ToothGaps saved, int shift, double[]? own, double[]? ownSigma)
    {
        int n = saved.Spacing.Count;
        var spacing = new double[n];
        var sigma = new double[n];
        for (int k = 0; k < n; k++)
        {
            int j = (k + shift) % n;
            double w = 1 / (saved.Sigma[j] * saved.Sigma[j]);
            double sum = w * saved.Spacing[j];
            if (own != null && ownSigma != null)
            {
                double v = 1 / (ownSigma[k] * ownSigma[k]);
                sum += v * own[k];
                w += v;
            }

            spacing[k] = sum / w;
            sigma[k] = 1 / Math.Sqrt(w);
        }

        return (spacing, sigma);
    }

    /// <summary>Each observation's edge place less its count, in pitches.</summary>
    public double[] Offsets(PulseChannel channel)
    {
        int n = offsets.Length;
        var result = new double[channel.Length];
        for (int i = 0; i < result.Length; i++)
        {
            result[i] = offsets[(int)(((channel.Counts[i] % n) + n) % n)];
        }

        return result;
    }
}
