namespace LaunchLogger.Prescribed.Motion;

/// <summary>The instants that delimit one run of a prescribed record, as the builder placed them
/// (exact by construction, not estimated).</summary>
/// <param name="StartS">Launch from rest (first motion) for a standing start; the record's start
/// for a run already moving.</param>
/// <param name="Standing">True when the run starts from rest.</param>
/// <param name="StartSpeedMps">Speed at <paramref name="StartS"/>: 0 standing.</param>
/// <param name="BrakeOnsetS">When the deceleration of the run's stop begins to build, or null.</param>
/// <param name="StandstillS">When the car comes to rest, or null when it never does.</param>
/// <param name="BrakeRiseS">How long the deceleration took to build (0 = a step), or null.</param>
public sealed record RunMarks(double StartS, bool Standing, double StartSpeedMps, double? BrakeOnsetS, double? StandstillS, double? BrakeRiseS);
