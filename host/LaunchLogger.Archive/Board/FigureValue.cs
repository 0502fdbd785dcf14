namespace LaunchLogger.Archive.Board;

/// <summary>One figure of one run under both conventions (equal for figures without one), SI.</summary>
/// <param name="Standstill">Timed from true standstill.</param>
/// <param name="StandstillSigma">1-σ of <paramref name="Standstill"/>.</param>
/// <param name="Rollout">Timed after the rollout.</param>
/// <param name="RolloutSigma">1-σ of <paramref name="Rollout"/>.</param>
public sealed record FigureValue(double? Standstill, double? StandstillSigma, double? Rollout, double? RolloutSigma);
