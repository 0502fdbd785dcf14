using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Analysis;

/// <summary>The whole host-side flow for one run: reconstruction → figures → braking.</summary>
public static class RunAnalyzer
{
    /// <summary>Analyses one run.</summary>
    /// <exception cref="AnalysisException">The run holds too little to reconstruct (no motion).</exception>
    public static RunAnalysis Analyze(DecodedRun run, AnalysisOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(run);
        options ??= AnalysisOptions.Default;
        ReconstructionOptions reconstructionOptions = options.RolloutM is { } rollout
            ? options.Reconstruction with { RolloutM = rollout }
            : options.Reconstruction;
        ReconstructedRun reconstruction;
        try
        {
            reconstruction = Reconstructor.Reconstruct(run, reconstructionOptions);
        }
        catch (InvalidOperationException e)
        {
            throw new AnalysisException($"{run.Source}: {e.Message}", e);
        }

        FigureSet figures = FigureCalculator.Compute(reconstruction.Trajectory, reconstruction.FirstMotionS, reconstruction.RolloutM, options.Figures);
        double[] brakeOn = run.Events.Where(e => e.Kind == EventKind.BrakeOn).Select(e => e.TimeS).ToArray();
        BrakingResult? braking = BrakingAnalyzer.Analyze(reconstruction.Trajectory, brakeOn, options.StopFromMps);
        return new RunAnalysis
        {
            Run = run,
            Reconstruction = reconstruction,
            Figures = figures,
            Braking = braking,
            Warnings = run.Warnings.Concat(reconstruction.Warnings).Distinct().ToList(),
        };
    }
}
